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
import { RPM_LIMITS } from '../case/schema.js';

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

/** Parse an --rpm value: "6500", "6500rpm" or "6500 rpm". */
export function parseRpm(text: string, option = '--rpm'): number {
  const r = parseQuantity(text, 'speed');
  if (!r.ok) throw new CaseError(option, `expected a speed in rpm, got '${text}'`, 'option');
  if (!(r.value >= RPM_LIMITS.min && r.value <= RPM_LIMITS.max))
    throw new CaseError(option, `expected a speed between ${RPM_LIMITS.min} and ${RPM_LIMITS.max} rpm, got '${text}'`, 'option');
  return r.value;
}

/** Load the engine case named by a positional, with --set and --rpm applied. */
export async function loadCaseFromArgs(file: string, args: ParsedArgs, io: CliIo): Promise<LoadedCase> {
  const rpmText = args.string('rpm');
  const rpm = rpmText === undefined ? undefined : parseRpm(rpmText);
  return loadCase(file, { set: args.list('set'), cwd: io.cwd, ...(rpm !== undefined ? { rpm } : {}) });
}
