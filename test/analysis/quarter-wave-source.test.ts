/**
 * One source for the quarter-wave hand figure: run (the pulse timing), check
 * and sweep (the case estimates) print the same frequency, with the sound
 * speed taken at the ambient temperature, and say so. The figure itself is
 * f₁ = a/(4(L+δ)), δ = 0.6133·r (Kinsler et al., Fundamentals of Acoustics;
 * Levine & Schwinger 1948); a = √(γRT), γ = 1.4, R = 287.05 J/(kg·K).
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { pulseTiming } from '../../src/analysis/pulse.js';
import { caseEstimates, handQuarterWave } from '../../src/analysis/estimates.js';
import { runSummary } from '../../src/cli/run-output.js';
import { checkReport } from '../../src/cli/commands/check.js';

describe('the quarter-wave figure: one source, a at the ambient temperature', async () => {
  const loaded = await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'] });
  const m = loaded.model;
  const { result } = simulatePoint(m);
  const pulse = pulseTiming(result, m);

  it('by hand for the demo: a = √(1.4·287.05·293.15) = 343.2 m/s; L = 0.38 m, r = 0.02 m: f₁ = 343.2/(4·(0.38 + 0.012266)) = 218.7 Hz', () => {
    const h = handQuarterWave(m);
    expect(h.temperature).toBeCloseTo(293.15, 6);
    expect(h.soundSpeed).toBeCloseTo(343.2, 1);
    expect(h.frequency).toBeCloseTo(218.7, 1);
  });

  it('run, check and the sweep estimates print the same frequency; run names the temperature', () => {
    const est = caseEstimates(m, 4000, 9000);
    expect(pulse.quarterWaveFrequency).toBe(est.quarterWaveFrequency);
    expect(pulse.quarterWaveSoundSpeed).toBe(est.soundSpeed);
    const run = runSummary(loaded, result, pulse, 0);
    const check = checkReport(loaded);
    const hz = (t: string) => /quarter-wave[^\n]*?(\d+\.\d) Hz/.exec(t)?.[1];
    expect(hz(run)).toBe('218.7');
    expect(hz(check)).toBe(hz(run));
    expect(run).toMatch(/a 343\.2 m\/s at the ambient 20\.0 °C/);
    expect(check).toMatch(/343\.2 m\/s at the ambient 20\.0 °C/);
  });
});
