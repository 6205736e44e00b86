/**
 * The plain mesh method of characteristics, non-homentropic (Benson's mesh
 * method with entropy levels carried along path lines), without any
 * conservation: what moc.ts grew out of, kept for comparison.
 *
 * Quasi-1-D unsteady flow in a duct of area F(x) with wall friction and wall
 * heat transfer. Along the Mach lines dx/dt = u ± a:
 *   dλ = a·dA/A + G1·[ −a·u·dlnF + (γ−1)·(q + u·G)/a − G ]·dt      (u + a)
 *   dβ = a·dA/A + G1·[ −a·u·dlnF + (γ−1)·(q + u·G)/a + G ]·dt      (u − a)
 * and along the path line dx/dt = u:
 *   dA/A = (γ−1)·(q + u·G)/(2a²)·dt
 * with
 *   λ = a + G1·u, β = a − G1·u        Riemann variables [m/s]
 *   a sound speed, u velocity [m/s], G1 = (γ−1)/2
 *   A = a·(P_REF/p)^((γ−1)/(2γ))      entropy level [m/s]; dA along a Mach
 *                                     line is A(new point) − A(foot)
 *   dlnF = (1/F)·dF/dx [1/m]          area change (mesh.ts)
 *   G = 2·f·u·|u|/D                   wall friction force per unit mass
 *                                     [m/s²], Fanning factor f
 *   q = 2·f·|u|·cp·(Tw − T)/D          wall heat per unit mass [W/kg]
 *                                     (Reynolds analogy, h = f/2·ρ·|u|·cp)
 * The feet of the characteristics at the old time level are found by linear
 * interpolation between mesh points, solving x_foot = x_i − c(x_foot)·dt with
 * c interpolated linearly; λ, β, a, u and A are interpolated there.
 *
 * Ends: `incoming` gives the boundary the arriving invariant normalised by
 * the arriving gas's entropy level (Benson's correction, boundary/types.ts);
 * `step` takes the end states from the boundaries.
 *
 * Mass: interpolating a (and density ∝ a⁵) loses mass at steep fronts, and a
 * front's speed is the mean of the characteristic speeds either side, not the
 * Rankine–Hugoniot speed: this plain mesh method is not conservative. It is
 * kept to show that defect (test/core/mass-drift.test.ts); the runner uses
 * the conservative form of moc.ts. `mass()` lets a test measure the drift.
 */
import { CP, G1, GAMMA, P_REF, PEXP, R_AIR, powP } from '../gas.js';
import type { EndState, Incoming } from '../boundary/types.js';
import type { Mesh } from './mesh.js';
import type { GasState, PipeScheme, PipeWall, Side } from './scheme.js';

const GM1 = GAMMA - 1;
const GR = GAMMA * R_AIR;
const INV_GR = 1 / GR;
const INV_2G1 = 1 / (2 * G1);

export class PlainCharacteristicsScheme implements PipeScheme {
  readonly name = 'characteristics' as const;
  private lam: Float64Array;
  private bet: Float64Array;
  private ent: Float64Array;
  private nl: Float64Array;
  private nb: Float64Array;
  private ne: Float64Array;
  private readonly f: number;
  private readonly heat: boolean;
  private readonly tw: number;
  /** old-level sound speed and velocity per node [m/s] (scratch of a step) */
  private av: Float64Array;
  private uv: Float64Array;
  /** 2f/D per node [1/m] */
  private kf: Float64Array;

  constructor(
    readonly mesh: Mesh,
    wall: PipeWall,
  ) {
    const n = mesh.n;
    this.av = new Float64Array(n);
    this.uv = new Float64Array(n);
    this.kf = new Float64Array(n);
    for (let i = 0; i < n; i++) this.kf[i] = (2 * wall.friction) / mesh.diameter[i]!;
    this.lam = new Float64Array(n);
    this.bet = new Float64Array(n);
    this.ent = new Float64Array(n);
    this.nl = new Float64Array(n);
    this.nb = new Float64Array(n);
    this.ne = new Float64Array(n);
    this.f = wall.friction;
    this.heat = wall.heatTransfer && wall.friction > 0;
    this.tw = wall.wallTemperature;
  }

  fill(pressure: number, velocity: number, temperature: number): void {
    const a = Math.sqrt(GR * temperature);
    const A = a * Math.pow(P_REF / pressure, 1 / PEXP);
    this.lam.fill(a + G1 * velocity);
    this.bet.fill(a - G1 * velocity);
    this.ent.fill(A);
  }

  setState(p: ArrayLike<number>, u: ArrayLike<number>, T: ArrayLike<number>): void {
    for (let i = 0; i < this.mesh.n; i++) {
      const a = Math.sqrt(GR * T[i]!);
      this.lam[i] = a + G1 * u[i]!;
      this.bet[i] = a - G1 * u[i]!;
      this.ent[i] = a * Math.pow(P_REF / p[i]!, 1 / PEXP);
    }
  }

  /**
   * `left` for x < xSplit, `right` beyond; the point whose volume
   * (x_i ± dx/2, half at the ends) the split cuts takes the mixture of each
   * side's share of mass, momentum and energy.
   */
  setSplit(xSplit: number, left: GasState, right: GasState): void {
    const { n, x, dx, length } = this.mesh;
    const rl = left.pressure / (R_AIR * left.temperature);
    const rr = right.pressure / (R_AIR * right.temperature);
    const el = left.pressure / GM1 + 0.5 * rl * left.velocity * left.velocity;
    const er = right.pressure / GM1 + 0.5 * rr * right.velocity * right.velocity;
    for (let i = 0; i < n; i++) {
      const lo = i === 0 ? 0 : x[i]! - 0.5 * dx;
      const hi = i === n - 1 ? length : x[i]! + 0.5 * dx;
      let w = (xSplit - lo) / (hi - lo);
      w = w < 0 ? 0 : w > 1 ? 1 : w;
      const r = w * rl + (1 - w) * rr;
      const u = (w * rl * left.velocity + (1 - w) * rr * right.velocity) / r;
      const p = GM1 * (w * el + (1 - w) * er - 0.5 * r * u * u);
      const a = Math.sqrt((GAMMA * p) / r);
      this.lam[i] = a + G1 * u;
      this.bet[i] = a - G1 * u;
      this.ent[i] = a * Math.pow(P_REF / p, 1 / PEXP);
    }
  }

  maxStableDt(courant: number): number {
    const { lam, bet } = this;
    let cmax = 0;
    for (let i = 0; i < lam.length; i++) {
      const a = 0.5 * (lam[i]! + bet[i]!);
      const u = (lam[i]! - bet[i]!) / (2 * G1);
      const c = Math.abs(u) + a;
      if (c > cmax) cmax = c;
    }
    return (courant * this.mesh.dx) / cmax;
  }

  /** friction force per unit mass G [m/s²] */
  private friction(u: number, d: number): number {
    return (2 * this.f * u * Math.abs(u)) / d;
  }

  /** (γ−1)·(q + u·G)/a source part shared by both invariants, times G1 */
  private heatSource(a: number, u: number, d: number, G: number): number {
    let q = 0;
    if (this.heat) q = (2 * this.f * Math.abs(u) * CP * (this.tw - (a * a) / GR)) / d;
    return (GM1 * (q + u * G)) / a;
  }

  /**
   * Foot of the λ characteristic arriving at node i from the left (k = i−1),
   * or of the β characteristic arriving from the right (k = i+1). Returns the
   * interpolation fraction s ∈ [0, 1] towards node k.
   */
  private footFraction(i: number, k: number, sign: number, sigma: number): number {
    const { lam, bet } = this;
    const ai = 0.5 * (lam[i]! + bet[i]!);
    const ui = (lam[i]! - bet[i]!) / (2 * G1);
    const ak = 0.5 * (lam[k]! + bet[k]!);
    const uk = (lam[k]! - bet[k]!) / (2 * G1);
    const ci = ai + sign * ui;
    const ck = ak + sign * uk;
    let s = (ci * sigma) / (1 + (ci - ck) * sigma);
    if (s < 0) s = 0;
    else if (s > 1) s = 1;
    return s;
  }

  incoming(side: Side, dt: number, out: Incoming): void {
    const n = this.mesh.n;
    const sigma = dt / this.mesh.dx;
    const { lam, bet, ent } = this;
    const mesh = this.mesh;
    // left end: β arrives from node 1; right end: λ arrives from node n−2
    const i = side === 'left' ? 0 : n - 1;
    const k = side === 'left' ? 1 : n - 2;
    const sign = side === 'left' ? -1 : 1;
    const s = this.footFraction(i, k, sign, sigma);
    const li = lam[i]! + s * (lam[k]! - lam[i]!);
    const bi = bet[i]! + s * (bet[k]! - bet[i]!);
    const A = ent[i]! + s * (ent[k]! - ent[i]!);
    const a = 0.5 * (li + bi);
    const u = (li - bi) / (2 * G1);
    const d = mesh.diameter[i]!;
    const G = this.f > 0 ? this.friction(u, d) : 0;
    const common = -a * u * mesh.dlnF[i]! + this.heatSource(a, u, d, G);
    let J: number;
    if (side === 'left') J = bi + G1 * (common + G) * dt;
    else J = li + G1 * (common - G) * dt;
    out.lambda = J / A;
    out.entropy = A;
    out.area = mesh.area[i]!;
  }

  step(dt: number, left: EndState, right: EndState): void {
    const n = this.mesh.n;
    const mesh = this.mesh;
    const sigma = dt / mesh.dx;
    const { lam, bet, ent, nl, nb, ne, av, uv, kf } = this;
    const dlnFa = mesh.dlnF;
    const fr = this.f > 0;
    const heat = this.heat;
    const tw = this.tw;
    // old-level sound speed and velocity, once per node
    for (let i = 0; i < n; i++) {
      const l = lam[i]!;
      const b = bet[i]!;
      av[i] = 0.5 * (l + b);
      uv[i] = (l - b) * INV_2G1;
    }
    for (let i = 1; i < n - 1; i++) {
      const ai = av[i]!;
      const ui = uv[i]!;
      const Ai = ent[i]!;
      const aL = av[i - 1]!;
      const uL = uv[i - 1]!;
      const aRt = av[i + 1]!;
      const uRt = uv[i + 1]!;
      const dlnF = dlnFa[i]!;
      const k = kf[i]!; // 2f/D
      // path line foot (upwind side by the sign of u)
      let Ap: number;
      let aP: number;
      let uP: number;
      if (ui >= 0) {
        let sp = (ui * sigma) / (1 + (ui - uL) * sigma);
        sp = sp < 0 ? 0 : sp > 1 ? 1 : sp;
        Ap = Ai + sp * (ent[i - 1]! - Ai);
        aP = ai + sp * (aL - ai);
        uP = ui + sp * (uL - ui);
      } else {
        let sp = (-ui * sigma) / (1 + (uRt - ui) * sigma);
        sp = sp < 0 ? 0 : sp > 1 ? 1 : sp;
        Ap = Ai + sp * (ent[i + 1]! - Ai);
        aP = ai + sp * (aRt - ai);
        uP = ui + sp * (uRt - ui);
      }
      let Anew = Ap;
      if (fr) {
        const au = uP < 0 ? -uP : uP;
        const G = k * uP * au;
        const q = heat ? k * au * CP * (tw - (aP * aP) * INV_GR) : 0;
        Anew = Ap * (1 + ((GM1 * (q + uP * G)) / (2 * aP * aP)) * dt);
      }
      ne[i] = Anew;
      // λ arriving from the left: foot where x_i − x = (u + a)·dt
      {
        const ci = ai + ui;
        let s = (ci * sigma) / (1 + (ci - (aL + uL)) * sigma);
        s = s < 0 ? 0 : s > 1 ? 1 : s;
        const li = lam[i]!;
        const lR = li + s * (lam[i - 1]! - li);
        const a = ai + s * (aL - ai);
        const u = ui + s * (uL - ui);
        const AR = Ai + s * (ent[i - 1]! - Ai);
        let src = -a * u * dlnF;
        if (fr) {
          const au = u < 0 ? -u : u;
          const G = k * u * au;
          const q = heat ? k * au * CP * (tw - a * a * INV_GR) : 0;
          src += (GM1 * (q + u * G)) / a - G;
        }
        nl[i] = lR + (a * (Anew - AR)) / AR + G1 * src * dt;
      }
      // β arriving from the right: foot where x − x_i = (a − u)·dt
      {
        const ci = ai - ui;
        let s = (ci * sigma) / (1 + (ci - (aRt - uRt)) * sigma);
        s = s < 0 ? 0 : s > 1 ? 1 : s;
        const bi = bet[i]!;
        const bS = bi + s * (bet[i + 1]! - bi);
        const a = ai + s * (aRt - ai);
        const u = ui + s * (uRt - ui);
        const AS = Ai + s * (ent[i + 1]! - Ai);
        let src = -a * u * dlnF;
        if (fr) {
          const au = u < 0 ? -u : u;
          const G = k * u * au;
          const q = heat ? k * au * CP * (tw - a * a * INV_GR) : 0;
          src += (GM1 * (q + u * G)) / a + G;
        }
        nb[i] = bS + (a * (Anew - AS)) / AS + G1 * src * dt;
      }
    }
    // ends from the boundary states (outward velocity → pipe velocity)
    this.setEnd(0, left.pressure, -left.velocity, left.entropy);
    this.setEnd(n - 1, right.pressure, right.velocity, right.entropy);
    this.lam = nl;
    this.nl = lam;
    this.bet = nb;
    this.nb = bet;
    this.ent = ne;
    this.ne = ent;
  }

  private setEnd(i: number, p: number, u: number, A: number): void {
    const a = A * Math.pow(p / P_REF, 1 / PEXP);
    this.nl[i] = a + G1 * u;
    this.nb[i] = a - G1 * u;
    this.ne[i] = A;
  }

  /** density at node i [kg/m³] */
  private rho(i: number): number {
    const a = 0.5 * (this.lam[i]! + this.bet[i]!);
    const p = P_REF * powP(a / this.ent[i]!);
    return (p * GR) / (R_AIR * a * a);
  }

  mass(): number {
    const { n, dx, area } = this.mesh;
    let m = 0;
    for (let i = 0; i < n; i++) {
      const w = i === 0 || i === n - 1 ? 0.5 : 1;
      m += w * this.rho(i) * area[i]!;
    }
    return m * dx;
  }

  sample(p: Float64Array, u: Float64Array, T: Float64Array): void {
    const { lam, bet, ent } = this;
    for (let i = 0; i < this.mesh.n; i++) {
      const a = 0.5 * (lam[i]! + bet[i]!);
      p[i] = P_REF * powP(a / ent[i]!);
      u[i] = (lam[i]! - bet[i]!) / (2 * G1);
      T[i] = (a * a) / GR;
    }
  }

  healthy(): boolean {
    const { lam, bet, ent } = this;
    for (let i = 0; i < this.mesh.n; i++) {
      const a = 0.5 * (lam[i]! + bet[i]!);
      const u = (lam[i]! - bet[i]!) / (2 * G1);
      if (!(a > 0) || !(ent[i]! > 0) || !Number.isFinite(u) || !Number.isFinite(a)) return false;
    }
    return true;
  }
}

export function createPlainCharacteristicsScheme(mesh: Mesh, wall: PipeWall): PipeScheme {
  return new PlainCharacteristicsScheme(mesh, wall);
}
