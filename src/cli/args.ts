/**
 * A tiny command-line option parser (no dependencies).
 *
 * Accepts `--name value`, `--name=value`, boolean `--flag`, repeated list
 * options (`--set a=1 --set b=2`), `-h`/`--help`, and `--` to end options.
 * Anything else is a positional. Problems are CaseErrors naming the option
 * (exit 2).
 */
import { CaseError } from '../case/errors.js';
import { closest } from '../case/suggest.js';

export type OptionType = 'boolean' | 'string' | 'list';

export interface OptionSpec {
  name: string;
  type: OptionType;
  /** placeholder shown in help, e.g. FILE */
  value?: string;
  description: string;
}

export interface ParsedArgs {
  positionals: string[];
  help: boolean;
  flag(name: string): boolean;
  string(name: string): string | undefined;
  list(name: string): string[];
}

export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[]): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const flags = new Set<string>();
  const strings = new Map<string, string>();
  const lists = new Map<string, string[]>();
  const positionals: string[] = [];
  let help = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (arg === '-h' || arg === '--help') {
      help = true;
      continue;
    }
    if (!arg.startsWith('--') || arg === '-') {
      if (arg.startsWith('-') && arg.length > 1 && !/^-\d/.test(arg))
        throw new CaseError(arg, `unknown option (options are spelled --name; see --help)`, 'option');
      positionals.push(arg);
      continue;
    }
    const eq = arg.indexOf('=');
    const name = arg.slice(2, eq < 0 ? undefined : eq);
    const spec = byName.get(name);
    if (!spec) {
      const guess = closest(name, [...byName.keys(), 'help']);
      throw new CaseError(`--${name}`, `unknown option${guess ? ` (did you mean --${guess}?)` : ''}`, 'option');
    }
    if (spec.type === 'boolean') {
      if (eq >= 0) throw new CaseError(`--${name}`, 'takes no value', 'option');
      flags.add(name);
      continue;
    }
    let value: string | undefined;
    if (eq >= 0) value = arg.slice(eq + 1);
    else {
      const next = argv[i + 1];
      if (next !== undefined && !(next.startsWith('--') && next.length > 2)) {
        value = next;
        i++;
      }
    }
    if (value === undefined || value === '') throw new CaseError(`--${name}`, `needs a value${spec.value ? ` (${spec.value})` : ''}`, 'option');
    if (spec.type === 'string') {
      if (strings.has(name)) throw new CaseError(`--${name}`, 'given more than once', 'option');
      strings.set(name, value);
    } else {
      const l = lists.get(name) ?? [];
      l.push(value);
      lists.set(name, l);
    }
  }
  return {
    positionals,
    help,
    flag: (n) => flags.has(n),
    string: (n) => strings.get(n),
    list: (n) => lists.get(n) ?? [],
  };
}

/** Lines of option help, aligned. */
export function optionHelp(specs: readonly OptionSpec[]): string {
  const left = specs.map((s) => `--${s.name}${s.value ? ` ${s.value}` : ''}`);
  left.push('-h, --help');
  const w = Math.max(...left.map((l) => l.length)) + 2;
  const desc = [...specs.map((s) => s.description), 'show this help'];
  // descriptions wrapped to fit 80 columns, continuation lines under the description
  const room = Math.max(30, 80 - 2 - w);
  return left.map((l, i) => `  ${l.padEnd(w)}${wrapWords(desc[i] ?? '', room).join(`\n${' '.repeat(w + 2)}`)}`).join('\n');
}

function wrapWords(text: string, width: number): string[] {
  const lines: string[] = [];
  let cur = '';
  for (const word of text.split(/\s+/).filter((x) => x !== '')) {
    if (cur !== '' && cur.length + 1 + word.length > width) {
      lines.push(cur);
      cur = word;
    } else cur = cur === '' ? word : `${cur} ${word}`;
  }
  lines.push(cur);
  return lines;
}

/** Exactly `n` positionals, or a usage error naming what is missing or extra. */
export function expectPositionals(args: ParsedArgs, names: readonly string[], command: string): string[] {
  if (args.positionals.length < names.length)
    throw new CaseError(command, `missing ${names[args.positionals.length]!} (usage: tractwave ${command} ${names.join(' ')} ...; see tractwave ${command} --help)`, 'option');
  if (args.positionals.length > names.length)
    throw new CaseError(args.positionals[names.length]!, `unexpected argument (tractwave ${command} takes ${names.join(' ')})`, 'option');
  return args.positionals.slice(0, names.length);
}
