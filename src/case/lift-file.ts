/**
 * A measured cam lift log (`intake.liftFile`, `exhaust.liftFile`), as taken
 * with a degree wheel and a dial gauge: CSV with a header row,
 *
 *   crank_deg | cam_deg      the angle; cam degrees are doubled to crank degrees
 *   lift_mm   | lift_in      the lift as logged
 *
 * Angles are crank degrees θ from the TDC at the start of the intake stroke
 * (gas-exchange TDC, 0 = that TDC, negative before it), increasing down the
 * file, any range within one cycle: an intake lobe is typically logged from
 * about −40° to +260°, an exhaust lobe from about −280° to +40° (or
 * +440° to +760°); the model wraps them into 0..720. Cam degrees are counted
 * from the same TDC (cam angle = crank angle / 2).
 *
 * Lash: the valve lift is the logged lift less the running clearance `lash`
 * (logged at the cam follower with no clearance), so the valve opens where the
 * log passes the lash and closes where it falls back to it (linear
 * interpolation between logged rows). The log must start and end on the base
 * circle (at or below the lash), so that both events lie inside it.
 *
 * What the model takes from the log (`liftProfile`): the zero-lift events
 * θo, θc (where the log crosses the lash), the maximum valve lift, and the
 * shape as a lift table of (φ, L/Lmax) with φ = (θ − θo)/(θc − θo): the
 * core's lift curve passes through every logged point.
 *
 * All lengths in m, angles in crank degrees.
 */
import { CaseError } from './errors.js';
import { cellError, parseTable, requireIncreasing } from './csv.js';

export interface LiftLog {
  /** the file as the user named it */
  file: string;
  /** angle of each row, crank degrees θ as in the file (not wrapped), increasing */
  crank: number[];
  /** lift as logged [m] */
  logged: number[];
  /** the row number of each point in the file */
  rows: number[];
  /** running clearance subtracted [m] */
  lash: number;
  /** the column names used */
  columns: { angle: string; lift: string };
}

/** The valve lift of a log: zero-lift events, maximum, and the shape the core follows. */
export interface LiftProfile {
  /** θ where the valve leaves its seat and where it closes [deg, unwrapped as in the file] */
  open: number;
  close: number;
  /** θ − θo of the peak [deg] and the peak valve lift [m] */
  peakAt: number;
  maxLift: number;
  /** lift table for the core: x = (θ − θo)/(θc − θo), y = L/Lmax */
  table: { x: number; y: number }[];
}

const ANGLE = { crank_deg: (v: number) => v, cam_deg: (v: number) => 2 * v } as const;
const LIFT = { lift_mm: (v: number) => v / 1000, lift_in: (v: number) => v * 0.0254 } as const;

/** Parse a lift log; `lash` [m] is subtracted to give the valve lift. */
export function parseLiftLog(text: string, file: string, lash = 0): LiftLog {
  const t = parseTable(text, file, 'lift log', [
    { key: 'angle', names: ANGLE, nonNegative: false },
    { key: 'lift', names: LIFT },
  ]);
  requireIncreasing(t, 'angle', 'the angle must increase down the file');
  const angleCol = t.columns['angle']!;
  const liftCol = t.columns['lift']!;
  if (t.rows.length < 3) throw new CaseError(file, `the lift log has ${t.rows.length} data rows; it needs at least 3 (base circle, lobe, base circle)`, 'file');
  const crank = t.rows.map((r) => r.values['angle']!);
  const logged = t.rows.map((r) => r.values['lift']!);
  const rows = t.rows.map((r) => r.row);
  const last = t.rows[t.rows.length - 1]!;
  const span = crank[crank.length - 1]! - crank[0]!;
  if (!(span < 720)) throw cellError(file, last.row, angleCol, `the log spans ${Number(span.toPrecision(6))} crank degrees; one lobe lies within one cycle (720°)`);
  const mm = (m: number) => `${Number((m * 1000).toPrecision(6))} mm`;
  const base = lash > 0 ? `at or below the lash ${mm(lash)}` : 'zero lift';
  if (logged[0]! > lash)
    throw cellError(file, rows[0]!, liftCol, `the log must start on the base circle (${base}), got ${mm(logged[0]!)}: log the whole lobe`);
  if (logged[logged.length - 1]! > lash)
    throw cellError(file, last.row, liftCol, `the log must end on the base circle (${base}), got ${mm(logged[logged.length - 1]!)}: log the whole lobe`);
  if (!logged.some((v) => v > lash))
    throw cellError(file, t.headerRow, liftCol, `the valve never lifts: every logged lift is at or below the lash (${mm(lash)})`);
  return { file, crank, logged, rows, lash, columns: { angle: angleCol, lift: liftCol } };
}

/** θ where the valve lift (logged − lash) first rises above `h` [m] and last falls back to it; undefined when it never exceeds h. */
export function liftCrossings(log: LiftLog, h: number): { open: number; close: number } | undefined {
  const level = log.lash + h;
  const { crank, logged } = log;
  const first = logged.findIndex((v) => v > level);
  if (first <= 0) return undefined;
  let lastIdx = first;
  for (let i = first; i < logged.length; i++) if (logged[i]! > level) lastIdx = i;
  if (lastIdx >= logged.length - 1) return undefined;
  const cross = (a: number, b: number): number => {
    const la = logged[a]!;
    const lb = logged[b]!;
    const f = lb !== la ? (level - la) / (lb - la) : 0;
    return crank[a]! + f * (crank[b]! - crank[a]!);
  };
  return { open: cross(first - 1, first), close: cross(lastIdx, lastIdx + 1) };
}

/** The valve lift the model takes from a log (see the file header). */
export function liftProfile(log: LiftLog): LiftProfile {
  const ends = liftCrossings(log, 0);
  // parseLiftLog guarantees the lobe lies inside the log
  if (!ends) throw new CaseError(log.file, 'the valve never lifts', 'file');
  const { open, close } = ends;
  const pts: { theta: number; lift: number }[] = [{ theta: open, lift: 0 }];
  log.crank.forEach((theta, i) => {
    if (theta > open && theta < close) pts.push({ theta, lift: Math.max(0, log.logged[i]! - log.lash) });
  });
  pts.push({ theta: close, lift: 0 });
  let peak = pts[0]!;
  for (const p of pts) if (p.lift > peak.lift) peak = p;
  const D = close - open;
  return {
    open,
    close,
    peakAt: peak.theta - open,
    maxLift: peak.lift,
    table: pts.map((p) => ({ x: (p.theta - open) / D, y: p.lift / peak.lift })),
  };
}

/** The logged valve lift (after lash) [m] at each whole crank degree θ = 0..719, linear between rows; NaN where the log does not reach. */
export function liftByDegree(log: LiftLog): Float64Array {
  const out = new Float64Array(720).fill(Number.NaN);
  const { crank, logged } = log;
  const first = crank[0]!;
  const last = crank[crank.length - 1]!;
  let k = 0;
  for (let a = Math.ceil(first); a <= last; a++) {
    while (k < crank.length - 2 && crank[k + 1]! < a) k++;
    const t0 = crank[k]!;
    const t1 = crank[k + 1]!;
    const f = t1 > t0 ? (a - t0) / (t1 - t0) : 0;
    const v = logged[k]! + f * (logged[k + 1]! - logged[k]!);
    out[((a % 720) + 720) % 720] = Math.max(0, v - log.lash);
  }
  return out;
}
