/**
 * Hand formulas shown beside the simulation, so a user sees where simple
 * rules agree with it and where they do not. All SI: lengths [m], volumes
 * [m³], areas [m²], sound speed a [m/s], frequencies [Hz], speeds N [rpm].
 *
 * Quarter-wave runner (closed at the valve, open at the upstream end):
 *   f₁ = a / (4 (L + δ))                       Kinsler et al., Fundamentals of Acoustics
 *   δ = 0.6133 r unflanged open end            Levine & Schwinger, Phys. Rev. 73 (1948)
 *   δ ≈ 0.8216 r flanged open end              Norris & Sheng, J. Sound Vib. 135 (1989) (from memory)
 * (the same table the simulation extends its open ends by: core/network/end-correction.ts)
 *
 * Tuned speeds, the convention used here: the wave order k is the number of
 * quarter-wave periods in one four-stroke cycle (720°), k = f₁·120/N, so the
 * speed at which order k falls is N_k = 120·f₁/k. Higher orders fall at lower
 * speeds and ram less, since the wave has decayed over more trips.
 *
 * Helmholtz intake estimate (runner + cylinder as a resonator):
 *   f = (a/2π)·√(A/(L·V_eff)),  V_eff = (V_d/2)·(r_c+1)/(r_c−1),
 *   peak near N ≈ 60·f/2 = 30·f                Engelman, ASME 73-WA/DGP-2 (1973) (form and constants from memory)
 *
 * Plenum as a Helmholtz resonator (volume V, neck area S, effective neck
 * length L′ = L + end corrections):
 *   f = (a/2π)·√(S/(V·L′))                     Kinsler et al. (section from memory)
 *
 * Brake torque and power — an ESTIMATE, not a simulation result: the air
 * the simulation delivers, burnt at an assumed air–fuel ratio with an assumed
 * brake thermal efficiency, four-stroke (one intake event per two turns):
 *   m_air = ηv · ρ_a · V_d          air per cycle [kg]
 *   W_b   = m_air / AFR · Q_LHV · η_b   brake work per cycle [J]
 *   T     = W_b / (4π)              [N·m]
 *   P     = T · 2πN/60              [W]
 * Defaults: AFR 12.8 (rich best-power petrol mixture), Q_LHV 44 MJ/kg
 * (petrol), η_b 0.28 — all common practice, to be replaced by the user's.
 */
import type { EngineModel } from '../core/model.js';
import { soundSpeed } from '../core/gas.js';
import { endCorrection as coreEndCorrection } from '../core/network/end-correction.js';

export type OpenEndKind = 'unflanged' | 'flanged';

/** open-end correction coefficients δ/r (the core's own, so estimates and simulation agree) */
export { END_CORRECTION } from '../core/network/end-correction.js';
import { END_CORRECTION } from '../core/network/end-correction.js';

/** open-end correction δ [m] of a pipe of radius r [m] */
export function endCorrection(radius: number, kind: OpenEndKind = 'unflanged'): number {
  return END_CORRECTION[kind] * radius;
}

/** quarter-wave frequency f₁ = a/(4(L+δ)) [Hz] of a closed–open pipe */
export function quarterWaveFrequency(soundSpeed: number, length: number, correction = 0): number {
  return soundSpeed / (4 * (length + correction));
}

/** the wave order k = f₁·120/N [-] at speed N [rpm] */
export function waveOrder(frequency: number, rpm: number): number {
  return (frequency * 120) / rpm;
}

/** The quarter-wave hand figure of a runner: the one source for run, check, sweep and the view. */
export interface HandQuarterWave {
  /** the sound speed used, √(γRT) at the ambient temperature [m/s] */
  soundSpeed: number;
  /** the temperature it is taken at: the ambient air's [K] */
  temperature: number;
  /** total runner length [m] */
  length: number;
  /** open-end correction δ [m] */
  endCorrection: number;
  /** f₁ = a/(4(L+δ)) [Hz] */
  frequency: number;
}

/**
 * The quarter-wave figure of the model's runner, with a at the ambient
 * temperature (the air the runner draws; the simulated runner gas is warmer
 * or cooler over the cycle, which is one of the things the simulation adds).
 */
export function handQuarterWave(model: Pick<EngineModel, 'ambient' | 'runner'>, openEnd: OpenEndKind = 'unflanged'): HandQuarterWave {
  const a = soundSpeed(model.ambient.temperature);
  const sections = model.runner.sections;
  const length = sections.reduce((s, x) => s + x.length, 0);
  const delta = endCorrection((sections[0]?.diameterStart ?? 0) / 2, openEnd);
  return { soundSpeed: a, temperature: model.ambient.temperature, length, endCorrection: delta, frequency: quarterWaveFrequency(a, length, delta) };
}

export interface TunedSpeed {
  /** wave order k: quarter-wave periods per 720° cycle */
  order: number;
  /** N_k = 120·f₁/k [rpm] */
  rpm: number;
}

/** tuned speeds N_k = 120·f/k [rpm] for the given orders */
export function tunedSpeeds(frequency: number, orders: readonly number[]): TunedSpeed[] {
  return orders.map((order) => ({ order, rpm: (120 * frequency) / order }));
}

/** the whole-number orders whose tuned speed falls in [lo, hi] rpm, lowest order first (at most `max`) */
export function tunedSpeedsInRange(frequency: number, lo: number, hi: number, max = 6): TunedSpeed[] {
  const out: TunedSpeed[] = [];
  const kMin = Math.max(1, Math.ceil((120 * frequency) / hi - 1e-9));
  const kMax = Math.floor((120 * frequency) / lo + 1e-9);
  for (let k = kMin; k <= kMax && out.length < max; k++) out.push({ order: k, rpm: (120 * frequency) / k });
  return out;
}

/** effective cylinder volume of the Engelman estimate V_eff = (V_d/2)(r_c+1)/(r_c−1) [m³] */
export function engelmanVolume(sweptVolume: number, compressionRatio: number): number {
  return ((sweptVolume / 2) * (compressionRatio + 1)) / (compressionRatio - 1);
}

export interface HelmholtzIntake {
  /** resonant frequency [Hz] */
  frequency: number;
  /** speed of the estimated peak, 60·f/2 [rpm] */
  peakRpm: number;
  /** the effective volume used [m³] */
  effectiveVolume: number;
}

/**
 * The intake as a Helmholtz resonator: the runner is the neck (area A,
 * length L), the cylinder volume at mid-stroke V_eff the volume (Engelman's
 * form, recalled from memory; the resonator formula itself is Kinsler et al.'s)
 */
export function helmholtzIntake(
  soundSpeed: number,
  runnerArea: number,
  runnerLength: number,
  sweptVolume: number,
  compressionRatio: number,
): HelmholtzIntake {
  const effectiveVolume = engelmanVolume(sweptVolume, compressionRatio);
  const frequency = (soundSpeed / (2 * Math.PI)) * Math.sqrt(runnerArea / (runnerLength * effectiveVolume));
  return { frequency, peakRpm: (60 * frequency) / 2, effectiveVolume };
}

/** Helmholtz resonator f = (a/2π)·√(S/(V·L′)) [Hz]; L′ is the effective neck length [m] */
export function helmholtzResonator(soundSpeed: number, neckArea: number, volume: number, effectiveNeckLength: number): number {
  return (soundSpeed / (2 * Math.PI)) * Math.sqrt(neckArea / (volume * effectiveNeckLength));
}

export interface OutputAssumptions {
  /** air–fuel ratio by mass [-] */
  airFuelRatio: number;
  /** fuel lower heating value [J/kg] */
  fuelHeatingValue: number;
  /** assumed brake thermal efficiency [-] */
  brakeEfficiency: number;
}

export const DEFAULT_OUTPUT_ASSUMPTIONS: Readonly<OutputAssumptions> = {
  airFuelRatio: 12.8,
  fuelHeatingValue: 44e6,
  brakeEfficiency: 0.28,
};

export interface OutputEstimate {
  /** estimated brake torque [N·m] */
  torque: number;
  /** estimated brake power [W] */
  power: number;
}

/**
 * Estimated brake torque and power of a four-stroke from ηv (an estimate:
 * the burn is not simulated). `referenceMass` = ambient density × swept
 * volume [kg], as in the core's PointResult.
 */
export function outputEstimate(
  volumetricEfficiency: number,
  referenceMass: number,
  rpm: number,
  assumptions: Partial<OutputAssumptions> = {},
): OutputEstimate {
  const { airFuelRatio, fuelHeatingValue, brakeEfficiency } = { ...DEFAULT_OUTPUT_ASSUMPTIONS, ...assumptions };
  const work = ((volumetricEfficiency * referenceMass) / airFuelRatio) * fuelHeatingValue * brakeEfficiency;
  const torque = work / (4 * Math.PI);
  return { torque, power: (torque * 2 * Math.PI * rpm) / 60 };
}

/**
 * What the plenum's feed offers the air that rings through it: the effective
 * neck length over area L′/S [1/m]. An orifice of radius r: L′ = 1.7·r (two
 * flanged sides, Kinsler et al.); a snorkel: ∫dx/A over its sections plus the
 * unflanged end corrections of its two open ends over their areas (the same
 * corrections the simulation extends the snorkel by, core/network/end-correction.ts).
 */
export function feedInertance(inlet: Extract<EngineModel['inlet'], { kind: 'plenum' }>): number {
  if (inlet.snorkel) {
    const secs = inlet.snorkel.sections;
    const d0 = secs[0]!.diameterStart;
    const d1 = secs[secs.length - 1]!.diameterEnd;
    const end = (d: number) => coreEndCorrection('unflanged', d) / ((Math.PI / 4) * d * d);
    return runnerLengthOverArea(secs) + end(d0) + end(d1);
  }
  const r = (inlet.feedDiameter ?? 0) / 2;
  return (1.7 * r) / (Math.PI * r * r);
}

/** ∫dx/A over the runner sections [1/m] (exact for cones: L/(π r₁ r₂)); the neck inertance per unit density */
export function runnerLengthOverArea(sections: readonly { length: number; diameterStart: number; diameterEnd: number }[]): number {
  let s = 0;
  for (const sec of sections) s += sec.length / ((Math.PI * sec.diameterStart * sec.diameterEnd) / 4);
  return s;
}

export interface CaseEstimates {
  /** sound speed used, √(γRT) at the ambient temperature [m/s] */
  soundSpeed: number;
  /** total runner length [m] */
  runnerLength: number;
  /** open-end correction δ [m] */
  endCorrection: number;
  openEnd: OpenEndKind;
  /** a/(4(L+δ)) [Hz] */
  quarterWaveFrequency: number;
  /** tuned speeds of the whole orders that fall in the speed range */
  tunedSpeeds: TunedSpeed[];
  /** Engelman Helmholtz estimate (form and constants from memory) */
  helmholtz: HelmholtzIntake;
  /** the plenum resonating through its feed (an orifice: L′ = 1.7 r), when there is a plenum [Hz] */
  plenumFrequency: number | null;
}

/** the hand estimates of a model, tuned speeds listed for the orders that fall in [lo, hi] rpm */
export function caseEstimates(
  model: EngineModel,
  lo: number,
  hi: number,
  openEnd: OpenEndKind = 'unflanged',
): CaseEstimates {
  const hand = handQuarterWave(model, openEnd);
  const a = hand.soundSpeed;
  const sections = model.runner.sections;
  const length = hand.length;
  const delta = hand.endCorrection;
  const f1 = hand.frequency;
  const swept = (Math.PI / 4) * model.engine.bore * model.engine.bore * model.engine.stroke;
  const lOverA = runnerLengthOverArea(sections);
  const helmholtz = helmholtzIntake(a, 1 / lOverA, 1, swept, model.engine.compressionRatio);
  let plenumFrequency: number | null = null;
  if (model.inlet.kind === 'plenum') plenumFrequency = (a / (2 * Math.PI)) * Math.sqrt(1 / (model.inlet.volume * feedInertance(model.inlet)));
  return {
    soundSpeed: a,
    runnerLength: length,
    endCorrection: delta,
    openEnd,
    quarterWaveFrequency: f1,
    tunedSpeeds: tunedSpeedsInRange(f1, lo, hi),
    helmholtz,
    plenumFrequency,
  };
}
