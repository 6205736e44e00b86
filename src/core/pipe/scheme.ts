/**
 * What the crank-angle stepper needs of a runner scheme. Two schemes
 * implement it: the method of characteristics (`moc.ts`) and the
 * conservative finite-volume reference (`fv.ts`). Both are pure and
 * allocation-free in `incoming`/`step`.
 *
 * Step protocol, for a time step dt chosen by the stepper (≤ maxStableDt):
 *   1. `incoming('left', dt, inc)` and `incoming('right', dt, inc)`: the wave
 *      arriving at each end during the step (see boundary/types.ts).
 *   2. the stepper solves each end's boundary into an EndState.
 *   3. `step(dt, leftEnd, rightEnd)` advances the pipe by dt using those end
 *      states (velocity outward, as the boundary wrote them).
 */
import type { EndState, Incoming } from '../boundary/types.js';
import type { Mesh } from './mesh.js';

export type Side = 'left' | 'right';

export interface PipeScheme {
  readonly name: 'characteristics' | 'conservative';
  readonly mesh: Mesh;
  /** largest dt [s] with Courant number `courant` over the whole mesh */
  maxStableDt(courant: number): number;
  incoming(side: Side, dt: number, out: Incoming): void;
  step(dt: number, left: EndState, right: EndState): void;
  /** gas mass in the pipe [kg] */
  mass(): number;
  /** fills per-point pressure [Pa], velocity [m/s] and temperature [K] at mesh.x */
  sample(p: Float64Array, u: Float64Array, T: Float64Array): void;
  /** true when every state is finite and positive */
  healthy(): boolean;
  /** set a uniform state */
  fill(pressure: number, velocity: number, temperature: number): void;
  /** set state per point from arrays at mesh.x */
  setState(p: ArrayLike<number>, u: ArrayLike<number>, T: ArrayLike<number>): void;
  /**
   * set `left` for x < xSplit [m] and `right` beyond (a diaphragm at
   * xSplit): the one volume the split cuts holds each side's share of
   * mass, momentum and energy, so the split sits at xSplit, not at a mesh
   * point or a cell centre near it
   */
  setSplit(xSplit: number, left: GasState, right: GasState): void;
}

/** a uniform gas state: pressure [Pa], velocity along +x [m/s], temperature [K] */
export interface GasState {
  pressure: number;
  velocity: number;
  temperature: number;
}

export interface PipeWall {
  /** Fanning friction factor, 0 = off */
  friction: number;
  /** wall heat transfer on/off */
  heatTransfer: boolean;
  /** wall temperature [K] */
  wallTemperature: number;
}
