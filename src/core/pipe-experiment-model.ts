/**
 * The bare pipe experiment (teaching and verification): a straight pipe with
 * chosen end types and a two-state initial split, advanced in time and
 * sampled at chosen instants. SI units.
 */
import type { SchemeName } from './model.js';

export interface PipeSideState {
  pressure: number;
  temperature: number;
  velocity: number;
}

export type PipeEndModel = 'closed' | 'open' | { volume: number; pressure: number; temperature: number };

export interface PipeExperimentModel {
  name: string;
  pipe: {
    length: number;
    diameter: number;
    meshSize: number;
    /** Fanning friction factor; 0 or wallFriction false switches it off */
    wallFriction: boolean;
    friction: number;
    wallHeatTransfer: boolean;
    wallTemperature: number;
  };
  /**
   * 'open' opens that end to a reservoir at the initial state of that side;
   * a volume end is a closed 0-D volume [m³] the pipe opens into, starting at
   * its own pressure and temperature
   */
  ends: { left: PipeEndModel; right: PipeEndModel };
  initial: { split: number; left: PipeSideState; right: PipeSideState };
  /** sample times [s], increasing */
  times: number[];
  numerics: { courant: number; scheme: SchemeName };
}

export interface PipeSnapshot {
  time: number;
  pressure: number[];
  velocity: number[];
  temperature: number[];
}

/** The pressure in a volume end over the run, at most a few hundred samples. */
export interface VolumeTrace {
  side: 'left' | 'right';
  /** [s] */
  time: number[];
  /** [Pa] */
  pressure: number[];
}

export interface PipeExperimentResult {
  x: number[];
  snapshots: PipeSnapshot[];
  /** total gas mass at each snapshot [kg] (the pipe and any volume ends) */
  mass: number[];
  /** the volume ends' pressure against time; empty without volume ends */
  volumes: VolumeTrace[];
  stats: { nodes: number; steps: number; scheme: SchemeName };
}
