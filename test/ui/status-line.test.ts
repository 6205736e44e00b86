/**
 * The status line warns when the solver's per-cycle mass balance is off by
 * more than 0.5 % (the limit the solver is held to). Results are SYNTHETIC
 * fixtures (see fixtures.ts); no physics is checked.
 */
import { describe, expect, it } from 'vitest';
import { statusLine, MASS_WARNING } from '../../src/ui/app.js';
import { initialState, reduce, type UiState } from '../../src/ui/state.js';
import { START_VALUES, syntheticResult } from './fixtures.js';

function withImbalance(massImbalance: number): UiState {
  const s = initialState({ values: { ...START_VALUES }, sweepPlan: { rpms: [3000, 4000], band: { from: 3000, to: 4000 } }, suggestedSavePath: '/x.yaml' });
  const result = { ...syntheticResult(), massImbalance };
  return reduce(s, { type: 'pointDone', id: 1, point: { result, label: 'as loaded', ambient: 101325, upstream: 'ambient' } });
}

describe('status line mass-balance warning', () => {
  it.each([
    [0.001, false],
    [-0.004, false],
    [0.006, true],
    [-0.02, true],
  ])('imbalance %f → warning %s', (imb, warns) => {
    const line = statusLine(withImbalance(imb), 200);
    expect(line.includes('mass balance off')).toBe(warns);
  });
  it('the threshold is 0.5 %', () => {
    expect(MASS_WARNING).toBe(0.005);
  });
});

describe('save failures in plain words', () => {
  it.each([
    ['ENOENT', 'does not exist'],
    ['EACCES', 'no permission'],
    ['ENOSPC', 'disk is full'],
  ])('%s → "%s", without the temporary file name', async (code, words) => {
    const { saveProblem } = await import('../../src/ui/app.js');
    const e = Object.assign(new Error(`${code}: open '/nowhere/.x.yaml.123.ab.tmp'`), { code });
    const text = saveProblem(e, '/nowhere/x.yaml');
    expect(text).toContain(words);
    expect(text).not.toContain('.tmp');
  });
});
