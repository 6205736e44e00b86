/**
 * Pulse timing: when does the pressure wave in the runner reach the valve,
 * and does it help or cost charge? Pure function of one simulated point.
 *
 * Inputs come from the core's `PointResult` (SI units, crank degrees
 * θ with 0 = gas-exchange TDC, 720° a cycle). Symbols used below:
 *
 *   N      engine speed [rpm]; one crank degree lasts 1/(6N) s
 *   L      total runner length [m]; a mean sound speed in the runner [m/s]
 *   p(θ)   static pressure at the valve end of the runner [Pa]
 *   p_ref  reference pressure [Pa]: the reservoir the runner draws from —
 *          ambient, or the cycle mean of the plenum pressure
 *   f₁     quarter-wave frequency of the runner, a/(4(L+δ)) [Hz] (see
 *          estimates.ts; δ the open-end correction)
 *   P      ringing period [deg]: measured from the closed-valve part of p(θ)
 *          when it rings clearly, otherwise 6N/f₁
 *
 * Definitions (what each output field means):
 *
 *   round trip      2L/a in seconds and in crank degrees, 12·N·L/a.
 *   wave order      f₁·120/N: how many quarter-wave periods fit in one
 *                   engine cycle (720°). Whole numbers mean the ringing repeats
 *                   in step with the cycle.
 *   compression peak  a local maximum of p(θ) (the largest sample within
 *                   ±PEAK_HALF_WINDOW degrees, refined by a parabola through
 *                   three samples) that stands more than `minPeakAmplitude`
 *                   above p_ref.
 *   last peak before IVC  the latest compression peak in the open period
 *                   IVO → IVC; its offset from IVC is θ_peak − θ_IVC
 *                   (negative = before the valve closes).
 *   peak after IVC  when the pressure is still rising at IVC, the compression
 *                   peak that follows within half a ringing period (up to
 *                   LATE_DEGREES after: "a little late"; more: "late").
 *   ringing phase   the phase of p(θ) read as a ringing about p_ref:
 *                   φ = atan2(−(dp/dθ)·P/(2π), p − p_ref), in [0°, 360°).
 *                   0° = at a compression peak, 90° = falling through p_ref,
 *                   180° = at an expansion trough, 270° = rising through p_ref.
 *   effect          'helping' when p at IVC is above p_ref by more than
 *                   `neutralBand` (fraction of p_ref, default 2 %), 'costing'
 *                   when below by more than that, else 'neutral'. The verdict
 *                   follows from these numbers only.
 */
import type { EngineModel, PointResult } from '../core/model.js';
import { quarterWaveFrequency, endCorrection, handQuarterWave } from './estimates.js';

/** half-width of the neighbourhood a peak must dominate [deg] */
export const PEAK_HALF_WINDOW = 3;
/** a compression peak up to this many degrees after IVC is "a little late"; later is "late" */
export const LATE_DEGREES = 10;
/** degrees trimmed at each end of the closed period before measuring the ringing */
const RINGING_TRIM = 5;

export type WaveEffect = 'helping' | 'neutral' | 'costing';

export interface ValveEventPulse {
  /** θ of the event [deg] */
  crank: number;
  /** valve-end pressure at the event [Pa] */
  pressure: number;
  /** pressure − reference pressure [Pa] */
  pressureAboveReference: number;
  /** ringing phase at the event [deg, 0..360), 0 = compression peak, 180 = expansion trough */
  ringingPhase: number;
}

export interface PressurePeak {
  /** θ of the peak [deg] */
  crank: number;
  /** θ_peak − θ_IVC [deg], negative = before the valve closes */
  offsetFromIvc: number;
  /** valve-end pressure at the peak [Pa] */
  pressure: number;
  /** pressure − reference pressure [Pa] */
  pressureAboveReference: number;
}

export interface PulseTiming {
  rpm: number;
  /** mean sound speed in the runner [m/s] */
  soundSpeed: number;
  /** total runner length [m] */
  runnerLength: number;
  /** 2L/a [s] */
  roundTripSeconds: number;
  /** 12·N·L/a [deg] */
  roundTripDegrees: number;
  /** a/(4(L+δ)) [Hz], with a at the ambient temperature when the model is given (analysis/estimates.ts handQuarterWave, the figure check prints), else the runner mean */
  quarterWaveFrequency: number;
  /** the sound speed of the quarter-wave figure [m/s] */
  quarterWaveSoundSpeed: number;
  /** f₁·120/N [-] */
  waveOrder: number;
  /** ringing frequency used for the phase [Hz] */
  ringingFrequency: number;
  /** ringing period used for the phase [deg] */
  ringingPeriodDegrees: number;
  /** 'trace' when measured from the closed-valve part of the pressure trace, else 'quarter-wave estimate' */
  ringingSource: 'trace' | 'quarter-wave estimate';
  /** reference pressure p_ref [Pa] */
  referencePressure: number;
  referenceKind: 'ambient' | 'plenum mean';
  atIvo: ValveEventPulse;
  atIvc: ValveEventPulse;
  lastPeakBeforeIvc: PressurePeak | null;
  peakAfterIvc: PressurePeak | null;
  /**
   * offset from IVC of the compression peak the verdict speaks of [deg]: the
   * peak after IVC when the wave is helping and still rising at IVC, else the
   * last peak before IVC; null when there is none
   */
  peakOffsetFromIvc: number | null;
  effect: WaveEffect;
  /** one line of plain words for the closing event, following from the numbers above */
  verdict: string;
  /** one line on what the valve sees when it opens (second order) */
  openingNote: string;
}

export interface PulseOptions {
  /** smallest rise above p_ref that counts as a compression peak, fraction of p_ref (default 0.003) */
  minPeakAmplitude?: number;
  /** |p_IVC − p_ref| up to this fraction of p_ref is 'neutral' (default 0.02) */
  neutralBand?: number;
  /** open-end correction kind for the quarter-wave frequency (default unflanged) */
  flanged?: boolean;
}

/** wrap an angle into [0, 720) */
function wrap720(theta: number): number {
  const t = theta % 720;
  return t < 0 ? t + 720 : t;
}

/** signed difference a − b folded into (−360, 360] */
function angleDiff(a: number, b: number): number {
  let d = wrap720(a) - wrap720(b);
  if (d > 360) d -= 720;
  if (d <= -360) d += 720;
  return d;
}

/** A 720° periodic sampled signal with uniform spacing. */
class Periodic {
  readonly n: number;
  readonly step: number;
  readonly start: number;
  constructor(
    readonly values: ArrayLike<number>,
    crank: ArrayLike<number>,
  ) {
    this.n = values.length;
    this.step = 720 / this.n;
    this.start = crank.length > 0 ? (crank[0] ?? 0) : 0;
  }
  /** sample k (any integer, wrapped) */
  at(k: number): number {
    const i = ((k % this.n) + this.n) % this.n;
    return this.values[i] ?? Number.NaN;
  }
  /** fractional sample index of θ (not wrapped) */
  index(theta: number): number {
    return wrap720(theta - this.start) / this.step;
  }
  /** θ of fractional sample index */
  theta(index: number): number {
    return wrap720(this.start + index * this.step);
  }
  /** linear interpolation at θ */
  valueAt(theta: number): number {
    const x = this.index(theta);
    const k = Math.floor(x);
    const f = x - k;
    return (1 - f) * this.at(k) + f * this.at(k + 1);
  }
  /** dp/dθ at θ [per degree], central difference over one sample each side */
  slopeAt(theta: number): number {
    return (this.valueAt(theta + this.step) - this.valueAt(theta - this.step)) / (2 * this.step);
  }
}

/**
 * Is sample k a compression peak: the largest value within ±PEAK_HALF_WINDOW
 * degrees (strictly above the following sample, so a plateau counts once)
 * and above `floor`? Returns the refined peak (fractional index, value) or null.
 */
function peakAt(sig: Periodic, k: number, floor: number): { index: number; value: number } | null {
  const v = sig.at(k);
  if (!(v > floor)) return null;
  const w = Math.max(1, Math.round(PEAK_HALF_WINDOW / sig.step));
  for (let j = 1; j <= w; j++) {
    if (sig.at(k - j) > v || sig.at(k + j) >= v) return null;
  }
  const ym = sig.at(k - 1);
  const yp = sig.at(k + 1);
  const curv = ym - 2 * v + yp;
  const shift = curv < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (ym - yp)) / curv)) : 0;
  const value = v - 0.25 * (ym - yp) * shift;
  return { index: k + shift, value };
}

/**
 * The ringing period [deg] of the closed-valve part of the trace, from the
 * spacing of crossings of its own mean (with hysteresis of 15 % of the half
 * swing, so noise does not count as a crossing). Null when the window holds
 * less than one whole period or no clear swing.
 */
export function closedValveRingingPeriod(
  valvePressure: ArrayLike<number>,
  crank: ArrayLike<number>,
  ivc: number,
  ivo: number,
): number | null {
  const sig = new Periodic(valvePressure, crank);
  const k0 = Math.ceil(sig.index(ivc + RINGING_TRIM));
  let span = angleDiff(ivo - RINGING_TRIM, ivc + RINGING_TRIM);
  if (span <= 0) span += 720;
  const count = Math.floor(span / sig.step);
  if (count < 8) return null;
  let mean = 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (let j = 0; j <= count; j++) {
    const v = sig.at(k0 + j);
    mean += v;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  mean /= count + 1;
  const swing = (hi - lo) / 2;
  if (!(swing > 1e-5 * Math.abs(mean))) return null;
  const h = 0.15 * swing;
  const crossings: number[] = [];
  let state = 0; // +1 above mean + h, −1 below mean − h
  for (let j = 0; j <= count; j++) {
    const v = sig.at(k0 + j) - mean;
    const s = v > h ? 1 : v < -h ? -1 : 0;
    if (s !== 0 && state !== 0 && s !== state) {
      // find the actual crossing of the mean between the last opposite sample and here
      let m = j;
      while (m > 0 && Math.sign(sig.at(k0 + m - 1) - mean) === s) m--;
      const a = sig.at(k0 + m - 1) - mean;
      const b = sig.at(k0 + m) - mean;
      const frac = a !== b ? a / (a - b) : 0;
      crossings.push((m - 1 + frac) * sig.step);
    }
    if (s !== 0) state = s;
  }
  if (crossings.length < 3) return null;
  const first = crossings[0]!;
  const last = crossings[crossings.length - 1]!;
  return (2 * (last - first)) / (crossings.length - 1);
}

function fmtKpa(pa: number): string {
  const k = pa / 1000;
  const s = Math.abs(k) < 0.05 ? '0.0' : k.toFixed(1);
  return `${k > 0 && s !== '0.0' ? '+' : ''}${s} kPa`;
}

function fmtDeg(d: number): string {
  return `${Math.round(Math.abs(d))}°`;
}

/**
 * Pulse timing of one converged point. Pass the model when you have it: it
 * gives the open-end radius for the end correction and the ambient pressure;
 * without it δ = 0 and p_ref is the cycle mean of the trace's plenum pressure
 * (which is the ambient pressure when the runner draws from ambient).
 */
export function pulseTiming(result: PointResult, model?: EngineModel, options: PulseOptions = {}): PulseTiming {
  const minPeak = options.minPeakAmplitude ?? 0.003;
  const neutral = options.neutralBand ?? 0.02;
  const N = result.rpm;
  const L = result.runnerLength;
  const a = result.meanSoundSpeed;
  const { ivo, ivc } = result.events;
  const trace = result.trace;
  const sig = new Periodic(trace.valvePressure, trace.crank);

  // reference pressure
  let referencePressure: number;
  let referenceKind: PulseTiming['referenceKind'];
  if (model && model.inlet.kind === 'ambient') {
    referencePressure = model.ambient.pressure;
    referenceKind = 'ambient';
  } else {
    let s = 0;
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < trace.plenumPressure.length; i++) {
      const v = trace.plenumPressure[i] ?? 0;
      s += v;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    referencePressure = s / Math.max(1, trace.plenumPressure.length);
    // without a model, a constant upstream pressure can only be the ambient
    referenceKind = model || hi > lo ? 'plenum mean' : 'ambient';
  }

  // hand figures
  const openEnd = options.flanged ? 'flanged' : 'unflanged';
  const hand = model ? handQuarterWave(model, openEnd) : undefined;
  const f1 = hand ? hand.frequency : quarterWaveFrequency(a, L, endCorrection(0, openEnd));
  const quarterWaveSoundSpeed = hand ? hand.soundSpeed : a;
  const roundTripSeconds = (2 * L) / a;
  const roundTripDegrees = (12 * N * L) / a;
  const waveOrder = (f1 * 120) / N;

  // ringing period
  const measured = closedValveRingingPeriod(trace.valvePressure, trace.crank, ivc, ivo);
  const ringingPeriodDegrees = measured ?? (6 * N) / f1;
  const ringingFrequency = (6 * N) / ringingPeriodDegrees;

  const phaseAt = (theta: number): number => {
    const dp = sig.slopeAt(theta);
    const phi = (Math.atan2((-dp * ringingPeriodDegrees) / (2 * Math.PI), sig.valueAt(theta) - referencePressure) * 180) / Math.PI;
    return phi < 0 ? phi + 360 : phi;
  };
  const event = (theta: number, pressure: number): ValveEventPulse => ({
    crank: theta,
    pressure,
    pressureAboveReference: pressure - referencePressure,
    ringingPhase: phaseAt(theta),
  });
  const atIvo = event(ivo, Number.isFinite(result.valvePressureAtIvo) ? result.valvePressureAtIvo : sig.valueAt(ivo));
  const atIvc = event(ivc, Number.isFinite(result.valvePressureAtIvc) ? result.valvePressureAtIvc : sig.valueAt(ivc));

  // compression peaks around IVC
  const floor = referencePressure * (1 + minPeak);
  const toPeak = (p: { index: number; value: number }): PressurePeak => {
    const crank = sig.theta(p.index);
    return { crank, offsetFromIvc: angleDiff(crank, ivc), pressure: p.value, pressureAboveReference: p.value - referencePressure };
  };
  let openSpan = angleDiff(ivc, ivo);
  if (openSpan <= 0) openSpan += 720;
  const kIvc = Math.floor(sig.index(ivc) + 1e-9);
  let lastPeakBeforeIvc: PressurePeak | null = null;
  for (let j = 0; j * sig.step <= openSpan; j++) {
    const p = peakAt(sig, kIvc - j, floor);
    if (p) {
      const peak = toPeak(p);
      if (peak.offsetFromIvc <= 0.5 && peak.offsetFromIvc > -openSpan - 0.5) {
        lastPeakBeforeIvc = peak;
        break;
      }
    }
  }
  let peakAfterIvc: PressurePeak | null = null;
  const rising = sig.slopeAt(ivc) > 0;
  if (rising) {
    for (let j = 1; j * sig.step <= ringingPeriodDegrees / 2; j++) {
      const p = peakAt(sig, kIvc + j, floor);
      if (p) {
        const peak = toPeak(p);
        if (peak.offsetFromIvc > 0.5) {
          peakAfterIvc = peak;
          break;
        }
      }
    }
  }

  // verdict
  const dIvc = atIvc.pressureAboveReference;
  const effect: WaveEffect = dIvc > neutral * referencePressure ? 'helping' : dIvc < -neutral * referencePressure ? 'costing' : 'neutral';
  const atClose = `${fmtKpa(dIvc)} at closing`;
  const before = lastPeakBeforeIvc;
  let verdict: string;
  if (effect === 'helping') {
    if (peakAfterIvc && peakAfterIvc.offsetFromIvc <= LATE_DEGREES) {
      verdict = `compression wave peaks ${fmtDeg(peakAfterIvc.offsetFromIvc)} after the valve closes: the wave is helping, a little late (${atClose})`;
    } else if (peakAfterIvc) {
      verdict = `compression wave still rising as the valve closes (peaks ${fmtDeg(peakAfterIvc.offsetFromIvc)} after): the wave is helping, but arrives late (${atClose})`;
    } else if (before && Math.abs(before.offsetFromIvc) < 0.5) {
      verdict = `compression wave peaks as the valve closes: the wave is helping (${atClose})`;
    } else if (before) {
      verdict = `compression wave peaks ${fmtDeg(before.offsetFromIvc)} before the valve closes: the wave is helping (${atClose})`;
    } else {
      verdict = `the valve closes on raised pressure: the wave is helping (${atClose})`;
    }
  } else if (effect === 'costing') {
    verdict = `the valve closes on an expansion (${atClose}): the wave is costing charge`;
    if (before) verdict += `; the last compression peak (${fmtKpa(before.pressureAboveReference)}) came ${fmtDeg(before.offsetFromIvc)} before closing`;
  } else {
    verdict = `the valve closes near the ${referenceKind === 'ambient' ? 'ambient' : 'plenum'} pressure (${atClose}): the wave neither helps nor costs much at closing`;
    if (before) verdict += `; the last compression peak (${fmtKpa(before.pressureAboveReference)}) came ${fmtDeg(before.offsetFromIvc)} before closing`;
  }
  const dIvo = atIvo.pressureAboveReference;
  const ivoPhase = `ringing phase ${Math.round(atIvo.ringingPhase) % 360}°`;
  let openingNote: string;
  if (dIvo > neutral * referencePressure) {
    openingNote = `at opening the valve sees ${fmtKpa(dIvo)} (${ivoPhase}): a push that starts the fresh flow early`;
  } else if (dIvo < -neutral * referencePressure) {
    openingNote = `at opening the valve sees ${fmtKpa(dIvo)} (${ivoPhase}): low runner pressure invites reverse flow during overlap`;
  } else {
    openingNote = `at opening the valve sees ${fmtKpa(dIvo)} (${ivoPhase}): little effect`;
  }

  return {
    rpm: N,
    soundSpeed: a,
    runnerLength: L,
    roundTripSeconds,
    roundTripDegrees,
    quarterWaveFrequency: f1,
    quarterWaveSoundSpeed,
    waveOrder,
    ringingFrequency,
    ringingPeriodDegrees,
    ringingSource: measured !== null ? 'trace' : 'quarter-wave estimate',
    referencePressure,
    referenceKind,
    atIvo,
    atIvc,
    lastPeakBeforeIvc,
    peakAfterIvc,
    peakOffsetFromIvc: ((effect === 'helping' ? peakAfterIvc : null) ?? lastPeakBeforeIvc)?.offsetFromIvc ?? null,
    effect,
    verdict,
    openingNote,
  };
}
