/**
 * Valve lift and flow area.
 *
 * Lift: between the opening angle θo and the closing angle θc (absolute crank
 * angles, the zero-lift ends of the curve), the phase φ = (θ − θo)/(θc − θo)
 * runs 0..1 and lift = Lmax·sin²(πφ) — a smooth default profile with zero
 * velocity at both ends; or a user table of (φ, lift/Lmax), linear between
 * points.
 *
 * Flow area: curtain area Ac = count·π·D·L; effective area = Cd(L/D)·Ac.
 * The default Cd table follows the usual shape of a curtain-area discharge
 * coefficient for a poppet valve: about 0.6–0.7 at low lift, falling as the
 * port throat takes over so the effective area gains little past
 * L/D ≈ 0.25 (Heywood 1988, §6.3; numbers from memory). Past the last table
 * point Cd·L/D is held constant (the port throat limits).
 */
import type { TablePoint, ValveModel } from './model.js';

export const DEFAULT_CD_TABLE: readonly TablePoint[] = [
  { x: 0.0, y: 0.7 },
  { x: 0.05, y: 0.7 },
  { x: 0.1, y: 0.68 },
  { x: 0.15, y: 0.65 },
  { x: 0.2, y: 0.61 },
  { x: 0.25, y: 0.56 },
  { x: 0.3, y: 0.48 },
  { x: 0.35, y: 0.41 },
  { x: 0.4, y: 0.36 },
];

/** linear interpolation in a table sorted by x, held at the ends */
export function interpolate(table: readonly TablePoint[], x: number): number {
  const n = table.length;
  if (n === 0) return 0;
  const first = table[0]!;
  if (x <= first.x) return first.y;
  for (let i = 1; i < n; i++) {
    const b = table[i]!;
    if (x <= b.x) {
      const a = table[i - 1]!;
      const f = b.x > a.x ? (x - a.x) / (b.x - a.x) : 0;
      return a.y + f * (b.y - a.y);
    }
  }
  return table[n - 1]!.y;
}

/** open duration [deg] from the opening to the closing angle */
export function openDuration(v: Pick<ValveModel, 'openAngle' | 'closeAngle'>): number {
  const d = (((v.closeAngle - v.openAngle) % 720) + 720) % 720;
  return d;
}

/** phase 0..1 within the open period, or −1 when shut */
export function openPhase(v: Pick<ValveModel, 'openAngle' | 'closeAngle'>, thetaDeg: number): number {
  const d = openDuration(v);
  const rel = (((thetaDeg - v.openAngle) % 720) + 720) % 720;
  return rel < d ? rel / d : -1;
}

/** valve lift [m] at crank angle θ [deg] */
export function valveLift(v: ValveModel, thetaDeg: number): number {
  const phi = openPhase(v, thetaDeg);
  if (phi <= 0) return 0;
  if (v.liftTable && v.liftTable.length > 1) return v.maxLift * Math.max(0, interpolate(v.liftTable, phi));
  const s = Math.sin(Math.PI * phi);
  return v.maxLift * s * s;
}

/** discharge coefficient on curtain area at lift/diameter ratio ld */
export function dischargeCoefficient(table: readonly TablePoint[], ld: number): number {
  const last = table[table.length - 1];
  if (last && ld > last.x && last.x > 0) return (last.y * last.x) / ld;
  return interpolate(table, ld);
}

/** curtain area count·π·D·L [m²] */
export function curtainArea(v: Pick<ValveModel, 'count' | 'diameter'>, lift: number): number {
  return v.count * Math.PI * v.diameter * lift;
}

/** effective flow area Cd·curtain [m²] at lift L [m] */
export function effectiveArea(v: ValveModel, lift: number): number {
  if (lift <= 0) return 0;
  return dischargeCoefficient(v.cdTable, lift / v.diameter) * curtainArea(v, lift);
}
