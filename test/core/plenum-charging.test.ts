/**
 * Mutant killed: the plenum volume doubled (seen by no other check).
 *
 * An adiabatic 0-D volume filled with air from a source at T0 changes its
 * pressure at dp/dt = γ·R·T0·ṁ/V (the first law for an open system of
 * constant volume, as in the filling-and-emptying models of Heywood 1988,
 * ch. 14; section from memory). Worked by hand: V 6 L, ṁ 10 g/s of air at
 * 293.15 K into air at 293.15 K → dp/dt = 1.4 × 287.05 × 293.15 × 0.01 / 0.006
 * = 196 347 Pa/s.
 */
import { describe, expect, it } from 'vitest';
import { Chamber } from '../../src/core/network/volumes.js';
import { CP } from '../../src/core/gas.js';
import { reservoirFlow } from '../../src/core/flow.js';
import { simulatePoint } from '../../src/core/engine.js';
import { testEngine } from '../support/engine-fixture.js';

const AMB = { pressure: 101325, temperature: 293.15 };

describe('plenum charging: dp/dt = γ·R·T0·ṁ/V', () => {
  it('6 L charged at 10 g/s from 293.15 K: 196 347 Pa/s (hand value above, within 0.1 %)', () => {
    const pl = new Chamber('plenum', 6e-3, AMB.pressure, AMB.temperature); // no feed: only what is pushed in
    const dt = 1e-5;
    const p0 = pl.pressure;
    pl.addFlow(0.01, 0.01 * CP * 293.15, 0);
    pl.advance({ dt, thetaMid: 0, theta1: 0, rpm: 6000 });
    expect(Math.abs((pl.pressure - p0) / dt / 196347 - 1)).toBeLessThan(1e-3);
  });

  it('emptying at 10 g/s (the leaving gas carries its own enthalpy) lowers it at the same rate', () => {
    const pl = new Chamber('plenum', 6e-3, AMB.pressure, AMB.temperature);
    const dt = 1e-5;
    const p0 = pl.pressure;
    pl.addFlow(-0.01, -0.01 * CP * pl.temperature, 0);
    pl.advance({ dt, thetaMid: 0, theta1: 0, rpm: 6000 });
    const rate = (p0 - pl.pressure) / dt;
    expect(Math.abs(rate / 196347 - 1)).toBeLessThan(1e-3);
  });

  it.each([
    [3e-3, 0.045, 7000],
    [6e-3, 0.045, 5000],
    [1.5e-3, 0.035, 8000],
  ])('in the engine (plenum %f m³, feed %f m, %d rpm): the plenum trace follows the law within 5 per cent', (V, d, rpm) => {
    // the measured dp/dθ of the converged cycle against γ·R·T0·(ṁ_feed − ṁ_runner)/(V·ω), with the
    // feed flow through Cd·πd²/4 from the orifice equation (Heywood 1988 App. C) and T0 the ambient's
    const m = testEngine({ rpm, plenum: { volume: V, feedDiameter: d } });
    const t = simulatePoint(m).result.trace;
    const area = 0.8 * (Math.PI / 4) * d * d;
    const omega = 6 * rpm;
    let sxy = 0;
    let sxx = 0;
    let syy = 0;
    for (let j = 0; j < 720; j++) {
      const p = t.plenumPressure[j]!;
      const T = AMB.temperature * Math.pow(p / AMB.pressure, 0.4 / 1.4);
      const feed = reservoirFlow(area, AMB.pressure, AMB.temperature, p, T);
      const law = (1.4 * 287.05 * AMB.temperature * (feed - t.inletFlow[j]!)) / V / omega;
      const seen = (t.plenumPressure[(j + 1) % 720]! - t.plenumPressure[(j + 719) % 720]!) / 2;
      sxy += law * seen;
      sxx += law * law;
      syy += seen * seen;
    }
    expect(sxy / Math.sqrt(sxx * syy)).toBeGreaterThan(0.99); // the same shape
    expect(Math.abs(sxy / sxx - 1)).toBeLessThan(0.05); // and the same size: the volume is V
  });
});
