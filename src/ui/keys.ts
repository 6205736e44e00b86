/**
 * Keys → typed actions. Pure: takes what Ink reports for a key press and the
 * current state (for the mode: help, typing a value, typing a file name,
 * confirming) and returns the action, or undefined for an unused key.
 *
 * The same table feeds the help screen, so the help lists every key there is.
 */
import type { Action, UiState } from './state.js';
import { RPM_STEP, VIEWS, reduce } from './state.js';
import { lineOpOfKey } from './line-edit.js';

/** The subset of Ink's `Key` this module reads. */
export interface KeyInfo {
  upArrow?: boolean;
  downArrow?: boolean;
  leftArrow?: boolean;
  rightArrow?: boolean;
  pageUp?: boolean;
  pageDown?: boolean;
  home?: boolean;
  end?: boolean;
  return?: boolean;
  escape?: boolean;
  ctrl?: boolean;
  shift?: boolean;
  meta?: boolean;
  tab?: boolean;
  backspace?: boolean;
  delete?: boolean;
}

export interface HelpEntry {
  keys: string;
  what: string;
}

export interface HelpGroup {
  title: string;
  entries: HelpEntry[];
}

/** Quitting and closing the help; shown in the help screen's title line. */
export const HELP_LEAVE: readonly HelpEntry[] = [
  { keys: 'q  ctrl+c', what: 'quit' },
  { keys: '?  esc', what: 'close this help' },
  { keys: 'g  k', what: 'words / keys' },
];

export const HELP: readonly HelpGroup[] = [
  {
    title: 'Crank angle',
    entries: [
      { keys: '← →', what: 'one degree' },
      { keys: '[ ]  shift+←→', what: 'ten degrees' },
      { keys: 'n  N', what: 'next / prev event' },
      { keys: 'home', what: 'back to 0° (TDC)' },
      { keys: 'space  < >', what: 'play, slower/faster' },
      { keys: 'z  Z', what: 'zoom in / out' },
    ],
  },
  {
    title: 'Compare and learn',
    entries: [
      { keys: 'p  b  P', what: `pin/compare/clear` },
      { keys: 'c (Valve)', what: 'chart to enlarge' },
      { keys: 't  m', what: 'teaching / measured' },
      { keys: 'u  ? g', what: 'units / glossary' },
    ],
  },
  {
    title: 'Views and runs',
    entries: [
      { keys: 'tab  shift+tab', what: 'next / prev view' },
      { keys: '1 2 3 4', what: 'go to a view' },
      { keys: '+ -', what: `speed ±${RPM_STEP} rpm` },
      { keys: 's  x', what: 'run / stop sweep' },
      { keys: '↑ ↓ (Runner)', what: 'pick the pipe' },
    ],
  },
  {
    title: 'Case view',
    entries: [
      { keys: '↑ ↓  enter', what: 'choose, type a value' },
      { keys: ',  .', what: 'step down / up' },
      { keys: 'ctrl+z', what: 'undo the last edit' },
      { keys: 'w  r', what: 'save case / report' },
      { keys: 'ctrl+a e u k w', what: 'edit a field' },
    ],
  },
];

/** Words for the safety caution on the help screen. */
export const SAFETY =
  'Results are estimates from a simplified model: verify them on an engine. More air with the same fuel runs ' +
  'lean (detonation, engine damage): re-check fuelling after any intake change. Dyno and road tests carry their ' +
  'own hazards, and intake changes can breach emissions rules: follow local regulations and qualified practice.';

export function keyToAction(input: string, key: KeyInfo, s: UiState): Action | undefined {
  if (key.ctrl && input === 'c') return { type: 'quit' };

  // typing a file name to save to
  if (s.save) {
    if (s.save.stage === 'confirm') {
      if (input === 'y' || input === 'Y') return { type: 'confirm', yes: true };
      if (input === 'n' || input === 'N' || key.escape) return { type: 'confirm', yes: false };
      return undefined;
    }
    if (s.save.stage !== 'typing') return undefined;
    if (key.escape) return { type: 'cancel' };
    if (key.return) return { type: 'confirm', yes: true };
    const op = lineOpOfKey(input, key);
    if (op) return { type: 'lineOp', op };
    if (input && !key.ctrl && !key.meta && isPrintable(input)) return { type: 'type', text: input };
    return undefined;
  }

  // typing a value in the case view
  if (s.editing !== undefined) {
    if (key.escape) return { type: 'cancel' };
    if (key.return) return { type: 'commitEdit' };
    const op = lineOpOfKey(input, key);
    if (op) return { type: 'lineOp', op };
    // any printable text is shown as typed (not a ctrl key); commitEdit says when it is not a plain number
    if (input && !key.ctrl && !key.meta && !/[\x00-\x1f\x7f]/.test(input)) return { type: 'type', text: input };
    return undefined;
  }

  if (s.help) {
    if (input === 'q') return { type: 'quit' };
    if (input === 'g') return { type: 'helpPage', page: s.helpPage === 'words' ? 'keys' : 'words' };
    if (input === 'k') return { type: 'helpPage', page: 'keys' };
    if (input === 'u') return { type: 'toggleUnits' };
    if (s.helpPage === 'words' && (key.downArrow || key.pageDown || input === ' ')) return { type: 'helpScroll', by: key.downArrow ? 1 : 10 };
    if (s.helpPage === 'words' && (key.upArrow || key.pageUp)) return { type: 'helpScroll', by: key.upArrow ? -1 : -10 };
    if (input === '?' || key.escape || key.return) return { type: 'closeHelp' };
    return undefined;
  }

  if (key.ctrl && input === 'z') return { type: 'undo' };
  if (key.ctrl) return undefined;
  if (key.tab) return { type: 'nextView', dir: key.shift ? -1 : 1 };
  if (key.leftArrow) return { type: 'step', by: key.shift || key.meta ? -10 : -1 };
  if (key.rightArrow) return { type: 'step', by: key.shift || key.meta ? 10 : 1 };
  if (key.home) return { type: 'setCrank', to: 0 };
  if (key.escape) return undefined;

  if (s.view === 'case') {
    if (key.upArrow) return { type: 'select', by: -1 };
    if (key.downArrow) return { type: 'select', by: 1 };
    if (key.return) return { type: 'beginEdit' };
    if (input === ',') return { type: 'nudge', dir: -1 };
    if (input === '.') return { type: 'nudge', dir: 1 };
    if (input === 'w') return { type: 'beginSave' };
  }
  if (s.view === 'runner') {
    if (key.upArrow) return { type: 'pipe', by: -1 };
    if (key.downArrow) return { type: 'pipe', by: 1 };
  }
  if (s.view === 'sweep') {
    if (input === 's' || key.return) return { type: 'sweepStart' };
    if (input === 'x') return { type: 'sweepStop' };
    if (input === 'p') return { type: 'pinSweep' };
  }

  switch (input) {
    case 'q':
      return { type: 'quit' };
    case '?':
      return { type: 'toggleHelp' };
    case '[':
      return { type: 'step', by: -10 };
    case ']':
      return { type: 'step', by: 10 };
    case ' ':
      return { type: 'togglePlay' };
    case '<':
      return { type: 'rate', dir: -1 };
    case '>':
      return { type: 'rate', dir: 1 };
    case 'n':
      return { type: 'nextEvent', dir: 1 };
    case 'N':
      return { type: 'nextEvent', dir: -1 };
    case '+':
    case '=':
      return { type: 'speed', by: RPM_STEP };
    case '-':
    case '_':
      return { type: 'speed', by: -RPM_STEP };
    case 't':
      return { type: 'toggleTeach' };
    case 'm':
      return { type: 'toggleMeasured' };
    case 'u':
      return { type: 'toggleUnits' };
    case 'z':
      return { type: 'zoom', dir: 1 };
    case 'Z':
      return { type: 'zoom', dir: -1 };
    case 'p':
      return { type: 'pinBaseline' };
    case 'P':
      return { type: 'clearPins' };
    case 'b':
      return { type: 'cycleBaseline' };
    case 'c':
      return { type: 'cycleChart' };
    case 's':
      return { type: 'showView', view: 'sweep' };
    case 'w':
      return { type: 'beginSave' };
    case 'r':
      return { type: 'beginReport' };
  }
  if (/^[1-4]$/.test(input)) {
    const view = VIEWS[Number(input) - 1];
    if (view) return { type: 'showView', view };
  }
  return undefined;
}

function isPrintable(text: string): boolean {
  // eslint-disable-next-line no-control-regex
  return !/[\u0000-\u001f\u007f]/.test(text);
}

/** A key press as an action, so the reducer reads the mode from the current state. */
export interface KeyAction {
  type: 'key';
  input: string;
  key: KeyInfo;
}

/** The app's reducer: key presses are turned into actions against the current state. */
export function reduceApp(s: UiState, a: Action | KeyAction): UiState {
  if (a.type === 'key') {
    // several keys in one read (fast typing, a paste, a script): one at a time
    if (a.input.length > 1 && !a.key.ctrl && !a.key.meta) {
      return [...a.input].reduce((st, ch) => reduceApp(st, { type: 'key', input: ch, key: keyOfChar(ch) }), s);
    }
    const action = keyToAction(a.input, a.key, s);
    return action ? reduce(s, action) : s;
  }
  return reduce(s, a);
}

/** The key of one plain character read on its own. */
export function keyOfChar(ch: string): KeyInfo {
  if (ch === '\r' || ch === '\n') return { return: true };
  if (ch === '\t') return { tab: true };
  if (ch === '\x7f' || ch === '\b') return { backspace: true };
  return /^[A-Z]$/.test(ch) ? { shift: true } : {};
}
