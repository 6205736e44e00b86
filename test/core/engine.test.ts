import { describe, expect, it } from 'vitest';
import { simulatePoint } from '../../src/core/engine.js';
import { sweptVolume } from '../../src/core/kinematics.js';
import { R_AIR } from '../../src/core/gas.js';
import { testEngine } from '../support/engine-fixture.js';

describe('one operating point, end to end (our own test engine)', () => {
  const { result: r } = simulatePoint(testEngine({ rpm: 6500 }));

  it('converges to a periodic cycle within the cap', () => {
    expect(r.converged).toBe(true);
    expect(r.cycles).toBeLessThan(30);
  });
  it('volumetric efficiency is delivered mass over ambient density × swept volume (Heywood 1988, eq. 2.27, per-cycle form)', () => {
    const m = testEngine();
    const ref = (m.ambient.pressure / (R_AIR * m.ambient.temperature)) * sweptVolume(m.engine);
    expect(r.volumetricEfficiency).toBeCloseTo(r.deliveredMass / ref, 12);
    expect(r.volumetricEfficiency).toBeGreaterThan(0.5);
    expect(r.volumetricEfficiency).toBeLessThan(1.5);
  });
  it('trace covers one whole cycle, 720 samples, θ increasing, all finite', () => {
    expect(r.trace.crank.length).toBe(720);
    for (let i = 1; i < 720; i++) expect(r.trace.crank[i]!).toBeGreaterThan(r.trace.crank[i - 1]!);
    for (const k of ['valvePressure', 'valveFlow', 'cylinderPressure', 'cylinderMass', 'lift'] as const) {
      expect(r.trace[k].every((v) => Number.isFinite(v))).toBe(true);
    }
    expect(r.runnerMap.pressure.length).toBe(720 * r.runnerMap.x.length);
  });
  it('the intake valve passes flow only while it is lifted', () => {
    for (let j = 0; j < 720; j++) if (r.trace.lift[j] === 0) expect(r.trace.valveFlow[j]).toBe(0);
  });
  it('trapped mass and residual fraction are physical', () => {
    expect(r.trappedMass).toBeGreaterThan(0);
    expect(r.residualFraction).toBeGreaterThan(0);
    expect(r.residualFraction).toBeLessThan(0.2);
  });
});

describe('mass balance per converged cycle: delivered vs runner inlet within 1 %', () => {
  it.each([
    ['characteristics', 4000],
    ['characteristics', 8000],
    ['characteristics', 10000],
    ['conservative', 4000],
    ['conservative', 8000],
    ['conservative', 10000],
  ] as const)('%s at %d rpm', (scheme, rpm) => {
    const { result } = simulatePoint(testEngine({ rpm, scheme }));
    expect(Math.abs(result.massImbalance)).toBeLessThan(0.01);
    // and far inside the 0.5 % the solver promises to report
    expect(Math.abs(result.massImbalance)).toBeLessThan(0.005);
    expect(result.inletMass).toBeCloseTo(result.deliveredMass, 6);
  });
  it('plenum-fed engine balances too', () => {
    const { result } = simulatePoint(testEngine({ rpm: 7000, plenum: { volume: 3e-3, feedDiameter: 0.045 } }));
    expect(Math.abs(result.massImbalance)).toBeLessThan(0.005);
  });
});

describe('grid convergence', () => {
  it.each([
    ['conservative', 4000],
    ['conservative', 7000],
    ['conservative', 9500],
    ['characteristics', 4000],
    ['characteristics', 9500],
  ] as const)('%s: ηv changes by less than 1 %% from the default mesh (10 mm) to half of it at %d rpm', (scheme, rpm) => {
    const a = simulatePoint(testEngine({ rpm, scheme, meshSize: 0.01 })).result.volumetricEfficiency;
    const b = simulatePoint(testEngine({ rpm, scheme, meshSize: 0.005 })).result.volumetricEfficiency;
    expect(Math.abs(b / a - 1)).toBeLessThan(0.01);
  });
});

describe('quasi-steady limit', () => {
  it('at 300 rpm with a short wide runner and no overlap, IVC pressure is within 3 % of ambient', () => {
    const m = testEngine({ rpm: 300, runnerLength: 0.05, runnerDiameter: 0.06, ivoBtdc: 0, evcAtdc: 0, ivcAbdc: 0, maxCycles: 12 });
    const { result } = simulatePoint(m);
    expect(Math.abs(result.ivcPressure / m.ambient.pressure - 1)).toBeLessThan(0.03);
  });
});

describe('divergence is reported, not hidden', () => {
  it('a Courant number above 1 (CFL condition broken) is refused up front, naming it', () => {
    const m = testEngine({ rpm: 6000 });
    m.numerics.courant = 3;
    expect(() => simulatePoint(m)).toThrow(/courant must be in \(0, 1\], got 3/);
  });
  it('a state gone non-finite stops with a SimulationError naming the case values', () => {
    const m = testEngine({ rpm: 6000 });
    m.runner.friction = 50; // absurd wall friction
    expect(() => simulatePoint(m)).toThrow(/diverged.*6000 rpm/);
  });
});
