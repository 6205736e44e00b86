/**
 * The coupling of a 0-D volume and a restriction is second order in time
 * (volumes.ts: the connectors read a mid-step estimate of the volume's
 * state; orifice.ts: the flow is solved implicitly at mid-step).
 *
 * A 2 L chamber at 150 kPa, 293.15 K empties through a 50 mm² orifice into a
 * fixed reservoir at 101.325 kPa for 50 ms (about a quarter of its
 * pressure). Reference: the same filling-and-emptying ODE — dm/dt = −ṁ,
 * dU/dt = −ṁ·cp·T, ṁ from the compressible orifice equation (Heywood 1988,
 * App. C) — integrated by odex (Hairer's extrapolation code, from the npm
 * registry) to 1e-12. The observed order between successive halvings of the
 * time step, p = ln(e(dt)/e(dt/2))/ln 2, must be at least 1.8; with the
 * state at the start of the step instead (the first-order coupling) it is 1.
 */
import { describe, expect, it } from 'vitest';
import { Chamber, FixedReservoir } from '../../src/core/network/volumes.js';
import { OrificeConnector } from '../../src/core/network/connectors/orifice.js';
import { CP, CV, R_AIR } from '../../src/core/gas.js';
import { reservoirFlow } from '../../src/core/flow.js';
import { odexSolver } from '../support/odex.js';

const V = 2e-3;
const AREA = 50e-6;
const P0 = 150e3;
const T0 = 293.15;
const PR = 101325;
const TEND = 0.05;

/** chamber pressure after TEND with N steps of the network's volume and orifice */
function stepped(n: number): number {
  const ch = new Chamber('box', V, P0, T0);
  const res = new FixedReservoir('outside', PR, T0, 0);
  const orifice = new OrificeConnector('hole', ch, res, { kind: 'fixed', area: AREA });
  const dt = TEND / n;
  const ctx = { dt, thetaMid: 0, theta1: 0, rpm: 6000 };
  for (let k = 0; k < n; k++) {
    // the order of Network.step: volumes predict, connectors solve, volumes advance
    ch.predict(ctx);
    res.predict();
    orifice.solve(ctx);
    ch.advance(ctx);
    res.advance();
  }
  return ch.pressure;
}

function reference(): number {
  const solver = odexSolver(2);
  solver.absoluteTolerance = 1e-14;
  solver.relativeTolerance = 1e-12;
  solver.maxSteps = 100000;
  const m0 = (P0 * V) / (R_AIR * T0);
  const r = solver.solve(
    (_t, [m, U]) => {
      const T = U! / (m! * CV);
      const p = (m! * R_AIR * T) / V;
      const mdot = reservoirFlow(AREA, p, T, PR, T0);
      return [-mdot, -mdot * CP * T];
    },
    0,
    [m0, m0 * CV * T0],
    TEND,
  );
  const [m, U] = r.y as [number, number];
  return (m * R_AIR * (U / (m * CV))) / V;
}

describe('a volume emptying through an orifice, against odex', () => {
  const ref = reference();
  const steps = [25, 50, 100, 200];
  const errors = steps.map((n) => Math.abs(stepped(n) - ref) / ref);

  it('the reference empties it by about a quarter (the case is not trivial)', () => {
    expect(ref / P0).toBeGreaterThan(0.6);
    expect(ref / P0).toBeLessThan(0.9);
  });
  it('converges to it: within 1e-4 at 200 steps', () => {
    expect(errors[errors.length - 1]).toBeLessThan(1e-4);
  });
  it('at second order: observed order ≥ 1.8 between successive halvings of the step', () => {
    for (let k = 1; k < errors.length; k++) {
      const order = Math.log(errors[k - 1]! / errors[k]!) / Math.LN2;
      expect(order, `errors ${errors.map((e) => e.toExponential(2)).join(', ')}`).toBeGreaterThanOrEqual(1.8);
    }
  });
});

/**
 * Near Δp = 0 the orifice flow goes as √Δp: its response to a pressure
 * difference has no bound, and an explicit flow overshoots and rings about
 * the equilibrium (an open exhaust valve near BDC). The flow solved
 * implicitly at mid-step settles monotonically: a small box with a large hole
 * at a step far longer than its time constant.
 */
describe('a volume settling to its surroundings through a large hole', () => {
  it('undershoots the outside pressure by less than 3 % of the first difference and settles within 1 Pa', () => {
    const ch = new Chamber('box', 0.5e-3, 103e3, T0);
    const res = new FixedReservoir('outside', PR, T0, 0);
    const orifice = new OrificeConnector('hole', ch, res, { kind: 'fixed', area: 300e-6 });
    const ctx = { dt: 2e-4, thetaMid: 0, theta1: 0, rpm: 6000 };
    const seen: number[] = [];
    for (let k = 0; k < 200; k++) {
      ch.predict(ctx);
      orifice.solve(ctx);
      ch.advance(ctx);
      seen.push(ch.pressure);
    }
    const under = (PR - Math.min(...seen)) / (103e3 - PR);
    expect(under, 'undershoot below the outside pressure, as a fraction of the first difference').toBeLessThan(0.03);
    expect(Math.abs(seen[seen.length - 1]! - PR)).toBeLessThan(1);
  });
});
