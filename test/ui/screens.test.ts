/**
 * The views as text lines (pure functions), with SYNTHETIC traces: sizes,
 * markers, readouts, and the teaching line. Rendering only; no physics.
 */
import { describe, expect, it } from 'vitest';
import { valveScreen } from '../../src/ui/valve-screen.js';
import { runnerScreen } from '../../src/ui/runner-screen.js';
import { curveColumns, curveStats, sweepScreen } from '../../src/ui/sweep-screen.js';
import { caseScreen, listWindow } from '../../src/ui/case-screen.js';
import { headerLine, helpLines, keyHints, tooSmall, tooSmallLines } from '../../src/ui/frame-screen.js';
import { FIELDS, sectionFields } from '../../src/ui/fields.js';
import { teachingLine, strokeOf } from '../../src/ui/teach.js';
import { wrapWords, fit } from '../../src/ui/text.js';
import { AMBIENT, EVENTS, START_VALUES, syntheticResult } from './fixtures.js';

const SIZES = [
  [80, 18],
  [72, 16],
  [120, 34],
  [200, 60],
] as const;

function widthOk(lines: readonly string[], w: number, rows: number): void {
  expect(lines).toHaveLength(rows);
  for (const l of lines) expect([...l].length).toBe(w);
}

describe('valve view lines', () => {
  const r = syntheticResult();
  const base = { crank: 100, from: 0, span: 720, now: r.trace, reference: AMBIENT, events: r.events, verdict: 'the wave is helping' };

  it.each(SIZES)('fill exactly %i × %i', (width, rows) => {
    widthOk(valveScreen({ ...base, width, rows }), width, rows);
  });

  it('mark IVO and IVC on the axis and read out the values at the cursor', () => {
    const text = valveScreen({ ...base, width: 80, rows: 18 }).join('\n');
    expect(text).toContain('IVO');
    expect(text).toContain('IVC');
    expect(text).toContain('▲');
    const p = (r.trace.valvePressure[100] as number) / 1000;
    expect(text).toContain(`${p.toFixed(1)} kPa`);
    const flow = (r.trace.valveFlow[100] as number) * 1000;
    expect(text).toContain(`${flow.toFixed(1)} g/s`);
    const mass = (r.trace.cylinderMass[100] as number) * 1e6;
    expect(text).toContain(`${mass.toFixed(1)} mg`);
    const lift = (r.trace.lift[100] as number) * 1000;
    expect(text).toContain(`lift ${lift.toFixed(2)} mm`);
    expect(text).toContain('the wave is helping');
  });

  it('show the baseline legend only when there is a baseline', () => {
    const without = valveScreen({ ...base, width: 80, rows: 18 }).join('\n');
    const withBase = valveScreen({ ...base, width: 80, rows: 18, before: syntheticResult({ shift: 20 }).trace }).join('\n');
    expect(without).not.toContain('baseline');
    expect(withBase).toContain('· baseline');
  });

  it('change the readout when the cursor moves', () => {
    const a = valveScreen({ ...base, width: 80, rows: 18, crank: 100 })[0];
    const b = valveScreen({ ...base, width: 80, rows: 18, crank: 101 })[0];
    expect(a).not.toBe(b);
  });
});

describe('runner view lines', () => {
  const r = syntheticResult();
  const input = {
    crank: 230,
    from: 0,
    span: 720,
    map: { x: r.runnerMap.x, pressure: r.runnerMap.pressure, ambient: AMBIENT },
    events: r.events,
    runnerLength: 0.3,
    upstream: 'ambient' as const,
    roundTripDeg: 42,
    rpm: 6000,
  };
  it.each(SIZES)('fill exactly %i × %i', (width, rows) => {
    widthOk(runnerScreen({ ...input, width, rows }), width, rows);
  });

  it('label the valve end at the top and the open end at the bottom, and mark the cursor', () => {
    const lines = runnerScreen({ ...input, width: 80, rows: 18 });
    const mapTop = lines.findIndex((l) => l.includes('valve┤'));
    const mapBottom = lines.findIndex((l) => l.includes('end┤'));
    expect(mapTop).toBeGreaterThan(0);
    expect(mapBottom).toBeGreaterThan(mapTop);
    expect(lines[mapBottom - 1]).toContain('open');
    const marker = lines[mapTop - 1] ?? '';
    const col = [...marker].indexOf('▼');
    expect(col).toBe(8 + Math.floor((230 * 72) / 720));
    const text = lines.join('\n');
    expect(text).toContain('round trip 42°');
    expect(text).toContain('kPa');
  });
});

describe('sweep view lines', () => {
  const rpms = [3000, 4000, 5000, 6000, 7000];
  const now = { rpms, eta: [0.8, 0.9, 1.0, 0.95, null], label: 'runner length 320 mm' };
  const before = { rpms, eta: [0.85, 0.88, 0.92, 0.97, 0.9], label: 'as loaded' };
  const input = { band: { from: 4000, to: 6000 }, plan: { from: 3000, to: 7000, count: 5 }, currentRpm: 5000, status: 'running' as const, stale: false };

  it.each(SIZES)('fill exactly %i × %i', (width, rows) => {
    widthOk(sweepScreen({ ...input, now, before, width, rows }), width, rows);
    widthOk(sweepScreen({ ...input, width, rows }), width, rows);
  });

  it('show progress, the band means of both curves and the best speed', () => {
    const done = { ...now, eta: [0.8, 0.9, 1.0, 0.95, 0.85] };
    const running = sweepScreen({ ...input, now, before, width: 100, rows: 20 }).join('\n');
    expect(running).toContain('4 of 5 points');
    const text = sweepScreen({ ...input, status: 'done', now: done, before, width: 100, rows: 20 }).join('\n');
    // band 4000–6000 on straight lines: (0.9/2 + 1.0 + 0.95/2) / 2 = 0.9625; baseline (0.88/2 + 0.92 + 0.97/2)/2 = 0.9225
    // shown as percentages (96.25 and 92.25 round either way in binary) and the change in points
    expect(text).toMatch(/mean ηv 96\.[23] %/);
    expect(text).toMatch(/baseline 92\.[23] %/);
    expect(text).toContain('+4.0 points');
    expect(text).toContain('Best 5000 rpm, ηv 100.0 %');
    expect(text).toContain('4000');
    expect(text).toContain('═');
  });

  it('sample a curve per column with gaps where a neighbour is missing', () => {
    const cols = curveColumns({ rpms: [0, 10, 20], eta: [0, 1, null], label: '' }, 0, 20, 4);
    expect(cols[0]).toBeCloseTo(0.25);
    expect(cols[1]).toBeCloseTo(0.75);
    expect(Number.isNaN(cols[2])).toBe(true);
    expect(Number.isNaN(cols[3])).toBe(true);
  });

  it('count unconverged points', () => {
    const st = curveStats({ rpms: [1, 2], eta: [1, 2], converged: [true, false], label: '' }, { from: 1, to: 2 });
    expect(st.unconverged).toBe(1);
    expect(st.bestRpm).toBe(2);
  });
});

describe('case view lines', () => {
  const r = syntheticResult();
  it.each(SIZES)('fill exactly %i × %i', (width, rows) => {
    const lines = caseScreen({
      width,
      rows,
      name: 'Synthetic',
      file: '/cases/synthetic.yaml',
      fields: FIELDS.filter((f) => START_VALUES[f.path] !== undefined),
      values: { ...START_VALUES, 'runner.length': 320 },
      baseValues: START_VALUES,
      selected: 1,
      running: false,
      result: r,
      baseline: { ...r, volumetricEfficiency: 0.9 },
      baselineLabel: 'as loaded',
    });
    widthOk(lines, width, rows);
    const text = lines.join('\n');
    expect(text).toContain('▶ Runner length');
    expect(text).toContain('320 mm');
    expect(text).toContain('(baseline 300)');
    expect(text).toContain('ηv 95.0 % (baseline 90.0 %, +5.0 points)');
  });

  it('show the save prompt and the overwrite question', () => {
    const common = { width: 80, rows: 18, name: 'S', file: 'f', fields: FIELDS, values: START_VALUES, selected: 0, running: false };
    expect(caseScreen({ ...common, save: { stage: 'typing', path: 'cases/s-2.yaml' } }).join('\n')).toContain('Save the changed case as: cases/s-2.yaml');
    expect(caseScreen({ ...common, save: { stage: 'confirm', path: 'cases/s-2.yaml' } }).join('\n')).toContain('already exists. Overwrite it?');
  });
});

describe('frame lines', () => {
  it.each([72, 80, 120])('the header fits %i columns and names the view and crank angle', (w) => {
    const h = headerLine({ width: w, name: 'A rather long invented engine name', rpm: 6500, crank: 245, view: 'runner', running: false });
    expect([...h]).toHaveLength(w);
    expect(h).toContain('Runner]');
    expect(h).toContain('θ 245°');
    expect(h).toContain('6500 rpm');
  });

  it.each([72, 80, 100])('the view tabs keep their digits (the keys 1–4) when the header is short: %i columns, running', (w) => {
    for (const view of ['valve', 'runner', 'sweep', 'case'] as const) {
      const h = headerLine({ width: w, name: 'A rather long invented engine name', rpm: 10500, crank: 245, view, running: true });
      expect([...h]).toHaveLength(w);
      const k = ['valve', 'runner', 'sweep', 'case'].indexOf(view) + 1;
      expect(h).toMatch(new RegExp(`\\[${k} [A-Z][a-z]+\\]`));
      for (const d of [1, 2, 3, 4]) expect(h).toMatch(new RegExp(`(^|[ \\[])${d}( |\\b)`));
    }
  });

  it.each([72, 80, 120])('the key hints fit %i columns and always offer help and quit', (w) => {
    for (const v of ['valve', 'runner', 'sweep', 'case'] as const) {
      const k = keyHints(v, w, false);
      expect([...k]).toHaveLength(w);
      expect(k).toContain('? help');
      expect(k).toContain('q quit');
    }
  });

  it.each([
    [72, 21],
    [80, 23],
    [120, 39],
    // the rows the view gives the help in a 72×22 and an 80×24 window (rowBudget: all but the header and the two bottom lines)
    [72, 18],
    [80, 20],
  ])('help fits %i × %i, lists every key with "quit" and the safety caution', (w, rows) => {
    const lines = helpLines(w, rows);
    widthOk(lines, w, rows);
    const text = lines.join('\n');
    expect(text).toContain('quit');
    expect(text).toContain('Safety');
    expect(text).toContain('regulations');
    expect(text).not.toContain('…'); // nothing cut
    for (const k of ['← →', '[ ]', 'space  < >', 'tab', '+ -', 'n  N', 'z  Z', 'p', 't', 'enter', 'w', 's  x', 'ctrl+c', 'ctrl+z', 'p  b  P', 'c (Valve)', 'ctrl+a e u k w']) expect(text).toContain(k);
  });

  it.each([
    [60, 20, true],
    [71, 30, true],
    [100, 21, true],
    [72, 22, false],
    [80, 24, false],
  ])('%i × %i is too small: %s', (c, r, small) => {
    expect(tooSmall(c, r)).toBe(small);
  });

  it('the too-small note fits the small window and says to make it larger', () => {
    const lines = tooSmallLines(60, 20);
    expect(lines.length).toBeLessThanOrEqual(19);
    for (const l of lines) expect([...l].length).toBeLessThanOrEqual(60);
    expect(lines.join(' ')).toContain('Make the window larger');
  });
});

describe('teaching line', () => {
  const at = (crank: number, over: Partial<Parameters<typeof teachingLine>[0]> = {}): string =>
    teachingLine({ crank, lift: 0, exhaustLift: 0, valvePressure: AMBIENT, valveFlow: 0, reference: AMBIENT, events: EVENTS, ...over });

  it.each([
    [90, 'Intake stroke'],
    [270, 'Compression stroke'],
    [450, 'Power stroke'],
    [630, 'Exhaust stroke'],
  ])('at %i° names the %s', (crank, words) => {
    expect(strokeOf(crank)).toContain(words);
  });

  it.each([
    [{ lift: 0.005, exhaustLift: 0.001 }, 10, 'Overlap'],
    [{ lift: 0.001 }, 705, 'opening'],
    [{ lift: 0.003, valvePressure: AMBIENT + 5000, valveFlow: 0.01 }, 220, 'rams extra charge'],
    [{ lift: 0.003, valvePressure: AMBIENT - 5000, valveFlow: 0.01 }, 220, 'charge is lost'],
    [{ lift: 0.008, valvePressure: AMBIENT - 8000, valveFlow: 0.05 }, 90, 'comes back as a compression'],
    [{ lift: 0.008, valveFlow: -0.01 }, 200, 'back out'],
    [{ valvePressure: AMBIENT + 3000 }, 300, 'Intake valve shut'],
    [{ valvePressure: AMBIENT + 3000 }, 235, 'has just closed with a compression'],
    [{ valvePressure: AMBIENT - 3000 }, 235, 'on an expansion'],
    [{ valvePressure: AMBIENT - 3000 }, 695, 'about to open'],
  ] as const)('%j at %i° says %j', (over, crank, words) => {
    expect(at(crank, over)).toContain(words);
  });

  it('fits two lines at 80 columns in every situation above', () => {
    for (const crank of [10, 90, 220, 235, 300, 695, 705]) {
      for (const over of [{ lift: 0.005, exhaustLift: 0.001, valveFlow: -1 }, { lift: 0.003, valvePressure: AMBIENT - 55500 }, { valvePressure: AMBIENT + 55500 }]) {
        const lines = wrapWords(at(crank, over), 80, 3);
        expect(lines.length).toBeLessThanOrEqual(2);
      }
    }
  });
});

describe('text helpers', () => {
  it.each([
    ['abc', 5, 'abc  '],
    ['abcdef', 4, 'abc…'],
  ])('fit %j into %i → %j', (t, w, out) => {
    expect(fit(t, w)).toBe(out);
  });

  it('wraps words and marks cut text', () => {
    expect(wrapWords('one two three four', 9, 3)).toEqual(['one two  ', 'three    ', 'four     ']);
    const cut = wrapWords('one two three four five six', 9, 2);
    expect(cut).toHaveLength(2);
    expect(cut[1]?.trimEnd().endsWith('…')).toBe(true);
  });
});

describe('case view with a runner in sections', () => {
  const fields = [...FIELDS.slice(0, 1), ...sectionFields(3), ...FIELDS.slice(4)];
  const values: Record<string, number> = {};
  for (const f of fields) values[f.path] = 10;
  const common = { width: 80, rows: 18, name: 'S', file: 'f', fields, values, running: false };

  it.each([0, 5, 9, fields.length - 1])('keeps selected value %i in view when the list is longer than the room', (selected) => {
    const lines = caseScreen({ ...common, selected });
    widthOk(lines, 80, 18);
    const label = fields[selected]?.label ?? '';
    expect(lines.some((l) => l.startsWith(`▶ ${label}`))).toBe(true);
  });

  it.each([
    [5, 10, 0, 0],
    [20, 10, 0, 0],
    [20, 10, 12, 7],
    [20, 10, 19, 10],
  ])('a list of %i in %i rows with %i selected starts at %i', (count, room, selected, first) => {
    expect(listWindow(count, room, selected)).toBe(first);
  });
});
