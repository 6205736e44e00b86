/**
 * The bare pipe experiment: a straight pipe, each end closed or open to a
 * reservoir at the initial state of its side, a two-state initial split at
 * x = split·L, advanced at the CFL step and sampled at the requested times
 * (each step is shortened to land on a sample time).
 */
import { buildMesh } from './pipe/mesh.js';
import { createPipeScheme } from './pipe/factory.js';
import { characteristicsRangeIssue } from './pipe/moc.js';
import { closedEnd } from './boundary/closed.js';
import { OpenEnd } from './boundary/open.js';
import type { Boundary } from './boundary/types.js';
import { PipeBetween } from './pipe/between.js';
import { SimulationError } from './engine.js';
import type { PipeExperimentModel, PipeExperimentResult, PipeSnapshot } from './pipe-experiment-model.js';

export function runPipeExperiment(model: PipeExperimentModel): PipeExperimentResult {
  const { pipe, ends, initial, numerics } = model;
  const mesh = buildMesh([{ length: pipe.length, diameterStart: pipe.diameter, diameterEnd: pipe.diameter }], pipe.meshSize);
  const scheme = createPipeScheme(numerics.scheme, mesh, {
    friction: pipe.wallFriction ? pipe.friction : 0,
    heatTransfer: pipe.wallHeatTransfer,
    wallTemperature: pipe.wallTemperature,
  });
  const beyond = numerics.scheme === 'characteristics' ? characteristicsRangeIssue(initial.left, initial.right) : undefined;
  if (beyond) throw new SimulationError('invalid', `numerics.scheme: ${beyond}`);
  const n = mesh.n;
  scheme.setSplit(initial.split * pipe.length, initial.left, initial.right);
  const left: Boundary = ends.left === 'closed' ? closedEnd : new OpenEnd({ pressure: initial.left.pressure, temperature: initial.left.temperature }, 0);
  const right: Boundary = ends.right === 'closed' ? closedEnd : new OpenEnd({ pressure: initial.right.pressure, temperature: initial.right.temperature }, 0);
  const between = new PipeBetween(scheme, left, right);
  const snapshots: PipeSnapshot[] = [];
  const mass: number[] = [];
  const p = new Float64Array(n);
  const u = new Float64Array(n);
  const T = new Float64Array(n);
  let t = 0;
  let steps = 0;
  const times = [...model.times].sort((a, b) => a - b);
  for (const target of times) {
    while (t < target - 1e-15) {
      let dt = scheme.maxStableDt(numerics.courant);
      if (!(dt > 0) || !Number.isFinite(dt)) throw new SimulationError('diverged', `the pipe solver diverged at t = ${t} s (CFL step not finite)`);
      if (t + dt > target) dt = target - t;
      between.step(dt);
      t += dt;
      steps++;
      if ((steps & 63) === 0 && !scheme.healthy()) throw new SimulationError('diverged', `the pipe solver diverged at t = ${t} s`);
    }
    scheme.sample(p, u, T);
    snapshots.push({ time: target, pressure: Array.from(p), velocity: Array.from(u), temperature: Array.from(T) });
    mass.push(scheme.mass());
  }
  return { x: Array.from(mesh.x), snapshots, mass, stats: { nodes: n, steps, scheme: scheme.name } };
}
