/**
 * A dyno sheet beside simulated curves, for `sweep` and `compare`: the JSON
 * `measured` list, the charts with the measured points, and the table of the
 * measured speeds against the model (its curve read at each measured speed).
 */
import { compareDyno, type DynoComparison, type DynoKind, type DynoPoint } from '../analysis/dyno.js';
import type { SweepPoint } from '../analysis/sweep.js';
import type { MeasuredSheet } from '../case/measured.js';
import { fix, table } from './format.js';
import { METRIC, type Units } from '../present/units.js';
import { curveChart, MEASURED_GLYPH, signed, wrapLine, type ChartMarks } from './commands/sweep.js';

/** the measured values of a point, as in the sheet (SI) */
function valuesOf(m: DynoPoint): Partial<Record<DynoKind, number>> {
  const v: Partial<Record<DynoKind, number>> = {};
  if (m.torque !== undefined) v.torque = m.torque;
  if (m.power !== undefined) v.power = m.power;
  if (m.volumetricEfficiency !== undefined) v.volumetricEfficiency = m.volumetricEfficiency;
  return v;
}

/** `measured` of sweep --json: each measured point with the model's values at its speed and the difference (model − measured). */
export function dynoJson(points: readonly SweepPoint[], sheet: MeasuredSheet) {
  return compareDyno(points, sheet.points).map((c) => ({ rpm: c.rpm, ...c.measured, model: c.model, difference: c.difference }));
}

/** `measured` of compare --json: each measured point against A and B. */
export function dynoJsonTwo(a: readonly SweepPoint[], b: readonly SweepPoint[], sheet: MeasuredSheet) {
  const ca = compareDyno(a, sheet.points);
  const cb = compareDyno(b, sheet.points);
  return sheet.points.map((m, i) => ({
    rpm: m.rpm,
    ...valuesOf(m),
    a: { model: ca[i]!.model, difference: ca[i]!.difference },
    b: { model: cb[i]!.model, difference: cb[i]!.difference },
  }));
}

type Shown = Record<DynoKind, { head: string; cell: (v: number) => string; chart: string; scale: number }>;

/** how each measured kind is shown in a unit system */
function showOf(u: Units): Shown {
  return {
    torque: { head: u.label('torque'), cell: (v) => u.value('torque', v, 1), chart: `estimated brake torque ${u.bracket('torque')} against speed`, scale: u.num('torque', 1) },
    power: { head: u.label('power'), cell: (v) => u.value('power', v, 2), chart: `estimated brake power ${u.bracket('power')} against speed`, scale: u.num('power', 1) },
    volumetricEfficiency: { head: 'ηv %', cell: (v) => fix(v * 100, 1), chart: 'volumetric efficiency ηv [%] against speed', scale: 100 },
  };
}

/** the measured kinds of a sheet, in the order torque, power, ηv */
export function sheetKinds(sheet: MeasuredSheet): DynoKind[] {
  return (['torque', 'power', 'volumetricEfficiency'] as const).filter((k) => sheet.points.some((p) => p[k] !== undefined));
}

/** the measured points of one kind in a chart's unit */
export function chartPoints(sheet: MeasuredSheet, kind: DynoKind, u: Units = METRIC): { rpm: number; value: number }[] {
  const SHOW = showOf(u);
  return sheet.points.filter((p) => p[kind] !== undefined).map((p) => ({ rpm: p.rpm, value: p[kind]! * SHOW[kind].scale }));
}

/**
 * The chart of torque (or else power) with the measured points, when the
 * sheet has them: the series are the curves' estimates (A line, B dots).
 */
export function outputChart(rpms: readonly number[], curves: readonly (readonly SweepPoint[])[], sheet: MeasuredSheet, marks: ChartMarks, u: Units = METRIC): string[] {
  const SHOW = showOf(u);
  const kind = sheetKinds(sheet).find((k) => k !== 'volumetricEfficiency');
  if (!kind) return [];
  const f = SHOW[kind].scale;
  return [
    '',
    `${SHOW[kind].chart}, ${MEASURED_GLYPH} measured`,
    ...curveChart(
      rpms,
      curves.map((c) => ({ values: c.map((p) => p[kind] * f) })),
      { ...marks, points: chartPoints(sheet, kind, u) },
    ),
  ];
}

/** Rows: each measured speed, each measured kind: measured, model, difference (%). */
export function dynoTable(rows: readonly DynoComparison[], kinds: readonly DynoKind[], u: Units = METRIC): string {
  const SHOW = showOf(u);
  const head = ['rpm', ...kinds.flatMap((k) => [`meas. ${SHOW[k].head}`, `model ${SHOW[k].head}`, 'Δ %'])];
  const body = rows.map((r) => [
    fix(r.rpm, 0),
    ...kinds.flatMap((k) => {
      const m = r.measured[k];
      if (m === undefined) return ['', '', ''];
      const y = r.model[k]!;
      return [SHOW[k].cell(m), Number.isFinite(y) ? SHOW[k].cell(y) : '—', Number.isFinite(r.relative[k]!) ? signed(r.relative[k]! * 100, 1) : '—'];
    }),
  ]);
  return table(head, body);
}

/** The text block of a sweep with a dyno sheet: the table and a line on how to read it. */
export function dynoBlock(points: readonly SweepPoint[], sheet: MeasuredSheet, u: Units = METRIC): string {
  const rows = compareDyno(points, sheet.points);
  const kinds = sheetKinds(sheet);
  let s = `\nmeasured (${sheet.file}) against the model at the measured speeds\n`;
  s += dynoTable(rows, kinds, u);
  const rel = rows.flatMap((r) => kinds.map((k) => r.relative[k])).filter((v): v is number => v !== undefined && Number.isFinite(v));
  if (rel.length > 0) {
    const rms = Math.sqrt(rel.reduce((t, v) => t + v * v, 0) / rel.length);
    s += `${wrapLine(`  RMS difference ${fix(rms * 100, 1)} % over ${rel.length} values; Δ = (model − measured)/measured; — outside the swept speeds`)}\n`;
  }
  if (kinds.some((k) => k !== 'volumetricEfficiency'))
    s += `${wrapLine("  the model's torque and power are estimates from ηv with the assumed efficiency: `tractwave calibrate` fits it to this sheet")}\n`;
  return s;
}

/** The text block of compare with a dyno sheet: measured against A and B. */
export function dynoBlockTwo(a: readonly SweepPoint[], b: readonly SweepPoint[], sheet: MeasuredSheet, u: Units = METRIC): string {
  const SHOW = showOf(u);
  const ra = compareDyno(a, sheet.points);
  const rb = compareDyno(b, sheet.points);
  const kinds = sheetKinds(sheet);
  const head = ['rpm', ...kinds.flatMap((k) => [`meas. ${SHOW[k].head}`, `A ${SHOW[k].head}`, 'A Δ %', `B ${SHOW[k].head}`, 'B Δ %'])];
  const cell = (r: DynoComparison, k: DynoKind) => {
    const y = r.model[k]!;
    return [Number.isFinite(y) ? SHOW[k].cell(y) : '—', Number.isFinite(r.relative[k]!) ? signed(r.relative[k]! * 100, 1) : '—'];
  };
  const body = ra.map((r, i) => [
    fix(r.rpm, 0),
    ...kinds.flatMap((k) => (r.measured[k] === undefined ? ['', '', '', '', ''] : [SHOW[k].cell(r.measured[k]!), ...cell(r, k), ...cell(rb[i]!, k)])),
  ]);
  const rms = (rows: DynoComparison[]) => {
    const rel = rows.flatMap((r) => kinds.map((k) => r.relative[k])).filter((v): v is number => v !== undefined && Number.isFinite(v));
    return rel.length > 0 ? Math.sqrt(rel.reduce((t, v) => t + v * v, 0) / rel.length) : Number.NaN;
  };
  let s = `\nmeasured (${sheet.file}) against A and B at the measured speeds\n`;
  s += table(head, body);
  s += `${wrapLine(`  RMS difference: A ${fix(rms(ra) * 100, 1)} %, B ${fix(rms(rb) * 100, 1)} %; Δ = (model − measured)/measured`)}\n`;
  return s;
}
