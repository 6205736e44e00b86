/**
 * What a report shows, computed with the very functions the text commands
 * use, so its numbers are theirs:
 *
 *   the speed curve      runSweeps (analysis/worker-pool.ts, as `sweep`),
 *                        summariseSweep and caseEstimates (as `sweep --json`);
 *   each operating point simulatePoint + pulseTiming on the model at that
 *                        speed, started from rest (as `run --rpm N --json`).
 *
 * The operating points are the best speed of the sweep and each speed asked
 * for. No files and no clock here: the caller loads the cases and passes the
 * date and version in the report's metadata (see html.ts).
 */
import { simulatePoint } from '../core/engine.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { caseEstimates, type CaseEstimates, type OutputAssumptions } from '../analysis/estimates.js';
import { pulseTiming, type PulseTiming } from '../analysis/pulse.js';
import { summariseSweep, type SweepPoint, type SweepSummary } from '../analysis/sweep.js';
import { runSweeps } from '../analysis/worker-pool.js';
import type { Case } from '../case/schema.js';
import type { MeasuredSheet } from '../case/measured.js';

/** One design as the report needs it: its validated case (SI) and its core model. */
export interface ReportDesign {
  name: string;
  /** the case file as the user named it ('' when none) */
  file: string;
  case: Case;
  model: EngineModel;
}

export interface ReportRequest {
  design: ReportDesign;
  /** the speeds of the curve, ascending [rpm] */
  rpms: readonly number[];
  /** the band of the figure of merit, inside the speeds [rpm] */
  band: { from: number; to: number };
  /** further operating points to show besides the best speed [rpm] */
  at?: readonly number[];
  assumptions: OutputAssumptions;
  /** a second design swept over the same speeds */
  compare?: ReportDesign;
  measured?: MeasuredSheet;
  /** worker threads for the sweeps (default: the cores) */
  jobs?: number;
  onProgress?: (done: number, total: number, rpm: number) => void;
}

export interface SpeedCurve {
  points: SweepPoint[];
  summary: SweepSummary;
}

export interface OperatingPoint {
  rpm: number;
  /** why it is shown */
  reason: 'best' | 'asked';
  result: PointResult;
  pulse: PulseTiming;
}

export interface ReportData {
  design: ReportDesign;
  rpms: number[];
  band: { from: number; to: number };
  assumptions: OutputAssumptions;
  curve: SpeedCurve;
  /** the hand estimates over the swept range, as `sweep --json` gives them */
  estimates: CaseEstimates;
  compare?: { design: ReportDesign; curve: SpeedCurve } | undefined;
  measured?: MeasuredSheet | undefined;
  points: OperatingPoint[];
}

/** One operating point exactly as `run` computes it. */
export function simulateOperatingPoint(model: EngineModel, rpm: number, reason: OperatingPoint['reason']): OperatingPoint {
  const m: EngineModel = { ...model, rpm };
  const { result } = simulatePoint(m);
  return { rpm, reason, result, pulse: pulseTiming(result, m) };
}

/** The speeds of the operating points: the best speed first, then those asked for, each once. */
export function operatingSpeeds(best: number, at: readonly number[]): { rpm: number; reason: OperatingPoint['reason'] }[] {
  const out: { rpm: number; reason: OperatingPoint['reason'] }[] = [];
  if (Number.isFinite(best)) out.push({ rpm: best, reason: 'best' });
  for (const rpm of at) if (!out.some((o) => o.rpm === rpm)) out.push({ rpm, reason: 'asked' });
  return out;
}

/** Run everything a report shows. */
export async function gatherReport(req: ReportRequest): Promise<ReportData> {
  const rpms = [...req.rpms];
  const tasks = [{ model: req.design.model, rpms }, ...(req.compare ? [{ model: req.compare.model, rpms }] : [])];
  const curves = await runSweeps(tasks, {
    assumptions: req.assumptions,
    ...(req.jobs !== undefined ? { jobs: req.jobs } : {}),
    ...(req.onProgress ? { onProgress: req.onProgress } : {}),
  });
  const mainPoints = curves[0] ?? [];
  const curve: SpeedCurve = { points: mainPoints, summary: summariseSweep(mainPoints, req.band) };
  const estimates = caseEstimates(req.design.model, rpms[0]!, rpms[rpms.length - 1]!);
  const compare =
    req.compare && curves[1] ? { design: req.compare, curve: { points: curves[1], summary: summariseSweep(curves[1], req.band) } } : undefined;
  const points = operatingSpeeds(curve.summary.bestRpm, req.at ?? []).map((o) => simulateOperatingPoint(req.design.model, o.rpm, o.reason));
  return {
    design: req.design,
    rpms,
    band: { ...req.band },
    assumptions: req.assumptions,
    curve,
    estimates,
    compare,
    measured: req.measured,
    points,
  };
}
