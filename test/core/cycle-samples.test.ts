/**
 * The per-degree traces come from the cycle the result is taken from
 * (engine.ts samples only the last cycles; a point that converges in an
 * unsampled cycle runs one more, sampled). Check: the valve-flow trace
 * summed over the 720 whole degrees (rectangle rule, 1° = 1/(6N) s) gives
 * the delivered mass of that cycle within 2 % (sampling error of the rule;
 * common practice), and the cylinder-pressure trace is filled everywhere.
 * Own consistency check, no external source.
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';

describe('traces belong to the result cycle', () => {
  for (const [file, rpm] of [['cases/demo.yaml', 6500], ['cases/demo.yaml', 9000], ['cases/airbox-single.yaml', 7000]] as const) {
    it(`${file} at ${rpm} rpm: Σ valve flow·Δt over the trace = delivered mass within 2 %, every degree sampled`, async () => {
      const { model } = await loadCase(file, { rpm });
      const r = simulatePoint(model).result;
      const dt = 1 / (6 * rpm);
      let m = 0;
      for (let j = 0; j < 720; j++) m += r.trace.valveFlow[j]! * dt;
      expect(Math.abs(m / r.deliveredMass - 1), `${m} vs ${r.deliveredMass} after ${r.cycles} cycles`).toBeLessThan(0.02);
      for (let j = 0; j < 720; j++) expect(r.trace.cylinderPressure[j]!).toBeGreaterThan(0);
    }, 10_000);
  }
});
