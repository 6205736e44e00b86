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
const E1 = 2 / GAMMA;
const E2 = (GAMMA + 1) / GAMMA;

/** mass flow [kg/s] from stagnation (p0, T0) to static pressure p through area A (p ≤ p0) */
export function orificeMassFlow(area: number, p0: number, T0: number, p: number): number {
  if (area <= 0 || p >= p0) return 0;
  let pr = p / p0;
  if (pr < CRITICAL_PRESSURE_RATIO) pr = CRITICAL_PRESSURE_RATIO;
  const psi = Math.sqrt(Math.max(0, K1 * (Math.pow(pr, E1) - Math.pow(pr, E2))));
  return (area * p0 * psi) / Math.sqrt(R_AIR * T0);
}

/** signed flow [kg/s] between two reservoirs, positive from 1 to 2 */
export function reservoirFlow(area: number, p1: number, T1: number, p2: number, T2: number): number {
  return p1 >= p2 ? orificeMassFlow(area, p1, T1, p2) : -orificeMassFlow(area, p2, T2, p1);
}
