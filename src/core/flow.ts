/**
 * Quasi-steady compressible flow through a restriction (isentropic nozzle
 * with a discharge coefficient folded into the effective area).
 *
 *   ṁ = A·p0/√(R·T0) · √(2γ/(γ−1)·(pr^(2/γ) − pr^((γ+1)/γ))),  pr = p/p0
 *
 * choked when pr < (2/(γ+1))^(γ/(γ−1)) = 0.528282 (γ = 1.4), where
 *   ṁ* = A·p0/√T0·√(γ/R)·(2/(γ+1))^((γ+1)/(2(γ−1)))
 * (NACA Report 1135, 1953; Heywood 1988, App. C).
 */
import { GAMMA, R_AIR } from './gas.js';

export const CRITICAL_PRESSURE_RATIO = Math.pow(2 / (GAMMA + 1), GAMMA / (GAMMA - 1));
const K1 = (2 * GAMMA) / (GAMMA - 1);
if (Math.abs(2 / GAMMA - 10 / 7) > 1e-12) throw new Error('flow.ts: orificeMassFlow assumes γ = 1.4 (2/γ = 10/7)');

/** mass flow [kg/s] from stagnation (p0, T0) to static pressure p through area A (p ≤ p0) */
export function orificeMassFlow(area: number, p0: number, T0: number, p: number): number {
  if (area <= 0 || p >= p0) return 0;
  let pr = p / p0;
  if (pr < CRITICAL_PRESSURE_RATIO) pr = CRITICAL_PRESSURE_RATIO;
  // γ = 1.4: pr^(2/γ) = y^10 and pr^((γ+1)/γ) = y^12 with y = pr^(1/7) — one power instead of two
  const y = Math.pow(pr, 1 / 7);
  const y2 = y * y;
  const y4 = y2 * y2;
  const y10 = y4 * y4 * y2;
  const psi = Math.sqrt(Math.max(0, K1 * (y10 - y10 * y2)));
  return (area * p0 * psi) / Math.sqrt(R_AIR * T0);
}

/** signed flow [kg/s] between two reservoirs, positive from 1 to 2 */
export function reservoirFlow(area: number, p1: number, T1: number, p2: number, T2: number): number {
  return p1 >= p2 ? orificeMassFlow(area, p1, T1, p2) : -orificeMassFlow(area, p2, T2, p1);
}
