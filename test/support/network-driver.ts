/**
 * Test support for assemblies: small networks built from parts, an acoustic
 * pulse to start them with, and a driver that steps a network with the valves
 * held at one crank angle (time runs, the crank does not).
 */
import { GAMMA, R_AIR } from '../../src/core/gas.js';
import { Network } from '../../src/core/network/network.js';
import type { ConnectorSpec, NetworkSpec, PipeSpec, StepContext, VolumeSpec } from '../../src/core/network/types.js';
import type { SchemeName } from '../../src/core/model.js';
import type { Pipe } from '../../src/core/network/pipe.js';

export const P0 = 1e5;
export const T0 = 293.15;
export const A0 = Math.sqrt(GAMMA * R_AIR * T0);
export const RHO0 = P0 / (R_AIR * T0);

/** a straight pipe spec without friction or heat transfer */
export function straight(name: string, length: number, diameter: number, extend = { left: 0, right: 0 }): PipeSpec {
  return {
    name,
    sections: [{ length, diameterStart: diameter, diameterEnd: diameter }],
    wall: { friction: 0, heatTransfer: false, wallTemperature: T0 },
    extend,
    nativeBurned: 0,
    initial: { pressure: P0, temperature: T0 },
  };
}

export function network(pipes: PipeSpec[], volumes: VolumeSpec[], connectors: ConnectorSpec[], scheme: SchemeName, meshSize: number): Network {
  return new Network({ pipes, volumes, connectors, numerics: { meshSize, scheme } });
}

/** A right-going (sign +1) or left-going (−1) isentropic Gaussian pulse of amplitude dp [Pa] at x0 [m], width σ [m], in a pipe at rest. */
export function setPulse(pipe: Pipe, x0: number, sigma: number, dp: number, sign = 1): void {
  const mesh = pipe.scheme.mesh;
  const n = mesh.n;
  const p = new Float64Array(n);
  const u = new Float64Array(n);
  const T = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = mesh.x[i]! - pipe.spec.extend.left;
    const d = dp * Math.exp(-0.5 * ((x - x0) / sigma) ** 2);
    p[i] = P0 + d;
    T[i] = T0 * Math.pow(p[i]! / P0, (GAMMA - 1) / GAMMA);
    u[i] = (sign * d) / (RHO0 * A0); // simple wave, acoustic order
  }
  pipe.scheme.setState(p, u, T);
}

/** pressure [Pa] at physical position x [m] of a pipe (linear between mesh points) */
export function pressureAt(pipe: Pipe, x: number, buf?: { p: Float64Array; u: Float64Array; T: Float64Array }): number {
  const n = pipe.scheme.mesh.n;
  const b = buf ?? { p: new Float64Array(n), u: new Float64Array(n), T: new Float64Array(n) };
  pipe.scheme.sample(b.p, b.u, b.T);
  const pos = pipe.meshX(x) / pipe.scheme.mesh.dx;
  const i = Math.min(n - 2, Math.floor(pos));
  const w = pos - i;
  return b.p[i]! * (1 - w) + b.p[i + 1]! * w;
}

/** Step a network for tEnd [s] at the CFL step, valves held at crank angle θ; calls onStep after each step. */
export function run(net: Network, tEnd: number, onStep: (t: number) => void = () => {}, theta = 0, courant = 0.9): number {
  const ctx: StepContext = { dt: 0, thetaMid: theta, theta1: theta, rpm: 0 };
  let t = 0;
  let steps = 0;
  while (t < tEnd - 1e-15) {
    let dt = net.maxStableDt(courant);
    if (t + dt > tEnd) dt = tEnd - t;
    ctx.dt = dt;
    net.step(ctx);
    t += dt;
    steps++;
    onStep(t);
  }
  return steps;
}

/** |Σ y_k·e^(−2πi f t_k)·Δt_k| (the spectrum of a non-uniformly sampled signal, rectangle rule) */
export function spectrumAt(t: readonly number[], y: readonly number[], f: number): number {
  let re = 0;
  let im = 0;
  for (let k = 1; k < t.length; k++) {
    const dt = t[k]! - t[k - 1]!;
    const w = 2 * Math.PI * f * t[k]!;
    re += y[k]! * Math.cos(w) * dt;
    im -= y[k]! * Math.sin(w) * dt;
  }
  return Math.hypot(re, im);
}

/** Step a network `steps` times at the CFL step, valves held at crank angle θ. */
export function runSteps(net: Network, steps: number, theta = 0, courant = 0.9): void {
  const ctx: StepContext = { dt: 0, thetaMid: theta, theta1: theta, rpm: 0 };
  for (let k = 0; k < steps; k++) {
    ctx.dt = net.maxStableDt(courant);
    net.step(ctx);
  }
}
