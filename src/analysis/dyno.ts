/**
 * Measured dyno points beside a simulated speed curve.
 *
 * A dyno sheet gives, at each measured speed, brake torque [N·m], brake
 * power [W] and/or volumetric efficiency [-] (src/case/measured.ts reads it;
 * the shape is repeated here so analysis depends on the core only). The
 * model's value at a measured speed is read off the simulated curve, linear
 * between its speeds (NaN outside them): the same curve the chart draws.
 *
 * Torque and power of the model are ESTIMATES from ηv (estimates.ts) with
 * the case's air–fuel ratio, heating value and brake efficiency; inverting
 * that estimate puts a measured torque on the ηv scale,
 *   ηv = T·4π·AFR / (ρa·Vd·Q_LHV·η_b)      (P = T·2πN/60 for a power)
 * so that the terminal view can draw dyno points on its ηv chart. It holds
 * only as far as the assumed efficiency does (`tractwave calibrate` fits it).
 */
import type { OutputAssumptions } from './estimates.js';
import { DEFAULT_OUTPUT_ASSUMPTIONS } from './estimates.js';
import { interpolate, type SweepPoint } from './sweep.js';

export type DynoKind = 'torque' | 'power' | 'volumetricEfficiency';
export const DYNO_KINDS: readonly DynoKind[] = ['torque', 'power', 'volumetricEfficiency'];

/** One measured speed (the shape of src/case/measured.ts MeasuredPoint). SI. */
export interface DynoPoint {
  rpm: number;
  torque?: number;
  power?: number;
  volumetricEfficiency?: number;
}

export type DynoValues = Partial<Record<DynoKind, number>>;

export interface DynoComparison {
  rpm: number;
  /** as measured */
  measured: DynoValues;
  /** the model's curve at this speed (NaN outside the swept speeds → null in JSON) */
  model: DynoValues;
  /** model − measured */
  difference: DynoValues;
  /** (model − measured)/measured */
  relative: DynoValues;
}

/** the model's value of one kind along a sweep, at a speed (NaN outside) */
export function curveAt(points: readonly SweepPoint[], kind: DynoKind, rpm: number): number {
  return interpolate(
    points.map((p) => ({ x: p.rpm, y: p[kind] })),
    rpm,
  );
}

/** Each measured point with the model's values at its speed. */
export function compareDyno(points: readonly SweepPoint[], measured: readonly DynoPoint[]): DynoComparison[] {
  return measured.map((m) => {
    const out: DynoComparison = { rpm: m.rpm, measured: {}, model: {}, difference: {}, relative: {} };
    for (const k of DYNO_KINDS) {
      const v = m[k];
      if (v === undefined) continue;
      const y = curveAt(points, k, m.rpm);
      out.measured[k] = v;
      out.model[k] = y;
      out.difference[k] = y - v;
      out.relative[k] = v !== 0 ? (y - v) / v : Number.NaN;
    }
    return out;
  });
}

/** which quantity of a sheet a comparison leads with: ηv when measured, else torque, else power */
export function leadingKind(measured: readonly DynoPoint[]): DynoKind | undefined {
  for (const k of ['volumetricEfficiency', 'torque', 'power'] as const) if (measured.some((m) => m[k] !== undefined)) return k;
  return undefined;
}

/**
 * A measured point on the ηv scale: its ηv when measured, else its torque
 * (or power) through the inverted output estimate (see the file header).
 * `referenceMass` = ambient density × swept volume [kg].
 */
export function dynoAsEta(m: DynoPoint, referenceMass: number, assumptions: Partial<OutputAssumptions> = {}): number | undefined {
  if (m.volumetricEfficiency !== undefined) return m.volumetricEfficiency;
  const a = { ...DEFAULT_OUTPUT_ASSUMPTIONS, ...assumptions };
  const torque = m.torque ?? (m.power !== undefined && m.rpm > 0 ? (m.power * 60) / (2 * Math.PI * m.rpm) : undefined);
  if (torque === undefined) return undefined;
  return (torque * 4 * Math.PI * a.airFuelRatio) / (referenceMass * a.fuelHeatingValue * a.brakeEfficiency);
}
