/**
 * The accelerated cycle iteration (engine.ts, CycleAccelerator: Aitken's Δ²
 * on the chambers' slow filling mode and a stopping rule on the estimated
 * remaining error) against plain cycling.
 *
 * Reference: plain cycling (no extrapolation, the plain rule |Δ| ≤ tol)
 * run to a tolerance of 1e-7, i.e. far past the case's own tolerance: the
 * periodic answer of the same discrete model. Aitken's Δ² process for a
 * linearly converging sequence: Aitken 1926, Proc. R. Soc. Edinburgh 46:289;
 * the remaining-error estimate |Δ|·ρ/(1 − ρ) of a linearly converging
 * sequence with ratio ρ: common practice (e.g. Burden & Faires, Numerical
 * Analysis, §2.5, from memory).
 */
import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';

const engineCases = readdirSync('cases')
  .filter((f) => f.endsWith('.yaml') && !f.startsWith('pipe-'))
  .sort();

describe('accelerated periodic convergence gives the same ηv as plain cycling (every bundled engine case)', () => {
  it('the bundled engine cases are all here', () => {
    expect(engineCases.length).toBeGreaterThanOrEqual(6);
  });

  for (const file of engineCases) {
    it(`${file} at its own speed: accelerated at the case tolerance within that tolerance of plain cycling converged to 1e-7`, async () => {
      const { model } = await loadCase(`cases/${file}`);
      const tol = model.numerics.tolerance;
      const fast = simulatePoint(model).result;
      const plain = simulatePoint({ ...model, numerics: { ...model.numerics, tolerance: 1e-7, maxCycles: 400 } }, { accelerate: false }).result;
      expect(plain.converged).toBe(true);
      expect(fast.converged).toBe(true);
      const rel = Math.abs(fast.volumetricEfficiency / plain.volumetricEfficiency - 1);
      expect(rel, `${file}: accelerated ${fast.volumetricEfficiency} after ${fast.cycles} cycles, plain ${plain.volumetricEfficiency} after ${plain.cycles}`).toBeLessThanOrEqual(tol);
    }, 20_000);
  }

  it('the airbox case (a slow plenum mode): fewer cycles than plain cycling needs for the same answer, and the plain rule at the case tolerance stops early and off', async () => {
    const { model } = await loadCase('cases/airbox-single.yaml', { rpm: 9000 });
    const tol = model.numerics.tolerance;
    const fast = simulatePoint(model).result;
    const plainEarly = simulatePoint(model, { accelerate: false }).result;
    const plain = simulatePoint({ ...model, numerics: { ...model.numerics, tolerance: 1e-7, maxCycles: 400 } }, { accelerate: false }).result;
    const relFast = Math.abs(fast.volumetricEfficiency / plain.volumetricEfficiency - 1);
    const relEarly = Math.abs(plainEarly.volumetricEfficiency / plain.volumetricEfficiency - 1);
    expect(relFast).toBeLessThanOrEqual(tol);
    // the plain rule |Δ| ≤ tol: a slow mode with ratio ρ leaves about |Δ|·ρ/(1 − ρ) behind
    expect(relEarly).toBeGreaterThan(10 * tol);
    expect(fast.cycles).toBeLessThan(plain.cycles / 4);
  }, 20_000);
});
