/**
 * Method of characteristics on a fixed mesh, non-homentropic (Riemann
 * variables λ, β along the Mach lines, Benson's entropy level A along path
 * lines), in conservation form: the characteristics carry the state to the
 * faces between mesh points, and the control volume around each point keeps
 * its mass, momentum and energy exactly.
 *
 * Symbols
 *   x position [m] (0 upstream end, L valve end), t time [s], dt step,
 *   dx mesh spacing, σ = dt/dx [s/m]; mesh points x_i, i = 0..n−1
 *   a sound speed, u velocity along +x [m/s]; p pressure [Pa]; ρ density
 *   [kg/m³]; E = p/(γ−1) + ρu²/2 total energy per volume [J/m³]
 *   G1 = (γ−1)/2; λ = a + G1·u, β = a − G1·u   Riemann variables [m/s]
 *   A = a·(P_REF/p)^((γ−1)/(2γ))               entropy level [m/s]
 *   X = (p/P_REF)^((γ−1)/(2γ)) = a/A             pressure function [-]
 *   F(x) flow area [m²], dlnF = (1/F)·dF/dx [1/m] (mesh.ts), D diameter
 *   G = 2·f·u·|u|/D   wall friction force per unit mass [m/s²], Fanning f
 *   q = 2·f·|u|·cp·(Tw − T)/D   wall heat per unit mass [W/kg] (Reynolds
 *                               analogy, h = f/2·ρ·|u|·cp)
 *
 * Characteristic equations (quasi-1-D, friction and heat). Along dx/dt = u ± a
 *   dλ = a·dA/A + G1·[ −a·u·dlnF + (γ−1)·(q + u·G)/a − G ]·dt      (u + a)
 *   dβ = a·dA/A + G1·[ −a·u·dlnF + (γ−1)·(q + u·G)/a + G ]·dt      (u − a)
 * and along the path line dx/dt = u
 *   dA/A = (γ−1)·(q + u·G)/(2a²)·dt,
 * dA along a Mach line being the entropy level of the gas at its end minus
 * that at its foot (Benson's non-homentropic correction).
 *
 * Why conservation form. The plain mesh method (moc-plain.ts) moves λ, β, A
 * from the feet of the characteristics to the mesh points. At a shock this
 * is wrong twice: interpolating a (ρ ∝ a⁵ on an isentrope) loses mass, and,
 * worse, the front moves at the mean of the characteristic speeds either
 * side instead of the speed the jump conditions (Rankine–Hugoniot) give; a
 * scheme that is not conservative converges to fronts at the wrong speed
 * (Lax–Wendroff theorem; Hou & LeFloch, Math. Comp. 62 (1994)). A mass-only
 * correction (densities from conservative mass fluxes, pressure and velocity
 * left to the characteristics, the difference put into temperature) keeps
 * the mass but not the speed. Measured on Sod's split in a closed pipe
 * (1 bar 348.4 K | 0.1 bar 278.7 K): the shock that reflects from the wall
 * into gas at 293 m/s, 398 K should run back at S = −ρ₁u₁/(ρ₂ − ρ₁)
 * = −319 m/s (p 0.780 bar, ρ₂/ρ₁ 1.918, T 534 K); the mesh method runs it at
 * ½·((u₁ − a₁) + (0 − a₂)) = −285 m/s, so the mass that the fluxes bring
 * piles into a shorter column, ρ₂/ρ₁ = (u₁ − S)/(−S) = 2.03, T ≈ 504 K.
 * At the wall u = 0: the path line never leaves the end point, so every
 * error put into its entropy level stays there (the overheating of a wall
 * reflection: 487 K beside 601 K at 1.1 ms, 90 K and 715 K by 3 ms), and
 * every later wave crosses that gas at the wrong sound speed. The error
 * grew with each reflection:
 * 6 % of the initial pressure difference at 1.6 ms, 15 % at 2 ms, 37 % at 3 ms
 * (mean |p − p_ref| against a converged reference, the same at 10 and
 * 2.5 mm). Only conservation of momentum and energy as well fixes the front
 * speed and the entropy rise; so the scheme below conserves all three and
 * lets the characteristics decide what crosses each face.
 *
 * The scheme
 * - Control volumes: inner point i owns [x_i − dx/2, x_i + dx/2], volume
 *   V_i = F_i·dx, holding ρ, ρu, E; the half-volumes at the two ends belong
 *   to points 1 and n−2 (so no volume is thinner than dx and the end
 *   volumes keep the Courant limit of the inner ones). The end points 0 and
 *   n−1 hold the boundaries' end states. Face j (j = 1..n−3) lies midway
 *   between points j and j+1, area F_j = ½(F_j + F_{j+1}); faces 0 and n−2
 *   are the pipe ends, area F_0 and F_{n−1}.
 * - Slopes: X, u and A vary linearly inside a volume with van Leer limited
 *   slopes ΔX, Δu, ΔA (per dx) of the neighbour differences.
 * - Tracing: the changes of the Riemann variables across the volume at
 *   fixed entropy, Δλ = A·ΔX + G1·Δu and Δβ = A·ΔX − G1·Δu, and ΔA each
 *   travel at their own speed c = u + a, u − a, u. Followed back from a
 *   face at t + dt/2 to its foot, each is taken at w = ½·(±1 − σ·c) dx
 *   from the point (+ for the volume's right face, − for its left face):
 *     A_f = A + w₀·ΔA,  X_f = X + (w₊·Δλ + w₋·Δβ)/(2A),
 *     u_f = u + (w₊·Δλ − w₋·Δβ)/(2·G1),
 *   then λ = A_f·X_f + G1·u_f and β = A_f·X_f − G1·u_f, plus the source
 *   terms above over dt/2 (A_f by its path-line factor). Built on the face
 *   gas's own entropy level this is Benson's non-homentropic λ, β exactly,
 *   and keeps a contact at rest (p, u uniform) exact; his linear term
 *   a·ΔA/A is only first order across a large entropy jump.
 * - Meeting at the face: the left side's λ_L (its gas A_L) and the right
 *   side's β_R (A_R) meet at one pressure and velocity,
 *     A_L·X* + G1·u* = λ_L,  A_R·X* − G1·u* = β_R
 *     X* = (λ_L + β_R)/(A_L + A_R),  u* = (λ_L − A_L·X*)/G1,
 *   exact for two simple waves (the two-rarefaction Riemann solver, Toro
 *   2009 §9.4.1). Where that compresses a side by more than 2:1 the
 *   characteristics of that side cross (a front): p*, u* then come from the
 *   jump conditions (the two-shock solver, Toro 2009 §9.4.2, started from
 *   the PVRS guess), and the gas behind the front gets its entropy rise
 *   (ρ* from Toro eq. 4.50). The face takes the left gas when u* ≥ 0, the
 *   right gas otherwise, and where a fan or a front straddles the face
 *   (supersonic or transonic flow) the left, right or sonic state as Toro
 *   2009 §4.5 samples it (fronts at their jump speed, eq. 4.52).
 * - Fluxes from the face state (p, u, ρ = γp/a², h0 = a²/(γ−1) + u²/2), times
 *   F_j: mass ρu, momentum ρu² + p, energy ρu·h0. At the ends exactly what the
 *   boundary reports (boundary/types.ts, outward w): mass ∓massFlow,
 *   momentum massFlow·w + p·F, energy ∓enthalpyFlow (upper sign x = 0).
 * - Update: V_i·ΔU_i = −dt·(G_{i+½} − G_{i−½}) + sources, the area term of
 *   the momentum p̄_i·(F_{i+½} − F_{i−½}) with p̄_i the mean of the two face
 *   pressures (gas at rest in a taper stays at rest), friction −ρ·G and heat
 *   ρ·q at the old point state. Then a, u, p, X, A of each point.
 * - Ends: `incoming` follows the arriving characteristic from the end back
 *   to its foot at t (c·dt from the end, between the end point and its
 *   neighbour, X, u, A interpolated there) and hands the boundary the
 *   invariant normalised by that gas's entropy level (Benson's correction).
 *   The boundary's end state, at t + dt as in the mesh method, is the end
 *   flux for the step and the new end point. (Tracing only dt/2 to
 *   time-centre it, as the inner faces are, made the end point half a step
 *   late and a square wave ringing in a closed pipe grew.)
 * Total mass, and with closed ends total energy, change by exactly the
 * boundary flows (round-off). Stable for a Courant number (|u| + a)·σ ≤ 1.
 * A reflection from a closed end leaves the wall-heating of shock-capturing
 * schemes: +1.5 % in T over the last two points after Sod's reflection, at
 * any mesh (test/core/strong-reflections.test.ts).
 *
 * Range, measured: a closed–closed 1 m pipe, 2.5 mm mesh, a two-state split,
 * to ten transits at 347 m/s, against the conservative scheme at 0.5–1 mm.
 * - Ratio 10 (Sod's states, and one temperature): mean |Δp| 0.05–0.2 % of
 *   the pressure difference at every time to 3 ms (the conservative scheme
 *   at 2.5 mm: 0.05–0.2 %).
 * - At rest, pressure ratios up to 10⁴ with the low-pressure side 0.001 to
 *   10 times as hot, and 3000 with it up to 100 times as hot: as close as
 *   the conservative scheme at the same mesh (0.03–3 %). First failure:
 *   ratio 10⁴ with that side 30 times as hot.
 * - Colliding or separating streams up to Mach 2.5: within 1.7 times the
 *   conservative scheme's own error at that mesh; Mach 3 ran; Mach 4
 *   colliding fails.
 * - Both at once: at ratio 1000, streams of Mach 2 can fail where the
 *   conservative scheme runs; Mach 0.5 ran in every direction and
 *   temperature tried (24 cases; the one failure failed the conservative
 *   scheme too). At ratio 100, Mach 2 ran wherever the conservative did.
 * Where it fails, the gas of a strong expansion is so cold and fast that
 * its kinetic energy is nearly all of E, and p = (γ−1)(E − ρu²/2) turns
 * negative beside a front. So `characteristicsRangeIssue` (below) refuses
 * splits beyond a pressure ratio of 1000, gas speeds beyond Mach 2, and
 * beyond Mach 0.5 where the ratio exceeds 100; a run that still goes
 * negative stops as diverged. Engine runs stay far inside this range.
 *
 * `incoming` and `step` allocate nothing: all work arrays are preallocated.
 */
import { CP, G1, GAMMA, P_REF, PEXP, R_AIR, powP, soundSpeed } from '../gas.js';
import type { EndState, Incoming } from '../boundary/types.js';
import type { Mesh } from './mesh.js';
import type { GasState, PipeScheme, PipeWall, Side } from './scheme.js';
import { createPlainCharacteristicsScheme } from './moc-plain.js';

const GM1 = GAMMA - 1;
const GR = GAMMA * R_AIR;
const INV_GR = 1 / GR;
const INV_2G1 = 1 / (2 * G1);
const INV_PEXP = 1 / PEXP;
/** smallest pressure function X the face meeting may return (p ≈ 1e-28 Pa) */
const X_MIN = 1e-4;
/** a compression by more than this pressure ratio at a face is a front, met by the jump conditions */
const FRONT_RATIO = 2;
const FRONT_X = Math.pow(FRONT_RATIO, 1 / PEXP);
/** (γ−1)/(γ+1) */
const G6 = (GAMMA - 1) / (GAMMA + 1);
/** (γ+1)/(2γ) and (γ−1)/(2γ), shock speed (Toro 2009 eq. 4.52) */
const GQ = (GAMMA + 1) / (2 * GAMMA);
const GQM = (GAMMA - 1) / (2 * GAMMA);

/** van Leer's harmonic slope limiter */
function vanLeer(dl: number, dr: number): number {
  const prod = dl * dr;
  return prod > 0 ? (2 * prod) / (dl + dr) : 0;
}

export class CharacteristicsScheme implements PipeScheme {
  readonly name = 'characteristics' as const;
  private readonly n: number;
  private readonly f: number;
  private readonly heat: boolean;
  private readonly tw: number;
  /** 2f/D per point [1/m] */
  private readonly kf: Float64Array;
  /** control volume of each point [m³] */
  private readonly vol: Float64Array;
  /** face areas, faces 0..n (0 and n the pipe ends) [m²] */
  private readonly Ff: Float64Array;
  // conserved state per unit volume: ρ [kg/m³], ρu [kg/(m²·s)], E [J/m³]
  private readonly rho: Float64Array;
  private readonly mom: Float64Array;
  private readonly ener: Float64Array;
  // point state derived from them
  private readonly a: Float64Array;
  private readonly u: Float64Array;
  private readonly p: Float64Array;
  private readonly A: Float64Array;
  /** pressure function X = a/A per point [-] */
  private readonly X: Float64Array;
  // limited slopes of X, u, A per dx
  private readonly dX: Float64Array;
  private readonly du: Float64Array;
  private readonly dA: Float64Array;
  // per point, the half-step source of λ and of β [m/s] and the path-line factor of A [-]
  private readonly sl: Float64Array;
  private readonly sb: Float64Array;
  private readonly sA: Float64Array;
  // face fluxes (times the face area) and face pressures, faces 0..n
  private readonly g0: Float64Array;
  private readonly g1: Float64Array;
  private readonly g2: Float64Array;
  private readonly gp: Float64Array;
  /** [0] largest |u| + a over the points [m/s], [1] half the present step [s] (an array, not fields: no boxed doubles) */
  private readonly st = new Float64Array(2);
  /**
   * scratch of a face: traced λ, β, A of its left side [0..2] and of its
   * right side [3..5], and the face state X, u, A [6..8] (read and written
   * here rather than passed, so a call that is not inlined boxes no doubles)
   */
  private readonly w = new Float64Array(9);

  constructor(
    readonly mesh: Mesh,
    wall: PipeWall,
  ) {
    const n = mesh.n;
    if (n < 3) throw new Error('characteristics scheme needs at least three mesh points');
    this.n = n;
    this.f = wall.friction > 0 ? wall.friction : 0;
    this.heat = wall.heatTransfer && this.f > 0;
    this.tw = wall.wallTemperature;
    this.kf = new Float64Array(n);
    this.vol = new Float64Array(n);
    const { area, dx } = mesh;
    for (let i = 0; i < n; i++) {
      this.kf[i] = (2 * this.f) / mesh.diameter[i]!;
      this.vol[i] = i === 0 || i === n - 1 ? 0 : area[i]! * dx;
    }
    // the end half-volumes belong to the first and last inner points
    this.vol[1] = this.vol[1]! + 0.5 * area[0]! * dx;
    this.vol[n - 2] = this.vol[n - 2]! + 0.5 * area[n - 1]! * dx;
    // face j lies between points j and j+1; faces 0 and n−2 are the pipe ends
    this.Ff = new Float64Array(n - 1);
    for (let j = 1; j < n - 2; j++) this.Ff[j] = 0.5 * (area[j]! + area[j + 1]!);
    this.Ff[0] = area[0]!;
    this.Ff[n - 2] = area[n - 1]!;
    this.rho = new Float64Array(n);
    this.mom = new Float64Array(n);
    this.ener = new Float64Array(n);
    this.a = new Float64Array(n);
    this.u = new Float64Array(n);
    this.p = new Float64Array(n);
    this.A = new Float64Array(n);
    this.X = new Float64Array(n);
    this.dX = new Float64Array(n);
    this.du = new Float64Array(n);
    this.dA = new Float64Array(n);
    this.sl = new Float64Array(n);
    this.sb = new Float64Array(n);
    this.sA = new Float64Array(n);
    this.g0 = new Float64Array(n - 1);
    this.g1 = new Float64Array(n - 1);
    this.g2 = new Float64Array(n - 1);
    this.gp = new Float64Array(n - 1);
    this.fill(P_REF, 0, 293.15);
  }

  fill(pressure: number, velocity: number, temperature: number): void {
    for (let i = 0; i < this.n; i++) this.setPoint(i, pressure, velocity, temperature);
    this.derive();
  }

  setState(p: ArrayLike<number>, u: ArrayLike<number>, T: ArrayLike<number>): void {
    for (let i = 0; i < this.n; i++) this.setPoint(i, p[i]!, u[i]!, T[i]!);
    this.derive();
  }

  /**
   * `left` for x < xSplit, `right` beyond. The one control volume the split
   * cuts holds each side's share (by length, exact for one diameter) of
   * mass, momentum and energy, so the gas left of the split is exactly
   * ρ_left·F·xSplit.
   */
  setSplit(xSplit: number, left: GasState, right: GasState): void {
    const n = this.n;
    const { x, dx, length } = this.mesh;
    const rl = left.pressure / (R_AIR * left.temperature);
    const rr = right.pressure / (R_AIR * right.temperature);
    const el = left.pressure / GM1 + 0.5 * rl * left.velocity * left.velocity;
    const er = right.pressure / GM1 + 0.5 * rr * right.velocity * right.velocity;
    for (let i = 1; i < n - 1; i++) {
      const lo = i === 1 ? 0 : x[i]! - 0.5 * dx;
      const hi = i === n - 2 ? length : x[i]! + 0.5 * dx;
      let w = (xSplit - lo) / (hi - lo);
      w = w < 0 ? 0 : w > 1 ? 1 : w;
      this.rho[i] = w * rl + (1 - w) * rr;
      this.mom[i] = w * rl * left.velocity + (1 - w) * rr * right.velocity;
      this.ener[i] = w * el + (1 - w) * er;
    }
    const s0 = xSplit > 0 ? left : right;
    const s1 = xSplit < length ? right : left;
    this.setPoint(0, s0.pressure, s0.velocity, s0.temperature);
    this.setPoint(n - 1, s1.pressure, s1.velocity, s1.temperature);
    this.derive();
  }

  maxStableDt(courant: number): number {
    const cmax = this.st[0]!;
    return cmax > 0 ? (courant * this.mesh.dx) / cmax : Infinity;
  }

  incoming(side: Side, dt: number, out: Incoming): void {
    const n = this.n;
    const { a, u, A } = this;
    // left end: β arrives from point 1; right end: λ arrives from point n−2
    const i = side === 'left' ? 0 : n - 1;
    const k = side === 'left' ? 1 : n - 2;
    const sign = side === 'left' ? -1 : 1;
    // foot at x_end ∓ c·dt, c = a ± u interpolated there (linear in x)
    const sg = dt / this.mesh.dx;
    const ci = a[i]! + sign * u[i]!;
    const ck = a[k]! + sign * u[k]!;
    let s = (ci * sg) / (1 + (ci - ck) * sg);
    s = s < 0 ? 0 : s > 1 ? 1 : s;
    const X = this.X;
    const Xf = X[i]! + s * (X[k]! - X[i]!);
    const uf = u[i]! + s * (u[k]! - u[i]!);
    const Af = A[i]! + s * (A[k]! - A[i]!);
    const af = Af * Xf;
    // J = a + G1·w with w = sign·u outward
    const src = this.commonSource(af, uf, i) - sign * this.friction(uf, i);
    const J = af + G1 * sign * uf + G1 * src * dt;
    out.lambda = J / Af;
    out.entropy = Af;
    out.area = this.mesh.area[i]!;
  }

  step(dt: number, left: EndState, right: EndState): void {
    const n = this.n;
    const { a, u, g0, g1, g2, gp, Ff, rho, mom, ener } = this;
    const sigma = dt / this.mesh.dx;
    this.st[1] = 0.5 * dt;
    this.slopes();
    // inner faces j = 1..n−3, between points j and j+1
    for (let j = 1; j < n - 2; j++) {
      const w = this.w;
      this.trace(j, sigma, 1, 0);
      this.trace(j + 1, sigma, -1, 3);
      this.meet();
      const X = w[6]!;
      const uf = w[7]!;
      const af = w[8]! * X;
      const pf = P_REF * powP(X);
      const rf = (GAMMA * pf) / (af * af);
      const m = rf * uf;
      const F = Ff[j]!;
      g0[j] = m * F;
      g1[j] = (m * uf + pf) * F;
      g2[j] = m * ((af * af) / GM1 + 0.5 * uf * uf) * F;
      gp[j] = pf;
    }
    // end faces from the boundaries' end states (outward → x-directed)
    const e = n - 2;
    g0[0] = -left.massFlow;
    g1[0] = left.massFlow * left.velocity + left.pressure * Ff[0]!;
    g2[0] = -left.enthalpyFlow;
    gp[0] = left.pressure;
    g0[e] = right.massFlow;
    g1[e] = right.massFlow * right.velocity + right.pressure * Ff[e]!;
    g2[e] = right.enthalpyFlow;
    gp[e] = right.pressure;

    const fr = this.f > 0;
    const heat = this.heat;
    for (let i = 1; i < n - 1; i++) {
      const k = dt / this.vol[i]!;
      const pm = 0.5 * (gp[i - 1]! + gp[i]!);
      const r0 = rho[i]!;
      let mo = mom[i]! - k * (g1[i]! - g1[i - 1]! - pm * (Ff[i]! - Ff[i - 1]!));
      let en = ener[i]! - k * (g2[i]! - g2[i - 1]!);
      if (fr) {
        const ui = u[i]!;
        const au = ui < 0 ? -ui : ui;
        const kk = this.kf[i]!;
        mo -= dt * r0 * kk * ui * au; // ρ·G
        if (heat) en += dt * r0 * kk * au * CP * (this.tw - a[i]! * a[i]! * INV_GR); // ρ·q
      }
      rho[i] = r0 - k * (g0[i]! - g0[i - 1]!);
      mom[i] = mo;
      ener[i] = en;
    }
    this.endPoint(0, left.pressure, -left.velocity, left.entropy);
    this.endPoint(n - 1, right.pressure, right.velocity, right.entropy);
    this.derive();
  }

  mass(): number {
    let m = 0;
    for (let i = 1; i < this.n - 1; i++) m += this.rho[i]! * this.vol[i]!;
    return m;
  }

  /** total energy of the gas in the pipe [J] */
  energy(): number {
    let e = 0;
    for (let i = 1; i < this.n - 1; i++) e += this.ener[i]! * this.vol[i]!;
    return e;
  }

  sample(p: Float64Array, u: Float64Array, T: Float64Array): void {
    for (let i = 0; i < this.n; i++) {
      p[i] = this.p[i]!;
      u[i] = this.u[i]!;
      T[i] = (this.a[i]! * this.a[i]!) * INV_GR;
    }
  }

  healthy(): boolean {
    for (let i = 0; i < this.n; i++) {
      const r = this.rho[i]!;
      const p = this.p[i]!;
      if (!(r > 0 && p > 0 && Number.isFinite(r) && Number.isFinite(p) && Number.isFinite(this.u[i]!))) return false;
    }
    return true;
  }

  // ---------------------------------------------------------------------

  private setPoint(i: number, p: number, u: number, T: number): void {
    const r = p / (R_AIR * T);
    this.rho[i] = r;
    this.mom[i] = r * u;
    this.ener[i] = p / GM1 + 0.5 * r * u * u;
  }

  /** an end point takes the boundary's end state: p, x-velocity, entropy level */
  private endPoint(i: number, pressure: number, xVelocity: number, entropy: number): void {
    let Ae = entropy;
    if (!(Ae > 0)) Ae = this.A[i]!;
    const ae = Ae * Math.pow(pressure / P_REF, INV_PEXP);
    const r = (GAMMA * pressure) / (ae * ae);
    this.rho[i] = r;
    this.mom[i] = r * xVelocity;
    this.ener[i] = pressure / GM1 + 0.5 * r * xVelocity * xVelocity;
  }

  /** a, u, p, A of every point from ρ, ρu, E, and the largest |u| + a */
  private derive(): void {
    let cmax = 0;
    for (let i = 0; i < this.n; i++) {
      const r = this.rho[i]!;
      const u = this.mom[i]! / r;
      const p = GM1 * (this.ener[i]! - 0.5 * r * u * u);
      const a = Math.sqrt((GAMMA * p) / r);
      this.u[i] = u;
      this.p[i] = p;
      this.a[i] = a;
      const X = Math.pow(p / P_REF, INV_PEXP);
      this.X[i] = X;
      this.A[i] = a / X;
      const c = (u < 0 ? -u : u) + a;
      if (c > cmax) cmax = c;
    }
    this.st[0] = cmax;
  }

  /**
   * Limited slopes of X, u, A at the inner points (the end points hold the
   * boundaries' states), and each point's sources over dt/2: G1·(common ∓ G)·dt/2
   * for λ and β, and the path-line factor 1 + (γ−1)(q + u·G)/(2a²)·dt/2 for A.
   */
  private slopes(): void {
    const n = this.n;
    const { X, u, a, A, dX, du, dA, sl, sb, sA } = this;
    const h = this.st[1]!;
    const fr = this.f > 0;
    const heat = this.heat;
    const dlnF = this.mesh.dlnF;
    for (let i = 1; i < n - 1; i++) {
      dX[i] = vanLeer(X[i]! - X[i - 1]!, X[i + 1]! - X[i]!);
      du[i] = vanLeer(u[i]! - u[i - 1]!, u[i + 1]! - u[i]!);
      dA[i] = vanLeer(A[i]! - A[i - 1]!, A[i + 1]! - A[i]!);
      const ai = a[i]!;
      const ui = u[i]!;
      let common = -ai * ui * dlnF[i]!;
      let G = 0;
      let fA = 1;
      if (fr) {
        const k = this.kf[i]!;
        const au = ui < 0 ? -ui : ui;
        G = k * ui * au;
        const q = heat ? k * au * CP * (this.tw - ai * ai * INV_GR) : 0;
        const e = GM1 * (q + ui * G);
        common += e / ai;
        fA = 1 + (e / (2 * ai * ai)) * h;
      }
      sl[i] = G1 * (common - G) * h;
      sb[i] = G1 * (common + G) * h;
      sA[i] = fA;
    }
  }

  /** source of both invariants except friction: −a·u·dlnF + (γ−1)(q + u·G)/a */
  private commonSource(a: number, u: number, i: number): number {
    let s = -a * u * this.mesh.dlnF[i]!;
    if (this.f > 0) {
      const k = this.kf[i]!;
      const au = u < 0 ? -u : u;
      const G = k * u * au;
      const q = this.heat ? k * au * CP * (this.tw - a * a * INV_GR) : 0;
      s += (GM1 * (q + u * G)) / a;
    }
    return s;
  }

  /** friction force per unit mass G [m/s²] */
  private friction(u: number, i: number): number {
    return this.f > 0 ? this.kf[i]! * u * (u < 0 ? -u : u) : 0;
  }

  /**
   * λ, β, A of volume i traced to its right face (side = 1) or its left
   * face (side = −1) at t + dt/2, into w[k..k+2] (see the header).
   */
  private trace(i: number, sigma: number, side: number, k: number): void {
    const a = this.a[i]!;
    const u = this.u[i]!;
    const A = this.A[i]!;
    const AdX = A * this.dX[i]!;
    const Gdu = G1 * this.du[i]!;
    // the changes of λ and β across the volume at fixed entropy, per dx
    const dP = AdX + Gdu;
    const dM = AdX - Gdu;
    // distance of each foot from the point, in dx: ½·(side − σ·c)
    const wA = 0.5 * (side - sigma * u);
    const wl = 0.5 * (side - sigma * (u + a));
    const wb = 0.5 * (side - sigma * (u - a));
    const Af = (A + wA * this.dA[i]!) * this.sA[i]!;
    const Xf = this.X[i]! + (wl * dP + wb * dM) / (2 * A);
    const uf = u + (wl * dP - wb * dM) * INV_2G1;
    const w = this.w;
    w[k] = Af * Xf + G1 * uf + this.sl[i]!;
    w[k + 1] = Af * Xf - G1 * uf + this.sb[i]!;
    w[k + 2] = Af;
  }

  /**
   * The state at a face from the traced left (λL, βL, AL) and right
   * (λR, βR, AR) sides in w[0..5], into w[6..8] (X, u, A): where the two isentropes meet, or,
   * for a strong front, across it by the jump conditions; sampled at the
   * face (Toro 2009 §4.5). See the header.
   */
  private meet(): void {
    const w = this.w;
    const lL = w[0]!;
    const bL = w[1]!;
    const AL = w[2]!;
    const lR = w[3]!;
    const bR = w[4]!;
    const AR = w[5]!;
    const XL = (lL + bL) / (2 * AL);
    const uL = (lL - bL) * INV_2G1;
    const XR = (lR + bR) / (2 * AR);
    const uR = (lR - bR) * INV_2G1;
    // the two isentropes meet at X*, u*
    // (Math.max, not `if (X < X_MIN) X = X_MIN`: a module constant on one branch boxes X)
    let X = Math.max((lL + bR) / (AL + AR), X_MIN);
    let us = (lL - AL * X) * (1 / G1);
    // p* > FRONT_RATIO·min(pL, pR), in X (p ∝ X^PEXP)
    const strong = X > FRONT_X * (XL < XR ? XL : XR);
    let ps = 0;
    let pL = 0;
    let pR = 0;
    if (strong) {
      pL = P_REF * powP(XL);
      pR = P_REF * powP(XR);
      // a strong front: two-shock approximation (Toro 2009 §9.4.2), guess from PVRS (eq. 9.20)
      const aL = AL * XL;
      const aR = AR * XR;
      const rL = (GAMMA * pL) / (aL * aL);
      const rR = (GAMMA * pR) / (aR * aR);
      let p0 = 0.5 * (pL + pR) - 0.125 * (uR - uL) * (rL + rR) * (aL + aR);
      if (p0 < 0) p0 = 0;
      const gL = Math.sqrt(2 / ((GAMMA + 1) * rL) / (p0 + G6 * pL));
      const gR = Math.sqrt(2 / ((GAMMA + 1) * rR) / (p0 + G6 * pR));
      ps = (gL * pL + gR * pR - (uR - uL)) / (gL + gR);
      ps = Math.max(ps, P_REF * powP(X_MIN));
      us = 0.5 * (uL + uR) + 0.5 * ((ps - pR) * gR - (ps - pL) * gL);
      X = Math.pow(ps / P_REF, INV_PEXP);
    }
    // the face state, written to w[6..8] at the end
    let fX = X;
    let fu = us;
    let fA: number;
    if (us >= 0) {
      // the face sees the left gas
      fA = AL;
      const head = uL - AL * XL;
      if (strong && ps > pL) {
        // left front (Toro 2009 eqs. 4.52, 4.50): the face is ahead of it, or behind it
        const q = ps / pL;
        if (uL - AL * XL * Math.sqrt(GQ * q + GQM) >= 0) {
          fX = XL;
          fu = uL;
        } else fA = shockedEntropy(X, ps, (GAMMA * pL) / (AL * AL * XL * XL), q);
      } else {
        const tail = us - AL * X;
        if (X <= XL ? head >= 0 : head + tail >= 0) {
          fX = XL;
          fu = uL;
        } else if (X <= XL && tail > 0) {
          // sonic point inside the left fan: u = a, λL kept
          fu = lL / (1 + G1);
          fX = fu / AL;
        }
      }
    } else {
      fA = AR;
      const head = uR + AR * XR;
      if (strong && ps > pR) {
        const q = ps / pR;
        if (uR + AR * XR * Math.sqrt(GQ * q + GQM) <= 0) {
          fX = XR;
          fu = uR;
        } else fA = shockedEntropy(X, ps, (GAMMA * pR) / (AR * AR * XR * XR), q);
      } else {
        const tail = us + AR * X;
        if (X <= XR ? head <= 0 : head + tail <= 0) {
          fX = XR;
          fu = uR;
        } else if (X <= XR && tail < 0) {
          // sonic point inside the right fan: u = −a, βR kept
          const as = bR / (1 + G1);
          fu = -as;
          fX = as / AR;
        }
      }
    }
    w[6] = fX;
    w[7] = fu;
    w[8] = fA;
  }
}

/**
 * Entropy level behind a front that raises the pressure from p_K to p_s
 * (q = p_s/p_K) in gas of density ρ_K: ρ_s = ρ_K·(q + G6)/(G6·q + 1)
 * (Toro 2009 eq. 4.50), a_s = √(γ·p_s/ρ_s), A_s = a_s/X_s.
 */
function shockedEntropy(X: number, ps: number, rK: number, q: number): number {
  const rs = (rK * (q + G6)) / (G6 * q + 1);
  return Math.sqrt((GAMMA * ps) / rs) / X;
}

/**
 * The strongest two-state split the characteristics scheme is checked for
 * (header, "Range"): pressure ratios up to 1000; gas speeds up to Mach 2
 * where the pressure ratio is at most 100, and up to Mach 0.5 above that.
 */
export const CHECKED_SPLIT = { pressureRatio: 1000, mach: 2, fastRatio: 100, machAtHighRatio: 0.5 } as const;

/**
 * Why a split of `left` | `right` lies outside what the characteristics
 * scheme is checked for, in plain words, or undefined when it lies inside.
 */
export function characteristicsRangeIssue(left: GasState, right: GasState): string | undefined {
  const hi = Math.max(left.pressure, right.pressure);
  const lo = Math.min(left.pressure, right.pressure);
  const advice = 'use numerics.scheme: conservative';
  const r = hi / lo;
  const ratio = r >= 10 ? String(Math.round(r)) : r.toFixed(1);
  if (!(r <= CHECKED_SPLIT.pressureRatio)) {
    return `the characteristics scheme is checked for splits up to a pressure ratio of ${CHECKED_SPLIT.pressureRatio}, this one is ${ratio}; ${advice}`;
  }
  const ml = Math.abs(left.velocity) / soundSpeed(left.temperature);
  const mr = Math.abs(right.velocity) / soundSpeed(right.temperature);
  const m = Math.max(ml, mr);
  const side = ml >= mr ? 'left' : 'right';
  if (!(m <= CHECKED_SPLIT.mach)) {
    return `the characteristics scheme is checked for gas speeds up to Mach ${CHECKED_SPLIT.mach}, the ${side} gas moves at Mach ${m.toFixed(2)}; ${advice}`;
  }
  if (r > CHECKED_SPLIT.fastRatio && m > CHECKED_SPLIT.machAtHighRatio) {
    return `the characteristics scheme is checked for gas speeds up to Mach ${CHECKED_SPLIT.machAtHighRatio} at pressure ratios above ${CHECKED_SPLIT.fastRatio}; this split has a ratio of ${ratio} and the ${side} gas moves at Mach ${m.toFixed(2)}; ${advice}`;
  }
  return undefined;
}

/**
 * The characteristics scheme on `mesh` (see the file header). With
 * `conservative = false`, the plain, non-conservative mesh method
 * (moc-plain.ts), kept to show what conservation form fixes.
 */
export function createCharacteristicsScheme(mesh: Mesh, wall: PipeWall, conservative = true): PipeScheme {
  return conservative ? new CharacteristicsScheme(mesh, wall) : createPlainCharacteristicsScheme(mesh, wall);
}
