/**
 * Conservative finite-volume reference scheme for the runner.
 *
 * Equations (quasi-1-D Euler, per unit length of pipe):
 *   ∂U/∂t + ∂G/∂x = S
 *   U = (ρF, ρuF, EF)
 *   G = (ρuF, (ρu² + p)F, (E + p)uF)
 *   S = (0,  p·dF/dx − Φ·F,  q·F)
 * Symbols: x position along the pipe [m] (x = 0 upstream end, x = L valve
 * end); t time [s]; ρ density [kg/m³]; u velocity along +x [m/s]; p static
 * pressure [Pa]; F(x) flow area [m²]; D diameter [m]; E = ρ(e + u²/2) total
 * energy per unit volume [J/m³], e = p/((γ−1)ρ) = cv·T specific internal
 * energy [J/kg]; T = p/(ρR) temperature [K]; a = √(γp/ρ) sound speed [m/s];
 * γ, R, cp from gas.ts.
 * Wall friction (Fanning factor f = wall.friction): wall shear
 * τ = f·ρu|u|/2 [Pa], force on the gas per unit volume Φ = τ·4/D [N/m³],
 * opposing the flow. Friction does no work on the gas as a whole (the wall
 * is at rest), so it has no energy term: the kinetic energy it removes
 * reappears as internal energy (adiabatic friction keeps E, Fanno flow).
 * Wall heat transfer (Reynolds analogy): h = (f/2)·ρ|u|·cp [W/(m²·K)],
 * q = h·(Tw − T)·4/D [W/m³], Tw = wall.wallTemperature. With f = 0 the
 * analogy gives h = 0, so heat transfer needs friction; it is off when
 * wall.heatTransfer is false.
 *
 * Layout: the mesh points x_j, j = 0..n−1, are the FACES; the N = n−1 cells
 * lie between them, cell i = [x_i, x_{i+1}], width dx. So the first and last
 * faces are the pipe ends. Face areas F_j = mesh.area[j]; a cell's volume is
 * that of the cone frustum between its faces, V_i = dx·π/12·(D_i² + D_i·D_{i+1}
 * + D_{i+1}²), and Fc_i = V_i/dx is its mean area, so ρF̄_i = ρ_i·Fc_i and the
 * pipe mass is Σ ρF̄_i·dx exactly for a uniform gas.
 *
 * Scheme: MUSCL–Hancock (Toro 2009 §14.4) on the primitive variables
 * W = (ρ, u, p): van Leer limited slopes Δ_i, face values W_i ∓ Δ_i/2 evolved
 * by half a step with the quasi-linear primitive equations
 *   ρ_t + uρ_x + ρu_x = −ρu·(ln F)_x
 *   u_t + uu_x + p_x/ρ = −Φ/ρ
 *   p_t + up_x + γp·u_x = −γpu·(ln F)_x + (γ−1)(q + Φu)
 * then the HLLC flux (Toro 2009 §10.4, pressure-based wave speeds, §10.5.2)
 * at each interior face, times the face area. The area source is integrated
 * as p̄_i·(F_{i+1} − F_i)/dx with p̄_i the mean of the two evolved face
 * pressures of cell i; friction and heat sources are taken at the evolved
 * cell state. Gas at rest with uniform pressure makes the HLLC momentum flux
 * exactly p·F_j at every face and p̄_i = p, so the pressure–area terms cancel
 * (well-balanced: a tapered pipe at rest stays at rest).
 *
 * Ends (boundary/types.ts conventions, outward velocity w): `incoming` gives
 * the boundary the state of the end cell extrapolated to the end face and
 * evolved to t + dt/2 (the Hancock step of that cell — the second-order
 * equivalent of tracing the characteristic foot): J = a + (γ−1)/2·w,
 * lambda = J/Ap, entropy Ap = a·(P_REF/p)^((γ−1)/(2γ)). `step` builds the end
 * face flux from the EndState the boundary returned:
 *   mass  = ∓ massFlow,  momentum = massFlow·w + p·F_end,  energy = ∓ enthalpyFlow
 * (upper sign left end, lower sign right end; x-directed fluxes), so the mass
 * and energy leaving the pipe are exactly what the boundary reports. A closed
 * end (massFlow 0, enthalpyFlow 0) is a wall carrying the end-state pressure.
 * The end face state of the last step (p, u, and ρ from p and the end-state
 * entropy level) is what `sample` reports at x = 0 and x = L, and serves as
 * the ghost value (2·W_face − W_end) for the end cells' slope limiter.
 *
 * `incoming` and `step` allocate nothing: all work arrays are preallocated.
 */
import type { EndState, Incoming } from '../boundary/types.js';
import { CP, G1, GAMMA, P_REF, PEXP, R_AIR } from '../gas.js';
import type { Mesh } from './mesh.js';
import type { GasState, PipeScheme, PipeWall, Side } from './scheme.js';

const GM1 = GAMMA - 1;
/** (γ+1)/(2γ), pressure-based wave-speed estimate (Toro 2009 eq. 10.61) */
const GQ = (GAMMA + 1) / (2 * GAMMA);

/** van Leer's harmonic slope limiter */
function vanLeer(dl: number, dr: number): number {
  const prod = dl * dr;
  return prod > 0 ? (2 * prod) / (dl + dr) : 0;
}

export class ConservativeScheme implements PipeScheme {
  readonly name = 'conservative' as const;
  readonly mesh: Mesh;
  /** number of cells (n − 1) */
  readonly cells: number;

  private readonly dx: number;
  private readonly friction: number;
  private readonly heat: boolean;
  private readonly wallT: number;
  /** face areas F_j, j = 0..N [m²] */
  private readonly Ff: Float64Array;
  /** cell mean areas V_i/dx [m²] */
  private readonly Fc: Float64Array;
  /** cell mean diameters √(4·Fc/π) [m] */
  private readonly Dc: Float64Array;
  /** (ln F)_x of each cell = (F_{i+1} − F_i)/(dx·Fc_i) [1/m] */
  private readonly dlnF: Float64Array;

  // conserved variables per unit length, cell averages
  private readonly m: Float64Array; // ρF [kg/m]
  private readonly mo: Float64Array; // ρuF [kg/s]
  private readonly en: Float64Array; // EF [J/m]
  // primitives of the cells
  private readonly r: Float64Array;
  private readonly u: Float64Array;
  private readonly p: Float64Array;
  // evolved (t + dt/2) left- and right-face values of each cell
  private readonly rL: Float64Array;
  private readonly uL: Float64Array;
  private readonly pL: Float64Array;
  private readonly rR: Float64Array;
  private readonly uR: Float64Array;
  private readonly pR: Float64Array;
  // x-directed face fluxes (already times the face area), faces 0..N
  private readonly g0: Float64Array;
  private readonly g1: Float64Array;
  private readonly g2: Float64Array;
  // end face states [left, right]: density, x-velocity, pressure
  private readonly faceR = new Float64Array(2);
  private readonly faceU = new Float64Array(2);
  private readonly faceP = new Float64Array(2);
  /** largest |u| + a over the cells, kept by updatePrimitives [m/s] */
  private waveSpeed = 0; // 0 until the first state is set
  // HLLC result per unit area
  private h0 = 0;
  private h1 = 0;
  private h2 = 0;

  constructor(mesh: Mesh, wall: PipeWall) {
    if (mesh.n < 2) throw new Error('conservative scheme needs at least two mesh points');
    this.mesh = mesh;
    const N = mesh.n - 1;
    this.cells = N;
    this.dx = mesh.dx;
    this.friction = wall.friction > 0 ? wall.friction : 0;
    this.heat = wall.heatTransfer && this.friction > 0;
    this.wallT = wall.wallTemperature;
    this.Ff = Float64Array.from(mesh.area);
    this.Fc = new Float64Array(N);
    this.Dc = new Float64Array(N);
    this.dlnF = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      const d0 = mesh.diameter[i]!;
      const d1 = mesh.diameter[i + 1]!;
      const fc = (Math.PI / 12) * (d0 * d0 + d0 * d1 + d1 * d1);
      this.Fc[i] = fc;
      this.Dc[i] = Math.sqrt((4 * fc) / Math.PI);
      this.dlnF[i] = (this.Ff[i + 1]! - this.Ff[i]!) / (this.dx * fc);
    }
    this.m = new Float64Array(N);
    this.mo = new Float64Array(N);
    this.en = new Float64Array(N);
    this.r = new Float64Array(N);
    this.u = new Float64Array(N);
    this.p = new Float64Array(N);
    this.rL = new Float64Array(N);
    this.uL = new Float64Array(N);
    this.pL = new Float64Array(N);
    this.rR = new Float64Array(N);
    this.uR = new Float64Array(N);
    this.pR = new Float64Array(N);
    this.g0 = new Float64Array(N + 1);
    this.g1 = new Float64Array(N + 1);
    this.g2 = new Float64Array(N + 1);
    this.fill(P_REF, 0, 293.15);
  }

  maxStableDt(courant: number): number {
    const smax = this.waveSpeed;
    return smax > 0 ? (courant * this.dx) / smax : Infinity;
  }

  incoming(side: Side, dt: number, out: Incoming): void {
    let rho: number;
    let w: number;
    let pe: number;
    if (side === 'left') {
      this.predictCell(0, dt);
      rho = this.rL[0]!;
      w = -this.uL[0]!;
      pe = this.pL[0]!;
      out.area = this.Ff[0]!;
    } else {
      const i = this.cells - 1;
      this.predictCell(i, dt);
      rho = this.rR[i]!;
      w = this.uR[i]!;
      pe = this.pR[i]!;
      out.area = this.Ff[this.cells]!;
    }
    const a = Math.sqrt((GAMMA * pe) / rho);
    const Ap = a * Math.pow(P_REF / pe, 1 / PEXP);
    out.entropy = Ap;
    out.lambda = (a + G1 * w) / Ap;
  }

  step(dt: number, left: EndState, right: EndState): void {
    const N = this.cells;
    const { Ff, Fc, m, mo, en, rL, uL, pL, rR, uR, pR, g0, g1, g2 } = this;
    for (let i = 0; i < N; i++) this.predictCell(i, dt);

    // interior faces
    for (let j = 1; j < N; j++) {
      this.hllc(j);
      const F = Ff[j]!;
      g0[j] = this.h0 * F;
      g1[j] = this.h1 * F;
      g2[j] = this.h2 * F;
    }
    // end faces from the boundaries' end states (outward → x-directed)
    g0[0] = -left.massFlow;
    g1[0] = left.massFlow * left.velocity + left.pressure * Ff[0]!;
    g2[0] = -left.enthalpyFlow;
    g0[N] = right.massFlow;
    g1[N] = right.massFlow * right.velocity + right.pressure * Ff[N]!;
    g2[N] = right.enthalpyFlow;

    const k = dt / this.dx;
    const fr = this.friction;
    for (let i = 0; i < N; i++) {
      // evolved cell-centre state (t + dt/2)
      const ph = 0.5 * (pL[i]! + pR[i]!);
      const fA = Ff[i]!;
      const fB = Ff[i + 1]!;
      m[i] = m[i]! - k * (g0[i + 1]! - g0[i]!);
      // the pressure–area source grouped with the flux so that rest is kept exactly
      mo[i] = mo[i]! - k * (g1[i + 1]! - ph * fB - (g1[i]! - ph * fA));
      en[i] = en[i]! - k * (g2[i + 1]! - g2[i]!);
      if (fr > 0) {
        const rh = 0.5 * (rL[i]! + rR[i]!);
        const uh = 0.5 * (uL[i]! + uR[i]!);
        const au = Math.abs(uh);
        const D = this.Dc[i]!;
        const F = Fc[i]!;
        // Φ = τ·4/D, τ = f·ρu|u|/2
        mo[i] = mo[i]! - dt * ((2 * fr * rh * uh * au) / D) * F;
        if (this.heat) {
          const Th = ph / (rh * R_AIR);
          const h = 0.5 * fr * rh * au * CP;
          en[i] = en[i]! + dt * ((h * (this.wallT - Th) * 4) / D) * F;
        }
      }
    }

    // end face states for sampling and the next step's ghost values
    this.setFace(0, left.pressure, -left.velocity, left.entropy);
    this.setFace(1, right.pressure, right.velocity, right.entropy);
    this.updatePrimitives();
  }

  mass(): number {
    let s = 0;
    for (let i = 0; i < this.cells; i++) s += this.m[i]!;
    return s * this.dx;
  }

  /** total energy of the gas in the pipe [J] */
  energy(): number {
    let s = 0;
    for (let i = 0; i < this.cells; i++) s += this.en[i]!;
    return s * this.dx;
  }

  /** total x-momentum of the gas in the pipe [kg·m/s] */
  momentum(): number {
    let s = 0;
    for (let i = 0; i < this.cells; i++) s += this.mo[i]!;
    return s * this.dx;
  }

  sample(p: Float64Array, u: Float64Array, T: Float64Array): void {
    const N = this.cells;
    const r = this.r;
    for (let j = 1; j < N; j++) {
      const pa = this.p[j - 1]!;
      const pb = this.p[j]!;
      p[j] = 0.5 * (pa + pb);
      u[j] = 0.5 * (this.u[j - 1]! + this.u[j]!);
      T[j] = (0.5 * (pa / r[j - 1]! + pb / r[j]!)) / R_AIR;
    }
    p[0] = this.faceP[0]!;
    u[0] = this.faceU[0]!;
    T[0] = this.faceP[0]! / (this.faceR[0]! * R_AIR);
    p[N] = this.faceP[1]!;
    u[N] = this.faceU[1]!;
    T[N] = this.faceP[1]! / (this.faceR[1]! * R_AIR);
  }

  healthy(): boolean {
    for (let i = 0; i < this.cells; i++) {
      const r = this.r[i]!;
      const p = this.p[i]!;
      if (!(r > 0 && p > 0 && Number.isFinite(r) && Number.isFinite(p) && Number.isFinite(this.u[i]!))) {
        return false;
      }
    }
    return true;
  }

  fill(pressure: number, velocity: number, temperature: number): void {
    const rho = pressure / (R_AIR * temperature);
    for (let i = 0; i < this.cells; i++) this.setCell(i, rho, velocity, pressure);
    for (let s = 0; s < 2; s++) {
      this.faceR[s] = rho;
      this.faceU[s] = velocity;
      this.faceP[s] = pressure;
    }
    this.updatePrimitives();
  }

  /**
   * State per mesh point; a cell takes the mean of its two face points
   * (ρ from p and T, u, p), and the end points become the end face states.
   */
  setState(p: ArrayLike<number>, u: ArrayLike<number>, T: ArrayLike<number>): void {
    const N = this.cells;
    let ra = p[0]! / (R_AIR * T[0]!);
    for (let i = 0; i < N; i++) {
      const rb = p[i + 1]! / (R_AIR * T[i + 1]!);
      this.setCell(i, 0.5 * (ra + rb), 0.5 * (u[i]! + u[i + 1]!), 0.5 * (p[i]! + p[i + 1]!));
      ra = rb;
    }
    this.faceR[0] = p[0]! / (R_AIR * T[0]!);
    this.faceU[0] = u[0]!;
    this.faceP[0] = p[0]!;
    this.faceR[1] = p[N]! / (R_AIR * T[N]!);
    this.faceU[1] = u[N]!;
    this.faceP[1] = p[N]!;
    this.updatePrimitives();
  }

  /**
   * `left` for x < xSplit, `right` beyond. The cell the split cuts holds each
   * side's share (by length, exact for one diameter) of mass, momentum and
   * energy, so the gas left of the split is exactly ρ_left·F·xSplit (a cell
   * given the mean of its two end points would put the split at its centre,
   * up to half a cell away).
   */
  setSplit(xSplit: number, left: GasState, right: GasState): void {
    const N = this.cells;
    const dx = this.dx;
    const rl = left.pressure / (R_AIR * left.temperature);
    const rr = right.pressure / (R_AIR * right.temperature);
    const el = left.pressure / GM1 + 0.5 * rl * left.velocity * left.velocity;
    const er = right.pressure / GM1 + 0.5 * rr * right.velocity * right.velocity;
    for (let i = 0; i < N; i++) {
      let w = (xSplit - i * dx) / dx;
      w = w < 0 ? 0 : w > 1 ? 1 : w;
      const F = this.Fc[i]!;
      this.m[i] = (w * rl + (1 - w) * rr) * F;
      this.mo[i] = (w * rl * left.velocity + (1 - w) * rr * right.velocity) * F;
      this.en[i] = (w * el + (1 - w) * er) * F;
    }
    const s0 = xSplit > 0 ? left : right;
    const s1 = xSplit < this.mesh.length ? right : left;
    this.faceR[0] = s0.pressure / (R_AIR * s0.temperature);
    this.faceU[0] = s0.velocity;
    this.faceP[0] = s0.pressure;
    this.faceR[1] = s1.pressure / (R_AIR * s1.temperature);
    this.faceU[1] = s1.velocity;
    this.faceP[1] = s1.pressure;
    this.updatePrimitives();
  }

  /**
   * Set cell averages directly (test and warm-start helper): ρ [kg/m³],
   * u [m/s], p [Pa] per cell, N = n − 1 values each. End face states are
   * taken from the end cells.
   */
  setCells(rho: ArrayLike<number>, u: ArrayLike<number>, p: ArrayLike<number>): void {
    const N = this.cells;
    for (let i = 0; i < N; i++) this.setCell(i, rho[i]!, u[i]!, p[i]!);
    this.faceR[0] = rho[0]!;
    this.faceU[0] = u[0]!;
    this.faceP[0] = p[0]!;
    this.faceR[1] = rho[N - 1]!;
    this.faceU[1] = u[N - 1]!;
    this.faceP[1] = p[N - 1]!;
    this.updatePrimitives();
  }

  /** cell primitives (copies) — for tests and diagnostics */
  cellState(): { rho: Float64Array; u: Float64Array; p: Float64Array } {
    return { rho: this.r.slice(), u: this.u.slice(), p: this.p.slice() };
  }

  // ---------------------------------------------------------------------

  private setCell(i: number, rho: number, u: number, p: number): void {
    const F = this.Fc[i]!;
    this.m[i] = rho * F;
    this.mo[i] = rho * u * F;
    this.en[i] = (p / GM1 + 0.5 * rho * u * u) * F;
  }

  private setFace(s: number, pressure: number, xVelocity: number, entropy: number): void {
    this.faceP[s] = pressure;
    this.faceU[s] = xVelocity;
    if (entropy > 0 && pressure > 0) {
      // a from p and the entropy level; ρ = γp/a²
      const a = entropy * Math.pow(pressure / P_REF, 1 / PEXP);
      this.faceR[s] = (GAMMA * pressure) / (a * a);
    } else {
      this.faceR[s] = s === 0 ? this.r[0]! : this.r[this.cells - 1]!;
    }
  }

  /** primitives from the conserved variables, and the largest wave speed |u| + a for the next CFL step */
  private updatePrimitives(): void {
    let smax = 0;
    for (let i = 0; i < this.cells; i++) {
      const F = this.Fc[i]!;
      const rho = this.m[i]! / F;
      const u = this.mo[i]! / this.m[i]!;
      const p = GM1 * (this.en[i]! / F - 0.5 * rho * u * u);
      this.r[i] = rho;
      this.u[i] = u;
      this.p[i] = p;
      const sp = Math.abs(u) + Math.sqrt((GAMMA * p) / rho);
      if (sp > smax) smax = sp;
    }
    this.waveSpeed = smax;
  }

  /**
   * MUSCL–Hancock predictor of cell i: limited slopes, face values, and
   * their evolution by dt/2 (into rL..pR). Falls back to zero slopes when
   * an evolved face value would not be positive.
   */
  private predictCell(i: number, dt: number): void {
    const N = this.cells;
    const r = this.r[i]!;
    const u = this.u[i]!;
    const p = this.p[i]!;
    // neighbours, or ghosts 2·W_face − W from the last end face states
    let rm: number, um: number, pm: number, rp: number, up: number, pp: number;
    if (i > 0) {
      rm = this.r[i - 1]!;
      um = this.u[i - 1]!;
      pm = this.p[i - 1]!;
    } else {
      rm = 2 * this.faceR[0]! - r;
      um = 2 * this.faceU[0]! - u;
      pm = 2 * this.faceP[0]! - p;
    }
    if (i < N - 1) {
      rp = this.r[i + 1]!;
      up = this.u[i + 1]!;
      pp = this.p[i + 1]!;
    } else {
      rp = 2 * this.faceR[1]! - r;
      up = 2 * this.faceU[1]! - u;
      pp = 2 * this.faceP[1]! - p;
    }
    let dr = vanLeer(r - rm, rp - r);
    let du = vanLeer(u - um, up - u);
    let dp = vanLeer(p - pm, pp - p);

    // half-step sources at the cell state
    const h = 0.5 * dt;
    const k = this.dlnF[i]!;
    let sr = -r * u * k;
    let su = 0;
    let sp = -GAMMA * p * u * k;
    if (this.friction > 0) {
      const au = Math.abs(u);
      const D = this.Dc[i]!;
      const phi = (2 * this.friction * r * u * au) / D;
      su = -phi / r;
      let q = 0;
      if (this.heat) {
        q = (0.5 * this.friction * r * au * CP * (this.wallT - p / (r * R_AIR)) * 4) / D;
      }
      sp += GM1 * (q + phi * u);
    }
    sr *= h;
    su *= h;
    sp *= h;

    const c = (0.5 * dt) / this.dx;
    for (let pass = 0; pass < 2; pass++) {
      // δ = −(dt/2dx)·A(W)·Δ + (dt/2)·S(W), the same for both faces
      const er = -c * (u * dr + r * du) + sr;
      const eu = -c * (u * du + dp / r) + su;
      const ep = -c * (GAMMA * p * du + u * dp) + sp;
      const rl = r - 0.5 * dr + er;
      const rrr = r + 0.5 * dr + er;
      const pl = p - 0.5 * dp + ep;
      const prr = p + 0.5 * dp + ep;
      if ((rl > 0 && rrr > 0 && pl > 0 && prr > 0) || pass === 1) {
        this.rL[i] = rl;
        this.rR[i] = rrr;
        this.uL[i] = u - 0.5 * du + eu;
        this.uR[i] = u + 0.5 * du + eu;
        this.pL[i] = pl;
        this.pR[i] = prr;
        return;
      }
      dr = 0;
      du = 0;
      dp = 0;
    }
  }

  /**
   * HLLC flux per unit area (Toro 2009 §10.4) at interior face j, between the
   * right face value of cell j−1 and the left face value of cell j, into
   * h0, h1, h2. It takes the face index, not the six states, so a call that
   * is not inlined boxes no doubles (no allocation per face).
   */
  private hllc(j: number): void {
    const rl = this.rR[j - 1]!;
    const ul = this.uR[j - 1]!;
    const pl = this.pR[j - 1]!;
    const rr = this.rL[j]!;
    const ur = this.uL[j]!;
    const pr = this.pL[j]!;
    const al = Math.sqrt((GAMMA * pl) / rl);
    const ar = Math.sqrt((GAMMA * pr) / rr);
    // pressure-based wave speeds (Toro 2009 eqs. 10.59–10.62)
    const ppv = 0.5 * (pl + pr) - 0.125 * (ur - ul) * (rl + rr) * (al + ar);
    const ps = ppv > 0 ? ppv : 0;
    const ql = ps <= pl ? 1 : Math.sqrt(1 + GQ * (ps / pl - 1));
    const qr = ps <= pr ? 1 : Math.sqrt(1 + GQ * (ps / pr - 1));
    const sl = ul - al * ql;
    const sr = ur + ar * qr;
    const El = pl / GM1 + 0.5 * rl * ul * ul;
    const Er = pr / GM1 + 0.5 * rr * ur * ur;
    if (sl >= 0) {
      this.h0 = rl * ul;
      this.h1 = rl * ul * ul + pl;
      this.h2 = (El + pl) * ul;
      return;
    }
    if (sr <= 0) {
      this.h0 = rr * ur;
      this.h1 = rr * ur * ur + pr;
      this.h2 = (Er + pr) * ur;
      return;
    }
    const ml = rl * (sl - ul);
    const mr = rr * (sr - ur);
    const ss = (pr - pl + ul * ml - ur * mr) / (ml - mr);
    if (ss >= 0) {
      // F*L = FL + SL·(U*L − UL), U*L from Toro eq. 10.39
      const c = (sl - ul) / (sl - ss);
      const u0 = rl * c;
      const u1 = u0 * ss;
      const u2 = c * (El + (ss - ul) * (rl * ss + pl / (sl - ul)));
      this.h0 = rl * ul + sl * (u0 - rl);
      this.h1 = rl * ul * ul + pl + sl * (u1 - rl * ul);
      this.h2 = (El + pl) * ul + sl * (u2 - El);
    } else {
      const c = (sr - ur) / (sr - ss);
      const u0 = rr * c;
      const u1 = u0 * ss;
      const u2 = c * (Er + (ss - ur) * (rr * ss + pr / (sr - ur)));
      this.h0 = rr * ur + sr * (u0 - rr);
      this.h1 = rr * ur * ur + pr + sr * (u1 - rr * ur);
      this.h2 = (Er + pr) * ur + sr * (u2 - Er);
    }
  }
}

/** The conservative finite-volume scheme on `mesh` (see the file header). */
export function createConservativeScheme(mesh: Mesh, wall: PipeWall): ConservativeScheme {
  return new ConservativeScheme(mesh, wall);
}
