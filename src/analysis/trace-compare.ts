/**
 * A measured runner pressure trace against the model's pressure at the same
 * place: does the measured pulse arrive when the model says it does?
 *
 * Inputs: one simulated point (core PointResult), the measured trace as one
 * absolute pressure per crank degree θ = 0..719 [Pa] (src/case/pressure-trace.ts)
 * and the transducer's distance s from the valve along the runner [m].
 *
 * The model's pressure at the sensor: at the valve (s = 0) the valve-end
 * pressure of the trace; elsewhere the runner's space–time map
 * (`result.pipes[0]`, x from the upstream end, so x = L − s), linear
 * between the map's points.
 *
 * Both signals are read the same way (analysis/pulse.ts, as for the verdict
 * at the valve), after the same light smoothing (a centred moving average
 * over SMOOTH_DEGREES, so a logger's noise does not count as a peak; it
 * moves no peak of a smooth trace by more than a fraction of a degree):
 *   - the model's last compression peak before IVC, and the measured
 *     compression peak nearest to it (within half a ringing period: the
 *     same pulse, even when it comes after IVC), their crank angles and
 *     rises above the reference pressure; `lateBy` = θ_measured − θ_model
 *     (positive: the measured pulse comes later); a peak is the largest
 *     sample within ±PEAK_HALF_WINDOW degrees, refined by a parabola;
 *   - the closed-valve ringing frequency, from the spacing of the crossings
 *     of its own mean between IVC and IVO (null when it does not ring clearly);
 *   - the pressure at IVO and at IVC (unsmoothed);
 *   - the RMS difference over the cycle [Pa] (unsmoothed).
 * The pulse timing agrees when both peaks exist and lie within
 * AGREE_DEGREES of each other (our own threshold, not a standard).
 */
import type { EngineModel, PointResult } from '../core/model.js';
import { PEAK_HALF_WINDOW, pulseTiming, type PressurePeak } from './pulse.js';

/** width of the smoothing window [deg] */
export const SMOOTH_DEGREES = 5;
/** peaks this close [deg] count as agreeing (our choice) */
export const AGREE_DEGREES = 5;

export interface TraceComparison {
  /** the transducer's distance from the valve [m] */
  sensorAt: number;
  /** the model's pressure at the sensor [Pa], θ = 0..719 */
  model: Float64Array;
  /** the measured pressure [Pa], θ = 0..719 */
  measured: Float64Array;
  lastPeakBeforeIvc: { model: PressurePeak | null; measured: PressurePeak | null; lateBy: number | null };
  /** closed-valve ringing [Hz] */
  ringingFrequency: { model: number | null; measured: number | null };
  /** pressure at IVO and at IVC [Pa] */
  atIvo: { model: number; measured: number };
  atIvc: { model: number; measured: number };
  /** RMS of measured − model over the cycle [Pa] */
  rms: number;
  agrees: boolean;
  /** one line of plain words */
  verdict: string;
}

/** The model's pressure [Pa] at `sensorAt` [m] from the valve along the runner, θ = 0..719. */
export function modelPressureAt(result: PointResult, sensorAt: number): Float64Array {
  if (!(sensorAt > 0)) return Float64Array.from(result.trace.valvePressure);
  const map = result.pipes[0] ?? result.runnerMap;
  const xs = map.x;
  const m = xs.length;
  const L = xs[m - 1]!;
  const x = Math.min(L, Math.max(0, L - sensorAt));
  let k = 0;
  while (k < m - 2 && xs[k + 1]! < x) k++;
  const x0 = xs[k]!;
  const x1 = xs[k + 1]!;
  const w = x1 > x0 ? (x - x0) / (x1 - x0) : 0;
  const out = new Float64Array(720);
  for (let j = 0; j < 720; j++) out[j] = map.pressure[j * m + k]! * (1 - w) + map.pressure[j * m + k + 1]! * w;
  return out;
}

/** centred moving average over `width` samples of a periodic signal */
export function smoothPeriodic(values: ArrayLike<number>, width = SMOOTH_DEGREES): Float64Array {
  const n = values.length;
  const h = Math.floor(width / 2);
  const out = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let d = -h; d <= h; d++) s += values[(((j + d) % n) + n) % n]!;
    out[j] = s / (2 * h + 1);
  }
  return out;
}

/** the pulse reading of one signal, as pulse.ts reads the valve-end trace */
function readSignal(result: PointResult, model: EngineModel, signal: Float64Array) {
  const r: PointResult = {
    ...result,
    valvePressureAtIvo: Number.NaN,
    valvePressureAtIvc: Number.NaN,
    trace: { ...result.trace, valvePressure: signal },
  };
  return pulseTiming(r, model);
}

function atAngle(a: ArrayLike<number>, theta: number): number {
  const t = ((theta % 720) + 720) % 720;
  const i = Math.floor(t);
  const f = t - i;
  return a[i % 720]! * (1 - f) + a[(i + 1) % 720]! * f;
}

const deg = (d: number) => `${Math.round(Math.abs(d))}°`;

function fold(d: number): number {
  let x = ((d % 720) + 720) % 720;
  if (x > 360) x -= 720;
  return x;
}

/** The compression peak of a per-degree signal nearest to θ `near`, within `within` degrees, above `floor`. */
export function nearestPeak(sig: ArrayLike<number>, near: number, within: number, floor: number, reference: number, ivc: number): PressurePeak | null {
  const n = sig.length;
  const at = (k: number) => sig[((k % n) + n) % n]!;
  let best: PressurePeak | null = null;
  const c0 = Math.round(near);
  const span = Math.ceil(within);
  for (let d = -span; d <= span; d++) {
    const k = c0 + d;
    const v = at(k);
    if (!(v > floor)) continue;
    let peak = true;
    for (let j = 1; j <= PEAK_HALF_WINDOW && peak; j++) if (at(k - j) > v || at(k + j) >= v) peak = false;
    if (!peak) continue;
    const ym = at(k - 1);
    const yp = at(k + 1);
    const curv = ym - 2 * v + yp;
    const shift = curv < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (ym - yp)) / curv)) : 0;
    const crank = ((k + shift) % 720 + 720) % 720;
    if (Math.abs(fold(crank - near)) > within) continue;
    const value = v - 0.25 * (ym - yp) * shift;
    if (!best || Math.abs(fold(crank - near)) < Math.abs(fold(best.crank - near)))
      best = { crank, offsetFromIvc: fold(crank - ivc), pressure: value, pressureAboveReference: value - reference };
  }
  return best;
}

/** Compare a measured trace (per degree, absolute [Pa]) with the model at the sensor. */
export function compareTrace(result: PointResult, model: EngineModel, measured: ArrayLike<number>, sensorAt = 0): TraceComparison {
  const modelAt = modelPressureAt(result, sensorAt);
  const meas = Float64Array.from(measured);
  const a = readSignal(result, model, smoothPeriodic(modelAt));
  const b = readSignal(result, model, smoothPeriodic(meas));

  const pm = a.lastPeakBeforeIvc;
  // the same pulse in the measured trace: its peak nearest the model's, within half a ringing period
  const smoothed = smoothPeriodic(meas);
  const pq = pm
    ? nearestPeak(smoothed, pm.crank, a.ringingPeriodDegrees / 2, a.referencePressure * 1.003, a.referencePressure, result.events.ivc)
    : b.lastPeakBeforeIvc;
  let lateBy: number | null = null;
  if (pm && pq) {
    let d = pq.crank - pm.crank;
    if (d > 360) d -= 720;
    if (d <= -360) d += 720;
    lateBy = d;
  }
  let ss = 0;
  for (let j = 0; j < 720; j++) ss += (meas[j]! - modelAt[j]!) ** 2;
  const rms = Math.sqrt(ss / 720);
  const { ivo, ivc } = result.events;
  const agrees = lateBy !== null && Math.abs(lateBy) <= AGREE_DEGREES;
  let verdict: string;
  if (lateBy === null) {
    verdict = !pq
      ? 'the measured trace shows no compression peak while the valve is open: no pulse timing to compare'
      : 'the model shows no compression peak at the sensor while the valve is open: no pulse timing to compare';
  } else {
    const when = Math.abs(lateBy) < 0.5 ? 'at the same crank angle as' : `${deg(lateBy)} ${lateBy > 0 ? 'later' : 'earlier'} than`;
    verdict = `the measured compression peak comes ${when} the model's (θ ${pq!.crank.toFixed(0)}° vs ${pm!.crank.toFixed(0)}°): ` +
      (agrees
        ? `within ${AGREE_DEGREES}°, the model's pulse timing agrees`
        : `more than ${AGREE_DEGREES}° apart: check the runner length and temperature (sound speed), the sensor position and the logger's TDC offset`);
  }
  return {
    sensorAt,
    model: modelAt,
    measured: meas,
    lastPeakBeforeIvc: { model: pm, measured: pq, lateBy },
    ringingFrequency: {
      model: a.ringingSource === 'trace' ? a.ringingFrequency : null,
      measured: b.ringingSource === 'trace' ? b.ringingFrequency : null,
    },
    atIvo: { model: atAngle(modelAt, ivo), measured: atAngle(meas, ivo) },
    atIvc: { model: atAngle(modelAt, ivc), measured: atAngle(meas, ivc) },
    rms,
    agrees,
    verdict,
  };
}
