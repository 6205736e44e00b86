/**
 * The options the commands share for measured data: a quantity with its unit
 * (`--diameter 35mm`), the dyno sheet of `--measured FILE` (or the case's
 * `measured` key), the pressure trace of `run --measured-trace FILE`.
 * Files named on the command line are read relative to the working
 * directory; files named in a case, relative to the case file (src/case).
 */
import { resolve } from 'node:path';
import { CaseError } from '../case/errors.js';
import { readDataFile } from '../case/csv.js';
import type { LoadedCase } from '../case/load.js';
import { parseMeasuredSheet, type MeasuredSheet } from '../case/measured.js';
import type { MeasuredTrace } from '../case/measured-files.js';
import { parsePressureTrace, traceByDegree } from '../case/pressure-trace.js';
import { parseQuantity, type QuantityKind } from '../case/units.js';
import type { OptionSpec, ParsedArgs } from './args.js';

export const MEASURED_OPTION: OptionSpec = {
  name: 'measured',
  type: 'string',
  value: 'FILE',
  description: "a dyno sheet (CSV: rpm and torque_Nm, torque_lbft, power_kW, power_hp or ve_pct) shown beside the model (default: the case's measured key)",
};

/** A dimensional option value in model units, or undefined when not given. */
export function quantityOption(args: ParsedArgs, name: string, kind: QuantityKind, opts: { positive?: boolean; nonNegative?: boolean } = {}): number | undefined {
  const text = args.string(name);
  if (text === undefined) return undefined;
  const r = parseQuantity(text, kind);
  if (!r.ok) throw new CaseError(`--${name}`, r.message, 'option');
  if (opts.positive && !(r.value > 0)) throw new CaseError(`--${name}`, `must be positive, got '${text}'`, 'option');
  if (opts.nonNegative && !(r.value >= 0)) throw new CaseError(`--${name}`, `must not be negative, got '${text}'`, 'option');
  return r.value;
}

/** Read a dyno sheet named on the command line (relative to `cwd`). */
export async function loadDynoSheet(file: string, cwd: string): Promise<MeasuredSheet> {
  return parseMeasuredSheet(await readDataFile(resolve(cwd, file), file), file);
}

/** The dyno sheet of --measured, else the case's `measured` key, else undefined. */
export async function dynoOf(args: ParsedArgs, loaded: LoadedCase, cwd: string): Promise<MeasuredSheet | undefined> {
  const file = args.string('measured');
  if (file !== undefined) return loadDynoSheet(file, cwd);
  return loaded.files.dyno;
}

/**
 * The pressure trace of --measured-trace (with --sensor-at and --tdc-offset),
 * else the case's `measuredTrace` key (the options override its sensorAt and
 * tdcOffset), else undefined.
 */
export async function traceOf(args: ParsedArgs, loaded: LoadedCase, cwd: string): Promise<MeasuredTrace | undefined> {
  const file = args.string('measured-trace');
  const sensorAt = quantityOption(args, 'sensor-at', 'length', { nonNegative: true });
  const tdcOffset = quantityOption(args, 'tdc-offset', 'angle');
  const own = loaded.files.trace;
  if (file === undefined && own === undefined) {
    if (sensorAt !== undefined) throw new CaseError('--sensor-at', 'only applies with --measured-trace FILE (or a case with measuredTrace)', 'option');
    if (tdcOffset !== undefined) throw new CaseError('--tdc-offset', 'only applies with --measured-trace FILE (or a case with measuredTrace)', 'option');
    return undefined;
  }
  const runnerLength = loaded.model.runner.sections.reduce((s, x) => s + x.length, 0);
  const at = sensorAt ?? own?.sensorAt ?? 0;
  if (!(at <= runnerLength))
    throw new CaseError(sensorAt !== undefined ? '--sensor-at' : 'measuredTrace.sensorAt', `must lie on the runner (at most its length ${(runnerLength * 1000).toFixed(1)} mm from the valve), got ${(at * 1000).toFixed(1)} mm`, 'option');
  const offset = tdcOffset ?? own?.tdcOffset ?? 0;
  const log = file !== undefined ? parsePressureTrace(await readDataFile(resolve(cwd, file), file), file) : own!.log;
  return { log, byDegree: traceByDegree(log, { ambient: loaded.model.ambient.pressure, tdcOffset: offset }), sensorAt: at, tdcOffset: offset };
}
