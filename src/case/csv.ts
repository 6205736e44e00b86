/**
 * Measured-data tables: CSV text with a header row whose column names carry
 * their unit (`lift_mm`, `flow_cfm`, `pressure_kPa`), converted to the
 * model's units here.
 *
 * The text: comma, semicolon or tab separated (the header's separator is
 * used throughout); blank lines and lines starting with '#' are skipped (so
 * a file can say where it came from); header names may be quoted. Every
 * problem is a CaseError whose path is the file as the user named it and
 * whose message starts with the row (the line of the file, 1 = the first
 * line, as a spreadsheet numbers its rows) and the column:
 *
 *   error: runs/lift.csv: row 12, column 'lift_mm': 'x' is not a number
 *
 * (the same form as the dyno sheet of measured.ts).
 */
import { readFileSync, statSync } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import { CaseError } from './errors.js';
import { didYouMean } from './suggest.js';

/** largest measured-data file read [bytes]: a long logger export, not a case file */
export const MAX_DATA_BYTES = 32 * 1024 * 1024;

/** One quantity of a table, offered under several column names (one per unit). */
export interface ColumnSpec {
  /** the quantity's key in the parsed rows */
  key: string;
  /** column name → conversion of a cell to the model unit */
  names: Readonly<Record<string, (v: number) => number>>;
  /** the table must have one of the names (default true) */
  required?: boolean;
  /** a negative cell is an error (default true) */
  nonNegative?: boolean;
}

export interface TableRow {
  /** row number in the file (1 = first line) */
  row: number;
  /** cells in model units, by quantity key */
  values: Record<string, number>;
}

export interface Table {
  file: string;
  /** the header's row number */
  headerRow: number;
  /** the column name used for each quantity present */
  columns: Record<string, string>;
  rows: TableRow[];
}

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** The error of one cell (or one row when `column` is undefined). */
export function cellError(file: string, row: number, column: string | undefined, message: string): CaseError {
  return new CaseError(file, `row ${row}${column !== undefined ? `, column '${column}'` : ''}: ${message}`, 'file');
}

/**
 * Parse a measured-data table. `what` names the kind of file in messages
 * ("lift log"); `columns` lists its quantities.
 */
export function parseTable(text: string, file: string, what: string, columns: readonly ColumnSpec[]): Table {
  const lines = text
    .split(/\r?\n/)
    .map((l, i) => ({ text: l.trim(), row: i + 1 }))
    .filter((l) => l.text !== '' && !l.text.startsWith('#'));
  const allNames = columns.flatMap((c) => Object.keys(c.names));
  const head = lines[0];
  if (!head) throw new CaseError(file, `the ${what} is empty (expected a header row: ${columns.map((c) => Object.keys(c.names).join(' or ')).join(', ')})`, 'file');
  const sep = head.text.includes('\t') ? '\t' : head.text.includes(';') ? ';' : ',';
  const names = head.text.split(sep).map((s) => s.trim().replace(/^"(.*)"$/, '$1'));
  const at: Record<string, { index: number; name: string; spec: ColumnSpec }> = {};
  names.forEach((n, index) => {
    const spec = columns.find((c) => n in c.names);
    if (!spec) throw cellError(file, head.row, n, `unknown column${didYouMean(n, allNames)} (a ${what} has ${columns.map((c) => Object.keys(c.names).join(' or ')).join(', ')})`);
    const before = at[spec.key];
    if (before) throw cellError(file, head.row, n, `a second column of the same quantity as '${before.name}': give it once`);
    at[spec.key] = { index, name: n, spec };
  });
  for (const c of columns) {
    if ((c.required ?? true) && !at[c.key])
      throw cellError(file, head.row, undefined, `no ${Object.keys(c.names).map((n) => `'${n}'`).join(' or ')} column (the header has ${names.map((n) => `'${n}'`).join(', ')})`);
  }
  const rows: TableRow[] = [];
  for (const line of lines.slice(1)) {
    const cells = line.text.split(sep).map((s) => s.trim());
    if (cells.length !== names.length) throw cellError(file, line.row, undefined, `${cells.length} cells, the header has ${names.length}`);
    const values: Record<string, number> = {};
    for (const { index, name, spec } of Object.values(at)) {
      const t = cells[index] ?? '';
      if (t === '') throw cellError(file, line.row, name, 'the cell is empty');
      if (!NUMBER.test(t)) throw cellError(file, line.row, name, `'${t}' is not a number`);
      const v = Number(t);
      if ((spec.nonNegative ?? true) && v < 0) throw cellError(file, line.row, name, `${t} is negative`);
      values[spec.key] = spec.names[name]!(v);
    }
    rows.push({ row: line.row, values });
  }
  if (rows.length === 0) throw new CaseError(file, `the ${what} has no data rows after the header (row ${head.row})`, 'file');
  const used: Record<string, string> = {};
  for (const [k, v] of Object.entries(at)) used[k] = v.name;
  return { file, headerRow: head.row, columns: used, rows };
}

/** Each row's value of `key` must increase down the file. */
export function requireIncreasing(t: Table, key: string, words = 'must increase down the file'): void {
  for (let i = 1; i < t.rows.length; i++) {
    const a = t.rows[i - 1]!;
    const b = t.rows[i]!;
    if (!(b.values[key]! > a.values[key]!)) {
      const col = t.columns[key];
      throw cellError(t.file, b.row, col, `${words} (this row is not above row ${a.row})`);
    }
  }
}

function tooBig(file: string, size: number): CaseError {
  return new CaseError(file, `file is ${size} bytes; measured-data files are limited to ${MAX_DATA_BYTES / 1024 / 1024} MB`, 'file');
}

function readError(file: string, e: unknown, named?: string): CaseError {
  const code = (e as NodeJS.ErrnoException).code;
  const by = named ? ` (named by ${named})` : '';
  if (code === 'ENOENT') return new CaseError(file, `file not found${by}`, 'file');
  if (code === 'EISDIR') return new CaseError(file, `not a file${by}`, 'file');
  return new CaseError(file, `cannot read the file (${code ?? String(e)})${by}`, 'file');
}

/** Read a measured-data file synchronously (the case loader); `file` names it in messages, `named` the case key. */
export function readDataFileSync(full: string, file: string, named?: string): string {
  try {
    const s = statSync(full);
    if (!s.isFile()) throw new CaseError(file, `not a file${named ? ` (named by ${named})` : ''}`, 'file');
    if (s.size > MAX_DATA_BYTES) throw tooBig(file, s.size);
    return readFileSync(full, 'utf8');
  } catch (e) {
    if (e instanceof CaseError) throw e;
    throw readError(file, e, named);
  }
}

/** Read a measured-data file (a command's option). */
export async function readDataFile(full: string, file: string): Promise<string> {
  try {
    const s = await stat(full);
    if (!s.isFile()) throw new CaseError(file, 'not a file', 'file');
    if (s.size > MAX_DATA_BYTES) throw tooBig(file, s.size);
    return await readFile(full, 'utf8');
  } catch (e) {
    if (e instanceof CaseError) throw e;
    throw readError(file, e);
  }
}
