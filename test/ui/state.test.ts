/**
 * Key → action → state: the pure reducer of the terminal view.
 * Results are SYNTHETIC fixtures (see fixtures.ts); no physics is checked.
 */
import { describe, expect, it } from 'vitest';
import { keyToAction, reduceApp, type KeyInfo } from '../../src/ui/keys.js';
import { AS_LOADED, initialState, nextEventAngle, reduce, RATES, sweepIsStale, whatDiffers, type Action, type UiState } from '../../src/ui/state.js';
import { START_VALUES, syntheticResult } from './fixtures.js';

function fresh(): UiState {
  return initialState({
    values: { ...START_VALUES },
    sweepPlan: { rpms: [3000, 4000, 5000], band: { from: 3500, to: 4500 } },
    suggestedSavePath: '/cases/x-2.yaml',
  });
}

/** The state after the first point came back. */
function withPoint(): UiState {
  return reduce(fresh(), {
    type: 'pointDone',
    id: 1,
    point: { result: syntheticResult(), label: 'as loaded', ambient: 101325, upstream: 'ambient' },
  });
}

function press(s: UiState, input: string, key: KeyInfo = {}): UiState {
  return reduceApp(s, { type: 'key', input, key });
}

describe('keys to actions', () => {
  const s = withPoint();
  it.each<[string, KeyInfo, Action | undefined]>([
    ['', { rightArrow: true }, { type: 'step', by: 1 }],
    ['', { leftArrow: true }, { type: 'step', by: -1 }],
    ['', { rightArrow: true, shift: true }, { type: 'step', by: 10 }],
    ['', { leftArrow: true, shift: true }, { type: 'step', by: -10 }],
    [']', {}, { type: 'step', by: 10 }],
    ['[', {}, { type: 'step', by: -10 }],
    [' ', {}, { type: 'togglePlay' }],
    ['n', {}, { type: 'nextEvent', dir: 1 }],
    ['N', { shift: true }, { type: 'nextEvent', dir: -1 }],
    ['', { tab: true }, { type: 'nextView', dir: 1 }],
    ['', { tab: true, shift: true }, { type: 'nextView', dir: -1 }],
    ['+', {}, { type: 'speed', by: 250 }],
    ['-', {}, { type: 'speed', by: -250 }],
    ['?', {}, { type: 'toggleHelp' }],
    ['t', {}, { type: 'toggleTeach' }],
    ['q', {}, { type: 'quit' }],
    ['c', { ctrl: true }, { type: 'quit' }],
    ['3', {}, { type: 'showView', view: 'sweep' }],
    ['x', {}, undefined],
  ])('%j %j → %j', (input, key, action) => {
    expect(keyToAction(input, key, s)).toEqual(action);
  });
});

describe('stepping the crank angle', () => {
  it.each<[string, KeyInfo, number, number]>([
    ['', { rightArrow: true }, 0, 1],
    ['', { leftArrow: true }, 0, 719],
    [']', {}, 715, 5],
    ['[', {}, 5, 715],
    ['', { rightArrow: true, shift: true }, 100, 110],
  ])('%j %j from %i° goes to %i°', (input, key, from, to) => {
    const s = reduce(withPoint(), { type: 'setCrank', to: from });
    expect(press(s, input, key).crank).toBe(to);
  });

  it.each([
    // events IVO 700, IVC 230, EVO 490, EVC 20
    [0, 1, 20],
    [20, 1, 230],
    [230, 1, 490],
    [600, 1, 700],
    [710, 1, 20],
    [0, -1, 700],
    [230, -1, 20],
  ] as const)('from %i°, the %s valve event is at %i°', (from, dir, to) => {
    const s = reduce(withPoint(), { type: 'setCrank', to: from });
    expect(reduce(s, { type: 'nextEvent', dir }).crank).toBe(to);
  });

  it('finds events with no result as no move', () => {
    expect(nextEventAngle([], 10, 1)).toBeUndefined();
    const s = fresh();
    expect(reduce(s, { type: 'nextEvent', dir: 1 }).crank).toBe(0);
  });

  it('plays at the chosen rate and carries fractions of a degree', () => {
    let s = press(withPoint(), ' ');
    expect(s.playing).toBe(true);
    const rate = RATES[s.rateIndex] as number;
    s = reduce(s, { type: 'tick', ms: 250 });
    s = reduce(s, { type: 'tick', ms: 250 });
    expect(s.crank).toBe(Math.floor(rate * 0.5));
    s = press(s, '>');
    expect(RATES[s.rateIndex]).toBeGreaterThan(rate);
    s = press(s, ' ');
    const before = s.crank;
    expect(reduce(s, { type: 'tick', ms: 1000 }).crank).toBe(before); // paused
  });

  it('zooms in and out within the allowed windows', () => {
    let s = withPoint();
    s = press(press(press(press(press(s, 'z'), 'z'), 'z'), 'z'), 'z');
    expect(s.zoomIndex).toBe(3);
    s = press(press(press(press(press(s, 'Z'), 'Z'), 'Z'), 'Z'), 'Z');
    expect(s.zoomIndex).toBe(0);
  });
});

describe('views, help, teaching line, quitting', () => {
  it('tab cycles the four views and comes back', () => {
    const seen: string[] = [];
    let s = withPoint();
    for (let k = 0; k < 4; k++) {
      seen.push(s.view);
      s = press(s, '', { tab: true });
    }
    expect(seen).toEqual(['valve', 'runner', 'sweep', 'case']);
    expect(s.view).toBe('valve');
    expect(press(s, '', { tab: true, shift: true }).view).toBe('case');
  });

  it('? opens help; in help the arrows do nothing, ? or esc close it, q still quits', () => {
    const s = press(withPoint(), '?');
    expect(s.help).toBe(true);
    expect(press(s, '', { rightArrow: true }).crank).toBe(0);
    expect(press(s, '?').help).toBe(false);
    expect(press(s, '', { escape: true }).help).toBe(false);
    expect(press(s, 'q').quit).toBe(true);
  });

  it('t turns the teaching line off and on', () => {
    const s = withPoint();
    expect(s.teach).toBe(true);
    expect(press(s, 't').teach).toBe(false);
    expect(press(press(s, 't'), 't').teach).toBe(true);
  });

  it('several keys in one read are taken one by one', () => {
    const s = press(withPoint(), ']]n');
    expect(s.crank).toBe(230); // 0 → 10 → 20 → next event after 20° is IVC 230°
  });
});

describe('engine speed and edits', () => {
  it('+ asks for a new run at 250 rpm more, and the old result becomes the baseline', () => {
    let s = withPoint();
    s = press(s, '+');
    expect(s.values['rpm']).toBe(6250);
    expect(s.request.id).toBe(2);
    expect(s.request.edits).toEqual([{ path: 'rpm', value: '6250' }]);
    expect(s.running).toBe(true);
    const old = s.point;
    s = reduce(s, { type: 'pointDone', id: 2, point: { result: syntheticResult({ rpm: 6250 }), label: 'engine speed 6250 rpm', ambient: 101325, upstream: 'ambient' } });
    expect(s.baseline).toBe(old);
    expect(s.point?.result.rpm).toBe(6250);
    expect(s.point?.values?.['rpm']).toBe(6250);
    expect(s.running).toBe(false);
  });

  it('ignores a result that arrives for an older request', () => {
    let s = press(press(withPoint(), '+'), '+');
    expect(s.request.id).toBe(3);
    const stale = reduce(s, { type: 'pointDone', id: 2, point: { result: syntheticResult(), label: 'x', ambient: 101325, upstream: 'ambient' } });
    expect(stale).toBe(s);
    s = reduce(s, { type: 'pointDone', id: 3, point: { result: syntheticResult({ rpm: 6500 }), label: 'y', ambient: 101325, upstream: 'ambient' } });
    expect(s.point?.result.rpm).toBe(6500);
  });

  it('the case view: choose runner length, type 420, enter → an override "420 mm" and a run', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'case' });
    s = press(s, '', { downArrow: true });
    expect(s.fields[s.selected]?.path).toBe('runner.length');
    s = press(s, '', { return: true });
    expect(s.editing).toBe('');
    s = press(s, '4');
    s = press(s, '2');
    s = press(s, '0');
    s = press(s, 'x'); // shown as typed (commit would refuse it with a message)
    expect(s.editing).toBe('420x');
    s = press(s, '', { backspace: true });
    expect(s.editing).toBe('420');
    s = press(s, '', { return: true });
    expect(s.editing).toBeUndefined();
    expect(s.values['runner.length']).toBe(420);
    expect(s.request.edits).toEqual([{ path: 'runner.length', value: '420 mm' }]);
    expect(s.request.id).toBe(2);
  });

  it(', and . step the selected value by its step', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'case' });
    s = press(s, '', { downArrow: true });
    s = press(s, '.');
    expect(s.values['runner.length']).toBe(310);
    s = press(press(s, ','), ',');
    expect(s.values['runner.length']).toBe(290);
    expect(s.request.edits).toEqual([{ path: 'runner.length', value: '290 mm' }]);
  });

  it('a value the case rejects is put back, with the message, and the result stays', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'case' });
    s = press(s, '', { downArrow: true });
    s = press(press(press(s, '', { return: true }), '0'), '', { return: true });
    expect(s.values['runner.length']).toBe(0);
    s = reduce(s, { type: 'pointFailed', id: s.request.id, message: 'runner.length: must be positive', badInput: true });
    expect(s.values['runner.length']).toBe(300);
    expect(s.edits).toEqual([]);
    expect(s.message?.tone).toBe('error');
    expect(s.message?.text).toContain('runner.length');
    expect(s.point).toBeDefined();
  });

  it('esc while typing keeps the old value', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'case' });
    s = press(press(press(s, '', { return: true }), '9'), '', { escape: true });
    expect(s.editing).toBeUndefined();
    expect(s.values['rpm']).toBe(6000);
    expect(s.request.id).toBe(1);
  });
});

describe('the sweep', () => {
  it('runs, fills in points, and keeps the old curve as the baseline after a design change', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'sweep' });
    s = press(s, 's');
    expect(s.sweepStatus).toBe('running');
    const id = s.sweepRequest;
    for (const [index, eta] of [
      [0, 0.9],
      [1, 1.0],
      [2, 0.95],
    ] as const)
      s = reduce(s, { type: 'sweepPoint', id, index, eta, converged: true });
    s = reduce(s, { type: 'sweepDone', id });
    expect(s.sweepStatus).toBe('done');
    expect(s.sweep?.eta).toEqual([0.9, 1.0, 0.95]);
    // lengthen the runner in the case view
    s = reduce(s, { type: 'showView', view: 'case' });
    s = press(press(s, '', { downArrow: true }), '.');
    expect(s.sweepStatus).toBe('running');
    expect(s.sweepRequest).toBe(id + 1);
    expect(s.sweepBaseline?.eta).toEqual([0.9, 1.0, 0.95]);
    expect(s.sweepBaseline?.label).toBe(AS_LOADED);
    expect(s.sweep?.label).toBe('runner length 310 mm');
    expect(s.sweep?.eta).toEqual([null, null, null]);
    // a point from the old sweep is ignored
    expect(reduce(s, { type: 'sweepPoint', id, index: 0, eta: 2, converged: true }).sweep?.eta[0]).toBeNull();
  });

  it('a speed change does not restart the sweep', () => {
    let s = reduce(withPoint(), { type: 'sweepStart' });
    const id = s.sweepRequest;
    s = press(s, '+');
    expect(s.sweepRequest).toBe(id);
  });

  it('x stops a running sweep', () => {
    let s = reduce(reduce(withPoint(), { type: 'showView', view: 'sweep' }), { type: 'sweepStart' });
    s = press(s, 'x');
    expect(s.sweepStatus).toBe('stopped');
  });
});

describe('saving', () => {
  it('offers a new name, checks it, and saves', () => {
    let s = press(withPoint(), 'w');
    expect(s.save).toEqual({ stage: 'typing', path: '/cases/x-2.yaml', overwrite: false, kind: 'case' });
    s = press(s, '', { return: true });
    expect(s.save?.stage).toBe('checking');
    s = reduce(s, { type: 'saveChecked', exists: false });
    expect(s.save).toMatchObject({ stage: 'saving', overwrite: false });
    s = reduce(s, { type: 'saved', path: '/cases/x-2.yaml', next: '/cases/x-3.yaml' });
    expect(s.save).toBeUndefined();
    expect(s.message?.text).toBe('Saved to /cases/x-2.yaml');
    expect(s.suggestedSavePath).toBe('/cases/x-3.yaml');
  });

  it('asks before overwriting an existing file; n goes back to the name', () => {
    let s = press(withPoint(), 'w');
    s = press(s, '', { backspace: true });
    s = press(s, 'X');
    expect(s.save?.path).toBe('/cases/x-2.yamX');
    s = reduce(press(s, '', { return: true }), { type: 'saveChecked', exists: true });
    expect(s.save?.stage).toBe('confirm');
    // other keys do nothing while asking
    expect(press(s, 'q').quit).toBe(false);
    const no = press(s, 'n');
    expect(no.save?.stage).toBe('typing');
    const yes = press(s, 'y');
    expect(yes.save).toMatchObject({ stage: 'saving', overwrite: true });
  });

  it('esc cancels saving', () => {
    const s = press(press(withPoint(), 'w'), '', { escape: true });
    expect(s.save).toBeUndefined();
    expect(s.message?.text).toBe('Not saved.');
  });
});

describe('the sweep view starts its sweep on the first visit', () => {
  it('tab to the sweep view starts a sweep once; later visits do not restart it', () => {
    let s = withPoint();
    expect(s.sweepStatus).toBe('idle');
    s = reduce(s, { type: 'showView', view: 'sweep' });
    expect(s.sweepStatus).toBe('running');
    const request = s.sweepRequest;
    s = reduce(s, { type: 'showView', view: 'valve' });
    s = reduce(s, { type: 'nextView', dir: 1 });
    s = reduce(s, { type: 'nextView', dir: 1 });
    expect(s.view).toBe('sweep');
    expect(s.sweepRequest).toBe(request);
  });
  it('other views do not start it', () => {
    let s = withPoint();
    s = reduce(s, { type: 'showView', view: 'runner' });
    s = reduce(s, { type: 'showView', view: 'case' });
    expect(s.sweepStatus).toBe('idle');
  });
});

describe('typing a value in the case view', () => {
  function typing(text: string): UiState {
    let s = withPoint();
    s = reduce(s, { type: 'showView', view: 'case' });
    s = reduce(s, { type: 'beginEdit' });
    for (const ch of text) s = reduce(s, { type: 'type', text: ch });
    return s;
  }
  it('text that is not a plain number is shown as typed and refused with a message, nothing run', () => {
    const s = typing('12 in');
    expect(s.editing).toBe('12 in');
    const after = reduce(s, { type: 'commitEdit' });
    expect(after.message?.tone).toBe('error');
    expect(after.message?.text).toContain("got '12 in'");
    expect(after.request.id).toBe(s.request.id);
  });
  it('a refused value names the change that caused it', () => {
    let s = typing('12');
    s = reduce(s, { type: 'commitEdit' });
    expect(s.running).toBe(true);
    s = reduce(s, { type: 'pointFailed', id: s.request.id, message: 'numerics.meshSize: must be at most half the runner length', badInput: true });
    expect(s.message?.text).toMatch(/refused: numerics\.meshSize/);
    expect(s.message?.text.startsWith(s.request.label ?? 'x')).toBe(true);
  });
});

describe('first-hour rough edges (issue 12)', () => {
  it('the difference in points is the difference of the two values shown', async () => {
    const { etaPct, etaPoints } = await import('../../src/ui/text.js');
    // 109.436 % and 107.251 % show as 109.4 and 107.3: the difference shown is 2.1, not 2.2
    expect(etaPct(1.09436)).toBe('109.4 %');
    expect(etaPct(1.07251)).toBe('107.3 %');
    expect(etaPoints(1.09436, 1.07251)).toBe('+2.1 points');
    expect(etaPoints(1.07251, 1.09436)).toBe('−2.1 points');
  });

  it('a speed change leaves the sweep current (a sweep covers every speed); a design change runs it again', () => {
    let s = reduce(withPoint(), { type: 'sweepStart' });
    const id = s.sweepRequest;
    s = reduce(s, { type: 'sweepDone', id });
    s = press(s, '+');
    expect(sweepIsStale(s)).toBe(false);
    expect(s.sweepRequest).toBe(id);
    s = press(press(reduce(s, { type: 'showView', view: 'case' }), '', { downArrow: true }), '.');
    expect(s.sweepRequest).toBe(id + 1);
    expect(sweepIsStale(s)).toBe(false);
    // a sweep run for another design is stale
    expect(sweepIsStale({ ...s, sweepEdits: [] })).toBe(true);
  });

  it('whatDiffers names the fields whose shown values differ, in the panel words', () => {
    const s = withPoint();
    expect(whatDiffers(s.fields, s.values, s.values)).toBe('the same design');
    expect(whatDiffers(s.fields, { ...s.values, rpm: 6500 }, s.values)).toBe('engine speed 6000 rpm');
    expect(whatDiffers(s.fields, { ...s.values, 'runner.length': 320, rpm: 6500 }, s.values)).toBe('engine speed 6000 rpm, runner length 300 mm');
  });

  it('a refused edit is put back and leaves no undo step behind', () => {
    let s = reduce(withPoint(), { type: 'showView', view: 'case' });
    s = press(press(s, '', { downArrow: true }), '.');
    s = reduce(s, { type: 'pointDone', id: s.request.id, point: { result: syntheticResult(), label: '', ambient: 101325, upstream: 'ambient' } });
    expect(s.history).toHaveLength(1);
    s = press(s, '.');
    expect(s.history).toHaveLength(2);
    s = reduce(s, { type: 'pointFailed', id: s.request.id, message: 'too long', badInput: true });
    expect(s.values['runner.length']).toBe(310);
    expect(s.history).toHaveLength(1);
    // ctrl+z then goes back to the case as loaded
    s = press(s, 'z', { ctrl: true });
    expect(s.values['runner.length']).toBe(300);
    expect(s.edits).toEqual([]);
  });
});
