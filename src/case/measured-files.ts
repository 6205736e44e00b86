/**
 * The measured-data files a case names, read by the case loader (load.ts)
 * relative to the case file's folder:
 *
 *   intake.liftFile, exhaust.liftFile   lift logs (lift-file.ts)
 *   intake.flowFile, exhaust.flowFile   flow-bench sheets (flow-sheet.ts)
 *   measured                            a dyno sheet (measured.ts)
 *   measuredTrace.file                  a runner pressure trace (pressure-trace.ts)
 *
 * In two steps around the schema:
 *
 * 1. `prepareLiftLogs` (before validation): a valve with a liftFile takes its
 *    card events and maxLift from the log, so the rest of the loader sees an
 *    ordinary valve. The card is read where the valve lift (after lash)
 *    crosses the valve's checkingLift, or zero lift without one — the
 *    convention of a written card — and maxLift is the log's highest valve
 *    lift. The case must then not give opens, closes or maxLift itself.
 * 2. `attachCaseFiles` (after validation): the log's shape becomes the
 *    valve's liftTable (so the core's curve passes through every logged
 *    point, and widening a checking-lift card with it gives back the log's
 *    own zero-lift ends), a flow sheet becomes its cdTable (Cd on the
 *    curtain area against L/D, core/flow-bench.ts), and the dyno sheet and
 *    the pressure trace are read for the commands and views.
 *
 * Every problem is a CaseError naming the case key, or the file with its row
 * and column (exit 2).
 */
import { dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import type { BenchSetup } from '../core/flow-bench.js';
import { CaseError } from './errors.js';
import { readDataFileSync } from './csv.js';
import { BENCH_DEFAULTS, benchCdTable, parseFlowSheet, type FlowSheet } from './flow-sheet.js';
import { liftCrossings, liftProfile, parseLiftLog, type LiftLog, type LiftProfile } from './lift-file.js';
import { parseMeasuredSheet, type MeasuredSheet } from './measured.js';
import { parsePressureTrace, traceByDegree, type PressureTraceLog } from './pressure-trace.js';
import type { Case } from './schema.js';
import { thetaToCard, wrap720 } from './to-model.js';
import { parseQuantity } from './units.js';

export type ValveSide = 'intake' | 'exhaust';

export interface ValveFiles {
  lift?: { log: LiftLog; profile: LiftProfile };
  flow?: { sheet: FlowSheet; setup: BenchSetup };
}

/** A pressure trace ready to compare: one absolute pressure per crank degree. */
export interface MeasuredTrace {
  log: PressureTraceLog;
  /** [Pa], θ = 0..719 */
  byDegree: Float64Array;
  /** the transducer's distance from the valve along the runner [m] */
  sensorAt: number;
  /** added to the logged angles [deg] */
  tdcOffset: number;
}

export interface CaseFiles {
  intake: ValveFiles;
  exhaust: ValveFiles;
  /** the dyno sheet of the case key `measured` */
  dyno?: MeasuredSheet;
  /** the trace of the case key `measuredTrace` */
  trace?: MeasuredTrace;
}

/**
 * Where a file named in a case is: `full` to read (relative to the case
 * file's folder, the case file relative to `cwd`), `shown` as the user would
 * type it from where they are.
 */
export function caseRelative(caseFile: string, name: string, cwd?: string): { full: string; shown: string } {
  if (isAbsolute(name)) return { full: name, shown: name };
  const dir = caseFile ? dirname(caseFile) : '.';
  return { full: resolve(cwd ?? process.cwd(), dir, name), shown: dir === '.' ? name : join(dir, name) };
}

function readNamed(caseFile: string, name: string, key: string, cwd: string | undefined): { text: string; shown: string } {
  const { full, shown } = caseRelative(caseFile, name, cwd);
  return { text: readDataFileSync(full, shown, key), shown };
}

function lengthOf(raw: unknown, path: string): number | undefined {
  if (raw === undefined) return undefined;
  const r = parseQuantity(raw, 'length');
  if (!r.ok) throw new CaseError(path, r.message);
  return r.value;
}

const mmText = (m: number) => `${Number((m * 1000).toPrecision(6))} mm`;

/** The card of a valve from its log: at the checking lift when given, else at zero lift. */
function cardOf(side: ValveSide, log: LiftLog, checkingLift: number | undefined): { opens: number; closes: number } {
  const at = checkingLift !== undefined && checkingLift > 0 ? liftCrossings(log, checkingLift) : liftCrossings(log, 0);
  if (!at) throw new CaseError(`${side}.checkingLift`, `is above the highest valve lift of the log ${log.file} (${mmText(liftProfile(log).maxLift)})`);
  const o = wrap720(at.open);
  const c = wrap720(at.close);
  return side === 'intake'
    ? { opens: thetaToCard.intakeOpens(o), closes: thetaToCard.intakeCloses(c) }
    : { opens: thetaToCard.exhaustOpens(o), closes: thetaToCard.exhaustCloses(c) };
}

/**
 * Step 1: read the lift logs of raw case data (after --set) and return a copy
 * in which each such valve has its card and maxLift from its log.
 */
export function prepareLiftLogs(
  data: Record<string, unknown>,
  caseFile: string,
  cwd?: string,
): { data: Record<string, unknown>; logs: Partial<Record<ValveSide, LiftLog>> } {
  const logs: Partial<Record<ValveSide, LiftLog>> = {};
  let out = data;
  for (const side of ['intake', 'exhaust'] as const) {
    const raw = data[side];
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) continue;
    const v = raw as Record<string, unknown>;
    if (v.liftFile === undefined) continue;
    if (typeof v.liftFile !== 'string' || v.liftFile.trim() === '')
      throw new CaseError(`${side}.liftFile`, `expected a file name (a CSV lift log, relative to the case file), got ${JSON.stringify(v.liftFile)}`);
    for (const k of ['opens', 'closes', 'maxLift'] as const)
      if (v[k] !== undefined) throw new CaseError(`${side}.${k}`, `not used with ${side}.liftFile: the lift log gives the events and the lift; remove ${k}`);
    const lash = lengthOf(v.lash, `${side}.lash`) ?? 0;
    if (!(lash >= 0)) throw new CaseError(`${side}.lash`, `must not be negative, got ${mmText(lash)}`);
    const checking = lengthOf(v.checkingLift, `${side}.checkingLift`);
    const { text, shown } = readNamed(caseFile, v.liftFile, `${side}.liftFile`, cwd);
    const log = parseLiftLog(text, shown, lash);
    logs[side] = log;
    const card = cardOf(side, log, checking);
    if (out === data) out = { ...data };
    out[side] = { ...v, ...card, maxLift: liftProfile(log).maxLift };
  }
  return { data: out, logs };
}

/** Step 2: the validated case with its files' tables in, and the files read. */
export function attachCaseFiles(c: Case, logs: Partial<Record<ValveSide, LiftLog>>, caseFile: string, cwd?: string): { case: Case; files: CaseFiles } {
  const files: CaseFiles = { intake: {}, exhaust: {} };
  let out: Case = c;
  for (const side of ['intake', 'exhaust'] as const) {
    const v = c[side];
    let next: Case[typeof side] = v;
    const log = logs[side];
    if (log) {
      const profile = liftProfile(log);
      files[side].lift = { log, profile };
      next = { ...next, liftTable: profile.table };
    }
    if (v.flowFile !== undefined) {
      const { text, shown } = readNamed(caseFile, v.flowFile, `${side}.flowFile`, cwd);
      const sheet = parseFlowSheet(text, shown);
      const setup: BenchSetup = { diameter: v.flowDiameter ?? v.diameter, valves: v.valves, ...BENCH_DEFAULTS, testPressure: v.flowTestPressure ?? 0 };
      files[side].flow = { sheet, setup };
      next = { ...next, cdTable: benchCdTable(sheet, setup) };
    }
    if (next !== v) out = { ...out, [side]: next };
  }
  if (c.measured !== undefined) {
    const { text, shown } = readNamed(caseFile, c.measured, 'measured', cwd);
    files.dyno = parseMeasuredSheet(text, shown);
  }
  if (c.measuredTrace) {
    const t = c.measuredTrace;
    const { text, shown } = readNamed(caseFile, t.file, 'measuredTrace.file', cwd);
    const log = parsePressureTrace(text, shown);
    const length = c.runner.sections.reduce((s, x) => s + x.length, 0);
    if (!(t.sensorAt <= length)) throw new CaseError('measuredTrace.sensorAt', `must lie on the runner (at most its length ${mmText(length)} from the valve), got ${mmText(t.sensorAt)}`);
    files.trace = { log, byDegree: traceByDegree(log, { ambient: c.ambient.pressure, tdcOffset: t.tdcOffset }), sensorAt: t.sensorAt, tdcOffset: t.tdcOffset };
  }
  return { case: out, files };
}

/** The case keys that name files (read relative to the case file). */
export const CASE_FILE_KEYS: readonly (readonly string[])[] = [
  ['intake', 'liftFile'],
  ['intake', 'flowFile'],
  ['exhaust', 'liftFile'],
  ['exhaust', 'flowFile'],
  ['measured'],
  ['measuredTrace', 'file'],
];

/**
 * The file keys of raw case data whose relative paths must change when the
 * case is written to `toCaseFile` instead of `fromCaseFile` (so they still
 * name the same files), with their new values.
 */
export function movedFileKeys(data: Record<string, unknown>, fromCaseFile: string, toCaseFile: string): { path: string[]; value: string }[] {
  const from = dirname(resolve(fromCaseFile));
  const to = dirname(resolve(toCaseFile));
  if (from === to) return [];
  const out: { path: string[]; value: string }[] = [];
  for (const path of CASE_FILE_KEYS) {
    let v: unknown = data;
    for (const k of path) v = v !== null && typeof v === 'object' ? (v as Record<string, unknown>)[k] : undefined;
    if (typeof v !== 'string' || v.trim() === '' || isAbsolute(v)) continue;
    const moved = relative(to, resolve(from, v)) || '.';
    if (moved !== v) out.push({ path: [...path], value: moved.split(sep).join('/') });
  }
  return out;
}
