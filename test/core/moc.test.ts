import { describe, expect, it } from 'vitest';
import { runPipeExperiment } from '../../src/core/pipe-experiment.js';
import type { PipeExperimentModel } from '../../src/core/pipe-experiment-model.js';
import type { SchemeName } from '../../src/core/model.js';
import { buildMesh } from '../../src/core/pipe/mesh.js';
import { createCharacteristicsScheme } from '../../src/core/pipe/moc.js';
import { createPipeScheme } from '../../src/core/pipe/factory.js';
import { closedEnd } from '../../src/core/boundary/closed.js';
import { OpenEnd } from '../../src/core/boundary/open.js';
import { Chamber } from '../../src/core/network/volumes.js';
import { withEndCorrection } from '../../src/core/engine.js';
import { GAMMA, R_AIR, soundSpeed } from '../../src/core/gas.js';
import { sampleRiemann, solveRiemann } from '../support/exact-riemann.js';
import { drive, ringingFrequency } from '../support/pipe-driver.js';

/** Riemann problem in SI: pressures in units of 1e5 Pa, densities in kg/m³ */
function riemannCase(pl: number, rl: number, pr: number, rr: number, tToro: number, scheme: SchemeName, meshSize = 0.0025): { model: PipeExperimentModel; t: number } {
  const U = Math.sqrt(1e5); // velocity unit √(p_unit/ρ_unit) [m/s]
  const t = tToro / U;
  return {
    t,
    model: {
      name: 'riemann',
      pipe: { length: 1, diameter: 0.05, meshSize, wallFriction: false, friction: 0, wallHeatTransfer: false, wallTemperature: 300 },
      ends: { left: 'closed', right: 'closed' },
      initial: {
        split: 0.5,
        left: { pressure: pl * 1e5, temperature: (pl * 1e5) / (rl * R_AIR), velocity: 0 },
        right: { pressure: pr * 1e5, temperature: (pr * 1e5) / (rr * R_AIR), velocity: 0 },
      },
      times: [t],
      numerics: { courant: 0.9, scheme },
    },
  };
}

/** median pressure and velocity over the middle of the star region (between the left wave's tail and the right wave) */
function starValues(x: number[], p: number[], u: number[], from: number, to: number): { p: number; u: number } {
  const ps: number[] = [];
  const us: number[] = [];
  for (let i = 0; i < x.length; i++) if (x[i]! > from && x[i]! < to) (ps.push(p[i]!), us.push(u[i]!));
  ps.sort((a, b) => a - b);
  us.sort((a, b) => a - b);
  return { p: ps[ps.length >> 1]!, u: us[us.length >> 1]! };
}

describe('Sod shock tube through the characteristics pipe solver (Sod 1978; Toro 2009 Table 4.3)', () => {
  const { model, t } = riemannCase(1, 1, 0.1, 0.125, 0.2, 'characteristics');
  const res = runPipeExperiment(model);
  const s = res.snapshots[0]!;
  const U = Math.sqrt(1e5);
  const exact = solveRiemann({ rho: 1, u: 0, p: 1 }, { rho: 0.125, u: 0, p: 0.1 });
  // star region in Toro units at t = 0.2: from the rarefaction tail to the shock
  const tail = 0.5 + 0.2 * (exact.uStar - Math.sqrt((GAMMA * exact.pStar) / exact.rhoStarL));
  const shock = 0.5 + 0.2 * 1.75216;
  const star = starValues(res.x, s.pressure.map((v) => v / 1e5), s.velocity.map((v) => v / U), tail + 0.03, shock - 0.03);

  it('star pressure within 2 % of 0.30313', () => {
    expect(Math.abs(star.p / 0.30313 - 1)).toBeLessThan(0.02);
  });
  it('star velocity within 2 % of 0.92745', () => {
    expect(Math.abs(star.u / 0.92745 - 1)).toBeLessThan(0.02);
  });
  it('mean pressure error over the pipe against the exact Riemann solution below 1.5 % of p_L', () => {
    let err = 0;
    for (let i = 0; i < res.x.length; i++) {
      const e = sampleRiemann(exact, (res.x[i]! - 0.5) / 0.2);
      err += Math.abs(s.pressure[i]! / 1e5 - e.p);
    }
    expect(err / res.x.length).toBeLessThan(0.015);
    expect(t).toBeGreaterThan(0);
  });
});

describe("Toro's tests 3 and 4 through the pipe solver (Toro 2009 Table 4.3)", () => {
  // Strong shocks (pressure ratios 1e5 and 1e4): the characteristics scheme
  // meets them with the jump conditions at the faces (moc.ts), so both
  // schemes must land on the exact star state. These ratios lie beyond the
  // range the pipe lab accepts for the characteristics scheme (1000, set by
  // hot thin gas failing at 1e4; moc.ts header), so the scheme is driven
  // directly here.
  it.each([
    ['test 3', 'conservative', 1000, 1, 0.01, 1, 0.012, 460.894, 19.5975],
    ['test 4', 'conservative', 0.01, 1, 100, 1, 0.035, 46.095, -6.19633],
    ['test 3', 'characteristics', 1000, 1, 0.01, 1, 0.012, 460.894, 19.5975],
    ['test 4', 'characteristics', 0.01, 1, 100, 1, 0.035, 46.095, -6.19633],
  ] as const)('%s, %s scheme: star pressure and velocity within 2 per cent', (_n, scheme, pl, rl, pr, rr, tt, pStar, uStar) => {
    const { model, t } = riemannCase(pl, rl, pr, rr, tt, scheme, 0.002);
    const mesh = buildMesh([{ length: 1, diameterStart: 0.05, diameterEnd: 0.05 }], 0.002);
    const s = createPipeScheme(scheme, mesh, { friction: 0, heatTransfer: false, wallTemperature: 300 });
    s.setSplit(0.5, model.initial.left, model.initial.right);
    drive(s, closedEnd, closedEnd, t);
    const p = new Float64Array(mesh.n);
    const u = new Float64Array(mesh.n);
    const T = new Float64Array(mesh.n);
    s.sample(p, u, T);
    const U = Math.sqrt(1e5);
    const exact = solveRiemann({ rho: rl, u: 0, p: pl }, { rho: rr, u: 0, p: pr });
    const c = 0.5 + tt * exact.uStar; // contact position
    const star = starValues(Array.from(mesh.x), Array.from(p, (v) => v / 1e5), Array.from(u, (v) => v / U), c - 0.02, c + 0.02);
    expect(Math.abs(star.p / pStar - 1)).toBeLessThan(0.02);
    expect(Math.abs(star.u / uStar - 1)).toBeLessThan(0.02);
  });
});

describe('weak pulse reflections (acoustics, common knowledge)', () => {
  const p0 = 1e5;
  const T0 = 293.15;
  const a0 = soundSpeed(T0);
  const rho0 = p0 / (R_AIR * T0);
  const eps = 0.005;
  function pulsePipe(scheme: SchemeName) {
    const mesh = buildMesh([{ length: 2, diameterStart: 0.04, diameterEnd: 0.04 }], 0.002);
    const s = createPipeScheme(scheme, mesh, { friction: 0, heatTransfer: false, wallTemperature: T0 });
    const p = new Float64Array(mesh.n);
    const u = new Float64Array(mesh.n);
    const T = new Float64Array(mesh.n);
    for (let i = 0; i < mesh.n; i++) {
      const dp = eps * p0 * Math.exp(-(((mesh.x[i]! - 0.6) / 0.08) ** 2));
      p[i] = p0 + dp;
      u[i] = dp / (rho0 * a0); // right-running simple wave
      T[i] = T0 * Math.pow(p[i]! / p0, (GAMMA - 1) / GAMMA);
    }
    s.setState(p, u, T);
    return { s, mesh };
  }
  it.each(['characteristics', 'conservative'] as const)('%s: amplitude doubles at a closed end', (scheme) => {
    const { s } = pulsePipe(scheme);
    let peak = 0;
    drive(s, closedEnd, closedEnd, 2.0 / a0, (_t, _dt, _l, r) => {
      peak = Math.max(peak, r.pressure - p0);
    });
    expect(peak / (eps * p0)).toBeGreaterThan(1.9);
    expect(peak / (eps * p0)).toBeLessThan(2.1);
  });
  it.each(['characteristics', 'conservative'] as const)('%s: returns inverted from an open end', (scheme) => {
    const { s, mesh } = pulsePipe(scheme);
    const open = new OpenEnd({ pressure: p0, temperature: T0 }, 0);
    // out 1.4 m to the open end and 0.6 m back: the pulse is centred near x = 1.4 m
    drive(s, closedEnd, open, 2.0 / a0);
    const p = new Float64Array(mesh.n);
    const u = new Float64Array(mesh.n);
    const T = new Float64Array(mesh.n);
    s.sample(p, u, T);
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < mesh.n; i++) {
      min = Math.min(min, p[i]! - p0);
      max = Math.max(max, p[i]! - p0);
    }
    expect(min / (eps * p0)).toBeLessThan(-0.9);
    expect(max / (eps * p0)).toBeLessThan(0.1);
  });
});

describe('ringing of a runner (Kinsler et al., Fundamentals of Acoustics; Levine & Schwinger 1948)', () => {
  it.each(['characteristics', 'conservative'] as const)('%s: closed–open runner rings at a/(4(L + 0.6133r)) within 3 per cent', (scheme) => {
    const L = 0.3;
    const r = 0.02;
    const T0 = 293.15;
    const a = soundSpeed(T0);
    const delta = 0.6133 * r;
    // the runner as the engine models it: extended by the open-end correction
    const mesh = buildMesh(withEndCorrection([{ length: L, diameterStart: 2 * r, diameterEnd: 2 * r }], delta), 0.004);
    const s = createPipeScheme(scheme, mesh, { friction: 0, heatTransfer: false, wallTemperature: T0 });
    s.fill(1.02e5, 0, T0);
    const t: number[] = [];
    const y: number[] = [];
    drive(s, new OpenEnd({ pressure: 1e5, temperature: T0 }, 0), closedEnd, 0.05, (tt, _dt, _l, rr) => {
      t.push(tt);
      y.push(rr.pressure);
    });
    const f = ringingFrequency(t, y);
    // REFERENCES.md example (Kinsler et al.; Levine & Schwinger 1948): 20 °C, L 0.30 m, r 20 mm → 274.79 Hz
    expect(Math.abs(f / 274.79 - 1)).toBeLessThan(0.03);
  });

  it('plenum and neck ring at the Helmholtz frequency (a/2π)·√(S/(V·L′)), L′ = L + 1.7r, within 10 %', () => {
    // Kinsler et al. (section from memory): V = 1 L, neck 50 mm long, r = 10 mm → 118.29 Hz
    const T0 = 293.15;
    const a = soundSpeed(T0);
    const r = 0.01;
    const V = 1e-3;
    const Ln = 0.05;
    const lPrime = Ln + 1.7 * r;
    const expected = 118.29; // Hz: the REFERENCES.md example, a 343.23 m/s
    // the neck as a 1-D pipe carrying both end corrections (0.85r each side)
    const mesh = buildMesh([{ length: lPrime, diameterStart: 2 * r, diameterEnd: 2 * r }], 0.002);
    const s = createCharacteristicsScheme(mesh, { friction: 0, heatTransfer: false, wallTemperature: T0 });
    s.fill(1e5, 0, T0);
    const amb = { pressure: 1e5, temperature: T0 };
    const plenum = new Chamber('plenum', V, 1.02e5, T0);
    const t: number[] = [];
    const y: number[] = [];
    drive(s, new OpenEnd(plenum, 0), new OpenEnd(amb, 0), 0.06, (tt, dt, l) => {
      plenum.addFlow(l.massFlow, l.enthalpyFlow, 0);
      plenum.advance({ dt, thetaMid: 0, theta1: 0, rpm: 0 });
      t.push(tt);
      y.push(plenum.pressure);
    });
    const f = ringingFrequency(t, y, 0);
    expect(Math.abs(f / expected - 1)).toBeLessThan(0.1);
  });
});
