/**
 * The engine model and the results of one operating point, in SI units.
 *
 * Everything the core computes starts from an `EngineModel` (built by
 * `src/case/` from a case file, already converted to SI) and ends in a
 * `PointResult`. Nothing here knows about files, units strings, the terminal
 * or the clock.
 *
 * Units: lengths [m], areas [m²], volumes [m³], pressures [Pa], temperatures
 * [K], masses [kg], mass flows [kg/s], speeds [rpm], crank angles [deg].
 *
 * Crank angle θ: 0 = TDC at the start of the intake stroke (gas-exchange TDC),
 * one cycle = 720°. Event angles in the model are absolute θ in [0, 720).
 *
 * Sign convention for flows (written once, used everywhere): a mass flow
 * through a valve is positive INTO the cylinder; a flow at the runner's
 * upstream (inlet) end is positive INTO the runner; velocity in the runner is
 * positive from the upstream end (x = 0) towards the valve (x = L).
 */

export type SchemeName = 'characteristics' | 'conservative';

/** A point of a lift or Cd table. */
export interface TablePoint {
  x: number;
  y: number;
}

export interface ValveModel {
  /** number of valves of this kind */
  count: number;
  /** valve head (seat) diameter [m] */
  diameter: number;
  /** peak lift [m] */
  maxLift: number;
  /** θ of opening, absolute [deg, 0..720) — the start of the lift curve */
  openAngle: number;
  /** θ of closing, absolute [deg, 0..720) — the end of the lift curve */
  closeAngle: number;
  /**
   * Optional lift table: x = fraction of the open duration (0..1), y = lift
   * fraction of maxLift (0..1). When absent a smooth default profile is used.
   */
  liftTable?: TablePoint[];
  /** discharge coefficient on curtain area against L/D (x = L/D, y = Cd) */
  cdTable: TablePoint[];
}

export interface RunnerSection {
  length: number;
  diameterStart: number;
  diameterEnd: number;
}

/** A pipe other than the runner (snorkel, exhaust primary): sections and wall. */
export interface PipeModel {
  /** sections, from the end nearer the ambient air (snorkel) or the valve (exhaust) */
  sections: RunnerSection[];
  /** wall temperature [K] */
  wallTemperature: number;
  /** Fanning friction factor [-] (0 switches friction off) */
  friction: number;
  /** wall heat transfer on/off (Reynolds analogy with the friction factor) */
  heatTransfer: boolean;
}

/**
 * A side resonator on the runner, joined at `at` [m] measured from the valve
 * along the runner: a closed side tube (quarter-wave) or a Helmholtz
 * resonator (a neck into a closed volume).
 */
export type ResonatorModel =
  | { kind: 'tube'; at: number; length: number; diameter: number }
  | { kind: 'helmholtz'; at: number; neckLength: number; neckDiameter: number; volume: number };

export interface EngineModel {
  name: string;
  engine: {
    bore: number;
    stroke: number;
    /** connecting-rod length, centre to centre [m] */
    rod: number;
    compressionRatio: number;
    /** cylinder wall temperature for heat transfer [K]; undefined = adiabatic */
    wallTemperature?: number;
  };
  ambient: { pressure: number; temperature: number };
  intake: ValveModel;
  exhaust: ValveModel & {
    /** exhaust back pressure [Pa] */
    backPressure: number;
    /** exhaust gas (residual) temperature [K] */
    gasTemperature: number;
    /** the exhaust primary from the valve to the back-pressure reservoir (sections from the valve end) */
    pipe?: PipeModel;
    /**
     * cylinder pressure at exhaust valve opening [Pa]: when set (default with
     * an exhaust pipe), each cycle starts at EVO with the cylinder at this
     * pressure, so the blowdown pulse runs down the exhaust pipe.
     */
    releasePressure?: number;
  };
  runner: {
    /** sections from the upstream (open) end to the valve end */
    sections: RunnerSection[];
    /** runner wall temperature [K] */
    wallTemperature: number;
    /** Fanning friction factor [-] (0 switches friction off) */
    friction: number;
    /** wall heat transfer on/off (Reynolds analogy with the friction factor) */
    heatTransfer: boolean;
    /** entry loss coefficient K at the upstream end (0 bellmouth … 0.5 plain edge) */
    entryLoss: number;
    /**
     * acoustic end correction at the open upstream end [m]: the 1-D runner is
     * extended by this length so its open end rings like a real one.
     * Default 0.6133·r of the entry (unflanged pipe, Levine & Schwinger 1948).
     */
    endCorrection?: number;
    /** side resonators (junctions on the runner); none when absent */
    resonators?: ResonatorModel[];
  };
  inlet:
    | { kind: 'ambient' }
    | {
        kind: 'plenum';
        /** plenum / airbox volume [m³] */
        volume: number;
        /** feed restriction (throttle or airbox mouth) diameter [m]; absent when a snorkel feeds the box */
        feedDiameter?: number;
        /** feed discharge coefficient [-] */
        feedCd: number;
        /** the airbox mouth as a 1-D pipe from the ambient into the box (sections from the ambient end) */
        snorkel?: PipeModel & { entryLoss: number };
        /**
         * boost: the feed (orifice or snorkel) draws from this supply reservoir
         * [Pa, K] instead of the ambient; ηv stays on the ambient density
         */
        supply?: { pressure: number; temperature: number };
      };
  rpm: number;
  numerics: {
    /** target mesh spacing [m] */
    meshSize: number;
    /** Courant number (≤ 1) */
    courant: number;
    maxCycles: number;
    /** relative change of delivered mass per cycle for convergence */
    tolerance: number;
    scheme: SchemeName;
  };
}

/** Events as absolute crank angles θ [deg, 0..720). */
export interface ValveEvents {
  ivo: number;
  ivc: number;
  evo: number;
  evc: number;
}

/** One converged cycle, one sample per crank degree, θ = 0..719. */
export interface CycleTrace {
  crank: Float64Array;
  /** static pressure at the valve end of the runner [Pa] */
  valvePressure: Float64Array;
  /** intake-valve mass flow [kg/s], positive into the cylinder */
  valveFlow: Float64Array;
  cylinderPressure: Float64Array;
  /** cylinder mass [kg] */
  cylinderMass: Float64Array;
  /** intake valve lift [m] */
  lift: Float64Array;
  /** exhaust valve lift [m] */
  exhaustLift: Float64Array;
  /** mass flow into the runner at its upstream end [kg/s] */
  inletFlow: Float64Array;
  /** plenum pressure [Pa] (ambient pressure when there is no plenum) */
  plenumPressure: Float64Array;
  /** pressure at the exhaust valve end of the exhaust pipe [Pa] (the back pressure when there is no exhaust pipe) */
  exhaustPortPressure: Float64Array;
}

/**
 * Pressure along the runner against crank angle (space–time map).
 * `x` holds positions from the upstream end [m]; `pressure` is row-major,
 * 720 rows (θ = 0..719) of `x.length` values [Pa].
 */
export interface RunnerMap {
  x: Float64Array;
  pressure: Float64Array;
}

/** What a pipe of the network is for (views pick pipes by it). */
export type PipeRole = 'runner' | 'snorkel' | 'exhaust' | 'resonator';

/**
 * Pressure along one pipe of the network against crank angle, as RunnerMap.
 * The runner is one map even when resonator junctions split it into pieces.
 * `x` runs from the pipe's upstream or valve end as its description says.
 */
export interface PipeMap {
  /** name of the pipe in the network (the runner: "runner") */
  name: string;
  role: PipeRole;
  /** words for a view: "runner, upstream end at the top" etc. */
  label: string;
  /** physical length [m] */
  length: number;
  /** what x = 0 is: "upstream end", "valve", "ambient end", "junction" */
  start: string;
  /** what x = length is */
  end: string;
  x: Float64Array;
  pressure: Float64Array;
}

/** The raw outcome of simulating one operating point (core only). */
export interface PointResult {
  rpm: number;
  converged: boolean;
  cycles: number;
  /** fresh mass delivered through the intake valve per cycle (net) [kg] */
  deliveredMass: number;
  /** net mass into the runner at its upstream end per cycle [kg] */
  inletMass: number;
  /** (inletMass − deliveredMass) / deliveredMass of the last cycle [-] */
  massImbalance: number;
  /** ambient density × swept volume [kg] */
  referenceMass: number;
  volumetricEfficiency: number;
  /** cylinder mass at IVC [kg] */
  trappedMass: number;
  /** burned-gas fraction of the trapped mass [-] */
  residualFraction: number;
  ivcPressure: number;
  valvePressureAtIvo: number;
  valvePressureAtIvc: number;
  /** largest flow out of the cylinder back into the runner [kg/s], ≥ 0 */
  peakReverseFlow: number;
  /** mean sound speed in the runner over the cycle [m/s] */
  meanSoundSpeed: number;
  /** total runner length [m] */
  runnerLength: number;
  events: ValveEvents;
  /** delivered mass of each cycle run (for convergence displays) [kg] */
  history: number[];
  stats: { nodes: number; steps: number; scheme: SchemeName };
  trace: CycleTrace;
  runnerMap: RunnerMap;
  /** every pipe's map, the runner first */
  pipes: PipeMap[];
}
