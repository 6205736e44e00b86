/**
 * The network of parts, as plain data (a spec) and as the runtime pieces the
 * stepper advances.
 *
 * An assembly is pipes, volumes and connectors:
 *   - a PIPE is a 1-D mesh with a scheme (characteristics | conservative); it
 *     has two ends, `left` (x = 0) and `right` (x = L), each joined to exactly
 *     one connector;
 *   - a VOLUME is a 0-D gas store: a fixed reservoir (ambient, exhaust back
 *     pressure), a rigid chamber (plenum, airbox, resonator cavity, silencer)
 *     or the cylinder;
 *   - a CONNECTOR joins pipe ends and volumes and returns, for every pipe end
 *     it touches, the end state (boundary/types.ts) and the mass and enthalpy
 *     flows it adds to the volumes it touches.
 *
 * Sign conventions (written once): a pipe end's `massFlow` is OUTWARD, leaving
 * the pipe through that end; a flow added to a volume is positive INTO it.
 * So a connector between a pipe end and a volume adds +massFlow to the volume.
 *
 * Units: SI throughout (m, m², m³, Pa, K, kg, kg/s, W, s); crank angle in
 * degrees, θ = 0 at gas-exchange TDC.
 *
 * Composition: every volume holds a burned-gas (residual) fraction; a fixed
 * reservoir has a fixed one (ambient 0, exhaust 1). Pipes carry no
 * composition of their own: each has a native fraction (0 on the intake side,
 * 1 on the exhaust side), and the connector between a pipe end and a volume
 * remembers the foreign gas the volume pushed into the pipe, which comes back
 * first (see connectors/composition.ts).
 */
import type { EndState, Incoming } from '../boundary/types.js';
import type { SchemeName, ValveModel } from '../model.js';
import type { MeshSection } from '../pipe/mesh.js';
import type { PipeScheme, PipeWall } from '../pipe/scheme.js';

export type Side = 'left' | 'right';

/** A pipe end, by pipe name and side. */
export interface EndRef {
  pipe: string;
  side: Side;
}

// ------------------------------------------------------------------ spec (plain data)

export interface PipeSpec {
  /** unique name, e.g. "runner", "snorkel", "exhaust", "resonator-1" */
  name: string;
  /** physical sections, from the left end (x = 0) to the right end */
  sections: MeshSection[];
  wall: PipeWall;
  /**
   * virtual straight extensions [m] added at each end: the acoustic end
   * correction of an open end (network/end-correction.ts). Not part of the
   * physical pipe: maps and lengths leave them out.
   */
  extend: { left: number; right: number };
  /** burned fraction of the gas this pipe holds natively: 0 intake side, 1 exhaust side */
  nativeBurned: number;
  /** initial uniform state */
  initial: { pressure: number; temperature: number };
}

export type VolumeSpec =
  | {
      kind: 'reservoir';
      name: string;
      pressure: number;
      temperature: number;
      /** burned fraction of its gas [-] */
      burned: number;
    }
  | {
      kind: 'chamber';
      name: string;
      /** [m³] */
      volume: number;
      /** initial state */
      pressure: number;
      temperature: number;
    }
  | {
      kind: 'cylinder';
      name: string;
      geometry: { bore: number; stroke: number; rod: number; compressionRatio: number };
      /** wall temperature for heat transfer [K]; undefined = adiabatic */
      wallTemperature?: number;
    };

/** Effective flow area of a restriction: fixed, or a valve's Cd(L/D)·curtain area at the crank angle. */
export type AreaSpec = { kind: 'fixed'; area: number } | { kind: 'valve'; valve: ValveModel };

export type ConnectorSpec =
  | { kind: 'closed'; name: string; end: EndRef }
  | { kind: 'open'; name: string; end: EndRef; volume: string; entryLoss: number }
  | { kind: 'restricted'; name: string; end: EndRef; volume: string; area: AreaSpec }
  | { kind: 'orifice'; name: string; from: string; to: string; area: AreaSpec }
  | { kind: 'junction'; name: string; ends: EndRef[] };

export interface NetworkSpec {
  pipes: PipeSpec[];
  volumes: VolumeSpec[];
  connectors: ConnectorSpec[];
  numerics: { meshSize: number; scheme: SchemeName };
}

// ------------------------------------------------------------------ runtime

/** What one step knows of time and crank. */
export interface StepContext {
  /** step length [s] */
  dt: number;
  /** crank angle at mid-step [deg, 0..720): valve areas are taken here */
  thetaMid: number;
  /** crank angle at the end of the step [deg] (unwrapped) */
  theta1: number;
  /** engine speed [rpm] (cylinder heat transfer) */
  rpm: number;
}

/** A 0-D gas store. Connectors add flows; the stepper then advances it once per step. */
export interface Volume {
  readonly name: string;
  /** [Pa] */
  readonly pressure: number;
  /** [K] */
  readonly temperature: number;
  /** gas mass [kg] (Infinity for a fixed reservoir) */
  readonly mass: number;
  /** burned-gas mass fraction of the gas it holds [-] */
  burnedFraction(): number;
  /** add a flow into the volume for the present step: mass [kg/s], stagnation enthalpy [W], burned part of the mass [kg/s] */
  addFlow(mass: number, enthalpy: number, burned: number): void;
  /**
   * before the connectors solve: make `pressure` and `temperature` the
   * estimate at mid-step they solve against (until `advance`)
   */
  predict(ctx: StepContext): void;
  /**
   * ∂p/∂H of the mid-step pressure [Pa/W]: how much higher `pressure` would
   * be between `predict` and `advance` had the volume received an extra
   * stagnation enthalpy flow of 1 W over the step (its mid-step pressure is
   * linear in its internal energy); 0 for a fixed reservoir. For connectors
   * that solve their own flow implicitly. A field, not a call: no number is
   * boxed per evaluation.
   */
  readonly midPressurePerEnthalpy: number;
  /** advance over the step with the flows added since the last call, then clear them */
  advance(ctx: StepContext): void;
}

/** One end of a runtime pipe: the wave arriving there and the end state a connector writes. */
export interface PipeEnd {
  readonly pipe: PipeRuntime;
  readonly side: Side;
  readonly incoming: Incoming;
  readonly state: EndState;
}

export interface PipeRuntime {
  readonly spec: PipeSpec;
  readonly scheme: PipeScheme;
  readonly left: PipeEnd;
  readonly right: PipeEnd;
}

export interface Connector {
  readonly name: string;
  /** the pipe ends this connector joins (each pipe end belongs to exactly one connector) */
  readonly ends: readonly PipeEnd[];
  /** solve the ends against the present volume states; add the flows to the volumes */
  solve(ctx: StepContext): void;
  /** forget remembered gas (composition) at the start of a cycle */
  startCycle?(): void;
}
