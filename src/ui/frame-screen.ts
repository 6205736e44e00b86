/**
 * The lines around the views: the top line (case, speed, crank angle, the
 * view tabs), the status line, the key hints, the help screen and the
 * "make the window larger" note. Pure.
 */
import { HELP, HELP_LEAVE, SAFETY, type HelpGroup } from './keys.js';
import { VIEWS, VIEW_TITLES, type ViewName } from './state.js';
import { fit, firstFit, wrapWords } from './text.js';
import { glossaryLines } from '../present/glossary.js';
import { padLines } from './valve-screen.js';

/** The smallest terminal the views are laid out for. */
export const MIN_COLUMNS = 72;
export const MIN_ROWS = 22;

export function tooSmall(columns: number, rows: number): boolean {
  return columns < MIN_COLUMNS || rows < MIN_ROWS;
}

/** The note shown instead of the views when the terminal is too small; fits any size ≥ 1×1. */
export function tooSmallLines(columns: number, rows: number): string[] {
  const w = Math.max(1, columns);
  const text = [
    'Make the window larger.',
    `tractwave needs at least ${MIN_COLUMNS} × ${MIN_ROWS}; this one is ${columns} × ${rows}.`,
    'q quits.',
  ];
  const lines = text.flatMap((t) => wrapWords(t, w, 3));
  return padLines(lines, Math.max(1, rows - 1), w);
}

export function headerLine(o: {
  width: number;
  name: string;
  rpm: number;
  crank: number;
  view: ViewName;
  running: boolean;
  /** the crank window when zoomed in [deg] (absent: the whole cycle) */
  zoom?: number | undefined;
}): string {
  const tabs = VIEWS.map((v, k) => (v === o.view ? `[${k + 1} ${VIEW_TITLES[v]}]` : ` ${k + 1} ${VIEW_TITLES[v]} `)).join('');
  // shorter forms keep the digits (the keys that go to each view): one space apart, then only the present view named
  const tabsShort = VIEWS.map((v, k) => (v === o.view ? `[${k + 1} ${VIEW_TITLES[v]}]` : `${k + 1} ${VIEW_TITLES[v]}`)).join(' ');
  const tabsTiny = VIEWS.map((v, k) => (v === o.view ? `[${k + 1} ${VIEW_TITLES[v]}]` : `${k + 1}`)).join(' ');
  const zoom = o.zoom !== undefined && o.zoom < 720 ? ` · zoom ${o.zoom}°` : '';
  const left = `${o.rpm.toFixed(0)} rpm  θ ${String(o.crank).padStart(3)}°${zoom}${o.running ? ' · running' : ''}`;
  const right = '? help';
  const attempts: [string, boolean][] = [
    [tabs, true],
    [tabsShort, true],
    [tabs, false],
    [tabsShort, false],
    [tabsTiny, false],
  ];
  for (const [t, withName] of attempts) {
    const fixed = left.length + 2 + t.length + 2 + right.length;
    const room = o.width - fixed - 3;
    if (room < 0) continue;
    // the case name gets what room is left (cut with an ellipsis)
    if (withName && room < 12) continue;
    const name = withName ? (o.name.length <= room ? o.name : `${o.name.slice(0, room - 1)}…`) : '';
    const head = name ? `${name} · ${left}` : left;
    const gap = o.width - head.length - t.length - right.length;
    if (gap < 2) continue;
    const a = Math.floor(gap / 2);
    return head + ' '.repeat(a) + t + ' '.repeat(gap - a) + right;
  }
  return fit(`${left} ${tabsTiny}`, o.width);
}

/** Key hints for the bottom line, most useful first. */
export function keyHints(view: ViewName, width: number, playing: boolean): string {
  const common = ['←→ 1°', '[ ] 10°', 'n event', `space ${playing ? 'pause' : 'play'}`, 'tab view', '+/- rpm'];
  const byView: Record<ViewName, string[]> = {
    valve: ['z zoom', 'c chart', 'p pin', 'u units'],
    runner: ['z zoom', 'u units'],
    sweep: ['s sweep', 'x stop', 'p pin', 'u units'],
    case: ['↑↓ choose', 'enter type', ', . step', 'w save', 'r report'],
  };
  const parts = view === 'case' ? [...byView.case, 'tab view', '+/- rpm'] : [...common, ...byView[view]];
  const tail = '? help  q quit';
  const kept: string[] = [];
  for (const p of parts) {
    const next = [...kept, p].join('  ');
    if (next.length + 2 + tail.length <= width) kept.push(p);
  }
  return fit([...kept, tail].join('  '), width);
}

/**
 * The glossary page of the help (? then g): each word and abbreviation the
 * screens show, in plain words. `scroll` is the first line shown; ↑ ↓ are not
 * needed at 80×24 for the first page, and the page says how to see the rest.
 */
export function glossaryPage(width: number, rows: number, scroll = 0): string[] {
  const w = width;
  const all = glossaryLines(w);
  const room = Math.max(1, rows - 1);
  const first = Math.max(0, Math.min(scroll, Math.max(0, all.length - room)));
  const shown = all.slice(first, first + room);
  const more = first + room < all.length;
  const title = firstFit(
    [
      `Words on the screens${more || first > 0 ? ` (lines ${first + 1}–${first + shown.length} of ${all.length}, ↓ ↑)` : ''} — g keys · esc close`,
      'Words on the screens — ↓ ↑ scroll · g keys · esc close',
      'Words',
    ],
    w,
  );
  return padLines([title, ...shown], rows, w);
}

export function helpLines(width: number, rows: number): string[] {
  const w = width;
  const colW = Math.floor((w - 2) / 2);
  const keyW = colW >= 38 ? 16 : 15;
  const render = (groups: readonly HelpGroup[]): string[] =>
    groups.flatMap((g) => [
      fit(g.title, colW),
      ...g.entries.map((e) => fit(`${e.keys.padEnd(keyW)}${e.what}`, colW)),
    ]);
  const [crank, learn, runs, caseKeys] = HELP;
  const left = render([crank, learn].filter((g): g is HelpGroup => g !== undefined));
  const right = render([runs, caseKeys].filter((g): g is HelpGroup => g !== undefined));
  const n = Math.max(left.length, right.length);
  const body: string[] = [];
  for (let k = 0; k < n; k++) body.push(fit(`${left[k] ?? ''}  ${right[k] ?? ''}`, w));
  const leave = HELP_LEAVE.map((e) => `${e.keys.replace(/\s+/g, ' or ')}: ${e.what}`).join(' · ');
  const title = firstFit([`Keys of the terminal view — ${leave}`, `Keys — ${leave}`, leave], w);
  // the blank line before the caution goes first when rows are short: the caution is never cut for it
  const whole = wrapWords(`Safety: ${SAFETY}`, w, 100).length;
  const gap = rows - body.length - 1 - whole >= 1 ? [''] : [];
  const safety = wrapWords(`Safety: ${SAFETY}`, w, Math.max(2, rows - body.length - 1 - gap.length));
  return padLines([title, ...body, ...gap, ...safety], rows, w);
}
