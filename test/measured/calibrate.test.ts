/**
 * Calibration against dyno sheets made from the model itself, so the true
 * values are known: the fit must find them (the test's own construction,
 * no external source), and its 95 % interval must cover the truth under
 * seeded noise. Student's t quantile checked against jStat, a general-purpose
 * statistics library from the npm registry.
 */
import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { loadCase } from '../../src/case/load.js';
import { calibrate, modelWith } from '../../src/analysis/calibrate.js';
import { runSweepSerial } from '../../src/analysis/sweep.js';
import { studentTCdf, studentTQuantile } from '../../src/analysis/student-t.js';

const jStat = (createRequire(import.meta.url)('jstat') as { jStat: { studentt: { inv: (p: number, dof: number) => number; cdf: (t: number, dof: number) => number } } }).jStat;

describe("Student's t against jStat", () => {
  // jStat's own values carry about 1e-8 (its CDF at t = 0 reads 0.5000000028): agree to 1e-6
  it.each([1, 2, 3, 5, 10, 30, 100])('ν = %d: the 97.5th percentile and the CDF agree with jStat', (nu) => {
    expect(studentTQuantile(0.975, nu)).toBeCloseTo(jStat.studentt.inv(0.975, nu), 6);
    for (const t of [-3, -0.5, 0, 0.7, 2.2, 6]) expect(studentTCdf(t, nu)).toBeCloseTo(jStat.studentt.cdf(t, nu), 6);
  });
  it('gives the familiar table values (t 0.975: 12.706 at ν 1, 2.228 at ν 10; from memory)', () => {
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
  });
});

/** seeded uniform noise in ±1 (mulberry32) */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (2 * ((t ^ (t >>> 14)) >>> 0)) / 4294967296 - 1;
  };
}

describe('calibration recovers what the sheet was made with', async () => {
  // the demo on a 20 mm mesh, to keep the suite quick
  const l = await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'] });
  const a = { airFuelRatio: 12.8, fuelHeatingValue: 43e6, brakeEfficiency: 0.3 };
  const base = { model: l.model, cdScale: 1, assumptions: a };

  it('torque × 1.08 → brake efficiency × 1.08 within 0.5 %', () => {
    const rpms = [5000, 6000, 7000, 8000];
    const pts = runSweepSerial(modelWith(l.model, 1, {}), rpms, a);
    const r = calibrate({ ...base, measured: pts.map((p) => ({ rpm: p.rpm, torque: p.torque * 1.08 })), quantity: 'torque', fit: ['brakeEfficiency'] });
    expect(Math.abs(r.fit.brakeEfficiency! / (0.3 * 1.08) - 1)).toBeLessThan(0.005);
    expect(r.residual.rmsRelative).toBeLessThan(1e-3);
    expect(r.residual.startRmsRelative).toBeGreaterThan(0.07);
  });

  it('a sheet made with cdScale 0.9 → cdScale 0.9 within 2 %', () => {
    const rpms = [5000, 6500, 8000];
    const pts = runSweepSerial(modelWith(l.model, 1, { cdScale: 0.9 }), rpms, a);
    const r = calibrate({ ...base, measured: pts.map((p) => ({ rpm: p.rpm, volumetricEfficiency: p.volumetricEfficiency })), quantity: 'volumetricEfficiency', fit: ['cdScale'] });
    expect(Math.abs(r.fit.cdScale! / 0.9 - 1)).toBeLessThan(0.02);
    expect(r.points).toHaveLength(3);
    expect(r.covers).toEqual({ from: 5000, to: 8000 });
  });

  it('±2 % seeded noise: the 95 % interval of the brake efficiency covers the true value', () => {
    const rpms = [4500, 5000, 5500, 6000, 6500, 7000, 7500, 8000];
    const truth = 0.32;
    const pts = runSweepSerial(modelWith(l.model, 1, {}), rpms, { ...a, brakeEfficiency: truth });
    for (const seed of [1, 2, 3]) {
      const noise = rng(seed);
      const measured = pts.map((p) => ({ rpm: p.rpm, torque: p.torque * (1 + 0.02 * noise()) }));
      const r = calibrate({ ...base, measured, quantity: 'torque', fit: ['brakeEfficiency'] });
      const u = r.uncertainty.brakeEfficiency!;
      expect(u).not.toBeNull();
      expect(u.low95).toBeLessThan(truth);
      expect(u.high95).toBeGreaterThan(truth);
      // and it is an interval worth having: ±2 % noise over 8 speeds, well under ±3 %
      expect((u.high95 - u.low95) / truth).toBeLessThan(0.06);
      expect(r.degreesOfFreedom).toBe(7);
    }
  });
});
