/**
 * A measured dyno sheet: CSV with a header row whose column names carry the
 * unit, one row per speed. Columns:
 *
 *   rpm                         engine speed [rpm] (required, increasing)
 *   torque_Nm | torque_lbft     brake torque
 *   power_kW  | power_hp        brake power
 *   ve_pct                      volumetric efficiency [%]
 *
 * At least one value column; an empty cell means "not measured at this
 * speed". Values are converted to SI here (N·m, W, fraction) with the NIST
 * SP 811 (2008) factors: 1 lbf·ft = 1.355818 N·m, 1 hp (550 ft·lbf/s) =
 * 745.6999 W. Comma, semicolon or tab separated; lines starting with '#' are
 * comments. Every problem is a CaseError naming the file, the row and the
 * column (exit 2).
 */
import { readCaseText } from './load.js';
import { CaseError } from './errors.js';

export type MeasuredKind = 'torque' | 'power' | 'volumetricEfficiency';

export interface MeasuredPoint {
  rpm: number;
  /** brake torque [N·m] */
  torque?: number;
  /** brake power [W] */
  power?: number;
  /** volumetric efficiency [-] */
  volumetricEfficiency?: number;
}

export interface MeasuredSheet {
  /** the file as named by the user */
  file: string;
  /** which quantities the sheet holds */
  kinds: MeasuredKind[];
  points: MeasuredPoint[];
}

const COLUMNS: Record<string, { kind: MeasuredKind; toSi: (v: number) => number }> = {
  torque_Nm: { kind: 'torque', toSi: (v) => v },
  torque_lbft: { kind: 'torque', toSi: (v) => v * 1.355818 },
  power_kW: { kind: 'power', toSi: (v) => v * 1000 },
  power_hp: { kind: 'power', toSi: (v) => v * 745.6999 },
  ve_pct: { kind: 'volumetricEfficiency', toSi: (v) => v / 100 },
};

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Parse the text of a dyno sheet; `file` names it in errors. */
export function parseMeasuredSheet(text: string, file: string): MeasuredSheet {
  const lines = text.split(/\r?\n/).map((l, i) => ({ text: l.trim(), row: i + 1 })).filter((l) => l.text !== '' && !l.text.startsWith('#'));
  const head = lines[0];
  if (!head) throw new CaseError(file, 'the measured sheet is empty (expected a header row: rpm and torque_Nm, torque_lbft, power_kW, power_hp or ve_pct)', 'file');
  const sep = head.text.includes('\t') ? '\t' : head.text.includes(';') ? ';' : ',';
  const names = head.text.split(sep).map((s) => s.trim().replace(/^"(.*)"$/, '$1'));
  const rpmAt = names.indexOf('rpm');
  if (rpmAt < 0) throw new CaseError(file, `row ${head.row}: no 'rpm' column (the header has ${names.map((n) => `'${n}'`).join(', ')})`, 'file');
  const valueCols: { at: number; name: string }[] = [];
  names.forEach((n, at) => {
    if (n === 'rpm') return;
    if (COLUMNS[n]) valueCols.push({ at, name: n });
    else throw new CaseError(file, `row ${head.row}, column '${n}': unknown column (use rpm and one of ${Object.keys(COLUMNS).join(', ')})`, 'file');
  });
  if (valueCols.length === 0) throw new CaseError(file, `row ${head.row}: no value column (add one of ${Object.keys(COLUMNS).join(', ')})`, 'file');
  const kinds = [...new Set(valueCols.map((c) => COLUMNS[c.name]!.kind))];
  if (kinds.length !== valueCols.length) throw new CaseError(file, `row ${head.row}: two columns of the same quantity (give torque, power and ve once each)`, 'file');
  const points: MeasuredPoint[] = [];
  for (const line of lines.slice(1)) {
    const cells = line.text.split(sep).map((s) => s.trim());
    if (cells.length !== names.length) throw new CaseError(file, `row ${line.row}: ${cells.length} cells, the header has ${names.length}`, 'file');
    const cell = (at: number, name: string): number | undefined => {
      const t = cells[at] ?? '';
      if (t === '') return undefined;
      if (!NUMBER.test(t)) throw new CaseError(file, `row ${line.row}, column '${name}': '${t}' is not a number`, 'file');
      const v = Number(t);
      if (!(v >= 0)) throw new CaseError(file, `row ${line.row}, column '${name}': ${t} is negative`, 'file');
      return v;
    };
    const rpm = cell(rpmAt, 'rpm');
    if (rpm === undefined || !(rpm > 0)) throw new CaseError(file, `row ${line.row}, column 'rpm': a speed above zero is needed`, 'file');
    const prev = points[points.length - 1];
    if (prev && !(rpm > prev.rpm)) throw new CaseError(file, `row ${line.row}, column 'rpm': ${rpm} does not increase (the row before has ${prev.rpm})`, 'file');
    const p: MeasuredPoint = { rpm };
    for (const c of valueCols) {
      const v = cell(c.at, c.name);
      if (v === undefined) continue;
      const def = COLUMNS[c.name]!;
      p[def.kind] = def.toSi(v);
    }
    points.push(p);
  }
  if (points.length === 0) throw new CaseError(file, 'no data rows after the header', 'file');
  return { file, kinds, points };
}

/** Read and parse a dyno sheet (relative to `cwd`). */
export async function loadMeasuredSheet(file: string, cwd?: string): Promise<MeasuredSheet> {
  return parseMeasuredSheet(await readCaseText(file, cwd), file);
}
