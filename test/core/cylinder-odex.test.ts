/**
 * The cylinder-filling ODE for a prescribed upstream state (the intake
 * valve opening straight onto a reservoir at ambient conditions, exhaust
 * shut), integrated two ways: by the project's own cylinder step (the one
 * the crank-angle stepper uses, at a step of the size the runner's CFL step
 * gives) and by `odex` (Hairer's ODEX, extrapolation method, tight
 * tolerances) on the same equations written out here:
 *   dm/dθ = ṁ/ω,   d(m·cv·T)/dθ = H/ω − p·dV/dθ,   ω = 6N [deg/s]
 */
import { describe, expect, it } from 'vitest';
import { Cylinder } from '../../src/core/cylinder.js';
import { cylinderVolume, cylinderVolumeRate } from '../../src/core/kinematics.js';
import { effectiveArea, valveLift } from '../../src/core/valve.js';
import { reservoirFlow } from '../../src/core/flow.js';
import { CP, CV, R_AIR } from '../../src/core/gas.js';
import { testEngine } from '../support/engine-fixture.js';
import { odexSolver } from '../support/odex.js';

describe('cylinder filling ODE: project integrator against odex', () => {
  const model = testEngine({ rpm: 4000 });
  const g = model.engine;
  const amb = { pressure: 101325, temperature: 293.15 };
  const omega = 6 * model.rpm;
  const theta0 = 0;
  const theta1 = model.intake.closeAngle; // IVC
  const p0 = 105000;
  const T0 = 900;

  function flows(theta: number, p: number, T: number): { m: number; h: number } {
    const area = effectiveArea(model.intake, valveLift(model.intake, theta));
    const m = reservoirFlow(area, amb.pressure, amb.temperature, p, T);
    return { m, h: m >= 0 ? m * CP * amb.temperature : m * CP * T };
  }

  function project(stepDeg: number): { m: number; p: number } {
    const cyl = new Cylinder(g, undefined);
    cyl.reset(theta0, p0, T0);
    let th = theta0;
    while (th < theta1 - 1e-12) {
      const d = Math.min(stepDeg, theta1 - th);
      const f = flows(th + d / 2, cyl.pressure, cyl.temperature);
      cyl.advance(d / omega, th + d, f.m, f.h, 0, model.rpm);
      th += d;
    }
    return { m: cyl.mass, p: cyl.pressure };
  }

  function reference(): { m: number; p: number } {
    const s = odexSolver(2);
    s.absoluteTolerance = 1e-12;
    s.relativeTolerance = 1e-10;
    s.maxSteps = 100000;
    const V0 = cylinderVolume(theta0, g);
    const m0 = (p0 * V0) / (R_AIR * T0);
    // y = [m, T]
    const r = s.solve(
      (th, y) => {
        const m = y[0]!;
        const T = y[1]!;
        const V = cylinderVolume(th, g);
        const p = (m * R_AIR * T) / V;
        const f = flows(th, p, T);
        const dm = f.m / omega;
        const dU = f.h / omega - p * cylinderVolumeRate(th, g);
        return [dm, (dU - CV * T * dm) / (m * CV)];
      },
      theta0,
      [m0, T0],
      theta1,
    );
    expect(r.outcome).toBe(0);
    const m = r.y[0]!;
    return { m, p: (m * R_AIR * r.y[1]!) / cylinderVolume(theta1, g) };
  }

  const ref = reference();
  it.each([1, 0.5, 0.25])('trapped mass at IVC within 0.5 per cent at a %f° step', (step) => {
    const mine = project(step);
    expect(Math.abs(mine.m / ref.m - 1)).toBeLessThan(0.005);
    expect(Math.abs(mine.p / ref.p - 1)).toBeLessThan(0.005);
  });
  it('the reference is a real filling (mass grows several-fold from the residual)', () => {
    const V0 = cylinderVolume(theta0, g);
    expect(ref.m / ((p0 * V0) / (R_AIR * T0))).toBeGreaterThan(5);
  });
});
