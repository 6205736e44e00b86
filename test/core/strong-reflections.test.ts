/**
 * A pressure-ratio-10 split in a closed–closed pipe, followed through the
 * first wave interaction and then through several wall reflections (to 3 ms,
 * about five shock transits), with both runner schemes at a 2.5 mm mesh.
 *
 * References:
 * - before any wave reaches a wall: the exact Riemann solution (Toro 2009,
 *   ch. 4, test/support/exact-riemann.ts; Sod 1978 / Toro Table 4.3 for the
 *   star values);
 * - the state behind the shock reflected from the closed end: p 0.780386,
 *   ρ 0.509395 in Sod's units (normal- and reflected-shock relations,
 *   Anderson, Modern Compressible Flow; REFERENCES.md);
 * - after the waves have crossed and reflected: the conservative scheme at
 *   a 1 mm mesh (measured: it differs from the same scheme at 0.5 mm by
 * 0.02–0.05 % of the initial pressure difference over these times, so it
 *   is converged far below the 2 % asked here).
 * Error measure: mean over the mesh points of |p − p_ref|, divided by the
 * initial pressure difference p_L − p_R.
 *
 * Before the characteristics scheme was put in conservation form it gave
 * 6 %, 15 % and 37 % at 1.6, 2 and 3 ms (the same at 10 and 2.5 mm), with
 * 150 K beside 600 K at the wall; the plain mesh method (no conservation at
 * all) is checked below to still miss, so these checks can fail.
 */
import { describe, expect, it } from 'vitest';
import { buildMesh, type Mesh } from '../../src/core/pipe/mesh.js';
import { createPipeScheme } from '../../src/core/pipe/factory.js';
import { CharacteristicsScheme, characteristicsRangeIssue, createCharacteristicsScheme } from '../../src/core/pipe/moc.js';
import { runPipeExperiment } from '../../src/core/pipe-experiment.js';
import { SimulationError } from '../../src/core/engine.js';
import type { GasState, PipeScheme } from '../../src/core/pipe/scheme.js';
import { closedEnd } from '../../src/core/boundary/closed.js';
import { R_AIR } from '../../src/core/gas.js';
import { drive } from '../support/pipe-driver.js';
import { sampleRiemann, solveRiemann } from '../support/exact-riemann.js';

const NO_WALL = { friction: 0, heatTransfer: false, wallTemperature: 300 };
const LENGTH = 1;
const SPLIT = 0.5;
const TIMES = [0.0006, 0.0012, 0.0016, 0.002, 0.0025, 0.003];

interface Snap {
  x: Float64Array;
  p: Float64Array;
  T: Float64Array;
}

function mesh(dx: number): Mesh {
  return buildMesh([{ length: LENGTH, diameterStart: 0.05, diameterEnd: 0.05 }], dx);
}

/** run a scheme from the split to each time of TIMES and sample it there */
function run(s: PipeScheme, left: GasState, right: GasState): Snap[] {
  s.setSplit(SPLIT * LENGTH, left, right);
  const out: Snap[] = [];
  let t = 0;
  for (const target of TIMES) {
    drive(s, closedEnd, closedEnd, target - t);
    t = target;
    const n = s.mesh.n;
    const p = new Float64Array(n);
    const u = new Float64Array(n);
    const T = new Float64Array(n);
    s.sample(p, u, T);
    out.push({ x: s.mesh.x, p, T });
  }
  return out;
}

/** linear interpolation of (x, y) at xq */
function at(x: Float64Array, y: Float64Array, xq: number): number {
  const dx = x[1]! - x[0]!;
  const k = Math.min(x.length - 2, Math.max(0, Math.floor(xq / dx)));
  const w = (xq - x[k]!) / dx;
  return y[k]! + w * (y[k + 1]! - y[k]!);
}

/** mean |p − p_ref| over the points of `a`, over the initial pressure difference */
function meanError(a: Snap, ref: (x: number) => number, dp: number): number {
  let e = 0;
  for (let i = 0; i < a.x.length; i++) e += Math.abs(a.p[i]! - ref(a.x[i]!));
  return e / a.x.length / dp;
}

const schemes = ['characteristics', 'conservative'] as const;

describe.each([
  // Sod's states in SI (pressure unit 1e5 Pa, density unit 1 kg/m³): the bundled cases/pipe-sod.yaml
  ['Sod (1 bar, 1 kg/m³ | 0.1 bar, 0.125 kg/m³)', { pressure: 1e5, velocity: 0, temperature: 1e5 / R_AIR }, { pressure: 1e4, velocity: 0, temperature: 1e4 / (0.125 * R_AIR) }],
  ['one temperature (1 bar | 0.1 bar, both 300 K)', { pressure: 1e5, velocity: 0, temperature: 300 }, { pressure: 1e4, velocity: 0, temperature: 300 }],
] as const)('pressure ratio 10 in a closed–closed pipe: %s', (_name, left, right) => {
  const dp = left.pressure - right.pressure;
  const ref = run(createPipeScheme('conservative', mesh(0.001), NO_WALL), left, right);
  const results = Object.fromEntries(schemes.map((s) => [s, run(createPipeScheme(s, mesh(0.0025), NO_WALL), left, right)])) as Record<(typeof schemes)[number], Snap[]>;
  const rhoL = left.pressure / (R_AIR * left.temperature);
  const rhoR = right.pressure / (R_AIR * right.temperature);
  const exact = solveRiemann({ rho: rhoL, u: 0, p: left.pressure }, { rho: rhoR, u: 0, p: right.pressure });

  it.each(schemes)('%s: first interaction (0.6 ms) within 2 % of the exact Riemann solution', (s) => {
    const t = TIMES[0]!;
    const e = meanError(results[s][0]!, (x) => sampleRiemann(exact, (x - SPLIT * LENGTH) / t).p, dp);
    expect(e).toBeLessThan(0.02);
  });

  it.each(schemes)('%s: after the reflections (1.2–3 ms) within 2 % of the converged reference', (s) => {
    for (let j = 1; j < TIMES.length; j++) {
      const r = ref[j]!;
      const e = meanError(results[s][j]!, (x) => at(r.x, r.p, x), dp);
      expect(e, `t = ${TIMES[j]! * 1e3} ms`).toBeLessThan(0.02);
    }
  });

  it('the plain mesh method of characteristics (not conservative) misses by more than 2 % after the reflections', () => {
    const plain = run(createCharacteristicsScheme(mesh(0.0025), NO_WALL, false), left, right);
    const j = TIMES.length - 1;
    const r = ref[j]!;
    expect(meanError(plain[j]!, (x) => at(r.x, r.p, x), dp)).toBeGreaterThan(0.02);
  });
});

describe('the shock reflected from a closed end (Sod; Anderson, reflected-shock relations)', () => {
  // Sod's incident shock reaches x = 1 m at 0.90 ms; the reflected shock runs back at
  // 319 m/s and meets the contact at 1.29 ms. At 1.15 ms the gas between 0.93 m and the
  // wall is the reflected-shock state: p 0.780386 bar, ρ 0.509395 kg/m³ (T 533.7 K).
  // Shock-capturing schemes leave a few points of "wall heating" there that do not shrink
  // with the mesh (Fedkiw, Marquina & Merriman, "An isobaric fix for the overheating
  // problem in multimaterial compressible flows"): measured +1.45 % in T at the last inner
  // point for the characteristics scheme, +0.2 % for the conservative one. Before the
  // characteristics scheme kept energy, the gas beside the wall was 487–601 K (−9 %…+13 %).
  const left = { pressure: 1e5, velocity: 0, temperature: 1e5 / R_AIR };
  const right = { pressure: 1e4, velocity: 0, temperature: 1e4 / (0.125 * R_AIR) };
  const pRef = 0.780386e5;
  const TRef = pRef / (0.509395 * R_AIR);
  it.each(schemes)('%s: pressure within 1 per cent and temperature within 2 per cent at every point of the last 5 cm (2.5 mm mesh)', (name) => {
    const s = createPipeScheme(name, mesh(0.0025), NO_WALL);
    s.setSplit(SPLIT * LENGTH, left, right);
    drive(s, closedEnd, closedEnd, 0.00115);
    const n = s.mesh.n;
    const p = new Float64Array(n);
    const u = new Float64Array(n);
    const T = new Float64Array(n);
    s.sample(p, u, T);
    for (let i = 0; i < n; i++) {
      if (s.mesh.x[i]! < 0.95) continue;
      // every point, the wall included: no hot or cold gas left beside the wall
      expect(Math.abs(p[i]! / pRef - 1), `p at x = ${s.mesh.x[i]}`).toBeLessThan(0.01);
      expect(Math.abs(T[i]! / TRef - 1), `T at x = ${s.mesh.x[i]}`).toBeLessThan(0.02);
    }
  });
});

describe('conservation in a closed pipe (characteristics scheme)', () => {
  it('mass and total energy stay constant to round-off through the reflections', () => {
    const s = new CharacteristicsScheme(mesh(0.0025), NO_WALL);
    s.setSplit(0.5, { pressure: 1e5, velocity: 0, temperature: 300 }, { pressure: 1e4, velocity: 0, temperature: 300 });
    const m0 = s.mass();
    const e0 = s.energy();
    drive(s, closedEnd, closedEnd, 0.003);
    expect(Math.abs(s.mass() / m0 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(s.energy() / e0 - 1)).toBeLessThan(1e-12);
  });
});

describe('the characteristics scheme keeps to the range it is checked for (moc.ts header)', () => {
  const pipe = { length: 1, diameter: 0.05, meshSize: 0.01, wallFriction: false, friction: 0, wallHeatTransfer: false, wallTemperature: 300 };
  const model = (left: GasState, right: GasState, scheme: 'characteristics' | 'conservative') => ({
    name: 'split',
    pipe,
    ends: { left: 'closed', right: 'closed' } as const,
    initial: { split: 0.5, left, right },
    times: [0.001],
    numerics: { courant: 0.9, scheme },
  });
  const still = (p: number, T = 300): GasState => ({ pressure: p, velocity: 0, temperature: T });
  it.each([
    ['pressure ratio 10⁴', still(1e5), still(10), 'pressure ratio of 1000'],
    ['Mach 2.5', { pressure: 1e5, velocity: 2.5 * 347.2, temperature: 300 }, still(1e5), 'Mach 2, the left gas moves at Mach 2.5'],
    ['Mach 1 at ratio 1000', still(1e5), { pressure: 100, velocity: -347.2, temperature: 300 }, 'Mach 0.5 at pressure ratios above 100'],
  ])('refuses %s with a plain message naming numerics.scheme', (_label, left, right, message) => {
    expect(() => runPipeExperiment(model(left, right, 'characteristics'))).toThrow(message);
    expect(() => runPipeExperiment(model(left, right, 'characteristics'))).toThrow(SimulationError);
    // the conservative scheme runs the same split
    expect(runPipeExperiment(model(left, right, 'conservative')).snapshots).toHaveLength(1);
  });
  it('runs a split at the edge of the range (ratio 1000 at rest; ratio 100 with Mach 2 streams)', () => {
    expect(characteristicsRangeIssue(still(1e5), still(100))).toBeUndefined();
    expect(characteristicsRangeIssue({ pressure: 1e5, velocity: 2 * 347.2, temperature: 300 }, { pressure: 1e3, velocity: -2 * 347.2, temperature: 300 })).toBeUndefined();
    const r = runPipeExperiment(model({ pressure: 1e5, velocity: 2 * 347.2, temperature: 300 }, { pressure: 1e3, velocity: -2 * 347.2, temperature: 300 }, 'characteristics'));
    expect(r.snapshots[0]!.pressure.every((p) => p > 0)).toBe(true);
  });
});
