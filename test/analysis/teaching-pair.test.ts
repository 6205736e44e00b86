/**
 * The teaching pair cases/teach-short.yaml and cases/teach-long.yaml: the
 * same engine with a 200 mm and a 600 mm runner. The classic bench
 * demonstration of a long and a short pipe drawn by a slow and a fast
 * piston (common practice, the classic bench demonstration): at low piston
 * speed both fill alike; at high speed the long pipe first lags (its
 * heavier column is slow to get moving) and then rams charge in after BDC,
 * ahead by the time the valve closes.
 *
 * The pair is built on wave timing, not on a lucky setting: the checks run at
 * the cases' own speeds (1000 and 5000 rpm) and, for the high speed, at
 * both ends of the span the case comments name (4750 and 5100 rpm).
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { deliveredAt, deliveredSinceIvo } from '../../src/analysis/filling.js';
import { cli, ROOT } from '../cli/helpers.js';

async function point(which: 'short' | 'long', rpm: number) {
  const loaded = await loadCase(join(ROOT, 'cases', `teach-${which}.yaml`), { rpm });
  return simulatePoint(loaded.model).result;
}

describe('the teaching pair (common practice, the classic bench demonstration)', () => {
  it('the two cases differ in runner length only: 200 and 600 mm', async () => {
    const s = (await loadCase(join(ROOT, 'cases/teach-short.yaml'))).model;
    const l = (await loadCase(join(ROOT, 'cases/teach-long.yaml'))).model;
    expect(s.runner.sections.map((x) => x.length)).toEqual([0.2]);
    expect(l.runner.sections.map((x) => x.length)).toEqual([0.6]);
    expect({ ...l, name: '', runner: { ...l.runner, sections: [] } }).toEqual({ ...s, name: '', runner: { ...s.runner, sections: [] } });
  });

  it('slow (1000 rpm): both runners fill alike, ηv within 2 points', async () => {
    const s = await point('short', 1000);
    const l = await point('long', 1000);
    expect(s.converged && l.converged).toBe(true);
    expect(Math.abs(l.volumetricEfficiency - s.volumetricEfficiency)).toBeLessThan(0.02);
  });

  it.each([4750, 5000, 5100])('fast (%i rpm): the long runner lags before BDC and is ahead by IVC', async (rpm) => {
    const s = await point('short', rpm);
    const l = await point('long', rpm);
    expect(s.converged && l.converged).toBe(true);
    const ms = deliveredSinceIvo(s);
    const ml = deliveredSinceIvo(l);
    // the sum over the cycle is the result's delivered mass (the trace samples it once a degree: within 0.1 %)
    expect(Math.abs(deliveredAt(ms, s.events.ivo - 1) / s.deliveredMass - 1)).toBeLessThan(1e-3);
    // before BDC (θ 180°) the long runner's column is still getting moving
    expect(deliveredAt(ml, 180)).toBeLessThan(deliveredAt(ms, 180));
    // by IVC it has rammed charge in after BDC
    expect(s.events.ivc).toBe(l.events.ivc);
    expect(deliveredAt(ml, l.events.ivc)).toBeGreaterThan(deliveredAt(ms, s.events.ivc));
  });

  it('why (wave round trip 12·N·L/a against the valve-open time): at 5000 rpm the long runner\'s wave comes back near BDC, the short one\'s long before', async () => {
    const s = await point('short', 5000);
    const l = await point('long', 5000);
    const roundTrip = (r: typeof s) => (12 * r.rpm * r.runnerLength) / r.meanSoundSpeed;
    expect(roundTrip(l)).toBeGreaterThan(90);
    expect(roundTrip(l)).toBeLessThan(120);
    expect(roundTrip(s)).toBeLessThan(40);
    // the long runner closes on a compression, the short one on an expansion with backflow
    expect(l.valvePressureAtIvc).toBeGreaterThan(101325);
    expect(s.valvePressureAtIvc).toBeLessThan(101325);
    expect(s.peakReverseFlow).toBeGreaterThan(l.peakReverseFlow);
  });

  it('`tractwave compare` of the pair at 1000 and 5000 rpm (the README command): even when slow, the long runner ahead when fast', async () => {
    const r = await cli(['compare', 'cases/teach-short.yaml', 'cases/teach-long.yaml', '--rpm', '1000:5000:4000', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { difference: { rpm: number; difference: number }[] };
    const at = (rpm: number) => j.difference.find((d) => d.rpm === rpm)?.difference ?? Number.NaN;
    expect(Math.abs(at(1000))).toBeLessThan(0.02);
    // B (long) − A (short): the ram is worth points, not a rounding
    expect(at(5000)).toBeGreaterThan(0.03);
  });
});
