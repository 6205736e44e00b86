/**
 * Open end to a reservoir (ambient or a plenum), the pipe's full area open.
 *
 * Outflow (the incoming wave's rest pressure p_rest ≥ p_res): the jet leaves
 * at the reservoir pressure, p_e = p_res, entropy level of the pipe gas;
 * w = Ap·(Λ − X_res)/G1; sonic limit w ≤ a_e (then X = 2Λ/(γ+1)).
 *
 * Inflow (p_rest < p_res): isentropic acceleration from the reservoir's
 * stagnation state with an entry loss K (0 for a good bellmouth, ≈ 0.5 for a
 * plain sharp edge; common practice): stagnation enthalpy kept,
 * a_e² + G1·w² = a_res², static pressure p_e = p_res·(a_e/a_res)^PEXP − K·½ρ_e·w².
 * Same unknown X and Benson relation as restricted.ts: one bracketed root in
 * X ∈ [Λ, min(X_res, Λ/(1 − G1))] of
 *   R(X) = p_e + K·½ρ_e·w² − p_res·(a_e/a_res)^PEXP.
 */
import { G1, GAMMA, P_REF, PEXP, R_AIR, powP } from '../gas.js';
import { inflowSoundSpeed, writeInflow, writeOutflow } from './end-state.js';
import { ScalarRoot } from './solve.js';
import type { Boundary, EndState, Incoming, Reservoir } from './types.js';

const GR = GAMMA * R_AIR;
const TOL = 1e-11;

export class OpenEnd extends ScalarRoot implements Boundary {
  private lam = 0;
  private aRes = 0;

  /**
   * @param reservoir the reservoir the end opens to (read at each solve)
   * @param entryLoss entry loss coefficient K on the dynamic head [-]
   */
  constructor(
    public reservoir: Reservoir,
    public entryLoss = 0,
  ) {
    super();
  }

  protected residualAt(X: number): number {
    const res = this.reservoir;
    const ae = inflowSoundSpeed(this.aRes, this.lam, X);
    const w = (ae * (this.lam / X - 1)) / G1;
    const pe = P_REF * powP(X);
    const rho = pe / (R_AIR * ((ae * ae) / GR));
    return pe + this.entryLoss * 0.5 * rho * w * w - res.pressure * powP(ae / this.aRes);
  }

  solve(inc: Incoming, out: EndState): void {
    const res = this.reservoir;
    const lam = inc.lambda;
    const ap = inc.entropy;
    const xRes = Math.pow(res.pressure / P_REF, 1 / PEXP);
    out.choked = false;
    if (lam >= xRes) {
      let X = xRes;
      if (X < (2 * lam) / (GAMMA + 1)) {
        X = (2 * lam) / (GAMMA + 1);
        out.choked = true;
      }
      writeOutflow(out, ap, lam, X, inc.area);
      return;
    }
    this.lam = lam;
    this.aRes = Math.sqrt(GR * res.temperature);
    out.choked = this.inflowRoot(lam, xRes, TOL);
    writeInflow(out, this.aRes, res.temperature, lam, this.rx, inc.area);
  }
}
