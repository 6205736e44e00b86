/**
 * The terminal view with measured data: the Valve view draws a pressure
 * trace (•) and a lift log in place of the cylinder mass, says whether the
 * measured pulse agrees; the Sweep view draws dyno points (●); m turns them
 * on and off. Synthetic traces: rendering only, no physics.
 */
import { describe, expect, it } from 'vitest';
import { valveScreen } from '../../src/ui/valve-screen.js';
import { sweepScreen } from '../../src/ui/sweep-screen.js';
import { GLYPH } from '../../src/ui/chart.js';
import { initialState, reduce } from '../../src/ui/state.js';
import { keyToAction } from '../../src/ui/keys.js';
import { helpLines } from '../../src/ui/frame-screen.js';
import { AMBIENT, START_VALUES, syntheticResult } from './fixtures.js';
import { loadCase } from '../../src/case/load.js';
import { measuredOf } from '../../src/ui/case-session.js';

describe('the Valve view with measured data', () => {
  const r = syntheticResult();
  const base = { crank: 100, from: 0, span: 720, now: r.trace, reference: AMBIENT, events: r.events, verdict: 'the wave is helping', width: 100, rows: 30 };
  const measuredP = Float64Array.from(r.trace.valvePressure, (v) => v + 3000);
  const liftLog = Float64Array.from(r.trace.lift, (v, j) => (j % 2 === 0 ? v : Number.NaN));

  it('draws the trace at its sensor with the model there, and says where', () => {
    const text = valveScreen({ ...base, measured: { trace: { pressure: measuredP, model: r.trace.valvePressure, sensorAt: 0.08 }, verdict: 'the measured compression peak comes 2° later than the model\'s' } }).join('\n');
    expect(text).toContain(GLYPH.measured);
    expect(text).toMatch(/Pressure 80 mm from the valve .* measured \d+\.\d kPa/);
    expect(text).toContain('• measured');
    expect(text).toMatch(/Measured: the measured compression peak comes 2° later/);
  });

  it('draws the lift log in place of the cylinder mass', () => {
    const text = valveScreen({ ...base, measured: { lift: liftLog } }).join('\n');
    expect(text).toMatch(/Valve lift\s+\d+\.\d+ mm \(lift log \d+\.\d+ mm\)/);
    expect(text).not.toContain('Gas in the cylinder');
  });

  it('without measured data is as before', () => {
    const text = valveScreen(base).join('\n');
    expect(text).not.toContain(GLYPH.measured);
    expect(text).toContain('Gas in the cylinder');
    for (const l of valveScreen({ ...base, measured: { lift: liftLog, trace: { pressure: measuredP, model: measuredP, sensorAt: 0 }, verdict: 'x' } }))
      expect([...l].length).toBe(100);
  });
});

describe('the Sweep view with dyno points', () => {
  const rpms = [4000, 5000, 6000, 7000, 8000];
  const now = { rpms, eta: [0.9, 0.95, 1.02, 1.05, 0.98], label: 'as loaded' };
  const input = { width: 80, rows: 20, now, band: { from: 5000, to: 7000 }, plan: { from: 4000, to: 8000, count: 5 }, currentRpm: 6000, status: 'done' as const, stale: false };
  it('draws each point as ● and names the sheet', () => {
    const text = sweepScreen({ ...input, measured: { points: [{ rpm: 5000, eta: 0.97 }, { rpm: 7000, eta: 1.1 }], label: 'dyno dyno.csv' } }).join('\n');
    expect(text.split('●').length - 1).toBe(3); // two points and the legend
    expect(text).toContain('● dyno dyno.csv');
  });
  it('a point above the curve widens the scale to show it', () => {
    const text = sweepScreen({ ...input, measured: { points: [{ rpm: 6000, eta: 1.4 }], label: 'dyno' } }).join('\n');
    expect(text).toMatch(/14\d\.\d┤/); // the top of the scale: 140 % and its margin
  });
});

describe('m turns measured data on and off', () => {
  const s0 = initialState({ values: START_VALUES, sweepPlan: { rpms: [5000, 6000], band: { from: 5000, to: 6000 } }, suggestedSavePath: 'x.yaml' });
  it('starts on; m toggles it in any view; the help lists it', () => {
    expect(s0.measured).toBe(true);
    const a = keyToAction('m', {}, s0);
    expect(a).toEqual({ type: 'toggleMeasured' });
    const s1 = reduce(s0, a!);
    expect(s1.measured).toBe(false);
    expect(reduce(s1, a!).measured).toBe(true);
    expect(keyToAction('m', {}, { ...s0, view: 'sweep' })).toEqual({ type: 'toggleMeasured' });
    expect(helpLines(80, 22).join('\n')).toMatch(/t  m +teaching \/ measured/);
  });
});

describe('the session of the bundled example', () => {
  it('carries the trace, the intake lift log and the dyno points on the ηv scale', async () => {
    const l = await loadCase('cases/measured-single.yaml');
    const m = measuredOf(l)!;
    expect(m.trace?.sensorAt).toBeCloseTo(0.08, 12);
    expect(m.trace?.byDegree).toHaveLength(720);
    expect(m.lift?.filter(Number.isFinite).length).toBeGreaterThan(300);
    expect(m.dyno?.points).toHaveLength(12);
    // a torque point put on the ηv scale with the case's estimate (AFR 12.8, 43 MJ/kg, η_b 0.28)
    const p = l.files.dyno!.points[0]!;
    const refMass = (l.model.ambient.pressure / (287.05 * l.model.ambient.temperature)) * (Math.PI / 4) * 0.089 ** 2 * 0.0628;
    expect(m.dyno!.points[0]!.eta).toBeCloseTo((p.torque! * 4 * Math.PI * 12.8) / (refMass * 43e6 * 0.28), 9);
  });
});
