/**
 * Reading case files: YAML (so JSON also loads) parsed as plain data, then
 * `--set path=value` overrides, then schema validation, then the core model.
 *
 * Plain data: only the YAML core schema; unresolved or custom tags, duplicate
 * keys and syntax errors are rejected with their line; aliases are limited;
 * files above MAX_CASE_BYTES are refused. Every failure is a CaseError.
 */
import { readFile, stat } from 'node:fs/promises';
import { resolve } from 'node:path';
import YAML from 'yaml';
import type { EngineModel } from '../core/model.js';
import type { PipeExperimentModel } from '../core/pipe-experiment-model.js';
import { CaseError } from './errors.js';
import {
  caseSchema,
  pipeCaseSchema,
  resolvePath,
  validateCase,
  validatePipeCase,
  type Case,
  type CaseIssue,
  type PipeCase,
} from './schema.js';
import { closest } from './suggest.js';
import { plausibilityIssues } from './plausibility.js';
import { printable } from './printable.js';
import { toEngineModel, toPipeModel } from './to-model.js';
import { attachCaseFiles, prepareLiftLogs, type CaseFiles } from './measured-files.js';

export const MAX_CASE_BYTES = 1024 * 1024;

const YAML_OPTIONS: YAML.ParseOptions & YAML.DocumentOptions & YAML.SchemaOptions = {
  prettyErrors: false,
  uniqueKeys: true,
  schema: 'core',
  customTags: [],
};
const MAX_ALIASES = 100;

export interface LoadOptions {
  /** overrides "path=value", applied in order */
  set?: readonly string[];
  /** speed override [rpm], applied after `set` */
  rpm?: number;
  /** directory a relative file name is read from (messages keep the name as given) */
  cwd?: string;
  /** accept values outside the working ranges of plausibility.ts (--allow-extreme) */
  allowExtreme?: boolean;
}

export interface LoadedCase {
  /** the file it came from ("" when parsed from text) */
  file: string;
  /** the raw data after overrides (plain JSON) */
  data: Record<string, unknown>;
  case: Case;
  model: EngineModel;
  /** the measured-data files the case names, read (measured-files.ts) */
  files: CaseFiles;
}

export interface LoadedPipeCase {
  file: string;
  data: Record<string, unknown>;
  case: PipeCase;
  model: PipeExperimentModel;
}

/** Read a file as text, with the size limit and a clear message naming the file. */
export async function readCaseText(file: string, cwd?: string): Promise<string> {
  const full = cwd === undefined ? file : resolve(cwd, file);
  let size: number;
  try {
    const s = await stat(full);
    if (!s.isFile()) throw new CaseError(file, 'not a file', 'file');
    size = s.size;
  } catch (e) {
    if (e instanceof CaseError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new CaseError(file, 'file not found', 'file');
    throw new CaseError(file, `cannot read the file (${code ?? String(e)})`, 'file');
  }
  if (size > MAX_CASE_BYTES) throw new CaseError(file, `file is ${size} bytes; case files are limited to ${MAX_CASE_BYTES} bytes (1 MB)`, 'file');
  try {
    return await readFile(full, 'utf8');
  } catch (e) {
    throw new CaseError(file, `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})`, 'file');
  }
}

function where(file: string, lines: YAML.LineCounter, offset: number | undefined): string {
  const name = file || 'case';
  if (offset === undefined) return name;
  const p = lines.linePos(offset);
  return `${name}:${p.line}:${p.col}`;
}

/** Parse YAML text as plain data (a mapping at the top). */
export function parseYamlText(text: string, file = ''): Record<string, unknown> {
  if (text.length > MAX_CASE_BYTES) throw new CaseError(file || 'case', `text is larger than ${MAX_CASE_BYTES} bytes (1 MB)`, 'file');
  const lines = new YAML.LineCounter();
  const tooDeep = `nested more than ${MAX_DEPTH} levels deep (a case file is a few levels deep)`;
  let doc: YAML.Document.Parsed;
  try {
    doc = YAML.parseDocument(text, { ...YAML_OPTIONS, lineCounter: lines });
  } catch (e) {
    if (e instanceof RangeError) throw new CaseError(file || 'case', tooDeep, 'yaml');
    throw new CaseError(file || 'case', `malformed YAML: ${(e as Error).message}`, 'yaml');
  }
  const problem = doc.errors[0] ?? doc.warnings.find((w) => w.code === 'TAG_RESOLVE_FAILED');
  if (problem) {
    const first = problem.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '');
    // the parser's own stack ran out: the text nests far deeper than any case
    if (/call stack/i.test(first)) throw new CaseError(where(file, lines, problem.pos[0]), tooDeep, 'yaml');
    const msg = problem.code === 'TAG_RESOLVE_FAILED' ? `${first} (case files are plain data: no custom tags)` : first;
    throw new CaseError(where(file, lines, problem.pos[0]), `malformed YAML: ${msg}`, 'yaml');
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: MAX_ALIASES });
  } catch (e) {
    if (e instanceof RangeError) throw new CaseError(file || 'case', tooDeep, 'yaml');
    throw new CaseError(file || 'case', `malformed YAML: ${(e as Error).message}`, 'yaml');
  }
  checkDepth(data, file || 'case');
  if (data === null || data === undefined) throw new CaseError(file || 'case', 'the file is empty', 'yaml');
  if (typeof data !== 'object' || Array.isArray(data))
    throw new CaseError(file || 'case', `the file must be a mapping of keys (name, engine, ...), got ${Array.isArray(data) ? 'a list' : typeof data}`, 'yaml');
  return data as Record<string, unknown>;
}

/** The object at `segs` inside raw data, if there is one (own keys only). */
function valueAt(data: unknown, segs: readonly string[]): Record<string, unknown> | undefined {
  let d: unknown = data;
  for (const k of segs) d = d !== null && typeof d === 'object' && Object.hasOwn(d, k) ? (d as Record<string, unknown>)[k] : undefined;
  return d !== null && typeof d === 'object' ? (d as Record<string, unknown>) : undefined;
}

/** a value typed on the command line, shortened for a one-line message */
function clip(text: string, max = 60): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

/** Parse one "--set" value as a YAML scalar (or flow value): "320mm", "0.32", "plenum", "true". */
export function parseSetValue(text: string, path: string): unknown {
  let v: unknown;
  try {
    const doc = YAML.parseDocument(text, YAML_OPTIONS);
    const problem = doc.errors[0] ?? doc.warnings.find((w) => w.code === 'TAG_RESOLVE_FAILED');
    if (problem && /call stack/i.test(problem.message)) throw new CaseError(path, `--set value '${clip(text)}' is nested too deeply`, 'option');
    if (problem) throw new CaseError(path, `--set value '${clip(text)}' is not a valid YAML value`, 'option');
    v = doc.toJS({ maxAliasCount: MAX_ALIASES });
  } catch (e) {
    if (e instanceof CaseError) throw e;
    if (e instanceof RangeError) throw new CaseError(path, `--set value '${clip(text)}' is nested too deeply`, 'option');
    throw new CaseError(path, `--set value '${clip(text)}' is not a valid YAML value`, 'option');
  }
  checkDepth(v, path);
  return v === null ? undefined : v;
}

type Schema = typeof caseSchema | typeof pipeCaseSchema;

function entries(n: number): string {
  return `${n} entr${n === 1 ? 'y' : 'ies'}`;
}

/**
 * Apply "path=value" overrides to raw data (in place), checking each path
 * against the schema. A list index may name an entry that exists or the one
 * just past the end (which adds it); anything further is refused before any
 * list is built (`sections.99999999` would otherwise build a list of that
 * length). A null value removes the key (or the list entry).
 */
export function applySets(data: Record<string, unknown>, sets: readonly string[], schema: Schema = caseSchema): void {
  for (const s of sets) {
    const eq = s.indexOf('=');
    if (eq <= 0) throw new CaseError('--set', `expected path=value (e.g. runner.length=320mm), got '${clip(s)}'`, 'option');
    const path = s.slice(0, eq).trim();
    const segs = path.split('.');
    if (segs.some((x) => x === '')) throw new CaseError('--set', `bad path '${clip(path)}'`, 'option');
    const r = resolvePath(schema, segs, data);
    if (!r.ok) {
      const prefix = segs.slice(0, r.at).join('.');
      // a key of another kind of the same thing (inlet.volume on an ambient inlet)
      if (resolvePath(schema, segs, undefined).ok) {
        const kind = valueAt(data, segs.slice(0, r.at))?.['kind'];
        const what = typeof kind === 'string' ? `${prefix}.kind is '${kind}'` : `this case's ${prefix || 'file'}`;
        throw new CaseError(path, `does not apply while ${what}: set ${prefix ? `${prefix}.` : ''}kind too, before it`, 'unknown-key');
      }
      const at = segs.slice(0, r.at + 1).join('.');
      const parent = r.known.length === 0 && r.at > 0 ? resolvePath(schema, segs.slice(0, r.at), data) : undefined;
      if (parent?.ok && parent.node.kind === 'list')
        throw new CaseError(at, `${prefix} is a list: expected an entry number (0, 1, ...), got '${clip(segs[r.at]!)}'`, 'unknown-key');
      if (parent?.ok && parent.node.kind === 'value') throw new CaseError(at, `${prefix} is set as a whole: it has no keys below it`, 'unknown-key');
      const guess = closest(segs[r.at]!, r.known);
      const full = guess === undefined ? '' : ` (did you mean '${prefix ? `${prefix}.` : ''}${guess}'?)`;
      throw new CaseError(path, `unknown key${full}`, 'unknown-key');
    }
    const value = parseSetValue(s.slice(eq + 1).trim(), path);
    if (r.node.kind === 'object' && value !== undefined && (value === null || typeof value !== 'object'))
      throw new CaseError(path, `is a group of keys (${r.node.keys.join(', ')}); set one of them, e.g. ${path}.${r.node.keys[0] ?? 'x'}=...`, 'option');
    let cur: Record<string, unknown> | unknown[] = data;
    for (let i = 0; i < segs.length; i++) {
      const k = segs[i]!;
      const here = segs.slice(0, i + 1).join('.');
      if (Array.isArray(cur)) {
        const index = Number(k);
        if (!(index <= cur.length))
          throw new CaseError(
            here,
            `no entry ${clip(k, 20)}: ${segs.slice(0, i).join('.')} has ${entries(cur.length)}` +
              `${cur.length > 0 ? ` (0 to ${cur.length - 1})` : ''}; ${cur.length} adds one at the end`,
            'option',
          );
      }
      const box = cur as Record<string, unknown>;
      if (i === segs.length - 1) {
        if (value !== undefined) box[k] = value;
        else if (Array.isArray(cur)) cur.splice(Number(k), 1);
        else delete box[k];
        break;
      }
      let next = Object.hasOwn(box, k) ? box[k] : undefined;
      if (next === undefined || next === null) {
        next = /^\d+$/.test(segs[i + 1]!) ? [] : {};
        box[k] = next;
      }
      if (typeof next !== 'object') throw new CaseError(here, `is a single value in the case, cannot set ${path}`, 'option');
      cur = next as Record<string, unknown> | unknown[];
    }
  }
}

/** the deepest nesting a case file has: a few levels; far more is a mistake or an attack */
export const MAX_DEPTH = 32;

/** Refuse data nested deeper than MAX_DEPTH (iterative: no recursion to overflow). */
function checkDepth(data: unknown, where: string): void {
  const stack: [unknown, number][] = [[data, 0]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (v === null || typeof v !== 'object' || v instanceof Uint8Array) continue;
    if (depth >= MAX_DEPTH) throw new CaseError(where, `nested more than ${MAX_DEPTH} levels deep (a case file is a few levels deep)`, 'yaml');
    for (const x of Object.values(v)) stack.push([x, depth + 1]);
  }
}

function firstIssue(issues: readonly CaseIssue[]): CaseError {
  // a misspelt key is the cause of the "required" issue of its sibling: report it first
  const i = issues.find((x) => x.message.startsWith('unknown key')) ?? issues[0];
  if (!i) return new CaseError('', 'invalid case');
  return new CaseError(i.path, i.message, i.message.startsWith('unknown key') ? 'unknown-key' : 'invalid');
}

function fileStem(file: string): string {
  const base = file.split(/[\\/]/).pop() ?? file;
  return base.replace(/\.(ya?ml|json)$/i, '') || 'case';
}

/** Validate raw case data (after YAML), apply overrides, build the model. */
export function buildCase(raw: Record<string, unknown>, file = '', opts: LoadOptions = {}): LoadedCase {
  if ('pipe' in raw && !('engine' in raw))
    throw new CaseError(file || 'case', "this is a pipe experiment (it has a 'pipe' key): run it with `tractwave pipe FILE`");
  const data = structuredClone(raw);
  applySets(data, opts.set ?? [], caseSchema);
  if (opts.rpm !== undefined) data.rpm = opts.rpm;
  // measured files, relative to the case file: lift logs give their valve's card before validation
  const lifts = prepareLiftLogs(data, file, opts.cwd);
  const v = validateCase(lifts.data);
  if (!v.ok) throw firstIssue(v.issues);
  if (!opts.allowExtreme) {
    const p = plausibilityIssues(v.value)[0];
    if (p) throw new CaseError(p.path, `${p.message}; add --allow-extreme to run it anyway`, 'invalid');
  }
  const { case: c, files } = attachCaseFiles(v.value, lifts.logs, file, opts.cwd);
  const model = toEngineModel(c, fileStem(file));
  // a name is shown on terminals: escape sequences and NUL in it are shown escaped, never sent
  model.name = printable(model.name);
  return { file, data, case: c, model, files };
}

export function buildPipeCase(raw: Record<string, unknown>, file = '', opts: Pick<LoadOptions, 'set'> = {}): LoadedPipeCase {
  if ('engine' in raw && !('pipe' in raw))
    throw new CaseError(file || 'case', 'this is an engine case, not a pipe experiment: run it with `tractwave run FILE`');
  const data = structuredClone(raw);
  applySets(data, opts.set ?? [], pipeCaseSchema);
  const v = validatePipeCase(data);
  if (!v.ok) throw firstIssue(v.issues);
  const model = toPipeModel(v.value, fileStem(file));
  model.name = printable(model.name);
  return { file, data, case: v.value, model };
}

export function parseCase(text: string, file = '', opts: LoadOptions = {}): LoadedCase {
  return buildCase(parseYamlText(text, file), file, opts);
}

export async function loadCase(file: string, opts: LoadOptions = {}): Promise<LoadedCase> {
  return parseCase(await readCaseText(file, opts.cwd), file, opts);
}

export async function loadPipeCase(file: string, opts: Pick<LoadOptions, 'set' | 'cwd'> = {}): Promise<LoadedPipeCase> {
  return buildPipeCase(parseYamlText(await readCaseText(file, opts.cwd), file), file, opts);
}
