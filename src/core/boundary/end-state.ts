/**
 * The two end states every open or restricted end is written in, given the
 * end pressure function X = (p_e/P_REF)^((γ−1)/(2γ)) found by its solve
 * (symbols as in types.ts, restricted.ts and open.ts).
 *
 * Outflow (pipe gas leaves, entropy level Ap kept):
 *   a_e = Ap·X, w = Ap·(Λ − X)/G1, energy flux ṁ·(cp·T_e + w²/2).
 * Inflow (reservoir gas enters with its stagnation enthalpy, Benson's relation):
 *   a_e = a_res/√(1 + (Λ/X − 1)²/G1), w = a_e·(Λ/X − 1)/G1 ≤ 0,
 *   A_e = a_e/X, energy flux ṁ·cp·T_res.
 */
import { CP, G1, GAMMA, P_REF, R_AIR, powP } from '../gas.js';
import type { EndState } from './types.js';

const GR = GAMMA * R_AIR;

/** end sound speed [m/s] of reservoir gas entering at end pressure function X */
export function inflowSoundSpeed(aRes: number, lam: number, X: number): number {
  const r = lam / X - 1;
  return aRes / Math.sqrt(1 + (r * r) / G1);
}

export function writeOutflow(out: EndState, ap: number, lam: number, X: number, area: number): void {
  const ae = ap * X;
  const w = (ap * (lam - X)) / G1;
  const Te = (ae * ae) / GR;
  const pe = P_REF * powP(X);
  out.pressure = pe;
  out.velocity = w;
  out.entropy = ap;
  out.massFlow = (pe / (R_AIR * Te)) * w * area;
  out.enthalpyFlow = out.massFlow * (CP * Te + 0.5 * w * w);
}

export function writeInflow(out: EndState, aRes: number, TRes: number, lam: number, X: number, area: number): void {
  const ae = inflowSoundSpeed(aRes, lam, X);
  const w = (ae * (lam / X - 1)) / G1;
  const Te = (ae * ae) / GR;
  const pe = P_REF * powP(X);
  out.pressure = pe;
  out.velocity = w;
  out.entropy = ae / X;
  out.massFlow = (pe / (R_AIR * Te)) * w * area;
  out.enthalpyFlow = out.massFlow * CP * TRes;
}
