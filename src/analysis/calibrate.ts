/**
 * Calibration: fit a few uncertain values of the model to a dyno sheet by
 * least squares, and say how well they are determined.
 *
 * Fitted values (each with the case key it is written back to):
 *   brakeEfficiency  estimate.brakeEfficiency  η_b of the torque/power estimate (scales them, no simulation)
 *   cdScale          intake.cdScale            multiplies the intake valve's Cd table
 *   friction         runner.friction           the runner's Fanning friction factor
 *
 * Residuals are relative, r_i = (y_i − m_i)/m_i for the model value y_i and
 * the measured m_i at each measured speed, so every speed counts alike;
 * the fit minimises S = Σ r_i² with the Levenberg–Marquardt method of the
 * `ml-levenberg-marquardt` package (forward-difference Jacobian), over
 * parameters scaled to order one (u = value/scale) and kept within bounds.
 * Each evaluation simulates every measured speed (sweep.ts, warm-started in
 * fixed chunks, cycles converged to CALIBRATION_TOLERANCE so the finite
 * differences see the parameters, not the convergence); η_b needs no
 * simulation, since torque and power are proportional to it.
 *
 * Uncertainty (the usual linearised estimate, e.g. Bates & Watts, Nonlinear
 * Regression Analysis and Its Applications, 1988, §2.3): with J the Jacobian
 * of the residuals at the optimum, n speeds and p fitted values,
 *   s² = S/(n − p),   Cov = s²·(JᵀJ)⁻¹,   se_k = √Cov_kk,
 *   95 % interval: value ± t(0.975, n − p)·se_k   (Student's t, student-t.ts).
 * It assumes independent errors of equal relative size at each speed and a
 * model that is nearly linear in the values over the interval; a value at
 * its bound, or n = p, gets no interval.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import type { EngineModel } from '../core/model.js';
import type { OutputAssumptions } from './estimates.js';
import type { DynoKind, DynoPoint } from './dyno.js';
import { runSweepSerial } from './sweep.js';
import { studentTQuantile } from './student-t.js';

export type FitName = 'brakeEfficiency' | 'cdScale' | 'friction';

export interface FitParameter {
  /** the case key the fitted value is written to */
  caseKey: string;
  /** typical size: the fit works on value/scale */
  scale: number;
  min: number;
  max: number;
  /** forward-difference step, in units of scale */
  step: number;
  /** does changing it need a simulation? */
  simulated: boolean;
  words: string;
}

export const FIT_PARAMETERS: Readonly<Record<FitName, FitParameter>> = {
  brakeEfficiency: { caseKey: 'estimate.brakeEfficiency', scale: 0.3, min: 0.05, max: 0.6, step: 1e-3, simulated: false, words: 'brake efficiency of the torque and power estimate' },
  cdScale: { caseKey: 'intake.cdScale', scale: 1, min: 0.3, max: 2, step: 1e-2, simulated: true, words: "multiplier of the intake valve's Cd table" },
  friction: { caseKey: 'runner.friction', scale: 0.005, min: 0, max: 0.05, step: 0.1, simulated: true, words: "the runner's Fanning friction factor" },
};

export const FIT_NAMES = Object.keys(FIT_PARAMETERS) as FitName[];

/** the cycle tolerance of the calibration's simulations (relative change of delivered mass) */
export const CALIBRATION_TOLERANCE = 1e-6;

export interface CalibrationInput {
  /** the model as loaded: its intake Cd table already carries `cdScale` */
  model: EngineModel;
  /** the case's intake.cdScale (1 when not given) */
  cdScale: number;
  assumptions: OutputAssumptions;
  measured: readonly DynoPoint[];
  /** which measured quantity to fit */
  quantity: DynoKind;
  fit: readonly FitName[];
  maxIterations?: number;
  /** called after each new simulation of the measured speeds */
  onEvaluation?: (evaluations: number) => void;
}

export interface FitUncertainty {
  standardError: number;
  low95: number;
  high95: number;
}

export interface CalibrationPoint {
  rpm: number;
  measured: number;
  model: number;
  /** model − measured (SI) */
  residual: number;
  /** (model − measured)/measured */
  relative: number;
}

export interface CalibrationResult {
  quantity: DynoKind;
  /** fitted values */
  fit: Partial<Record<FitName, number>>;
  /** the values the fit started from (the case's) */
  start: Partial<Record<FitName, number>>;
  /** null where no interval can be given (at a bound, or as many values as speeds) */
  uncertainty: Partial<Record<FitName, FitUncertainty | null>>;
  /** fitted values that ended at a bound */
  atBound: FitName[];
  points: CalibrationPoint[];
  residual: { rmsRelative: number; rms: number; startRmsRelative: number };
  /** the speeds the fit covers [rpm] */
  covers: { from: number; to: number };
  degreesOfFreedom: number;
  iterations: number;
  /** simulations of the measured speeds run */
  evaluations: number;
}

/** Why a fit cannot be asked for (bad input), or undefined. */
export function fitProblem(fit: readonly FitName[], quantity: DynoKind, speeds: number): string | undefined {
  if (fit.length === 0) return 'name at least one value to fit';
  if (quantity === 'volumetricEfficiency' && fit.includes('brakeEfficiency'))
    return 'brakeEfficiency cannot be fitted to a measured ηv (it only scales the torque and power estimate): fit cdScale or friction, or give a torque or power sheet';
  if (speeds < fit.length) return `${fit.length} values need at least ${fit.length} measured speeds, the sheet has ${speeds}`;
  return undefined;
}

/** The model with these values of the simulated parameters. */
export function modelWith(base: EngineModel, baseCdScale: number, values: Partial<Record<FitName, number>>): EngineModel {
  const cd = values.cdScale;
  const f = values.friction;
  return {
    ...base,
    intake: cd === undefined ? base.intake : { ...base.intake, cdTable: base.intake.cdTable.map((p) => ({ x: p.x, y: (p.y * cd) / baseCdScale })) },
    runner: f === undefined ? base.runner : { ...base.runner, friction: f },
    numerics: { ...base.numerics, tolerance: Math.min(base.numerics.tolerance, CALIBRATION_TOLERANCE), maxCycles: Math.max(base.numerics.maxCycles, 60) },
  };
}

/** 3×3 or smaller symmetric positive matrix inverse by Gauss–Jordan; null when singular */
function invert(a: number[][]): number[][] | null {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[piv]![c]!)) piv = r;
    if (!(Math.abs(m[piv]![c]!) > 1e-300)) return null;
    [m[c], m[piv]] = [m[piv]!, m[c]!];
    const d = m[c]![c]!;
    for (let k = 0; k < 2 * n; k++) m[c]![k]! /= d;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r]![c]!;
      if (f !== 0) for (let k = 0; k < 2 * n; k++) m[r]![k] = m[r]![k]! - f * m[c]![k]!;
    }
  }
  return m.map((row) => row.slice(n));
}

/** Fit the values to the measured points (see the file header). */
export function calibrate(input: CalibrationInput): CalibrationResult {
  const { quantity, fit } = input;
  const pts = input.measured.filter((m) => m[quantity] !== undefined).sort((a, b) => a.rpm - b.rpm);
  const rpms = pts.map((p) => p.rpm);
  const meas = pts.map((p) => p[quantity]!);
  const problem = fitProblem(fit, quantity, pts.length);
  if (problem) throw new Error(problem);
  const defs = fit.map((k) => FIT_PARAMETERS[k]);
  const start: Partial<Record<FitName, number>> = {};
  for (const k of fit)
    start[k] = k === 'brakeEfficiency' ? input.assumptions.brakeEfficiency : k === 'cdScale' ? input.cdScale : input.model.runner.friction;
  const valuesOf = (u: readonly number[]): Partial<Record<FitName, number>> => {
    const v: Partial<Record<FitName, number>> = {};
    fit.forEach((k, i) => (v[k] = u[i]! * FIT_PARAMETERS[k].scale));
    return v;
  };

  // simulations, cached by the simulated values (rounded far below the difference steps)
  const cache = new Map<string, number[]>();
  let evaluations = 0;
  const unitOutput = (v: Partial<Record<FitName, number>>): number[] => {
    const simKey = fit
      .filter((k) => FIT_PARAMETERS[k].simulated)
      .map((k) => `${k}=${(v[k]! / FIT_PARAMETERS[k].scale).toFixed(9)}`)
      .join(',');
    const hit = cache.get(simKey);
    if (hit) return hit;
    const rounded: Partial<Record<FitName, number>> = {};
    for (const k of fit) if (FIT_PARAMETERS[k].simulated) rounded[k] = Number((v[k]! / FIT_PARAMETERS[k].scale).toFixed(9)) * FIT_PARAMETERS[k].scale;
    const m = modelWith(input.model, input.cdScale, rounded);
    // torque and power at η_b = 1: the fitted η_b multiplies them
    const swept = runSweepSerial(m, rpms, { ...input.assumptions, brakeEfficiency: 1 });
    const out = swept.map((p) => (quantity === 'volumetricEfficiency' ? p.volumetricEfficiency : p[quantity]));
    cache.set(simKey, out);
    evaluations++;
    input.onEvaluation?.(evaluations);
    return out;
  };
  const predict = (v: Partial<Record<FitName, number>>): number[] => {
    const eta = quantity === 'volumetricEfficiency' ? 1 : (v.brakeEfficiency ?? input.assumptions.brakeEfficiency);
    return unitOutput(v).map((y) => y * eta);
  };
  const ratios = (u: readonly number[]): number[] => predict(valuesOf(u)).map((y, i) => y / meas[i]!);

  const u0 = defs.map((d, i) => Math.min(d.max, Math.max(d.min, start[fit[i]!]!)) / d.scale);
  const startRatios = ratios(u0);
  const lm = levenbergMarquardt(
    { x: pts.map((_, i) => i), y: pts.map(() => 1) },
    (u: number[]) => {
      const r = ratios(u);
      return (i: number) => r[i]!;
    },
    {
      initialValues: u0,
      minValues: defs.map((d) => d.min / d.scale),
      maxValues: defs.map((d) => d.max / d.scale),
      gradientDifference: defs.map((d) => d.step),
      damping: 1e-3,
      errorTolerance: 1e-14,
      maxIterations: input.maxIterations ?? 30,
    },
  );
  const u = lm.parameterValues;
  const fitted = valuesOf(u);
  const rFit = ratios(u).map((x) => x - 1);
  const S = rFit.reduce((s, r) => s + r * r, 0);
  const n = pts.length;
  const p = fit.length;
  const dof = n - p;

  // uncertainty from the Jacobian at the optimum
  const atBound: FitName[] = [];
  fit.forEach((k, i) => {
    const d = defs[i]!;
    if (Math.abs(u[i]! * d.scale - d.min) < 1e-9 * d.scale || Math.abs(u[i]! * d.scale - d.max) < 1e-9 * d.scale) atBound.push(k);
  });
  const uncertainty: Partial<Record<FitName, FitUncertainty | null>> = {};
  for (const k of fit) uncertainty[k] = null;
  if (dof >= 1) {
    const J: number[][] = fit.map((_, i) => {
      const h = defs[i]!.step;
      const uh = [...u];
      // step into the interval
      uh[i] = u[i]! + h <= defs[i]!.max / defs[i]!.scale ? u[i]! + h : u[i]! - h;
      const dh = uh[i]! - u[i]!;
      const rh = ratios(uh);
      return rh.map((x, j) => (x - 1 - rFit[j]!) / dh);
    });
    const JtJ = fit.map((_, a) => fit.map((_, b) => J[a]!.reduce((s, x, j) => s + x * J[b]![j]!, 0)));
    const inv = invert(JtJ);
    if (inv) {
      const s2 = S / dof;
      const t = studentTQuantile(0.975, dof);
      fit.forEach((k, i) => {
        if (atBound.includes(k)) return;
        const se = Math.sqrt(Math.max(0, s2 * inv[i]![i]!)) * defs[i]!.scale;
        const v = fitted[k]!;
        uncertainty[k] = { standardError: se, low95: v - t * se, high95: v + t * se };
      });
    }
  }
  const model = predict(fitted);
  const points: CalibrationPoint[] = pts.map((pt, i) => ({
    rpm: pt.rpm,
    measured: meas[i]!,
    model: model[i]!,
    residual: model[i]! - meas[i]!,
    relative: rFit[i]!,
  }));
  const rms = (xs: number[]) => Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / Math.max(1, xs.length));
  return {
    quantity,
    fit: fitted,
    start,
    uncertainty,
    atBound,
    points,
    residual: { rmsRelative: rms(rFit), rms: rms(points.map((q) => q.residual)), startRmsRelative: rms(startRatios.map((x) => x - 1)) },
    covers: { from: rpms[0]!, to: rpms[rpms.length - 1]! },
    degreesOfFreedom: dof,
    iterations: lm.iterations,
    evaluations,
  };
}
