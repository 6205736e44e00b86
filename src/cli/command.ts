/**
 * The shape of a command, and the options shared by commands that read an
 * engine case. Add a command: write src/cli/commands/<name>.ts exporting a
 * `Command`, and list it in src/cli/commands/index.ts.
 *
 * A command writes only through `io`, returns its exit code (0 ok, 2 bad
 * input, 1 internal failure) and may throw: main.ts turns a CaseError into
 * `error: <path>: <message>` with exit 2, a SimulationError into exit 1.
 */
import type { CliIo } from './io.js';
import type { OptionSpec, ParsedArgs } from './args.js';
import { CaseError } from '../case/errors.js';
import { loadCase, type LoadedCase } from '../case/load.js';
import { parseQuantity } from '../case/units.js';
import { speedProblem } from '../case/schema.js';
import { costCulprit, costProblem, type CostEstimate } from '../analysis/cost.js';
import type { EngineModel } from '../core/model.js';
import { units, unitSystemOf, UNIT_SYSTEMS, type Units } from '../present/units.js';

export interface Command {
  name: string;
  /** one line for the top-level help */
  summary: string;
  /** the whole `tractwave <name> --help` text (printed by the dispatcher, main.ts) */
  help: string;
  run(args: string[], io: CliIo): Promise<number>;
}

export const SET_OPTION: OptionSpec = {
  name: 'set',
  type: 'list',
  value: 'path=value',
  description: 'override a case value, e.g. --set runner.length=320mm (repeatable)',
};

export const RPM_OPTION: OptionSpec = {
  name: 'rpm',
  type: 'string',
  value: 'N',
  description: 'engine speed [rpm], overrides the case',
};

export const UNITS_OPTION: OptionSpec = {
  name: 'units',
  type: 'string',
  value: 'metric|imperial',
  description: "units of the text output (default: the case's display.units, else metric); JSON and CSV stay SI",
};

/**
 * The display units of a text command: --units, else the case's
 * display.units, else metric. A bad --units value is exit 2.
 */
export function displayUnits(args: ParsedArgs, loaded?: { case: { display?: { units: 'metric' | 'imperial' } | undefined } }): Units {
  const text = args.string('units');
  if (text !== undefined) {
    const system = unitSystemOf(text);
    if (!system) throw new CaseError('--units', `expected one of ${UNIT_SYSTEMS.join(', ')}, got '${text}'`, 'option');
    return units(system);
  }
  return units(loaded?.case.display?.units ?? 'metric');
}

export const ALLOW_EXTREME_OPTION: OptionSpec = {
  name: 'allow-extreme',
  type: 'boolean',
  description: 'accept pressures, temperatures and sizes outside the ranges engines meet (the results may mean nothing)',
};

export const ALLOW_LONG_OPTION: OptionSpec = {
  name: 'allow-long',
  type: 'boolean',
  description: 'start even when the estimated run time is over the limit (15 min)',
};

/** Parse an --rpm value: "6500", "6500rpm" or "6500 rpm". */
export function parseRpm(text: string, option = '--rpm'): number {
  const r = parseQuantity(text, 'speed');
  if (!r.ok) throw new CaseError(option, `expected a speed in rpm, got '${text}'`, 'option');
  const problem = speedProblem(r.value);
  if (problem) throw new CaseError(option, `${problem.replace(/^must be/, 'expected a speed')}`, 'option');
  return r.value;
}

/** Load the engine case named by a positional, with --set, --rpm and --allow-extreme applied. */
export async function loadCaseFromArgs(file: string, args: ParsedArgs, io: CliIo): Promise<LoadedCase> {
  const rpmText = args.string('rpm');
  const rpm = rpmText === undefined ? undefined : parseRpm(rpmText);
  return loadCase(file, { set: args.list('set'), cwd: io.cwd, allowExtreme: args.flag('allow-extreme'), ...(rpm !== undefined ? { rpm } : {}) });
}

/**
 * Refuse a run whose estimated cost is over the limit, unless --allow-long
 * (exit 2, naming the field that makes it long, or `fallback`).
 */
export function checkCost(cost: CostEstimate, model: Pick<EngineModel, 'numerics'>, args: ParsedArgs, fallback: string): void {
  if (args.flag('allow-long')) return;
  const problem = costProblem(cost);
  if (problem) throw new CaseError(costCulprit(model, fallback), problem, 'option');
}
