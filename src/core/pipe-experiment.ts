/**
 * The bare pipe experiment: a straight pipe, each end closed, open to a
 * reservoir at the initial state of its side, or opening into a closed 0-D
 * volume (a Helmholtz resonator's cavity), a two-state initial split at
 * x = split·L, advanced at the CFL step and sampled at the requested times
 * (each step is shortened to land on a sample time).
 *
 * It is a network of one pipe (core/network), stepped by the same stepper as
 * the engine. Unlike the engine's pipes, the lab's pipe has no acoustic end
 * corrections: it is exactly its length, so a shock tube compares with the
 * exact solution and a volume end rings at the lumped Helmholtz frequency
 * of the bare pipe, f = (a/2π)·√(S/(V·L)), less a little for the pipe's own
 * volume.
 */
import { characteristicsRangeIssue } from './pipe/moc.js';
import { SimulationError } from './errors.js';
import { Network } from './network/network.js';
import type { ConnectorSpec, StepContext, VolumeSpec } from './network/types.js';
import type { PipeEndModel, PipeExperimentModel, PipeExperimentResult, PipeSnapshot, VolumeTrace } from './pipe-experiment-model.js';

/** samples kept of each volume's pressure over the run */
const VOLUME_SAMPLES = 400;

export function runPipeExperiment(model: PipeExperimentModel): PipeExperimentResult {
  const { pipe, ends, initial, numerics } = model;
  const beyond = numerics.scheme === 'characteristics' ? characteristicsRangeIssue(initial.left, initial.right) : undefined;
  if (beyond) throw new SimulationError('invalid', `numerics.scheme: ${beyond}`);

  const volumes: VolumeSpec[] = [];
  const connectors: ConnectorSpec[] = [];
  const join = (side: 'left' | 'right', end: PipeEndModel) => {
    const state = side === 'left' ? initial.left : initial.right;
    const ref = { pipe: 'pipe', side };
    if (end === 'closed') connectors.push({ kind: 'closed', name: `${side} end`, end: ref });
    else if (end === 'open') {
      volumes.push({ kind: 'reservoir', name: `${side} reservoir`, pressure: state.pressure, temperature: state.temperature, burned: 0 });
      connectors.push({ kind: 'open', name: `${side} end`, end: ref, volume: `${side} reservoir`, entryLoss: 0 });
    } else {
      volumes.push({ kind: 'chamber', name: `${side} volume`, volume: end.volume, pressure: end.pressure, temperature: end.temperature });
      connectors.push({ kind: 'open', name: `${side} end`, end: ref, volume: `${side} volume`, entryLoss: 0 });
    }
  };
  join('left', ends.left);
  join('right', ends.right);
  const net = new Network({
    pipes: [
      {
        name: 'pipe',
        sections: [{ length: pipe.length, diameterStart: pipe.diameter, diameterEnd: pipe.diameter }],
        wall: { friction: pipe.wallFriction ? pipe.friction : 0, heatTransfer: pipe.wallHeatTransfer, wallTemperature: pipe.wallTemperature },
        extend: { left: 0, right: 0 },
        nativeBurned: 0,
        initial: { pressure: initial.left.pressure, temperature: initial.left.temperature },
      },
    ],
    volumes,
    connectors,
    numerics: { meshSize: pipe.meshSize, scheme: numerics.scheme },
  });
  const scheme = net.pipe('pipe').scheme;
  const n = scheme.mesh.n;
  scheme.setSplit(initial.split * pipe.length, initial.left, initial.right);

  const volumeEnds = (['left', 'right'] as const).filter((side) => typeof ends[side] === 'object');
  const traces: VolumeTrace[] = volumeEnds.map((side) => ({ side, time: [], pressure: [] }));
  const ofSide = volumeEnds.map((side) => net.volume(`${side} volume`));
  const times = [...model.times].sort((a, b) => a - b);
  const tEnd = times[times.length - 1] ?? 0;
  const every = tEnd / VOLUME_SAMPLES;
  let nextSample = 0;
  const sampleVolumes = (t: number) => {
    if (traces.length === 0 || t < nextSample - 1e-15) return;
    traces.forEach((tr, k) => {
      tr.time.push(t);
      tr.pressure.push(ofSide[k]!.pressure);
    });
    nextSample += every;
  };

  const snapshots: PipeSnapshot[] = [];
  const mass: number[] = [];
  const p = new Float64Array(n);
  const u = new Float64Array(n);
  const T = new Float64Array(n);
  const ctx: StepContext = { dt: 0, thetaMid: 0, theta1: 0, rpm: 0 };
  let t = 0;
  let steps = 0;
  sampleVolumes(0);
  for (const target of times) {
    while (t < target - 1e-15) {
      let dt = net.maxStableDt(numerics.courant);
      if (!(dt > 0) || !Number.isFinite(dt)) throw new SimulationError('diverged', `the pipe solver diverged at t = ${t} s (CFL step not finite)`);
      if (t + dt > target) dt = target - t;
      ctx.dt = dt;
      net.step(ctx);
      t += dt;
      steps++;
      sampleVolumes(t);
      if ((steps & 63) === 0 && !net.healthy()) throw new SimulationError('diverged', `the pipe solver diverged at t = ${t} s`);
    }
    scheme.sample(p, u, T);
    snapshots.push({ time: target, pressure: Array.from(p), velocity: Array.from(u), temperature: Array.from(T) });
    mass.push(net.mass());
  }
  return { x: Array.from(scheme.mesh.x), snapshots, mass, volumes: traces, stats: { nodes: n, steps, scheme: scheme.name } };
}
