/**
 * Ranges typed on the command line: "FROM:TO:STEP" (a grid, both ends
 * included when TO lands on the grid) and "LO:HI" (a band).
 *
 * Each of FROM, TO, STEP is a number with an optional unit written after it,
 * with or without a space: "3000:9000:250", "250mm:450mm:50mm",
 * "0.25:0.45:0.05 m". A unit given on some parts applies to all; different
 * units in one range are refused (say it once). The numbers stay in the unit
 * they were typed in: the caller hands them on as "<value> <unit>" strings to
 * whatever converts units (the case loader's --set), so unit conversion
 * stays in one place.
 *
 * Errors are `RangeInputError`, naming the option ("--rpm", "--vary") and
 * what is wrong; the CLI prints them and exits 2.
 */

export class RangeInputError extends Error {
  constructor(
    /** the option the range came from, e.g. "--rpm" */
    readonly option: string,
    /** what is wrong, without the option name */
    readonly detail: string,
  ) {
    super(`${option}: ${detail}`);
    this.name = 'RangeInputError';
  }
}

export interface NumberGrid {
  from: number;
  to: number;
  step: number;
  /** the unit typed ('' when none) */
  unit: string;
  /** from, from + step, … ≤ to */
  values: number[];
}

export interface Band {
  from: number;
  to: number;
  unit: string;
}

/** the most points one range may hold */
export const MAX_RANGE_POINTS = 2000;

const TOKEN = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-z][A-Za-z0-9]*)?$/;

interface Token {
  value: number;
  unit: string;
}

function parseToken(text: string, option: string, what: string): Token {
  const t = text.trim();
  const m = TOKEN.exec(t);
  if (!m) throw new RangeInputError(option, `${what} '${text.trim()}' is not a number (with an optional unit, e.g. 250mm)`);
  const value = Number(m[1]);
  if (!Number.isFinite(value)) throw new RangeInputError(option, `${what} '${t}' is not a finite number`);
  return { value, unit: m[2] ?? '' };
}

function commonUnit(tokens: readonly Token[], option: string, allowed: readonly string[] | undefined): string {
  const units = [...new Set(tokens.map((t) => t.unit).filter((u) => u !== ''))];
  if (units.length > 1) throw new RangeInputError(option, `mixes units (${units.join(', ')}); write all parts in one unit`);
  const unit = units[0] ?? '';
  if (allowed && unit !== '' && !allowed.includes(unit))
    throw new RangeInputError(option, `unit '${unit}' is not allowed here (use ${allowed.join(' or ')}, or a plain number)`);
  return unit;
}

/** round away binary noise of from + i·step (12 significant digits) */
function clean(x: number): number {
  return Number(x.toPrecision(12));
}

export interface RangeOptions {
  /** units accepted (default: any); a plain number is always accepted */
  units?: readonly string[];
  /** values must be above zero (default true) */
  positive?: boolean;
}

/** Parse "FROM:TO:STEP" into a grid of values. */
export function parseGrid(text: string, option: string, opts: RangeOptions = {}): NumberGrid {
  const parts = text.split(':');
  if (parts.length !== 3 || parts.some((p) => p.trim() === ''))
    throw new RangeInputError(option, `expected FROM:TO:STEP (e.g. 3000:9000:250), got '${text}'`);
  const [a, b, c] = parts as [string, string, string];
  const from = parseToken(a, option, 'FROM');
  const to = parseToken(b, option, 'TO');
  const step = parseToken(c, option, 'STEP');
  const unit = commonUnit([from, to, step], option, opts.units);
  const u = unit ? ` ${unit}` : '';
  if ((opts.positive ?? true) && !(from.value > 0)) throw new RangeInputError(option, `FROM must be above zero, got ${from.value}${u}`);
  if (!(to.value >= from.value)) throw new RangeInputError(option, `TO (${to.value}${u}) must not be below FROM (${from.value}${u})`);
  if (!(step.value > 0)) throw new RangeInputError(option, `STEP must be above zero, got ${step.value}${u}`);
  const span = to.value - from.value;
  const count = Math.floor(span / step.value + 1e-9) + 1;
  if (count > MAX_RANGE_POINTS)
    throw new RangeInputError(option, `${count} points is too many (at most ${MAX_RANGE_POINTS}); use a larger STEP`);
  const values: number[] = [];
  for (let i = 0; i < count; i++) values.push(clean(from.value + i * step.value));
  return { from: from.value, to: to.value, step: step.value, unit, values };
}

/** Parse "LO:HI" into a band (LO < HI). */
export function parseBand(text: string, option: string, opts: RangeOptions = {}): Band {
  const parts = text.split(':');
  if (parts.length !== 2 || parts.some((p) => p.trim() === ''))
    throw new RangeInputError(option, `expected LO:HI (e.g. 5000:8000), got '${text}'`);
  const lo = parseToken(parts[0]!, option, 'LO');
  const hi = parseToken(parts[1]!, option, 'HI');
  const unit = commonUnit([lo, hi], option, opts.units);
  const u = unit ? ` ${unit}` : '';
  if ((opts.positive ?? true) && !(lo.value > 0)) throw new RangeInputError(option, `LO must be above zero, got ${lo.value}${u}`);
  if (!(hi.value > lo.value)) throw new RangeInputError(option, `HI (${hi.value}${u}) must be above LO (${lo.value}${u})`);
  return { from: lo.value, to: hi.value, unit };
}

export interface VarySpec {
  /** case path, e.g. "runner.length" */
  path: string;
  grid: NumberGrid;
  /** the values as --set strings, "250 mm" (or "0.25" without a unit) */
  setValues: string[];
}

/** Parse "path=FROM:TO:STEP" (tune --vary). Values may be zero or negative (angles). */
export function parseVary(text: string, option = '--vary'): VarySpec {
  const eq = text.indexOf('=');
  if (eq <= 0) throw new RangeInputError(option, `expected path=FROM:TO:STEP (e.g. runner.length=250mm:450mm:50mm), got '${text}'`);
  const path = text.slice(0, eq).trim();
  if (!/^[A-Za-z_][A-Za-z0-9_]*(\.[A-Za-z0-9_]+)*$/.test(path)) throw new RangeInputError(option, `bad case path '${path}'`);
  const grid = parseGrid(text.slice(eq + 1), `${option} ${path}`, { positive: false });
  const setValues = grid.values.map((v) => (grid.unit ? `${v} ${grid.unit}` : String(v)));
  return { path, grid, setValues };
}
