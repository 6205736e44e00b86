/**
 * The case view as text lines: the main values of the case with units, the
 * selected one marked, the value typed so far, what changed against the
 * baseline run, the latest result in numbers, and the save prompt. Pure.
 */
import type { FieldDef } from './fields.js';
import { fieldIn, formatField } from './fields.js';
import { etaPct, etaPoints, firstFit, fit, joinFit, wrapWords } from './text.js';
import { METRIC, type Units } from '../present/units.js';
import { fixed } from '../present/number.js';
import { withCursor } from './line-edit.js';
import { padLines } from './valve-screen.js';

export interface CaseScreenInput {
  width: number;
  rows: number;
  name: string;
  file: string;
  /** the file the edited case was last saved to, and whether it was edited since */
  savedAs?: { path: string; changedSince: boolean } | undefined;
  fields: readonly FieldDef[];
  values: Readonly<Record<string, number>>;
  /** the values the baseline result was run with */
  baseValues?: Readonly<Record<string, number>> | undefined;
  selected: number;
  editing?: string | undefined;
  /** the cursor in the text being typed (default: its end) */
  cursor?: number | undefined;
  running: boolean;
  result?: ResultNumbers | undefined;
  baseline?: ResultNumbers | undefined;
  baselineLabel?: string | undefined;
  /** the pinned results: name, ηv, what differed from the present design, whether it is the one compared */
  pins?: readonly { name: string; eta: number; differs: string; compared: boolean }[] | undefined;
  /** an edit can be taken back (ctrl+z) */
  canUndo?: boolean | undefined;
  save?: { stage: 'typing' | 'checking' | 'confirm' | 'saving'; path: string; kind?: 'case' | 'report' } | undefined;
  /** display units (the u key): of the results, and of the values, which are typed in them too */
  units?: Units | undefined;
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
  const base = (p: string): string => p.split(/[\\/]/).pop() ?? p;
  const where = (p: string): string => (i.savedAs ? `saved as ${p}${i.savedAs.changedSince ? ', changed since' : ''}` : p);
  const shownFile = i.savedAs?.path ?? i.file;
  const title = firstFit([`Case: ${i.name}  (${where(shownFile)})`, `Case: ${i.name}  (${where(base(shownFile))})`, `Case: ${i.name}`], w);
  const cursorAt = (text: string): string => withCursor({ text, cursor: i.cursor ?? text.length });
  const labelW = Math.max(...i.fields.map((f) => f.label.length), 10);
  const system = i.units?.system ?? 'metric';
  const sel = i.fields[i.selected] ? fieldIn(i.fields[i.selected]!, system).def : undefined;

  const below: string[] = [fit('', w)];
  if (i.save) {
    const report = i.save.kind === 'report';
    const prompt =
      i.save.stage === 'confirm'
        ? `${i.save.path} already exists. Overwrite it? y = yes, n = choose another name`
        : i.save.stage === 'typing'
          ? report
            ? `Write the report of this case (HTML) to: ${cursorAt(i.save.path)}   (enter writes, esc cancels)`
            : `Save the changed case as: ${cursorAt(i.save.path)}   (enter saves, esc cancels)`
          : report
            ? `Writing the report to ${i.save.path} … (a sweep and the best speed run first: a few seconds)`
            : `Saving to ${i.save.path} …`;
    below.push(...wrapWords(prompt, w, 2));
  } else if (i.editing !== undefined && sel) {
    below.push(...wrapWords(`Type the new ${sel.label.toLowerCase()}${sel.unit.trim() ? ` (${sel.unit.trim()})` : ''}; enter runs it, esc keeps the old value; ← → ctrl+a/e move, ctrl+u clears.`, w, 2));
  } else if (sel) {
    below.push(...wrapWords(`${sel.label}: ${sel.hint}.  enter types a value, , and . step it${i.canUndo ? ', ctrl+z undoes' : ''}, w saves, r writes a report.`, w, 2));
  }
  below.push(fit('', w));
  const r = i.result;
  if (r) {
    const b = i.baseline;
    const d = b ? ` (baseline ${etaPct(b.volumetricEfficiency)}, ${etaPoints(r.volumetricEfficiency, b.volumetricEfficiency)})` : '';
    below.push(fit(`${i.running ? 'Running… last result' : 'Result'}: volumetric efficiency ηv ${etaPct(r.volumetricEfficiency)}${d}`, w));
    below.push(
      joinFit(
        [
          `trapped ${(i.units ?? METRIC).text('mass', r.trappedMass)}`,
          `cylinder at IVC ${(i.units ?? METRIC).text('pressure', r.ivcPressure)}`,
          `${r.cycles} cycles${r.converged ? ', converged' : ', NOT converged'}`,
          `mass balance ${fixed(r.massImbalance * 100, 2)} %`,
        ],
        w,
        ' · ',
      ),
    );
    const pins = i.pins ?? [];
    if (b && i.baselineLabel) below.push(firstFit([`Baseline, ${i.baselineLabel}${pins.length > 0 ? '   (b another, P clears pins)' : ''}`, `Baseline, ${i.baselineLabel}`], w));
    // one line a pin, the one compared marked
    for (const p of pins) below.push(fit(`${p.compared ? '▸' : ' '} ${p.name} ${etaPct(p.eta)} (${p.differs})`, w));
  } else {
    below.push(fit(i.running ? 'Running the point…' : 'No result yet.', w));
  }

  // the list scrolls to keep the selected value in view
  const room = Math.max(1, i.rows - 1 - below.length);
  const first = listWindow(i.fields.length, room, i.selected);
  const shown = i.fields.slice(first, first + room);
  const rows = shown.map((f, k) => {
    const index = first + k;
    const view = fieldIn(f, system);
    const kept = i.values[f.path];
    const v = kept !== undefined ? view.toShown(kept) : undefined;
    const isSel = index === i.selected;
    const value = isSel && i.editing !== undefined ? cursorAt(i.editing) : v !== undefined ? formatField(view.def, v) : '—';
    const keptWas = i.baseValues?.[f.path];
    const was = keptWas !== undefined ? view.toShown(keptWas) : undefined;
    const change = was !== undefined && v !== undefined && formatField(view.def, was) !== formatField(view.def, v) ? `(baseline ${formatField(view.def, was)})` : '';
    const more = k === 0 && first > 0 ? '↑' : k === shown.length - 1 && first + room < i.fields.length ? '↓' : ' ';
    return fit(`${isSel ? '▶' : more} ${f.label.padEnd(labelW)}  ${value.padStart(9)} ${view.def.unit.padEnd(7)} ${change}`, w);
  });
  return padLines([title, ...rows, ...below], i.rows, w);
}

/** The first index of a window of `room` items out of `count` that shows `selected`, centred when it can be. */
export function listWindow(count: number, room: number, selected: number): number {
  if (count <= room) return 0;
  const centred = selected - Math.floor(room / 2);
  return Math.max(0, Math.min(count - room, centred));
}
