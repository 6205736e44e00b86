/**
 * tractwave's command line: dispatch to a command, or open the terminal view.
 *
 *   tractwave [CASE]                 the interactive view on a terminal
 *   tractwave <command> [options]    see `commands/index.ts`
 *
 * `runCli(argv, io)` does everything and returns the exit code (0 ok, 2 bad
 * input, 1 internal failure); `main()` binds it to the process. Run directly
 * with `npx tsx src/cli/main.ts ...`, or through bin/tractwave.js.
 */
import { existsSync, realpathSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { CaseError } from '../case/errors.js';
import { loadCase } from '../case/load.js';
import { SimulationError } from '../core/engine.js';
import { closest } from '../case/suggest.js';
import { commands } from './commands/index.js';
import type { Command } from './command.js';
import type { CliIo } from './io.js';
import { defaultCasePath, packageVersion } from './package-root.js';
import { SAFETY_CAUTION } from './safety.js';
import { wrap } from './format.js';
import { glossaryLines } from '../present/glossary.js';
import { errnoWords, OutputError } from './write-file.js';
import { printable } from '../case/printable.js';

export { type CliIo, memoryIo } from './io.js';

function topHelp(): string {
  const w = Math.max(...commands.map((c) => c.name.length)) + 2;
  return `tractwave: crank-degree-by-degree simulation of a single-cylinder intake
tract: a 1-D unsteady runner (conservative finite volumes by default, or the
method of characteristics) coupled to the valves, the cylinder and a plenum

usage
  tractwave [CASE]               terminal view (default case: the bundled demo;
                                 --allow-extreme, --allow-long as for run)
  tractwave <command> [options]  one of:

${commands.map((c) => `  ${c.name.padEnd(w)}${wrap(c.summary, 76 - w, '').trimEnd().split('\n').join(`\n${' '.repeat(w + 2)}`)}`).join('\n')}

  tractwave <command> --help     the options of one command
  tractwave help words           the words and abbreviations on the screens
  tractwave --version

case files are YAML (or JSON). A value is a number in SI units (m, m³, Pa, K;
crank angles in degrees, speeds in rpm) or a string "<number> <unit>": mm, cm,
m, in; cc, L, ci; Pa, kPa, bar, psi, inH2O; K, degC, degF; deg; rpm.
Crank angle θ: 0 = TDC at the start of the intake stroke, 720° per cycle.

exit codes: 0 ok (also a run that did not converge, with a warning),
2 bad input (the message names the field), 1 internal failure.

${SAFETY_CAUTION}
`;
}

/** `tractwave help words`: the glossary of the screens' words, at 80 columns. */
export function wordsHelp(): string {
  return `Words and abbreviations on tractwave's screens, in plain words\n\n${glossaryLines(78).join('\n')}\n\n${SAFETY_CAUTION}\n`;
}

/** Print an error as one line and give its exit code. */
export function reportError(e: unknown, io: CliIo): number {
  if (e instanceof CaseError) {
    io.stderr.write(`error: ${e.path ? `${printable(e.path)}: ` : ''}${printable(e.detail)}\n`);
    return 2;
  }
  if (e instanceof SimulationError) {
    // the core's message says what happened ("the solver diverged (...) at ...")
    io.stderr.write(`error: ${e.code === 'diverged' ? '' : 'the simulation could not start: '}${printable(e.message)}\n`);
    return e.code === 'invalid' ? 2 : 1;
  }
  if (e instanceof OutputError) {
    io.stderr.write(`error: ${printable(e.path)}: ${printable(e.detail)}\n`);
    return 1;
  }
  const msg = e instanceof Error ? e.message : String(e);
  io.stderr.write(`internal error: ${printable(msg)}\n`);
  if (process.env.TRACTWAVE_DEBUG && e instanceof Error && e.stack) io.stderr.write(`${e.stack}\n`);
  else io.stderr.write('(set TRACTWAVE_DEBUG=1 to see where; please report it with the case file)\n');
  return 1;
}

function findCommand(name: string): Command | undefined {
  return commands.find((c) => c.name === name);
}

function looksLikeCaseFile(arg: string): boolean {
  return /\.(ya?ml|json)$/i.test(arg) || arg.includes('/') || arg.includes('\\');
}

/** options of the interactive view */
const VIEW_FLAGS = ['--allow-extreme', '--allow-long'] as const;

/** `tractwave [CASE] [--allow-extreme] [--allow-long]`: the interactive view. */
async function interactive(argv: readonly string[], io: CliIo): Promise<number> {
  const flags = new Set(argv.filter((a) => (VIEW_FLAGS as readonly string[]).includes(a)));
  const rest = argv.filter((a) => !flags.has(a));
  const unknown = rest.find((a) => a.startsWith('-') && a.length > 1);
  if (unknown) throw new CaseError(unknown, `unknown option (the terminal view takes ${VIEW_FLAGS.join(' and ')}; see --help)`, 'option');
  if (rest.length > 1) throw new CaseError(rest[1]!, 'unexpected argument (usage: tractwave [CASE], or tractwave <command> ...; see --help)', 'option');
  const given = rest[0];
  const file = given ?? defaultCasePath();
  const options = { allowExtreme: flags.has('--allow-extreme'), allowLong: flags.has('--allow-long') };
  await loadCase(file, { cwd: io.cwd, allowExtreme: options.allowExtreme }); // bad input: exit 2 before anything else
  const dumb = io.term === 'dumb';
  if (!(io.stdinIsTTY && io.stdoutIsTTY) || dumb) {
    const why = dumb
      ? 'a terminal that can move the cursor (TERM is dumb)'
      : 'a terminal (stdin and stdout are not a TTY)';
    io.stderr.write(
      `error: the interactive view needs ${why}; ` +
        `use \`tractwave run ${given ?? 'CASE'}\` for one speed or \`tractwave sweep ${given ?? 'CASE'}\` for a speed range\n`,
    );
    return 2;
  }
  // Ink draws nothing but the last frame when it believes it runs under CI
  // (the CI or CONTINUOUS_INTEGRATION variable, read once when Ink loads).
  // Here stdin and stdout are a terminal and the user asked for the view, so
  // it is interactive whatever the environment says.
  for (const key of ['CI', 'CONTINUOUS_INTEGRATION']) if (key in process.env) process.env[key] = 'false';
  // imported here so that run, sweep and check never load Ink (start-up time)
  const { startUi } = await import('../ui/index.js');
  return startUi(resolve(io.cwd, file), options);
}

export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  try {
    const first = argv[0];
    if (first === 'help' && (argv[1] === 'words' || argv[1] === 'glossary')) {
      io.stdout.write(wordsHelp());
      return 0;
    }
    if (first === '-h' || first === '--help' || first === 'help') {
      const sub = first === 'help' && argv[1] !== undefined ? findCommand(argv[1]) : undefined;
      if (first === 'help' && argv[1] !== undefined && !sub) throw new CaseError(argv[1], `unknown command${hint(argv[1])}`, 'option');
      io.stdout.write(sub ? sub.help : topHelp());
      return 0;
    }
    if (first === '--version' || first === '-V') {
      io.stdout.write(`tractwave ${packageVersion()}\n`);
      return 0;
    }
    if (first === undefined) return await interactive([], io);
    const cmd = findCommand(first);
    if (cmd) {
      // `--help` anywhere after a command shows that command's help (one place for all commands)
      const rest = argv.slice(1);
      if (rest.includes('--help') || rest.includes('-h')) {
        io.stdout.write(cmd.help);
        return 0;
      }
      return await cmd.run(rest, io);
    }
    if ((VIEW_FLAGS as readonly string[]).includes(first)) return await interactive(argv, io);
    if (first.startsWith('-')) throw new CaseError(first, 'unknown option (see tractwave --help)', 'option');
    if (existsSync(resolve(io.cwd, first)) || looksLikeCaseFile(first)) return await interactive(argv, io);
    const guess = closest(first, commands.map((x) => x.name));
    throw new CaseError(first, `unknown command${guess ? `; did you mean '${guess}'?` : ''} (commands: ${commands.map((c) => c.name).join(', ')})`, 'option');
  } catch (e) {
    return reportError(e, io);
  }
}

function hint(word: string): string {
  const c = closest(word, commands.map((x) => x.name));
  return c ? ` (did you mean '${c}'?)` : '';
}

/** Bind runCli to the process. */
export async function main(argv: readonly string[] = process.argv.slice(2)): Promise<void> {
  // a closed pipe (tractwave run ... | head) is not an error; any other write
  // error of standard output (a full disk: run --json > /dev/full) is one plain line
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    try {
      process.stderr.write(`error: standard output: cannot write: ${errnoWords(e)}\n`);
    } catch {
      // stderr is gone too: nothing more to say
    }
    process.exit(1);
  });
  // a closed standard error is not worth a crash
  process.stderr.on('error', () => {});
  const io: CliIo = {
    stdout: process.stdout,
    stderr: process.stderr,
    stdoutIsTTY: process.stdout.isTTY === true,
    stdinIsTTY: process.stdin.isTTY === true,
    stderrIsTTY: process.stderr.isTTY === true,
    ...(process.stdout.isTTY === true && process.stdout.rows > 0 ? { stdoutRows: process.stdout.rows } : {}),
    cwd: process.cwd(),
    ...(process.env.TERM !== undefined ? { term: process.env.TERM } : {}),
    env: process.env,
  };
  process.exitCode = await runCli(argv, io);
}

function isEntry(): boolean {
  const script = process.argv[1];
  if (!script) return false;
  try {
    return realpathSync(script) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isEntry()) await main();
