/**
 * The Case view in shop units (issue 12, the part left over): with `u` on
 * imperial, lengths are shown and typed in inches, volumes in ci,
 * pressures in psi, temperatures in °F; the change is kept (and written to
 * the case) in the field's own metric unit. Conversion factors: NIST SP 811
 * (1 in = 25.4 mm exactly, 1 in³ = 16.387064 cm³ exactly, 1 psi = 6.894757 kPa,
 * °F = 1.8·°C + 32). The reducer and screen are checked on SYNTHETIC values
 * (fixtures.ts); no physics here.
 */
import { describe, expect, it } from 'vitest';
import { FIELDS, fieldByPath, fieldIn, niceStep } from '../../src/ui/fields.js';
import { initialState, reduce, type UiState } from '../../src/ui/state.js';
import { caseScreen } from '../../src/ui/case-screen.js';
import { IMPERIAL, METRIC } from '../../src/present/units.js';
import { START_VALUES, syntheticResult } from './fixtures.js';

const field = (path: string) => {
  const f = fieldByPath(path);
  if (!f) throw new Error(`no field ${path}`);
  return f;
};

describe('a field in imperial units (NIST SP 811)', () => {
  it('a length: mm kept, inches shown, 381 mm = 15 in exactly', () => {
    const v = fieldIn(field('runner.length'), 'imperial');
    expect(v.def.unit).toBe('in');
    expect(v.toShown(381)).toBeCloseTo(15, 12);
    expect(v.fromShown(15)).toBeCloseTo(381, 10);
    expect(v.def.decimals).toBe(2);
    expect(v.def.step).toBe(0.5); // 10 mm ≈ 0.39 in: the nearest 1–2–2.5–5 step
  });
  it('a pressure: 101.325 kPa = 14.696 psi; a temperature: 20 °C = 68 °F', () => {
    const p = fieldIn(field('ambient.pressure'), 'imperial');
    expect(p.def.unit).toBe('psi');
    expect(p.toShown(101.325)).toBeCloseTo(14.696, 3);
    const t = fieldIn(field('ambient.temperature'), 'imperial');
    expect(t.def.unit).toBe('°F');
    expect(t.toShown(20)).toBeCloseTo(68, 10);
    expect(t.fromShown(212)).toBeCloseTo(100, 10);
  });
  it('a volume: 1 L = 61.024 ci', () => {
    const f = FIELDS.find((x) => x.unitWord === 'L');
    expect(f).toBeDefined();
    const v = fieldIn(f!, 'imperial');
    expect(v.def.unit).toBe('ci');
    expect(v.toShown(1)).toBeCloseTo(61.024, 3);
  });
  it('metric, and fields without a unit to change (speed, cam degrees), stay as they are', () => {
    for (const f of FIELDS) expect(fieldIn(f, 'metric').def).toEqual(f);
    expect(fieldIn(field('rpm'), 'imperial').def).toEqual(field('rpm'));
    expect(fieldIn(field('intake.closes'), 'imperial').def).toEqual(field('intake.closes'));
  });
  it('steps are 1–2–2.5–5 numbers', () => {
    expect(niceStep(0.3937)).toBe(0.5);
    expect(niceStep(0.03937)).toBeCloseTo(0.05, 12);
    expect(niceStep(1.8)).toBe(2);
    expect(niceStep(30.5)).toBe(25);
  });
});

function imperialCase(): UiState {
  let s = initialState({ values: { ...START_VALUES }, sweepPlan: { rpms: [3000, 4000], band: { from: 3000, to: 4000 } }, suggestedSavePath: '/cases/x-2.yaml', units: 'imperial' });
  s = reduce(s, { type: 'pointDone', id: 1, point: { result: syntheticResult(), label: 'as loaded', ambient: 101325, upstream: 'ambient' } });
  s = reduce(s, { type: 'showView', view: 'case' });
  const at = s.fields.findIndex((f) => f.path === 'runner.length');
  return reduce(s, { type: 'select', by: at - s.selected });
}

describe('the Case view with imperial units', () => {
  it('a length typed in inches is kept and written in mm', () => {
    let s = imperialCase();
    s = reduce(s, { type: 'beginEdit' });
    for (const ch of '15') s = reduce(s, { type: 'type', text: ch });
    s = reduce(s, { type: 'commitEdit' });
    expect(s.values['runner.length']).toBeCloseTo(381, 9);
    expect(s.edits.find((e) => e.path === 'runner.length')?.value).toBe('381 mm');
    expect(s.request.label).toBe('runner length 15.00 in');
  });
  it('the step keys step by half an inch', () => {
    let s = imperialCase();
    const before = s.values['runner.length']!; // 300 mm = 11.81 in
    s = reduce(s, { type: 'nudge', dir: 1 });
    expect(s.values['runner.length']! / 25.4).toBeCloseTo(before / 25.4 + 0.5, 3);
  });
  it('typing the value shown changes nothing and runs nothing', () => {
    let s = imperialCase();
    const id = s.request.id;
    s = reduce(s, { type: 'beginEdit' });
    for (const ch of '11.81') s = reduce(s, { type: 'type', text: ch });
    s = reduce(s, { type: 'commitEdit' });
    expect(s.request.id).toBe(id);
    expect(s.edits).toHaveLength(0);
  });
  it('the screen shows inches, psi and °F, and the baseline in the same unit', () => {
    const common = {
      width: 80,
      rows: 23,
      name: 'Synthetic',
      file: '/cases/synthetic.yaml',
      fields: FIELDS.filter((f) => START_VALUES[f.path] !== undefined),
      values: { ...START_VALUES, 'runner.length': 381 },
      baseValues: START_VALUES,
      selected: 1,
      running: false,
    };
    const imp = caseScreen({ ...common, units: IMPERIAL }).join('\n');
    expect(imp).toMatch(/Runner length\s+15\.00 in\s+\(baseline 11\.81\)/);
    expect(imp).toMatch(/14\.70 psi/);
    expect(imp).toMatch(/68 °F/);
    const met = caseScreen({ ...common, units: METRIC }).join('\n');
    expect(met).toMatch(/Runner length\s+381 mm\s+\(baseline 300\)/);
  });
});
