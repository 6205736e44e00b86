/**
 * The mass delivered since IVO (analysis/filling.ts) on flows worked out by
 * hand: at N rpm one crank degree lasts 1/(6·N) s.
 */
import { describe, expect, it } from 'vitest';
import { deliveredAt, deliveredSinceIvo } from '../../src/analysis/filling.js';

function result(rpm: number, ivo: number, flow: (theta: number) => number) {
  const valveFlow = new Float64Array(720);
  for (let t = 0; t < 720; t++) valveFlow[t] = flow(t);
  return { rpm, events: { ivo, ivc: 230, evo: 490, evc: 20 }, trace: { valveFlow } as never };
}

describe('mass delivered since IVO (hand)', () => {
  it('a steady 1 g/s at 6000 rpm: 1e-3 kg/s × 1/36000 s a degree, counted from IVO', () => {
    // one degree at 6000 rpm = 1/36000 s → 2.7778e-8 kg a degree
    const m = deliveredSinceIvo(result(6000, 700, () => 1e-3));
    expect(deliveredAt(m, 700)).toBeCloseTo(2.7778e-8, 12);
    // θ 0 is 21 degrees on from 700 (700..719, then 0)
    expect(deliveredAt(m, 0)).toBeCloseTo(21 * 2.7778e-8, 11);
    // the whole cycle: 720 degrees = 0.02 s → 20 mg
    expect(deliveredAt(m, 699)).toBeCloseTo(2e-5, 12);
  });
  it('flow back out of the cylinder counts against it', () => {
    // +2 g/s for the 10 degrees from IVO, then −1 g/s for 10: at 3000 rpm a degree is 1/18000 s
    const m = deliveredSinceIvo(result(3000, 100, (t) => (t >= 100 && t < 110 ? 2e-3 : t >= 110 && t < 120 ? -1e-3 : 0)));
    expect(deliveredAt(m, 109)).toBeCloseTo((10 * 2e-3) / 18000, 12);
    expect(deliveredAt(m, 119)).toBeCloseTo((10 * 1e-3) / 18000, 12);
    expect(deliveredAt(m, 99)).toBeCloseTo((10 * 1e-3) / 18000, 12);
  });
});
