/**
 * The solver stops on divergence with a SimulationError that names the case
 * values behind it, promptly (each test has its own timeout: a hang fails),
 * and the command line turns that into exit 1 with one clear line; a run
 * that only fails to become periodic is still exit 0 with a warning
 * (DESIGN §3, issue 5).
 */
import { describe, expect, it } from 'vitest';
import { simulatePoint, SimulationError } from '../../src/core/engine.js';
import type { EngineModel, SchemeName } from '../../src/core/model.js';
import { testEngine } from '../support/engine-fixture.js';
import { tractwave as cli } from './cli.js';

const SCHEMES: SchemeName[] = ['characteristics', 'conservative'];
const DEMO = 'cases/demo.yaml';

function model(scheme: SchemeName, change: (m: EngineModel) => void): EngineModel {
  const m = testEngine({ scheme, meshSize: 0.02, maxCycles: 6 });
  change(m);
  return m;
}

/** run and return the SimulationError it must throw */
function failure(m: EngineModel): SimulationError {
  try {
    simulatePoint(m);
  } catch (e) {
    if (e instanceof SimulationError) return e;
    throw new Error(`expected a SimulationError, got ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
  }
  throw new Error('expected a SimulationError, but the run finished');
}

describe.each(SCHEMES)('divergence is caught and explained (%s)', (scheme) => {
  // The CFL condition (Courant–Friedrichs–Lewy): an explicit scheme is unstable, or for the
  // characteristics method reaches outside its domain of dependence, when C = (|u| + a)·dt/dx > 1.
  // simulatePoint refuses numerics.courant > 1 up front (the characteristics scheme would
  // otherwise clamp the feet of the characteristics into the neighbouring cell and run on).
  it('Courant number above 1 is refused or detected, naming the Courant number', { timeout: 10_000 }, () => {
    const e = failure(model(scheme, (m) => (m.numerics.courant = 1.5)));
    expect(e.message).toContain('courant');
    expect(e.message).toContain('1.5');
  });

  it('Courant number 3: a SimulationError, not garbage', { timeout: 10_000 }, () => {
    const e = failure(model(scheme, (m) => (m.numerics.courant = 3)));
    expect(e.message).toContain('courant');
    expect(e.message).toMatch(/\b3\b/);
  });

  it.each([
    ['absurd wall friction (Fanning factor 50)', (m: EngineModel) => (m.runner.friction = 50)],
    // 10⁶ K no longer diverges since the exhaust valve's flow is solved implicitly (the cylinder
    // holds a trace of very hot gas and the run finishes; the case's plausibility guard stops such a
    // case before it runs): 10⁸ K still drives the pressure negative
    ['absurd exhaust gas temperature (10⁸ K)', (m: EngineModel) => (m.exhaust.gasTemperature = 1e8)],
    ['a NaN bore', (m: EngineModel) => (m.engine.bore = Number.NaN)],
  ])('%s: stops with the case values in the message', { timeout: 10_000 }, (_label, change) => {
    const e = failure(model(scheme, change));
    expect(e.name).toBe('SimulationError');
    // names the operating point and the numerics that produced it
    expect(e.message).toContain('6500 rpm');
    expect(e.message).toContain('mesh 20.0 mm');
    expect(e.message).toContain(`scheme ${scheme}`);
    expect(e.message).toMatch(/crank \d+°/);
  });
});

describe('the command line on a diverging or unconverged run', () => {
  it('a case that passes validation but diverges: exit 1, one line, no stack', { timeout: 20_000 }, async () => {
    const r = await cli(['run', DEMO, '--set', 'runner.friction=50', '--set', 'numerics.meshSize=20mm']);
    expect(r.code).toBe(1);
    const lines = r.err.split('\n').filter((l) => l !== '');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^error: the solver diverged \(/);
    expect(lines[0]).toContain('6500 rpm');
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(r.out).toBe('');
  });

  it('a sweep with diverging points on two worker threads (9 speeds, three chunks): exit 1 with the same clear message', { timeout: 30_000 }, async () => {
    const r = await cli(['sweep', DEMO, '--rpm', '5000:7000:250', '--jobs', '2', '--set', 'runner.friction=50', '--set', 'numerics.meshSize=20mm']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/error: the solver diverged \(.*rpm/);
    expect(r.err).not.toMatch(/\n\s+at /);
  });

  it('not periodic within the cycle cap: exit 0, converged false, a warning naming the cap', { timeout: 20_000 }, async () => {
    const r = await cli(['run', DEMO, '--json', '--set', 'numerics.maxCycles=2', '--set', 'numerics.tolerance=1e-12', '--set', 'numerics.meshSize=20mm']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { converged: boolean; cycles: number };
    expect(j.converged).toBe(false);
    expect(j.cycles).toBe(2);
    expect(r.err).toMatch(/warning: .*converge/);
    expect(r.err).toContain('maxCycles');
  });
});
