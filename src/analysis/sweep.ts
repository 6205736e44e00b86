/**
 * Speed sweeps and band figures — the pure part (no threads, no I/O).
 *
 * A sweep runs the core at a list of speeds (rpm, ascending). Speeds are cut
 * into fixed chunks of SWEEP_CHUNK_POINTS consecutive points, independent of
 * how many workers run them: the first point of each chunk starts cold (the
 * runner at ambient rest), each later point starts from the converged state
 * of the point before it (the core's warm start). So every point's result
 * depends only on the speeds of its chunk, and a sweep gives bit-identical
 * numbers whether one worker or many run the chunks, a whole chunk on one
 * thread or each point on another (`sweepPoint` takes the warm start as
 * data; see worker-pool.ts).
 *
 * Band figure of merit: the mean ηv over a speed band [lo, hi] is the area
 * under the curve over the band divided by the band width,
 *   η̄ = (1/(hi − lo)) ∫_lo^hi ηv(N) dN,
 * with the curve taken as straight lines between the simulated points
 * (trapezoid rule), the band ends interpolated on those lines. A band
 * average, not a single peak, is the figure of merit: a gain from wave tuning
 * at one speed usually costs at a nearby one.
 */
import { simulatePoint, type WarmStart } from '../core/index.js';
import type { EngineModel } from '../core/model.js';
import { outputEstimate, type OutputAssumptions } from './estimates.js';
import { pulseTiming, type PulseTiming } from './pulse.js';

/** points per warm-started chunk (fixed, so results do not depend on the job count) */
export const SWEEP_CHUNK_POINTS = 4;

/** What a sweep keeps of one simulated speed (JSON-able). SI units. */
export interface SweepPoint {
  rpm: number;
  volumetricEfficiency: number;
  /** estimated brake torque [N·m] (an estimate: see estimates.ts) */
  torque: number;
  /** estimated brake power [W] */
  power: number;
  converged: boolean;
  cycles: number;
  /** (inlet-end mass − delivered mass) / delivered mass of the last cycle [-] */
  massImbalance: number;
  /** fresh mass delivered per cycle [kg] */
  deliveredMass: number;
  /** cylinder mass at IVC [kg] */
  trappedMass: number;
  residualFraction: number;
  /** cylinder pressure at IVC [Pa] */
  ivcPressure: number;
  /** largest reverse flow into the runner [kg/s] */
  peakReverseFlow: number;
  pulse: PulseTiming;
}

/** Cut an ascending list of speeds into consecutive chunks of `size`. */
export function chunkSpeeds(rpms: readonly number[], size = SWEEP_CHUNK_POINTS): number[][] {
  const k = Math.max(1, Math.floor(size));
  const out: number[][] = [];
  for (let i = 0; i < rpms.length; i += k) out.push(rpms.slice(i, i + k));
  return out;
}

/**
 * One point of a sweep: `rpm` on `model`, started from `warm` (the converged
 * state of the point before it in its chunk) or from rest. Returns what the
 * sweep keeps and the converged state for the next point of the chunk. The
 * serial run, the worker threads and the terminal view all go through here,
 * so a point's numbers depend only on its model, speed and warm start.
 */
export function sweepPoint(
  model: EngineModel,
  rpm: number,
  assumptions: Partial<OutputAssumptions> = {},
  warm?: WarmStart,
): { point: SweepPoint; warmStart: WarmStart } {
  const m: EngineModel = { ...model, rpm };
  const { result, warmStart } = simulatePoint(m, warm ? { warmStart: warm, mapPoints: 2 } : { mapPoints: 2 });
  const est = outputEstimate(result.volumetricEfficiency, result.referenceMass, rpm, assumptions);
  const point: SweepPoint = {
    rpm,
    volumetricEfficiency: result.volumetricEfficiency,
    torque: est.torque,
    power: est.power,
    converged: result.converged,
    cycles: result.cycles,
    massImbalance: result.massImbalance,
    deliveredMass: result.deliveredMass,
    trappedMass: result.trappedMass,
    residualFraction: result.residualFraction,
    ivcPressure: result.ivcPressure,
    peakReverseFlow: result.peakReverseFlow,
    pulse: pulseTiming(result, m),
  };
  return { point, warmStart };
}

/**
 * The points of one chunk, one at a time: the first speed cold, each next
 * one warm-started from the previous converged state.
 */
export function* chunkPoints(model: EngineModel, rpms: readonly number[], assumptions: Partial<OutputAssumptions> = {}): Generator<SweepPoint> {
  let warm: WarmStart | undefined;
  for (const rpm of rpms) {
    const { point, warmStart } = sweepPoint(model, rpm, assumptions, warm);
    warm = warmStart;
    yield point;
  }
}

/** Run one chunk whole (see chunkPoints); `onPoint` is called after each point. */
export function runChunk(
  model: EngineModel,
  rpms: readonly number[],
  assumptions: Partial<OutputAssumptions> = {},
  onPoint?: (point: SweepPoint) => void,
): SweepPoint[] {
  const out: SweepPoint[] = [];
  for (const point of chunkPoints(model, rpms, assumptions)) {
    out.push(point);
    onPoint?.(point);
  }
  return out;
}

/** Run a whole sweep in this thread, chunk by chunk (the reference the parallel run must equal). */
export function runSweepSerial(
  model: EngineModel,
  rpms: readonly number[],
  assumptions: Partial<OutputAssumptions> = {},
  onPoint?: (point: SweepPoint) => void,
): SweepPoint[] {
  return chunkSpeeds(rpms).flatMap((c) => runChunk(model, c, assumptions, onPoint));
}

export interface CurvePoint {
  x: number;
  y: number;
}

/** y on the polyline through `curve` (x ascending) at x; NaN outside. */
export function interpolate(curve: readonly CurvePoint[], x: number): number {
  const n = curve.length;
  if (n === 0) return Number.NaN;
  const first = curve[0]!;
  const last = curve[n - 1]!;
  if (x < first.x || x > last.x) return Number.NaN;
  if (n === 1) return first.y;
  let k = 0;
  while (k < n - 2 && curve[k + 1]!.x < x) k++;
  const a = curve[k]!;
  const b = curve[k + 1]!;
  if (b.x === a.x) return b.y;
  const f = (x - a.x) / (b.x - a.x);
  return a.y + f * (b.y - a.y);
}

/**
 * Mean of y over [lo, hi]: ∫y dx/(hi − lo) on the polyline (trapezoids), the
 * ends interpolated. Exact for data linear in x. lo = hi gives the value
 * there. NaN when the band is not inside the curve's x range.
 */
export function bandMean(curve: readonly CurvePoint[], lo: number, hi: number): number {
  if (!(hi >= lo) || curve.length === 0) return Number.NaN;
  const first = curve[0]!.x;
  const last = curve[curve.length - 1]!.x;
  const eps = 1e-9 * Math.max(1, Math.abs(last));
  if (lo < first - eps || hi > last + eps) return Number.NaN;
  const a = Math.max(lo, first);
  const b = Math.min(hi, last);
  if (b === a) return interpolate(curve, a);
  const xs: CurvePoint[] = [{ x: a, y: interpolate(curve, a) }];
  for (const p of curve) if (p.x > a && p.x < b) xs.push(p);
  xs.push({ x: b, y: interpolate(curve, b) });
  let area = 0;
  for (let i = 1; i < xs.length; i++) {
    const p = xs[i - 1]!;
    const q = xs[i]!;
    area += 0.5 * (p.y + q.y) * (q.x - p.x);
  }
  return area / (b - a);
}

export interface SweepSummary {
  band: { from: number; to: number; meanVolumetricEfficiency: number };
  /** speed of the highest simulated ηv [rpm] */
  bestRpm: number;
  bestVolumetricEfficiency: number;
  /** how many points did not reach periodic convergence */
  unconverged: number;
}

/** Band mean and best speed of a sweep. The band must lie inside the swept speeds. */
export function summariseSweep(points: readonly SweepPoint[], band: { from: number; to: number }): SweepSummary {
  const curve = points.map((p) => ({ x: p.rpm, y: p.volumetricEfficiency }));
  let best = points[0];
  for (const p of points) if (best === undefined || p.volumetricEfficiency > best.volumetricEfficiency) best = p;
  return {
    band: { from: band.from, to: band.to, meanVolumetricEfficiency: bandMean(curve, band.from, band.to) },
    bestRpm: best?.rpm ?? Number.NaN,
    bestVolumetricEfficiency: best?.volumetricEfficiency ?? Number.NaN,
    unconverged: points.filter((p) => !p.converged).length,
  };
}
