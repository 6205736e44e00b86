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
 * then the HLLC flux (Toro 2009 §10.4, pressure-based wave speeds, §10.5.2,
 * with the cells' sound speeds)
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
 * entropy level) is what `sample` reports at x = 0 and x = L. It belongs to
 * the middle of that step; carried on to the start of the next step along
 * its trend over the last two steps (linear in time) it gives the ghost value
 * (2·W_face − W_end) for the end cells' slope limiter. (Used as it was, half a
 * step old, it made the end cells' slopes wrong by O(1) in smooth flow and
 * the ends first order.)
 *
 * Work per step, in two passes over the cells: (1) limited slopes and the
 * Hancock predictor of every cell (the end cells' already done by
 * `incoming`, not repeated; one division serves the three van Leer slopes
 * and 1/ρ); (2) one pass over the faces, in which the HLLC flux of face j
 * completes cell j − 1, which is updated at once together with its
 * primitives, its sound speed and the CFL speed. The HLLC wave-speed
 * estimates take the cached sound speeds of the two cells beside the face
 * rather than those of the evolved face values (they differ by O(dx); the
 * estimates need bounds, not exact speeds), so a face costs no square root
 * unless a shock factor is needed.
 *
 * `incoming` and `step` allocate nothing: all work arrays are preallocated.
 */
import type { EndState, Incoming } from '../boundary/types.js';
import { CP, G1, GAMMA, P_REF, PEXP, R_AIR } from '../gas.js';
import type { Mesh } from './mesh.js';
import type { GasState, PipeScheme, PipeWall, Side } from './scheme.js';

const GM1 = GAMMA - 1;
/** 1/(γ−1) */
const IGM1 = 1 / GM1;
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
  // primitives of the cells, and their sound speeds (kept by updatePrimitives)
  private readonly r: Float64Array;
  private readonly u: Float64Array;
  private readonly p: Float64Array;
  private readonly a: Float64Array;
  /** 1/Fc_i [1/m²] */
  private readonly iFc: Float64Array;
  /** 1/Dc_i [1/m] */
  private readonly iDc: Float64Array;
  /** dt of the end cells' predictor already done by `incoming` (per side), 0 = not done */
  private readonly endDt = new Float64Array(2);
  // evolved (t + dt/2) left- and right-face values of each cell
  private readonly rL: Float64Array;
  private readonly uL: Float64Array;
  private readonly pL: Float64Array;
  private readonly rR: Float64Array;
  private readonly uR: Float64Array;
  private readonly pR: Float64Array;
  // end face states [left, right]: density, x-velocity, pressure
  private readonly faceR = new Float64Array(2);
  private readonly faceU = new Float64Array(2);
  private readonly faceP = new Float64Array(2);
  // the end face states carried to the start of the next step (ghost values), see endGhosts
  private readonly ghostR = new Float64Array(2);
  private readonly ghostU = new Float64Array(2);
  private readonly ghostP = new Float64Array(2);
  /** length of the last step [s]; 0 after a state was set (no trend of the end states yet) */
  private dtLast = 0;
  /** largest |u| + a over the cells, kept by updatePrimitives [m/s] */
  private waveSpeed = 0; // 0 until the first state is set

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
    this.iFc = new Float64Array(N);
    this.iDc = new Float64Array(N);
    this.dlnF = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      const d0 = mesh.diameter[i]!;
      const d1 = mesh.diameter[i + 1]!;
      const fc = (Math.PI / 12) * (d0 * d0 + d0 * d1 + d1 * d1);
      this.Fc[i] = fc;
      this.Dc[i] = Math.sqrt((4 * fc) / Math.PI);
      this.iFc[i] = 1 / fc;
      this.iDc[i] = 1 / this.Dc[i]!;
      this.dlnF[i] = (this.Ff[i + 1]! - this.Ff[i]!) / (this.dx * fc);
    }
    this.m = new Float64Array(N);
    this.mo = new Float64Array(N);
    this.en = new Float64Array(N);
    this.r = new Float64Array(N);
    this.u = new Float64Array(N);
    this.p = new Float64Array(N);
    this.a = new Float64Array(N);
    this.rL = new Float64Array(N);
    this.uL = new Float64Array(N);
    this.pL = new Float64Array(N);
    this.rR = new Float64Array(N);
    this.uR = new Float64Array(N);
    this.pR = new Float64Array(N);
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
      this.endDt[0] = dt;
      rho = this.rL[0]!;
      w = -this.uL[0]!;
      pe = this.pL[0]!;
      out.area = this.Ff[0]!;
    } else {
      const i = this.cells - 1;
      this.predictCell(i, dt);
      this.endDt[1] = dt;
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
    const { Ff, Fc, m, mo, en, rL, uL, pL, rR, uR, pR } = this;
    // the end cells' predictor was done by `incoming` for this dt (the same numbers); the rest in one pass
    if (this.endDt[0] !== dt) this.predictCell(0, dt);
    if (N > 1 && this.endDt[1] !== dt) this.predictCell(N - 1, dt);
    this.endDt[0] = 0;
    this.endDt[1] = 0;
    this.predictInterior(dt);

    // end face states for sampling and the next step's ghost values
    const rl0 = this.faceR[0]!;
    const ul0 = this.faceU[0]!;
    const pl0 = this.faceP[0]!;
    const rr0 = this.faceR[1]!;
    const ur0 = this.faceU[1]!;
    const pr0 = this.faceP[1]!;
    this.setFace(0, left.pressure, -left.velocity, left.entropy);
    this.setFace(1, right.pressure, right.velocity, right.entropy);
    if (this.dtLast > 0) {
      // the end states belong to mid-step: carry them on to the start of the
      // next step along their trend over the last two steps
      const w = dt / (this.dtLast + dt);
      this.ghostR[0] = this.faceR[0]! + w * (this.faceR[0]! - rl0);
      this.ghostU[0] = this.faceU[0]! + w * (this.faceU[0]! - ul0);
      this.ghostP[0] = this.faceP[0]! + w * (this.faceP[0]! - pl0);
      this.ghostR[1] = this.faceR[1]! + w * (this.faceR[1]! - rr0);
      this.ghostU[1] = this.faceU[1]! + w * (this.faceU[1]! - ur0);
      this.ghostP[1] = this.faceP[1]! + w * (this.faceP[1]! - pr0);
    } else this.holdGhosts();
    this.dtLast = dt;

    // one pass over the faces: the flux of face j completes cell j − 1, which
    // is updated at once (conserved variables, primitives, sound speed, CFL
    // speed). Face j reads the cached sound speeds of cells j − 1 and j before
    // cell j − 1 is updated.
    const k = dt / this.dx;
    const fr = this.friction;
    const heat = this.heat;
    const wallT = this.wallT;
    const { iFc, iDc, r, u, p, a } = this;
    // face 0 from the left boundary's end state (outward → x-directed)
    let f0 = -left.massFlow;
    let f1 = left.massFlow * left.velocity + left.pressure * Ff[0]!;
    let f2 = -left.enthalpyFlow;
    let smax = 0;
    for (let j = 1; j <= N; j++) {
      let n0: number, n1: number, n2: number;
      if (j < N) {
        // HLLC flux per unit area (Toro 2009 §10.4) between the right face
        // value of cell j − 1 and the left face value of cell j
        let h0 = 0;
        let h1 = 0;
        let h2 = 0;
        face: {
          const rl = rR[j - 1]!;
          const ul = uR[j - 1]!;
          const pl = pR[j - 1]!;
          const rr = rL[j]!;
          const ur = uL[j]!;
          const pr = pL[j]!;
          // sound speeds for the wave-speed estimates: those of the two cells (cached
          // by updatePrimitives; the evolved face values differ by O(dx), and the
          // estimates need bounds, not exact speeds — Toro 2009 §10.5)
          const al = a[j - 1]!;
          const ar = a[j]!;
          // pressure-based wave speeds (Toro 2009 eqs. 10.59–10.62)
          const ppv = 0.5 * (pl + pr) - 0.125 * (ur - ul) * (rl + rr) * (al + ar);
          const ps = ppv > 0 ? ppv : 0;
          const ql = ps <= pl ? 1 : Math.sqrt(1 + GQ * (ps / pl - 1));
          const qr = ps <= pr ? 1 : Math.sqrt(1 + GQ * (ps / pr - 1));
          const sl = ul - al * ql;
          const sr = ur + ar * qr;
          if (sl >= 0) {
            const El = pl * IGM1 + 0.5 * rl * ul * ul;
            h0 = rl * ul;
            h1 = rl * ul * ul + pl;
            h2 = (El + pl) * ul;
            break face;
          }
          if (sr <= 0) {
            const Er = pr * IGM1 + 0.5 * rr * ur * ur;
            h0 = rr * ur;
            h1 = rr * ur * ur + pr;
            h2 = (Er + pr) * ur;
            break face;
          }
          const ml = rl * (sl - ul);
          const mr = rr * (sr - ur);
          const ss = (pr - pl + ul * ml - ur * mr) / (ml - mr);
          if (ss >= 0) {
            // F*L = FL + SL·(U*L − UL), U*L from Toro eq. 10.39, with c·pL/(SL − uL) = pL/(SL − S*)
            const El = pl * IGM1 + 0.5 * rl * ul * ul;
            const is = 1 / (sl - ss);
            const c = (sl - ul) * is;
            const u0 = rl * c;
            const u1 = u0 * ss;
            const u2 = c * El + (ss - ul) * (u0 * ss + pl * is);
            h0 = rl * ul + sl * (u0 - rl);
            h1 = rl * ul * ul + pl + sl * (u1 - rl * ul);
            h2 = (El + pl) * ul + sl * (u2 - El);
          } else {
            const Er = pr * IGM1 + 0.5 * rr * ur * ur;
            const is = 1 / (sr - ss);
            const c = (sr - ur) * is;
            const u0 = rr * c;
            const u1 = u0 * ss;
            const u2 = c * Er + (ss - ur) * (u0 * ss + pr * is);
            h0 = rr * ur + sr * (u0 - rr);
            h1 = rr * ur * ur + pr + sr * (u1 - rr * ur);
            h2 = (Er + pr) * ur + sr * (u2 - Er);
          }
        }
        const F = Ff[j]!;
        n0 = h0 * F;
        n1 = h1 * F;
        n2 = h2 * F;
      } else {
        n0 = right.massFlow;
        n1 = right.massFlow * right.velocity + right.pressure * Ff[N]!;
        n2 = right.enthalpyFlow;
      }
      const i = j - 1;
      // evolved cell-centre pressure (t + dt/2)
      const ph = 0.5 * (pL[i]! + pR[i]!);
      const mi = m[i]! - k * (n0 - f0);
      // the pressure–area source grouped with the flux so that rest is kept exactly
      let moi = mo[i]! - k * (n1 - ph * Ff[j]! - (f1 - ph * Ff[i]!));
      let eni = en[i]! - k * (n2 - f2);
      if (fr > 0) {
        const rh = 0.5 * (rL[i]! + rR[i]!);
        const uh = 0.5 * (uL[i]! + uR[i]!);
        const au = Math.abs(uh);
        const iD = iDc[i]!;
        const F = Fc[i]!;
        // Φ = τ·4/D, τ = f·ρu|u|/2
        moi -= dt * (2 * fr * rh * uh * au * iD) * F;
        if (heat) {
          const Th = ph / (rh * R_AIR);
          const hc = 0.5 * fr * rh * au * CP;
          eni += dt * (hc * (wallT - Th) * 4 * iD) * F;
        }
      }
      m[i] = mi;
      mo[i] = moi;
      en[i] = eni;
      // primitives (as updatePrimitives)
      const im = 1 / mi;
      const rho = mi * iFc[i]!;
      const ui = moi * im;
      const pi = GM1 * (eni * iFc[i]! - 0.5 * rho * ui * ui);
      r[i] = rho;
      u[i] = ui;
      p[i] = pi;
      const ai = Math.sqrt(GAMMA * pi * Fc[i]! * im);
      a[i] = ai;
      const sp = Math.abs(ui) + ai;
      if (sp > smax) smax = sp;
      f0 = n0;
      f1 = n1;
      f2 = n2;
    }
    this.waveSpeed = smax;
  }

  /** ghost values = the present end face states, no trend (after a state was set) */
  private holdGhosts(): void {
    this.endDt[0] = 0;
    this.endDt[1] = 0;
    for (let s = 0; s < 2; s++) {
      this.ghostR[s] = this.faceR[s]!;
      this.ghostU[s] = this.faceU[s]!;
      this.ghostP[s] = this.faceP[s]!;
    }
    this.dtLast = 0;
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
    this.holdGhosts();
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
    this.holdGhosts();
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
    this.holdGhosts();
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
    this.holdGhosts();
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
    this.en[i] = (p * IGM1 + 0.5 * rho * u * u) * F;
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

  /** primitives from the conserved variables, their sound speeds, and the largest wave speed |u| + a for the next CFL step */
  private updatePrimitives(): void {
    let smax = 0;
    const { m, mo, en, iFc, Fc, r, u, p, a } = this;
    for (let i = 0; i < this.cells; i++) {
      const mi = m[i]!;
      const im = 1 / mi;
      const rho = mi * iFc[i]!;
      const ui = mo[i]! * im;
      const pi = GM1 * (en[i]! * iFc[i]! - 0.5 * rho * ui * ui);
      r[i] = rho;
      u[i] = ui;
      p[i] = pi;
      // a = √(γp/ρ), 1/ρ = Fc/m
      const ai = Math.sqrt(GAMMA * pi * Fc[i]! * im);
      a[i] = ai;
      const sp = Math.abs(ui) + ai;
      if (sp > smax) smax = sp;
    }
    this.waveSpeed = smax;
  }

  /**
   * The MUSCL–Hancock predictor of the interior cells 1..N−2 in one pass
   * (the same arithmetic as predictCell, with the neighbours read directly).
   */
  private predictInterior(dt: number): void {
    const N = this.cells;
    const { r, u, p, dlnF, iDc, rL, uL, pL, rR, uR, pR } = this;
    const h = 0.5 * dt;
    const c = (0.5 * dt) / this.dx;
    const fr = this.friction;
    const heat = this.heat;
    const wallT = this.wallT;
    for (let i = 1; i < N - 1; i++) {
      const ri = r[i]!;
      const ui = u[i]!;
      const pi = p[i]!;
      // van Leer slopes 2·a·b/(a + b) of ρ, u, p with one division for the three
      const ar = ri - r[i - 1]!;
      const br = r[i + 1]! - ri;
      const au0 = ui - u[i - 1]!;
      const bu = u[i + 1]! - ui;
      const ap = pi - p[i - 1]!;
      const bp = p[i + 1]! - pi;
      const qr = ar * br;
      const qu = au0 * bu;
      const qp = ap * bp;
      const sr0 = qr > 0 ? ar + br : 1;
      const su0 = qu > 0 ? au0 + bu : 1;
      const sp0 = qp > 0 ? ap + bp : 1;
      // 1/ρ rides on the same division
      const inv = 1 / (sr0 * su0 * sp0 * ri);
      const ir = sr0 * su0 * sp0 * inv;
      let dr = qr > 0 ? 2 * qr * su0 * sp0 * ri * inv : 0;
      let du = qu > 0 ? 2 * qu * sr0 * sp0 * ri * inv : 0;
      let dp = qp > 0 ? 2 * qp * sr0 * su0 * ri * inv : 0;
      const k = dlnF[i]!;
      let sr = -ri * ui * k;
      let su = 0;
      let sp = -GAMMA * pi * ui * k;
      if (fr > 0) {
        const au = Math.abs(ui);
        const phi = 2 * fr * ri * ui * au * iDc[i]!;
        su = -phi * ir;
        let q = 0;
        if (heat) q = 0.5 * fr * ri * au * CP * (wallT - pi * ir * (1 / R_AIR)) * 4 * iDc[i]!;
        sp += GM1 * (q + phi * ui);
      }
      sr *= h;
      su *= h;
      sp *= h;
      for (let pass = 0; pass < 2; pass++) {
        const er = -c * (ui * dr + ri * du) + sr;
        const eu = -c * (ui * du + dp * ir) + su;
        const ep = -c * (GAMMA * pi * du + ui * dp) + sp;
        const rl = ri - 0.5 * dr + er;
        const rrr = ri + 0.5 * dr + er;
        const pl = pi - 0.5 * dp + ep;
        const prr = pi + 0.5 * dp + ep;
        if ((rl > 0 && rrr > 0 && pl > 0 && prr > 0) || pass === 1) {
          rL[i] = rl;
          rR[i] = rrr;
          uL[i] = ui - 0.5 * du + eu;
          uR[i] = ui + 0.5 * du + eu;
          pL[i] = pl;
          pR[i] = prr;
          break;
        }
        dr = 0;
        du = 0;
        dp = 0;
      }
    }
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
      rm = 2 * this.ghostR[0]! - r;
      um = 2 * this.ghostU[0]! - u;
      pm = 2 * this.ghostP[0]! - p;
    }
    if (i < N - 1) {
      rp = this.r[i + 1]!;
      up = this.u[i + 1]!;
      pp = this.p[i + 1]!;
    } else {
      rp = 2 * this.ghostR[1]! - r;
      up = 2 * this.ghostU[1]! - u;
      pp = 2 * this.ghostP[1]! - p;
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
      const iD = this.iDc[i]!;
      const phi = 2 * this.friction * r * u * au * iD;
      su = -phi / r;
      let q = 0;
      if (this.heat) q = 0.5 * this.friction * r * au * CP * (this.wallT - p / (r * R_AIR)) * 4 * iD;
      sp += GM1 * (q + phi * u);
    }
    sr *= h;
    su *= h;
    sp *= h;

    const c = (0.5 * dt) / this.dx;
    const ir = 1 / r;
    for (let pass = 0; pass < 2; pass++) {
      // δ = −(dt/2dx)·A(W)·Δ + (dt/2)·S(W), the same for both faces
      const er = -c * (u * dr + r * du) + sr;
      const eu = -c * (u * du + dp * ir) + su;
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

}

/** The conservative finite-volume scheme on `mesh` (see the file header). */
export function createConservativeScheme(mesh: Mesh, wall: PipeWall): ConservativeScheme {
  return new ConservativeScheme(mesh, wall);
}
