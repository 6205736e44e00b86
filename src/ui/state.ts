/**
 * The terminal view's state and its one pure reducer: key → typed action →
 * `reduce(state, action)`. Nothing here touches the terminal, files, the
 * clock or the solver; the top component (app.tsx) runs those effects and
 * reports back with actions such as `pointDone`.
 */
import type { PointResult } from '../core/model.js';
import { FIELDS, type FieldDef, fieldByPath, fieldIn, formatField, overrideText, parseTyped, roundTo } from './fields.js';
import { applyLineOp, insertText, type LineOp } from './line-edit.js';
import { mod } from './chart.js';
import { RPM_LIMITS } from '../case/schema.js';
import type { UnitSystem } from '../present/units.js';

export type ViewName = 'valve' | 'runner' | 'sweep' | 'case';
export const VIEWS: readonly ViewName[] = ['valve', 'runner', 'sweep', 'case'];
export const VIEW_TITLES: Record<ViewName, string> = {
  valve: 'Valve',
  runner: 'Runner',
  sweep: 'Sweep',
  case: 'Case',
};

/** The Valve view's charts; one is drawn large, the others as one-line strips (key c cycles). */
export type ValveChart = 'pressure' | 'flow' | 'mass';
export const VALVE_CHARTS: readonly ValveChart[] = ['pressure', 'flow', 'mass'];

/** the most results kept pinned as baselines (key p) */
export const MAX_PINS = 3;
/** how many edits ctrl+z can take back */
export const MAX_UNDO = 50;

/** Crank windows the zoom key cycles through [deg]. */
export const ZOOMS = [720, 360, 180, 90] as const;
/** Play rates [crank degrees per second]. */
export const RATES = [15, 30, 60, 120, 240, 480] as const;
/** Engine-speed step of the + and - keys [rpm]. */
export const RPM_STEP = 250;
/** the speed keys stay inside the limits every command uses (case/schema.ts RPM_LIMITS) */
export const RPM_MIN = RPM_LIMITS.min;
export const RPM_MAX = RPM_LIMITS.max;

/** Pulse timing as the analysis reports it, reduced to what the view shows. */
export interface PulseSummary {
  verdict: string;
  /** what the valve sees when it opens */
  openingNote?: string;
  /** wave round trip 12·N·L/a [crank deg] */
  roundTripDeg?: number;
  /** crank angle of the last compression peak before IVC [deg] */
  lastPeakDeg?: number;
  /** IVC − last peak [deg] (positive: the peak comes before closing) */
  peakBeforeIvcDeg?: number;
}

export interface PointShown {
  result: PointResult;
  pulse?: PulseSummary | undefined;
  /** what was changed to get this result (for the baseline label) */
  label: string;
  /** ambient pressure of the model it was run with [Pa] */
  ambient: number;
  /** the runner's upstream end opens to */
  upstream: 'ambient' | 'plenum';
  /** the field values it was run with (display units); set by the reducer */
  values?: Record<string, number> | undefined;
  /** the case's measured pressure trace against this result (analysis/trace-compare.ts) */
  traceCheck?: { model: ArrayLike<number>; verdict: string } | undefined;
}

export interface SweepCurve {
  rpms: number[];
  /** ηv per speed; null until computed */
  eta: (number | null)[];
  converged: (boolean | null)[];
  label: string;
}

export interface Edit {
  path: string;
  /** override text, e.g. "320 mm" */
  value: string;
}

/** the case's edits and panel values at one moment (for undo) */
export interface Snapshot {
  edits: Edit[];
  values: Record<string, number>;
}

export interface UiState {
  view: ViewName;
  /** the Valve view's large chart */
  bigChart: ValveChart;
  /** cursor crank angle [deg, 0..719] */
  crank: number;
  playing: boolean;
  rateIndex: number;
  /** fractional degrees carried between play ticks */
  playCarry: number;
  zoomIndex: number;
  /** which pipe the Runner view shows: 0 the runner, then the case's other pipes */
  pipeIndex: number;
  help: boolean;
  /** which page of the help: the keys, or the glossary of the words on the screens (g) */
  helpPage: 'keys' | 'words';
  /** first line shown of the glossary page */
  helpScroll: number;
  /** display units of every screen (u) */
  units: UnitSystem;
  teach: boolean;
  /** draw the case's measured data beside the model (m) */
  measured: boolean;
  quit: boolean;

  /** overrides applied on top of the case file, in order */
  edits: Edit[];
  /** the edits of the last result that ran without an input error */
  goodEdits: Edit[];
  /** field values in display units (case panel) */
  values: Record<string, number>;
  goodValues: Record<string, number>;
  /** fields this case has (e.g. no plenum volume without a plenum) */
  fields: readonly FieldDef[];
  selected: number;
  /** text being typed into the selected field, if editing */
  editing?: string | undefined;
  /** the cursor in the text being typed (a value or a file name) */
  cursor: number;
  /** the states before each edit, oldest first (ctrl+z goes back one) */
  history: Snapshot[];
  /** the field values of the case as loaded from its file */
  loadedValues: Record<string, number>;

  /** the run the top component should be doing (id changes → run) */
  request: { id: number; edits: Edit[]; label: string };
  running: boolean;
  point?: PointShown | undefined;
  /** the result before the present one */
  baseline?: PointShown | undefined;
  /** results pinned with p, oldest first (at most MAX_PINS) */
  pins: PointShown[];
  /** which baseline the view compares with: 0 the previous result, k the k-th pin (key b) */
  compare: number;
  runError?: string | undefined;

  sweepPlan: { rpms: number[]; band: { from: number; to: number } };
  sweepRequest: number;
  sweepStatus: 'idle' | 'running' | 'done' | 'stopped' | 'failed';
  sweep?: SweepCurve | undefined;
  sweepBaseline?: SweepCurve | undefined;
  /** the edits the current sweep was run with */
  sweepEdits?: Edit[] | undefined;

  /** a file being written: the edited case ('case', key w) or the report of it ('report', key r) */
  save?: { stage: 'typing' | 'checking' | 'confirm' | 'saving'; path: string; overwrite: boolean; kind: 'case' | 'report' } | undefined;
  suggestedSavePath: string;
  suggestedReportPath: string;
  /** the file the edited case was last saved to, and the edits it holds */
  savedAs?: { path: string; edits: Edit[] } | undefined;
  message?: { text: string; tone: 'info' | 'error' } | undefined;
}

export type Action =
  | { type: 'step'; by: number }
  | { type: 'setCrank'; to: number }
  | { type: 'nextEvent'; dir: 1 | -1 }
  | { type: 'togglePlay' }
  | { type: 'rate'; dir: 1 | -1 }
  | { type: 'tick'; ms: number }
  | { type: 'nextView'; dir: 1 | -1 }
  | { type: 'showView'; view: ViewName }
  | { type: 'speed'; by: number }
  | { type: 'toggleHelp' }
  | { type: 'helpPage'; page: 'keys' | 'words' }
  | { type: 'toggleUnits' }
  | { type: 'helpScroll'; by: number }
  | { type: 'closeHelp' }
  | { type: 'toggleTeach' }
  | { type: 'toggleMeasured' }
  | { type: 'zoom'; dir: 1 | -1 }
  | { type: 'pipe'; by: number }
  | { type: 'pinBaseline' }
  | { type: 'cycleBaseline' }
  | { type: 'clearPins' }
  | { type: 'cycleChart' }
  | { type: 'undo' }
  | { type: 'lineOp'; op: LineOp }
  | { type: 'quit' }
  | { type: 'select'; by: number }
  | { type: 'beginEdit' }
  | { type: 'type'; text: string }
  | { type: 'backspace' }
  | { type: 'commitEdit' }
  | { type: 'cancel' }
  | { type: 'nudge'; dir: 1 | -1 }
  | { type: 'pointDone'; id: number; point: PointShown }
  | { type: 'pointFailed'; id: number; message: string; badInput: boolean }
  | { type: 'sweepStart' }
  | { type: 'sweepStop' }
  | { type: 'sweepPoint'; id: number; index: number; eta: number; converged: boolean }
  | { type: 'sweepDone'; id: number }
  | { type: 'sweepFailed'; id: number; message: string }
  | { type: 'pinSweep' }
  | { type: 'beginSave' }
  | { type: 'beginReport' }
  | { type: 'saveChecked'; exists: boolean }
  | { type: 'confirm'; yes: boolean }
  | { type: 'saved'; path: string; next: string }
  | { type: 'saveFailed'; message: string }
  | { type: 'suggestSave'; path: string }
  | { type: 'suggestReport'; path: string }
  | { type: 'message'; text: string; tone: 'info' | 'error' };

export interface InitOptions {
  /** field values in display units, from the case */
  values: Record<string, number>;
  /** the fields this case has, in order (default: those of FIELDS with a value) */
  fields?: readonly FieldDef[];
  sweepPlan: { rpms: number[]; band: { from: number; to: number } };
  suggestedSavePath: string;
  suggestedReportPath?: string;
  teach?: boolean;
  /** display units at start (the case's display.units) */
  units?: UnitSystem;
}

export function initialState(o: InitOptions): UiState {
  const fields = (o.fields ?? FIELDS).filter((f) => o.values[f.path] !== undefined);
  return {
    view: 'valve',
    bigChart: 'pressure',
    crank: 0,
    playing: false,
    rateIndex: 2,
    playCarry: 0,
    zoomIndex: 0,
    pipeIndex: 0,
    help: false,
    helpPage: 'keys',
    helpScroll: 0,
    units: o.units ?? 'metric',
    teach: o.teach ?? true,
    measured: true,
    quit: false,
    edits: [],
    goodEdits: [],
    values: { ...o.values },
    goodValues: { ...o.values },
    fields,
    selected: 0,
    cursor: 0,
    history: [],
    loadedValues: { ...o.values },
    pins: [],
    compare: 0,
    request: { id: 1, edits: [], label: AS_LOADED },
    running: true,
    sweepPlan: o.sweepPlan,
    sweepRequest: 0,
    sweepStatus: 'idle',
    suggestedSavePath: o.suggestedSavePath,
    suggestedReportPath: o.suggestedReportPath ?? '',
  };
}

export function zoomSpan(s: UiState): number {
  return ZOOMS[s.zoomIndex] ?? 720;
}

export function playRate(s: UiState): number {
  return RATES[s.rateIndex] ?? 60;
}

/** The valve events of the shown result, sorted by crank angle. */
export function eventList(s: UiState): { name: string; at: number }[] {
  const ev = s.point?.result.events;
  if (!ev) return [];
  return [
    { name: 'IVO', at: ev.ivo },
    { name: 'IVC', at: ev.ivc },
    { name: 'EVO', at: ev.evo },
    { name: 'EVC', at: ev.evc },
  ]
    .map((e) => ({ name: e.name, at: mod(Math.round(e.at), 720) }))
    .sort((a, b) => a.at - b.at);
}

/** The next (dir 1) or previous (dir −1) valve event from `crank`, wrapping around the cycle. */
export function nextEventAngle(events: readonly { at: number }[], crank: number, dir: 1 | -1): number | undefined {
  if (events.length === 0) return undefined;
  let best: number | undefined;
  let bestGap = Infinity;
  for (const e of events) {
    const gap = dir === 1 ? mod(e.at - crank, 720) : mod(crank - e.at, 720);
    const g = gap === 0 ? 720 : gap;
    if (g < bestGap) {
      bestGap = g;
      best = e.at;
    }
  }
  return best;
}

/** the words for the case as its file has it, no edits */
export const AS_LOADED = 'as in the case file';

function withEdit(edits: readonly Edit[], edit: Edit): Edit[] {
  return [...edits.filter((e) => e.path !== edit.path), edit];
}

/** "runner length 320 mm": a kept value in the display units of `system` */
function describeEdit(field: FieldDef, value: number, system: UnitSystem): string {
  const v = fieldIn(field, system);
  return `${field.label.toLowerCase()} ${formatField(v.def, v.toShown(value))} ${v.def.unit}`.trimEnd();
}

/** Change one field (display units) and ask for a re-run. */
function applyValue(s: UiState, field: FieldDef, value: number): UiState {
  const edits = withEdit(s.edits, { path: field.path, value: overrideText(field, value) });
  const history = [...s.history, { edits: s.edits, values: s.values }].slice(-MAX_UNDO);
  return afterChange(s, { ...s, history, edits, values: { ...s.values, [field.path]: value } }, describeEdit(field, value, s.units));
}

/** Run the changed design; a design change (speed aside) re-runs a sweep that was run. */
function afterChange(before: UiState, changed: UiState, label: string): UiState {
  const next: UiState = {
    ...changed,
    editing: undefined,
    request: { id: before.request.id + 1, edits: changed.edits, label },
    running: true,
    runError: undefined,
    message: undefined,
  };
  // a design change makes the sweep curve out of date: keep it as the
  // baseline and run the new curve in the background (speed changes do not)
  if (designKey(before.edits) !== designKey(changed.edits) && before.sweep && before.sweepStatus !== 'idle') return startSweep(next);
  return next;
}

/** the design part of some edits (the speed aside), as one comparable string */
function designKey(edits: readonly Edit[]): string {
  return JSON.stringify(edits.filter((e) => e.path !== 'rpm').sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0)));
}

/** Take back the last edit (ctrl+z): the edits and values before it, re-run. */
function undo(s: UiState): UiState {
  const history = [...s.history];
  const key = JSON.stringify(s.edits);
  let back: Snapshot | undefined;
  // skip states equal to the present one (an edit refused as bad input was already put back)
  while (history.length > 0) {
    const top = history.pop() as Snapshot;
    if (JSON.stringify(top.edits) !== key) {
      back = top;
      break;
    }
  }
  if (!back) return { ...s, history: [], message: { text: 'Nothing to undo: this is the case as loaded or as first changed.', tone: 'info' } };
  const undone = whatDiffers(s.fields, s.values, back.values, s.units);
  const changed = afterChange(s, { ...s, history, edits: back.edits, values: { ...back.values } }, `undo (${undone})`);
  return { ...changed, message: { text: `Undone: back to ${undone}${history.length > 0 ? ` (${history.length} more ctrl+z)` : ''}.`, tone: 'info' } };
}

/**
 * What `was` differs in from `now`, in the panel's words ("runner length
 * 600 mm, engine speed 5000 rpm"); the same design when nothing differs.
 */
export function whatDiffers(
  fields: readonly FieldDef[],
  now: Readonly<Record<string, number>>,
  was: Readonly<Record<string, number>> | undefined,
  system: UnitSystem = 'metric',
  max = 3,
): string {
  if (!was) return 'the same design';
  const parts: string[] = [];
  for (const f of fields) {
    const a = was[f.path];
    const b = now[f.path];
    const v = fieldIn(f, system);
    if (a === undefined || b === undefined || formatField(v.def, v.toShown(a)) === formatField(v.def, v.toShown(b))) continue;
    parts.push(describeEdit(f, a, system));
  }
  if (parts.length === 0) return 'the same design';
  return parts.length > max ? `${parts.slice(0, max).join(', ')} (+${parts.length - max} more)` : parts.join(', ');
}

/** The baseline the view compares with: the previous result, or the pin chosen with b. */
export function shownBaseline(s: UiState): PointShown | undefined {
  return s.compare > 0 ? (s.pins[s.compare - 1] ?? s.baseline) : s.baseline;
}

/** The name of the baseline compared with: "previous result" or "pin B". */
export function baselineName(s: UiState): string {
  return s.compare > 0 && s.pins[s.compare - 1] ? `pin ${pinLetter(s.compare - 1)}` : 'previous result';
}

export function pinLetter(i: number): string {
  return String.fromCharCode(65 + i);
}

/** The label of a baseline against the present design: its name and what differed. */
export function baselineLabel(s: UiState, b: PointShown | undefined = shownBaseline(s), name = baselineName(s)): string {
  if (!b) return '';
  return `${name}: ${whatDiffers(s.fields, s.values, b.values, s.units)}`;
}

/** The design a sweep curve belongs to: its changes from the case file, speed aside. */
export function designLabel(s: UiState): string {
  const design = s.edits.filter((e) => e.path !== 'rpm');
  if (design.length === 0) return AS_LOADED;
  const last = design[design.length - 1] as Edit;
  const f = fieldByPath(last.path, s.fields);
  const v = s.values[last.path];
  const words = f && v !== undefined ? describeEdit(f, v, s.units) : `${last.path} ${last.value}`;
  return design.length > 1 ? `${words} (+${design.length - 1} more)` : words;
}

function startSweep(s: UiState): UiState {
  const keepAsBaseline = s.sweep && s.sweep.eta.some((v) => v !== null) ? s.sweep : s.sweepBaseline;
  return {
    ...s,
    sweepRequest: s.sweepRequest + 1,
    sweepStatus: 'running',
    sweep: {
      rpms: [...s.sweepPlan.rpms],
      eta: s.sweepPlan.rpms.map(() => null),
      converged: s.sweepPlan.rpms.map(() => null),
      label: designLabel(s),
    },
    sweepBaseline: keepAsBaseline,
    sweepEdits: s.edits,
  };
}

/** Go to a view; the first visit to the sweep view starts the sweep (there is nothing to see before). */
function enterView(s: UiState, view: ViewName): UiState {
  const next = { ...s, view, editing: undefined };
  return view === 'sweep' && s.sweepStatus === 'idle' && !s.sweep ? startSweep(next) : next;
}

function clampRpm(v: number): number {
  return Math.min(RPM_MAX, Math.max(RPM_MIN, v));
}

export function reduce(s: UiState, a: Action): UiState {
  switch (a.type) {
    case 'step':
      return { ...s, crank: mod(s.crank + a.by, 720), playCarry: 0 };
    case 'setCrank':
      return { ...s, crank: mod(Math.round(a.to), 720), playCarry: 0 };
    case 'nextEvent': {
      const at = nextEventAngle(eventList(s), s.crank, a.dir);
      return at === undefined ? s : { ...s, crank: at, playCarry: 0 };
    }
    case 'togglePlay':
      return { ...s, playing: !s.playing, playCarry: 0 };
    case 'rate':
      return { ...s, rateIndex: Math.min(RATES.length - 1, Math.max(0, s.rateIndex + a.dir)) };
    case 'tick': {
      if (!s.playing) return s;
      const deg = s.playCarry + (playRate(s) * a.ms) / 1000;
      const whole = Math.floor(deg);
      return { ...s, crank: mod(s.crank + whole, 720), playCarry: deg - whole };
    }
    case 'nextView': {
      const i = VIEWS.indexOf(s.view);
      const view = VIEWS[mod(i + a.dir, VIEWS.length)] as ViewName;
      return enterView(s, view);
    }
    case 'showView':
      return enterView(s, a.view);
    case 'speed': {
      const field = fieldByPath('rpm');
      const current = s.values['rpm'];
      if (!field || current === undefined) return s;
      const next = clampRpm(Math.round((current + a.by) / RPM_STEP) * RPM_STEP);
      if (next === current) return s;
      return applyValue(s, field, next);
    }
    case 'toggleHelp':
      return { ...s, help: !s.help, helpPage: 'keys' };
    case 'closeHelp':
      return { ...s, help: false, helpPage: 'keys' };
    case 'helpPage':
      return { ...s, help: true, helpPage: a.page, helpScroll: 0 };
    case 'helpScroll':
      return { ...s, helpScroll: Math.max(0, s.helpScroll + a.by) };
    case 'toggleUnits': {
      const units: UnitSystem = s.units === 'metric' ? 'imperial' : 'metric';
      return { ...s, units, message: { text: units === 'imperial' ? 'Imperial units: in, ci, psi, inHg vs ambient, lb/min, gr, °F (u: metric).' : 'Metric units: mm, L, kPa, g/s, mg, °C (u: imperial).', tone: 'info' } };
    }
    case 'toggleTeach':
      return { ...s, teach: !s.teach };
    case 'toggleMeasured':
      return { ...s, measured: !s.measured, message: { text: s.measured ? 'Measured data hidden (m shows them).' : 'Measured data shown beside the model.', tone: 'info' } };
    case 'zoom':
      return { ...s, zoomIndex: Math.min(ZOOMS.length - 1, Math.max(0, s.zoomIndex + a.dir)) };
    case 'pipe': {
      const count = s.point?.result.pipes.length ?? 1;
      if (count <= 1) return { ...s, pipeIndex: 0, message: { text: 'This case has one pipe, the runner.', tone: 'info' } };
      return { ...s, pipeIndex: mod(s.pipeIndex + a.by, count), message: undefined };
    }
    case 'pinBaseline': {
      if (!s.point) return s;
      const dropped = s.pins.length >= MAX_PINS;
      const pins = [...s.pins, s.point].slice(-MAX_PINS);
      const letter = pinLetter(pins.length - 1);
      return {
        ...s,
        pins,
        compare: pins.length,
        message: {
          text: `Pinned this result as ${letter} (${pins.length} of ${MAX_PINS}${dropped ? ', the oldest dropped' : ''}); b picks the baseline to compare, P clears the pins.`,
          tone: 'info',
        },
      };
    }
    case 'cycleBaseline': {
      if (s.pins.length === 0) return { ...s, compare: 0, message: { text: 'Comparing with the previous result; p pins this one to keep it.', tone: 'info' } };
      const compare = mod(s.compare + 1, s.pins.length + 1);
      const next = { ...s, compare };
      return { ...next, message: { text: `Comparing with ${baselineLabel(next) || baselineName(next)}.`, tone: 'info' } };
    }
    case 'clearPins':
      return { ...s, pins: [], compare: 0, message: { text: s.pins.length > 0 ? 'Pins cleared; comparing with the previous result.' : 'No pins to clear.', tone: 'info' } };
    case 'cycleChart': {
      const next = VALVE_CHARTS[mod(VALVE_CHARTS.indexOf(s.bigChart) + 1, VALVE_CHARTS.length)] as ValveChart;
      return { ...s, bigChart: next };
    }
    case 'undo':
      return undo(s);
    case 'lineOp': {
      if (s.save && s.save.stage === 'typing') {
        const l = applyLineOp({ text: s.save.path, cursor: s.cursor }, a.op);
        return { ...s, save: { ...s.save, path: l.text }, cursor: l.cursor };
      }
      if (s.editing === undefined) return s;
      const l = applyLineOp({ text: s.editing, cursor: s.cursor }, a.op);
      return { ...s, editing: l.text, cursor: l.cursor };
    }
    case 'quit':
      return { ...s, quit: true, playing: false };

    case 'select': {
      if (s.fields.length === 0) return s;
      return { ...s, selected: mod(s.selected + a.by, s.fields.length), editing: undefined };
    }
    case 'beginEdit': {
      const f = s.fields[s.selected];
      if (!f) return s;
      return { ...s, editing: '', cursor: 0, message: undefined };
    }
    case 'type': {
      if (s.save && s.save.stage === 'typing') {
        const l = insertText({ text: s.save.path, cursor: s.cursor }, a.text);
        return { ...s, save: { ...s.save, path: l.text }, cursor: l.cursor };
      }
      if (s.editing === undefined) return s;
      const l = insertText({ text: s.editing, cursor: s.cursor }, a.text, 16);
      return { ...s, editing: l.text, cursor: l.cursor };
    }
    case 'backspace':
      return reduce(s, { type: 'lineOp', op: 'backspace' });
    case 'commitEdit': {
      const f = s.fields[s.selected];
      if (!f || s.editing === undefined) return s;
      const view = fieldIn(f, s.units);
      const typed = parseTyped(s.editing);
      if (typed === undefined) {
        return { ...s, message: { text: `${f.label}: type a plain number${view.def.unit.trim() ? ` (${view.def.unit.trim()})` : ''}, got '${s.editing.trim()}'.`, tone: 'error' } };
      }
      // typed in the shown unit, kept in the field's own (the override's)
      const v = view.fromShown(typed);
      const was = s.values[f.path];
      if (was !== undefined && formatField(view.def, view.toShown(was)) === formatField(view.def, typed)) return { ...s, editing: undefined };
      return applyValue(s, f, v);
    }
    case 'cancel': {
      if (s.save) return { ...s, save: undefined, message: { text: s.save.kind === 'report' ? 'No report written.' : 'Not saved.', tone: 'info' } };
      if (s.editing !== undefined) return { ...s, editing: undefined };
      if (s.help) return { ...s, help: false };
      return s;
    }
    case 'nudge': {
      const f = s.fields[s.selected];
      const v = f ? s.values[f.path] : undefined;
      if (!f || v === undefined) return s;
      // a step in the shown unit (0.5 in, not 12.7 mm), kept in the field's own
      const view = fieldIn(f, s.units);
      const next = view.fromShown(roundTo(view.toShown(v) + a.dir * view.def.step, view.def.decimals + 2));
      if (f.path === 'rpm') return applyValue(s, f, clampRpm(next));
      return applyValue(s, f, next);
    }

    case 'pointDone': {
      if (a.id !== s.request.id) return s;
      const first = s.point === undefined;
      return {
        ...s,
        running: false,
        point: { ...a.point, values: { ...s.values } },
        baseline: first ? s.baseline : s.point,
        goodEdits: s.request.edits,
        goodValues: { ...s.values },
        runError: undefined,
      };
    }
    case 'pointFailed': {
      if (a.id !== s.request.id) return s;
      if (a.badInput) {
        // put the bad value back, keep the last good result on screen (and drop its undo step)
        return {
          ...s,
          // (an undo took its step already)
          history: s.request.label.startsWith('undo') ? s.history : s.history.slice(0, -1),
          running: false,
          edits: s.goodEdits,
          values: { ...s.goodValues },
          request: { ...s.request, edits: s.goodEdits },
          runError: a.message,
          // say which change was refused: the message may name another field it conflicts with
          message: { text: s.request.label ? `${s.request.label} refused: ${a.message}` : a.message, tone: 'error' },
        };
      }
      return { ...s, running: false, runError: a.message, message: { text: a.message, tone: 'error' } };
    }

    case 'sweepStart':
      return startSweep(s);
    case 'sweepStop':
      if (s.sweepStatus !== 'running') return s;
      return { ...s, sweepStatus: 'stopped', sweepRequest: s.sweepRequest + 1 };
    case 'sweepPoint': {
      if (a.id !== s.sweepRequest || !s.sweep) return s;
      const eta = [...s.sweep.eta];
      const converged = [...s.sweep.converged];
      eta[a.index] = a.eta;
      converged[a.index] = a.converged;
      return { ...s, sweep: { ...s.sweep, eta, converged } };
    }
    case 'sweepDone':
      if (a.id !== s.sweepRequest) return s;
      return { ...s, sweepStatus: 'done' };
    case 'sweepFailed':
      if (a.id !== s.sweepRequest) return s;
      return { ...s, sweepStatus: 'failed', message: { text: a.message, tone: 'error' } };
    case 'pinSweep':
      if (!s.sweep) return s;
      return { ...s, sweepBaseline: s.sweep, message: { text: 'Pinned this curve as the baseline.', tone: 'info' } };

    case 'beginSave':
      // the prompt is in the case view
      return {
        ...s,
        view: 'case',
        help: false,
        editing: undefined,
        save: { stage: 'typing', path: s.suggestedSavePath, overwrite: false, kind: 'case' },
        cursor: s.suggestedSavePath.length,
        message: undefined,
      };
    case 'beginReport':
      // the prompt is in the case view too
      return {
        ...s,
        view: 'case',
        help: false,
        editing: undefined,
        playing: false,
        save: { stage: 'typing', path: s.suggestedReportPath, overwrite: false, kind: 'report' },
        cursor: s.suggestedReportPath.length,
        message: undefined,
      };
    case 'saveChecked':
      if (!s.save || (s.save.stage !== 'checking' && s.save.stage !== 'saving')) return s;
      return { ...s, save: { ...s.save, stage: a.exists ? 'confirm' : 'saving' } };
    case 'confirm':
      if (!s.save) return s;
      if (s.save.stage === 'typing') {
        // Enter on the path
        if (s.save.path.trim() === '') return { ...s, message: { text: 'Type a file name to save to.', tone: 'error' } };
        return { ...s, save: { ...s.save, path: s.save.path.trim(), stage: 'checking' } };
      }
      if (s.save.stage !== 'confirm') return s;
      if (!a.yes) return { ...s, save: { ...s.save, stage: 'typing' }, cursor: s.save.path.length, message: { text: 'Choose another name.', tone: 'info' } };
      return { ...s, save: { ...s.save, stage: 'saving', overwrite: true } };
    case 'saved':
      if (s.save?.kind === 'report')
        return { ...s, save: undefined, suggestedReportPath: a.next, message: { text: `Report written to ${a.path}`, tone: 'info' } };
      return {
        ...s,
        save: undefined,
        suggestedSavePath: a.next,
        savedAs: { path: a.path, edits: s.edits },
        message: { text: `Saved to ${a.path}`, tone: 'info' },
      };
    case 'saveFailed':
      return { ...s, save: undefined, message: { text: a.message, tone: 'error' } };
    case 'suggestSave':
      return { ...s, suggestedSavePath: a.path };
    case 'suggestReport':
      return { ...s, suggestedReportPath: a.path };
    case 'message':
      return { ...s, message: { text: a.text, tone: a.tone } };
  }
}

/** Whether a sweep exists that was run for another design than the present one (the speed of the point aside: a sweep covers every speed). */
export function sweepIsStale(s: UiState): boolean {
  if (!s.sweep || !s.sweepEdits) return false;
  return designKey(s.sweepEdits) !== designKey(s.edits);
}
