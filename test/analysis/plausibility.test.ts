/**
 * Results no engine gives are flagged with what they mean (analysis/
 * plausibility.ts): ηv below 0 or above 2, residual gas above half the
 * charge, a negative cylinder mass. The limits are common practice (an
 * unboosted engine's ηv stays near 0.8–1.3; Heywood 1988, ch. 6, from memory).
 */
import { describe, expect, it } from 'vitest';
import { curveWarnings, resultProblems, resultWarnings } from '../../src/analysis/plausibility.js';
import { simulatePoint } from '../../src/core/engine.js';
import { loadCase } from '../../src/case/load.js';
import { ROOT } from '../hardening/cli.js';

describe('result plausibility', () => {
  it.each([
    [{ volumetricEfficiency: 1.05, residualFraction: 0.05, minCylinderMass: 1e-5 }, []],
    [{ volumetricEfficiency: -0.16, residualFraction: 0.05 }, ['negative-ve']],
    [{ volumetricEfficiency: 2.5, residualFraction: 0.05 }, ['huge-ve']],
    [{ volumetricEfficiency: 0.5, residualFraction: 0.62 }, ['mostly-residual']],
    [{ volumetricEfficiency: 0.5, residualFraction: 0.1, minCylinderMass: -1e-7 }, ['negative-mass']],
    [{ volumetricEfficiency: 0, residualFraction: 0.5 }, []],
    [{ volumetricEfficiency: 2, residualFraction: 0.5 }, []],
  ])('%j → %j', (p, kinds) => {
    expect(resultProblems(p)).toEqual(kinds);
  });

  it('the demo at its case speed gives no warning', async () => {
    const { model } = await loadCase('cases/demo.yaml', { cwd: ROOT, set: ['numerics.meshSize=20mm'] });
    expect(resultWarnings(simulatePoint(model).result)).toEqual([]);
  });

  it('the demo at 100 rpm (the exhaust back pressure blows through the intake): ηv below zero, said in words', async () => {
    const { model } = await loadCase('cases/demo.yaml', { cwd: ROOT, rpm: 100, set: ['numerics.meshSize=20mm'] });
    const r = simulatePoint(model).result;
    expect(r.volumetricEfficiency).toBeLessThan(0);
    const w = resultWarnings(r);
    expect(w[0]).toMatch(/^ηv -\d+\.\d % is below zero at 100 rpm: more gas went back out through the intake valve than came in/);
  }, 30_000);

  it('a curve names the speeds of each kind once', () => {
    const w = curveWarnings(
      [
        { rpm: 100, volumetricEfficiency: -0.1, residualFraction: 0.9 },
        { rpm: 200, volumetricEfficiency: -0.05, residualFraction: 0.3 },
        { rpm: 3000, volumetricEfficiency: 0.9, residualFraction: 0.05 },
      ],
      'A',
    );
    expect(w).toHaveLength(2);
    expect(w[0]).toMatch(/^A: ηv below zero at 100, 200 rpm: /);
    expect(w[1]).toMatch(/^A: residual gas above 50\.0 % at 100 rpm: /);
  });
});

describe('a boosted supply raises the ηv limit by its density ratio', () => {
  it('ηv 2.5 on the ambient density is implausible unboosted, plausible from a 2-bar supply', async () => {
    const { maxVolumetricEfficiency } = await import('../../src/analysis/plausibility.js');
    const ambient = { pressure: 101325, temperature: 293.15 };
    expect(maxVolumetricEfficiency({ ambient, inlet: { kind: 'ambient' } })).toBe(2);
    const boosted = { ambient, inlet: { kind: 'plenum' as const, volume: 3e-3, feedDiameter: 0.04, feedCd: 0.8, supply: { pressure: 202650, temperature: 293.15 } } };
    // the same temperature: density ratio 2 → limit 4
    expect(maxVolumetricEfficiency(boosted)).toBeCloseTo(4, 9);
    expect(resultProblems({ volumetricEfficiency: 2.5, residualFraction: 0.05 }, maxVolumetricEfficiency(boosted))).toEqual([]);
    expect(resultProblems({ volumetricEfficiency: 2.5, residualFraction: 0.05 })).toEqual(['huge-ve']);
  });
});
