/**
 * Junction of N pipe ends at one point: Benson's constant-pressure junction
 * (R. S. Benson, The Thermodynamics and Gas Dynamics of Internal-Combustion
 * Engines, vol. 1, Clarendon Press 1982, ch. 7; Winterbone & Pearson, Theory
 * of Engine Manifold Design, 2000, ch. 9).
 *
 * Every end sits at the same static pressure p_j (pressure function
 * X = (p_j/P_REF)^((γ−1)/(2γ)), symbols as in boundary/restricted.ts); the
 * gas leaving the pipes mixes to one stagnation state, and the pipes the flow
 * enters receive it:
 *   end k with Λ_k ≥ X: outflow of its own gas (entropy level A_k kept),
 *       a_e = A_k·X, w = A_k·(Λ_k − X)/G1;
 *   end k with Λ_k < X: inflow of the mixture, stagnation sound speed a0_j,
 *       a_e = a0_j/√(1 + (Λ_k/X − 1)²/G1), w = a_e·(Λ_k/X − 1)/G1;
 *   a0_j² = γ·R·T0_j, cp·T0_j = Σ_out H_k / Σ_out ṁ_k (enthalpy-weighted mixing).
 * The one unknown X solves Σ_k ṁ_k(X) = 0 (mass); Σ H_k = 0 (energy) then
 * holds by the choice of T0_j. Σ ṁ_k falls monotonically with X and changes
 * sign between min Λ_k and max Λ_k, so the root is bracketed there. An end
 * that would pass sonic speed is held at its sonic bound (choked).
 * After the root the inflows are scaled by Σ out / Σ in (a change of the
 * order of the root tolerance) so that mass and energy balance to round-off.
 *
 * No loss and no momentum is carried through the junction: for a weak pulse
 * it gives the linear-acoustics split of N equal pipes, transmitted 2/N and
 * reflected 2/N − 1 (Kinsler et al., Fundamentals of Acoustics).
 */
import { CP, G1, GAMMA, R_AIR } from '../../gas.js';
import { writeInflow, writeOutflow } from '../../boundary/end-state.js';
import { bracketedRoot, type Residual } from '../../boundary/solve.js';
import type { Connector, PipeEnd } from '../types.js';

const GR = GAMMA * R_AIR;
const TOL = 1e-12;

export class JunctionConnector implements Connector, Residual {
  rx = 0;
  rf = 0;
  /** stagnation temperature of the mixed gas [K] */
  mixTemperature: number;
  private readonly lam: Float64Array;
  private readonly ent: Float64Array;
  private readonly area: Float64Array;

  constructor(
    readonly name: string,
    readonly ends: readonly PipeEnd[],
    initialTemperature: number,
  ) {
    const n = ends.length;
    this.lam = new Float64Array(n);
    this.ent = new Float64Array(n);
    this.area = new Float64Array(n);
    this.mixTemperature = initialTemperature;
  }

  /** Write every end's state at junction pressure function X; returns Σ ṁ outward [kg/s]. */
  private writeAll(X: number): number {
    const { ends, lam, ent, area } = this;
    const n = ends.length;
    // outflows first: they fix the mixture's stagnation state
    let mOut = 0;
    let hOut = 0;
    for (let k = 0; k < n; k++) {
      const l = lam[k]!;
      if (l < X) continue;
      let x = X;
      const sonic = (2 * l) / (GAMMA + 1);
      const s = ends[k]!.state;
      s.choked = x < sonic;
      if (s.choked) x = sonic;
      writeOutflow(s, ent[k]!, l, x, area[k]!);
      mOut += s.massFlow;
      hOut += s.enthalpyFlow;
    }
    if (mOut > 0) this.mixTemperature = hOut / (CP * mOut);
    const T0 = this.mixTemperature;
    const a0 = Math.sqrt(GR * T0);
    let sum = mOut;
    for (let k = 0; k < n; k++) {
      const l = lam[k]!;
      if (l >= X) continue;
      let x = X;
      const sonic = l / (1 - G1);
      const s = ends[k]!.state;
      s.choked = x > sonic;
      if (s.choked) x = sonic;
      writeInflow(s, a0, T0, l, x, area[k]!);
      sum += s.massFlow;
    }
    return sum;
  }

  evaluate(): void {
    this.rf = this.writeAll(this.rx);
  }

  solve(): void {
    const { ends, lam, ent, area } = this;
    const n = ends.length;
    let lo = Infinity;
    let hi = 0;
    for (let k = 0; k < n; k++) {
      const inc = ends[k]!.incoming;
      lam[k] = inc.lambda;
      ent[k] = inc.entropy;
      area[k] = inc.area;
      if (inc.lambda < lo) lo = inc.lambda;
      if (inc.lambda > hi) hi = inc.lambda;
    }
    if (!(hi > lo)) {
      this.rx = lo;
      this.evaluate();
    } else {
      this.rx = lo;
      this.evaluate();
      const flo = this.rf;
      this.rx = hi;
      this.evaluate();
      const fhi = this.rf;
      bracketedRoot(this, lo, hi, flo, fhi, TOL);
      this.evaluate();
    }
    // exact balance: scale the inflows to the outflows
    let mOut = 0;
    let mIn = 0;
    for (let k = 0; k < n; k++) {
      const m = ends[k]!.state.massFlow;
      if (m > 0) mOut += m;
      else mIn -= m;
    }
    if (mIn > 0 && mOut > 0) {
      const f = mOut / mIn;
      for (let k = 0; k < n; k++) {
        const s = ends[k]!.state;
        if (s.massFlow < 0) {
          s.massFlow *= f;
          s.enthalpyFlow *= f;
        }
      }
    }
  }
}
