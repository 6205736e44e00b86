/**
 * Partially open end: the pipe end joined to a reservoir (the cylinder behind
 * the intake valve, or any 0-D volume) through a restriction of effective
 * area Aeff = Cd·curtain area, quasi-steady, both directions, subsonic or
 * choked, coupled to the wave arriving from the pipe.
 *
 * Unknown: X = (p_e/P_REF)^((γ−1)/(2γ)), the end pressure function; for gas of
 * entropy level A the end sound speed is a_e = A·X. One scalar root in X,
 * bracketed inside the pipe end's subsonic range |w| ≤ a_e (the pipe-end
 * mass flux peaks at |w| = a, so outside it a second, unphysical root
 * exists). Λ = J/Ap is the normalised incoming invariant; p_rest = P_REF·Λ^PEXP
 * is the end pressure the wave implies at zero velocity.
 *
 * Outflow from the pipe (p_rest ≥ p_res): end gas is pipe gas (A = Ap),
 *   a_e = Ap·X, w = Ap·(Λ − X)/G1 ≥ 0, X ∈ [2Λ/(γ+1) (sonic), Λ (rest)];
 *   the pipe gas's stagnation state (p0, T0) feeds the nozzle into the
 *   reservoir: residual ρ_e·w·F − ṁ_nozzle(Aeff, p0, T0, p_res).
 * Inflow to the pipe (p_rest < p_res): the reservoir's stagnation enthalpy is
 *   kept (a_e² + G1·w² = a_res²), the jet's static pressure is the pipe-end
 *   pressure (no recovery), the entropy level A_e = a_e/X is what the jet
 *   brings; with Benson's relation a_e + G1·w = Λ·A_e:
 *   a_e = a_res/√(1 + (Λ/X − 1)²/G1), w = a_e·(Λ/X − 1)/G1 ≤ 0,
 *   X ∈ [Λ, min(X_res, Λ/(1 − G1))]; residual ρ_e·|w|·F − ṁ_nozzle(Aeff,
 *   p_res, T_res, p_e).
 * When the bracket's sonic end still cannot pass what the restriction would,
 * the pipe end is choked and sits at the sonic bound.
 */
import { CP, G1, GAMMA, P_REF, PEXP, R_AIR, powP } from '../gas.js';
import { orificeMassFlow } from '../flow.js';
import { bracketedRoot, ScalarRoot } from './solve.js';
import { solveClosed } from './closed.js';
import { inflowSoundSpeed, writeInflow, writeOutflow } from './end-state.js';
import type { Boundary, EndState, Incoming, Reservoir } from './types.js';

const GR = GAMMA * R_AIR;
const TOL = 1e-11;

export class RestrictedEnd extends ScalarRoot implements Boundary {
  /** effective area of the restriction [m²]; set before each solve */
  area = 0;
  private mode = 0; // +1 outflow, −1 inflow
  private lam = 0;
  private ap = 0;
  private pipeArea = 0;
  private aRes = 0;

  constructor(public reservoir: Reservoir) {
    super();
  }

  /** residual for the current mode: pipe-end mass flow minus nozzle flow */
  protected residualAt(X: number): number {
    const res = this.reservoir;
    const pe = P_REF * powP(X);
    if (this.mode > 0) {
      const ae = this.ap * X;
      const w = (this.ap * (this.lam - X)) / G1;
      const Te = (ae * ae) / GR;
      const mPipe = (pe / (R_AIR * Te)) * w * this.pipeArea;
      const T0 = Te + (w * w) / (2 * CP);
      const p0 = pe * Math.pow(T0 / Te, GAMMA / (GAMMA - 1));
      return mPipe - orificeMassFlow(this.area, p0, T0, res.pressure);
    }
    const ae = inflowSoundSpeed(this.aRes, this.lam, X);
    const w = (ae * (this.lam / X - 1)) / G1;
    const Te = (ae * ae) / GR;
    const mPipe = (pe / (R_AIR * Te)) * -w * this.pipeArea;
    return mPipe - orificeMassFlow(this.area, res.pressure, res.temperature, pe);
  }

  solve(inc: Incoming, out: EndState): void {
    if (this.area <= 0) {
      solveClosed(inc, out);
      return;
    }
    const res = this.reservoir;
    const lam = inc.lambda;
    this.lam = lam;
    this.ap = inc.entropy;
    this.pipeArea = inc.area;
    const pRest = P_REF * powP(lam);
    out.choked = false;
    if (pRest >= res.pressure) {
      this.mode = 1;
      const lo = (2 * lam) / (GAMMA + 1);
      const flo = this.at(lo);
      if (flo <= 0) {
        this.rx = lo;
        out.choked = true;
      } else bracketedRoot(this, lo, lam, flo, this.at(lam), TOL);
      writeOutflow(out, this.ap, lam, this.rx, inc.area);
      return;
    }
    this.mode = -1;
    this.aRes = Math.sqrt(GR * res.temperature);
    const xRes = Math.pow(res.pressure / P_REF, 1 / PEXP);
    out.choked = this.inflowRoot(lam, xRes, TOL);
    writeInflow(out, this.aRes, res.temperature, lam, this.rx, inc.area);
  }
}
