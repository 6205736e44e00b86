/**
 * The two runner schemes on the same strong-wave engine point: our test
 * single at 6000 rpm, where the valve-end pressure swings well beyond
 * ±40 kPa around ambient. Both must balance mass per cycle within 0.5 %,
 * give ηv within 1.5 % of each other, put the last compression peak before
 * IVC within 2° and ring at the same closed-valve frequency within 1 %.
 */
import { describe, expect, it } from 'vitest';
import { simulatePoint } from '../../src/core/engine.js';
import { pulseTiming, closedValveRingingPeriod } from '../../src/analysis/pulse.js';
import { testEngine } from '../support/engine-fixture.js';

describe('characteristics and conservative schemes agree on a strong-wave point', () => {
  const models = {
    characteristics: testEngine({ rpm: 6000, scheme: 'characteristics' }),
    conservative: testEngine({ rpm: 6000, scheme: 'conservative' }),
  };
  const moc = simulatePoint(models.characteristics).result;
  const fv = simulatePoint(models.conservative).result;

  it('is a strong-wave case: valve-end swing beyond ±40 kPa around ambient', () => {
    for (const r of [moc, fv]) {
      const p = Array.from(r.trace.valvePressure);
      expect(Math.max(...p) - 101325).toBeGreaterThan(40e3);
      expect(101325 - Math.min(...p)).toBeGreaterThan(40e3);
    }
  });
  it('per-cycle mass imbalance ≤ 0.5 % for both', () => {
    expect(Math.abs(moc.massImbalance)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(fv.massImbalance)).toBeLessThanOrEqual(0.005);
  });
  it('ηv within 1.5 %', () => {
    expect(Math.abs(moc.volumetricEfficiency / fv.volumetricEfficiency - 1)).toBeLessThan(0.015);
  });
  it('last compression peak before IVC within 2°', () => {
    const a = pulseTiming(moc, models.characteristics).lastPeakBeforeIvc;
    const b = pulseTiming(fv, models.conservative).lastPeakBeforeIvc;
    expect(a).not.toBeNull();
    expect(b).not.toBeNull();
    expect(Math.abs(a!.crank - b!.crank)).toBeLessThanOrEqual(2);
  });
  it('closed-valve ringing frequency within 1 %', () => {
    const ta = closedValveRingingPeriod(moc.trace.valvePressure, moc.trace.crank, moc.events.ivc, moc.events.ivo);
    const tb = closedValveRingingPeriod(fv.trace.valvePressure, fv.trace.crank, fv.events.ivc, fv.events.ivo);
    expect(ta).not.toBeNull();
    expect(tb).not.toBeNull();
    expect(Math.abs(ta! / tb! - 1)).toBeLessThan(0.01);
  });
});
