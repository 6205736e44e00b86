/**
 * The case view as text lines: the main values of the case with units, the
 * selected one marked, the value typed so far, what changed against the
 * baseline run, the latest result in numbers, and the save prompt. Pure.
 */
import type { FieldDef } from './fields.js';
import { formatField } from './fields.js';
import { firstFit, fit, joinFit, kpa, mg, wrapWords } from './text.js';
import { padLines } from './valve-screen.js';

export interface CaseScreenInput {
  width: number;
  rows: number;
  name: string;
  file: string;
  fields: readonly FieldDef[];
  values: Readonly<Record<string, number>>;
  /** the values the baseline result was run with */
  baseValues?: Readonly<Record<string, number>> | undefined;
  selected: number;
  editing?: string | undefined;
  running: boolean;
  result?: ResultNumbers | undefined;
  baseline?: ResultNumbers | undefined;
  baselineLabel?: string | undefined;
  save?: { stage: 'typing' | 'checking' | 'confirm' | 'saving'; path: string } | undefined;
}

export interface ResultNumbers {
  volumetricEfficiency: number;
  trappedMass: number;
  ivcPressure: number;
  cycles: number;
  converged: boolean;
  massImbalance: number;
}

export function caseScreen(i: CaseScreenInput): string[] {
  const w = i.width;
  const lines: string[] = [];
  lines.push(firstFit([`Case: ${i.name}  (${i.file})`, `Case: ${i.name}`], w));
  const labelW = Math.max(...i.fields.map((f) => f.label.length), 10);
  i.fields.forEach((f, k) => {
    const v = i.values[f.path];
    const sel = k === i.selected;
    const shown = sel && i.editing !== undefined ? `${i.editing}▌` : v !== undefined ? formatField(f, v) : '—';
    const was = i.baseValues?.[f.path];
    const change = was !== undefined && v !== undefined && formatField(f, was) !== formatField(f, v) ? `(baseline ${formatField(f, was)})` : '';
    const row = `${sel ? '▶' : ' '} ${f.label.padEnd(labelW)}  ${shown.padStart(9)} ${f.unit.padEnd(7)} ${change}`;
    lines.push(fit(row, w));
  });
  const sel = i.fields[i.selected];
  lines.push(fit('', w));
  if (i.save) {
    const prompt =
      i.save.stage === 'confirm'
        ? `${i.save.path} already exists. Overwrite it? y = yes, n = choose another name`
        : i.save.stage === 'typing'
          ? `Save the changed case as: ${i.save.path}▌   (enter saves, esc cancels)`
          : `Saving to ${i.save.path} …`;
    lines.push(...wrapWords(prompt, w, 2));
  } else if (i.editing !== undefined && sel) {
    lines.push(fit(`Type the new ${sel.label.toLowerCase()} in ${sel.unit}; enter runs it, esc keeps the old value.`, w));
  } else if (sel) {
    lines.push(...wrapWords(`${sel.label}: ${sel.hint}.  enter types a value, , and . step it, w saves.`, w, 2));
  }
  lines.push(fit('', w));
  const r = i.result;
  if (r) {
    const b = i.baseline;
    const d = b ? ` (baseline ${b.volumetricEfficiency.toFixed(3)}, ${signed((r.volumetricEfficiency / b.volumetricEfficiency - 1) * 100)} %)` : '';
    lines.push(fit(`${i.running ? 'Running… last result' : 'Result'}: volumetric efficiency ηv ${r.volumetricEfficiency.toFixed(3)}${d}`, w));
    lines.push(
      joinFit(
        [
          `trapped ${mg(r.trappedMass)} mg`,
          `cylinder at IVC ${kpa(r.ivcPressure)} kPa`,
          `${r.cycles} cycles${r.converged ? ', converged' : ', NOT converged'}`,
          `mass balance ${(r.massImbalance * 100).toFixed(2)} %`,
        ],
        w,
        ' · ',
      ),
    );
    if (b && i.baselineLabel) lines.push(fit(`Baseline: ${i.baselineLabel}`, w));
  } else {
    lines.push(fit(i.running ? 'Running the point…' : 'No result yet.', w));
  }
  return padLines(lines, i.rows, w);
}

function signed(v: number): string {
  return `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(1)}`;
}
