import { describe, expect, it } from 'vitest';
import { simulatePoint } from '../../src/core/engine.js';
import { testEngine } from '../support/engine-fixture.js';

describe('one operating point, end to end (our own test engine)', () => {
  const { result: r } = simulatePoint(testEngine({ rpm: 6500 }));

  it('converges to a periodic cycle within the cap', () => {
    expect(r.converged).toBe(true);
    expect(r.cycles).toBeLessThan(30);
  });
  it('volumetric efficiency is delivered mass over ambient density × swept volume (Heywood 1988, eq. 2.27, per-cycle form)', () => {
    // worked by hand for the test engine: Vd = π/4 · 94² · 65 mm³ = 451.09 cm³, ρ = 101325 / (287.05 · 293.15)
    // = 1.20412 kg/m³ → reference mass 543.160 mg
    expect(r.referenceMass * 1e6).toBeCloseTo(543.16, 2);
    expect(Math.abs((r.volumetricEfficiency * 543.16e-6) / r.deliveredMass - 1)).toBeLessThan(1e-5);
    // common practice: a tuned unboosted single breathes 0.5–1.5 of its swept volume
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
    // A sample at θ = j holds the flow of the time step that reaches j, whose valve area is
    // taken at its midpoint: at IVO and IVC that midpoint may fall on either side of the
    // event, depending on where the steps fall (they are under 2° long). So the check is
    // made where the valve is shut over the whole neighbourhood [j − 2°, j + 1°], at any
    // speed and mesh, and the flow there must be exactly zero.
    const shut = (j: number) => [-2, -1, 0, 1].every((k) => r.trace.lift[(j + k + 720) % 720] === 0);
    let checked = 0;
    for (let j = 0; j < 720; j++)
      if (shut(j)) {
        expect(r.trace.valveFlow[j], `θ ${j}`).toBe(0);
        checked++;
      }
    expect(checked).toBeGreaterThan(400); // the valve is shut for 450° of the 720
  });
  it.each([
    [6100, 0.01],
    [6300, 0.01],
    [6500, 0.008],
    [7000, 0.012],
  ])('and at %d rpm on a %f m mesh too (no luck of where the steps fall)', (rpm, mesh) => {
    const t = simulatePoint(testEngine({ rpm, meshSize: mesh, maxCycles: 6 })).result.trace;
    for (let j = 0; j < 720; j++)
      if ([-2, -1, 0, 1].every((k) => t.lift[(j + k + 720) % 720] === 0)) expect(t.valveFlow[j], `θ ${j}`).toBe(0);
  });
  it('trapped mass and residual fraction are physical (residual gas at full load a few to 20 %: Heywood 1988 §6.4, from memory)', () => {
    expect(r.trappedMass).toBeGreaterThan(0);
    expect(r.residualFraction).toBeGreaterThan(0);
    expect(r.residualFraction).toBeLessThan(0.2);
  });
});

// continuity: over a periodic cycle the runner stores nothing, so what enters its open end leaves through the valve
describe('mass balance per converged cycle: delivered vs runner inlet within 1 % (conservation of mass)', () => {
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

// mesh independence (common practice; the grid-convergence study of Roache, Verification and Validation in
// Computational Science and Engineering, 1998, from memory): halving the mesh changes the answer little
describe('grid convergence', () => {
  it.each([
    ['conservative', 4000],
    ['conservative', 7000],
    ['conservative', 9500],
    ['characteristics', 4000],
    ['characteristics', 9500],
  ] as const)('%s: ηv changes by less than 1 per cent from the default mesh (10 mm) to half of it at %d rpm', (scheme, rpm) => {
    const a = simulatePoint(testEngine({ rpm, scheme, meshSize: 0.01 })).result.volumetricEfficiency;
    const b = simulatePoint(testEngine({ rpm, scheme, meshSize: 0.005 })).result.volumetricEfficiency;
    expect(Math.abs(b / a - 1)).toBeLessThan(0.01);
  });
});

// at a low speed the gas has time to follow the piston: the cylinder fills to the pressure upstream, as in
// a steady-flow test of the valve (quasi-steady flow, Heywood 1988 §6.2; section from memory)
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
