/**
 * A rough cost estimate of simulating speeds, made before anything runs,
 * from the model alone (mesh size, runner length, speeds, cycle cap). It
 * drives the line `tune` says before a long run and the limit every command
 * refuses to start above without --allow-long (a mistyped
 * `numerics.meshSize=0.01mm` or a speed range down to a few rpm would
 * otherwise run for hours without a word).
 *
 * One point costs cycles × steps per cycle × time per step. The time step is
 * set by the CFL condition, Δt = C·Δx/(|u| + a); with a the ambient speed of
 * sound and the measured ratio of steps to the ambient estimate (STEP_RATIO,
 * about 1.2: the hot gas and the flow speed shorten the step):
 *   steps per cycle ≈ STEP_RATIO · (120/N) / (C·Δx/a),   N in rpm.
 * The time per step grows with the mesh nodes n: PER_STEP + PER_NODE·n (the
 * boundaries, valves and cylinder are a fixed part of each step). Cycles per
 * point: a warm-started sweep converges in about CYCLES_AMBIENT cycles on an
 * open runner and CYCLES_PLENUM with a plenum (it fills slowly); the cap
 * numerics.maxCycles bounds it.
 *
 * The constants were measured on the project's reference machine (2 shared
 * cores, Node 20; 2026-12) over the bundled cases at 5, 10 and 20 mm meshes,
 * both schemes: the estimate is within about a factor of two of what a run
 * then takes there. Another machine is faster or slower by its own factor.
 * Pure: no clock, no I/O.
 */
import { GAMMA, R_AIR, totalLength, type EngineModel } from '../core/index.js';
import type { PipeExperimentModel } from '../core/pipe-experiment-model.js';

const STEP_RATIO = 1.2;
/** [s] per time step, fixed part */
const PER_STEP = 6e-6;
/** [s] per time step and mesh node */
const PER_NODE = 1e-7;
const CYCLES_AMBIENT = 6;
const CYCLES_PLENUM = 14;
/** in a pipe experiment shocks and contacts outrun the initial sound speed */
const PIPE_WAVE_SPEED_FACTOR = 1.5;

/** estimated wall time above which a command refuses to start without --allow-long [s] */
export const COST_LIMIT_SECONDS = 15 * 60;
/** estimated wall time above which a terminal shows progress [s] */
export const PROGRESS_AFTER_SECONDS = 3;

/** lengths of every pipe of the model: the runner, a snorkel, an exhaust pipe, side tubes and necks [m] */
function pipeLengths(model: EngineModel): number[] {
  const out = [totalLength(model.runner.sections)];
  if (model.inlet.kind === 'plenum' && model.inlet.snorkel) out.push(totalLength(model.inlet.snorkel.sections));
  if (model.exhaust.pipe) out.push(totalLength(model.exhaust.pipe.sections));
  for (const r of model.runner.resonators ?? []) out.push(r.kind === 'tube' ? r.length : r.neckLength);
  return out;
}

/**
 * mesh points of all pipes and CFL time steps a cycle of the model at `rpm`
 * (nothing allocated): one step over all pipes, set by the shortest cell and
 * the fastest sound (the exhaust gas when there is an exhaust pipe)
 */
function meshAndSteps(model: EngineModel, rpm: number): { nodes: number; steps: number } {
  let nodes = 0;
  let dx = Infinity;
  for (const length of pipeLengths(model)) {
    const n = Math.max(3, Math.round(length / model.numerics.meshSize) + 1);
    nodes += n;
    dx = Math.min(dx, length / (n - 1));
  }
  const T = model.exhaust.pipe ? Math.max(model.ambient.temperature, model.exhaust.gasTemperature) : model.ambient.temperature;
  const a = Math.sqrt(GAMMA * R_AIR * T);
  const dt = (model.numerics.courant * dx) / a;
  return { nodes, steps: (STEP_RATIO * (120 / rpm)) / dt };
}

function likelyCycles(model: EngineModel): number {
  return Math.min(model.numerics.maxCycles, model.inlet.kind === 'plenum' ? CYCLES_PLENUM : CYCLES_AMBIENT);
}

/** Estimated seconds to simulate one speed of this model on one job. */
export function pointSeconds(model: EngineModel, rpm: number): number {
  const { nodes, steps } = meshAndSteps(model, rpm);
  const cycles = model.inlet.kind === 'plenum' ? CYCLES_PLENUM : CYCLES_AMBIENT;
  return cycles * steps * (PER_STEP + PER_NODE * nodes);
}

/** Estimated wall seconds for `designs` sweeps of this model over `rpms` on `jobs` jobs. */
export function sweepsSeconds(model: EngineModel, rpms: readonly number[], designs: number, jobs: number): number {
  let one = 0;
  for (const rpm of rpms) one += pointSeconds(model, rpm);
  return (one * designs) / Math.max(1, jobs);
}

/** "40 s", "12 min", "3 h 20 min" */
export function roughDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return 'an unknown time';
  if (seconds < 90) return `${Math.max(1, Math.round(seconds))} s`;
  const min = Math.round(seconds / 60);
  if (min < 90) return `${min} min`;
  const h = Math.floor(min / 60);
  const m = min - 60 * h;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

// ---------------------------------------------------------------- the limit (--allow-long)

export interface CostEstimate {
  /** mesh points of all pipes */
  nodes: number;
  /** time steps per cycle at the slowest speed (a pipe experiment: all its steps) */
  stepsPerCycle: number;
  /** cycles counted per point (likely) and the cap */
  cycles: number;
  maxCycles: number;
  /** operating points */
  points: number;
  /** workers sharing the points */
  jobs: number;
  /** node updates expected, and at most (every point to the cycle cap) */
  nodeUpdates: number;
  maxNodeUpdates: number;
  /** expected wall time [s] with `jobs` workers, and at most */
  seconds: number;
  maxSeconds: number;
}

/** the cost of simulating `model` at each speed of `rpms` (capped by maxCycles), shared by `jobs` workers */
export function engineCost(model: EngineModel, rpms: readonly number[] = [model.rpm], jobs = 1): CostEstimate {
  const cycles = likelyCycles(model);
  const maxCycles = model.numerics.maxCycles;
  let steps = 0;
  let slowest = 0;
  let perCycle = 0;
  let nodes = 3;
  for (const rpm of rpms) {
    const m = meshAndSteps(model, rpm);
    nodes = m.nodes;
    steps += m.steps;
    slowest = Math.max(slowest, m.steps);
    perCycle += m.steps * (PER_STEP + PER_NODE * m.nodes);
  }
  const workers = Math.max(1, Math.min(jobs, rpms.length));
  return {
    nodes,
    stepsPerCycle: Math.ceil(slowest),
    cycles,
    maxCycles,
    points: rpms.length,
    jobs: workers,
    nodeUpdates: nodes * steps * cycles,
    maxNodeUpdates: nodes * steps * maxCycles,
    seconds: (perCycle * cycles) / workers,
    maxSeconds: (perCycle * maxCycles) / workers,
  };
}

/** Several designs over the same workers (compare, tune): the sum of their costs. */
export function combinedCost(costs: readonly CostEstimate[], jobs = 1): CostEstimate {
  const first = costs[0];
  if (!first) throw new Error('combinedCost: no costs');
  const points = costs.reduce((t, c) => t + c.points, 0);
  const workers = Math.max(1, Math.min(jobs, points));
  const sum = (k: 'nodeUpdates' | 'maxNodeUpdates' | 'seconds' | 'maxSeconds'): number => costs.reduce((t, c) => t + c[k] * c.jobs, 0);
  return {
    nodes: Math.max(...costs.map((c) => c.nodes)),
    stepsPerCycle: Math.max(...costs.map((c) => c.stepsPerCycle)),
    cycles: first.cycles,
    maxCycles: Math.max(...costs.map((c) => c.maxCycles)),
    points,
    jobs: workers,
    nodeUpdates: costs.reduce((t, c) => t + c.nodeUpdates, 0),
    maxNodeUpdates: costs.reduce((t, c) => t + c.maxNodeUpdates, 0),
    seconds: sum('seconds') / workers,
    maxSeconds: sum('maxSeconds') / workers,
  };
}

/** the cost of a bare pipe experiment to its last sample time */
export function pipeCost(model: PipeExperimentModel): CostEstimate {
  const nodes = Math.max(3, Math.round(model.pipe.length / model.pipe.meshSize) + 1);
  const dx = model.pipe.length / (nodes - 1);
  const { left, right } = model.initial;
  const a = Math.sqrt(GAMMA * R_AIR * Math.max(left.temperature, right.temperature));
  const u = Math.max(Math.abs(left.velocity), Math.abs(right.velocity));
  const dt = (model.numerics.courant * dx) / (PIPE_WAVE_SPEED_FACTOR * a + u);
  const steps = Math.ceil(Math.max(0, ...model.times) / dt);
  const seconds = steps * (PER_STEP + PER_NODE * nodes);
  return { nodes, stepsPerCycle: steps, cycles: 1, maxCycles: 1, points: 1, jobs: 1, nodeUpdates: nodes * steps, maxNodeUpdates: nodes * steps, seconds, maxSeconds: seconds };
}

/** "45 s", "12 min", "3.2 h", "4 days" */
export function duration(seconds: number): string {
  if (seconds >= 48 * 3600 && Number.isFinite(seconds)) return `${Number((seconds / 86400).toPrecision(2))} days`;
  return roughDuration(seconds);
}

function big(n: number): string {
  return n < 1e6 ? String(Math.round(n)) : n.toExponential(1).replace('e+', 'e');
}

/** One line on what the estimate counts: "38001 mesh points × 774473 time steps a cycle × about 6 cycles ..." */
export function costBreakdown(c: CostEstimate, what: 'engine' | 'pipe' = 'engine'): string {
  if (what === 'pipe') return `${c.nodes} points × ${big(c.stepsPerCycle)} time steps = ${big(c.nodeUpdates)} node updates`;
  const points = c.points === 1 ? '' : ` × ${c.points} operating points${c.jobs > 1 ? ` on ${c.jobs} workers` : ''}`;
  return `${c.nodes} mesh points × ${big(c.stepsPerCycle)} time steps a cycle × about ${c.cycles} cycles (at most ${c.maxCycles})${points} ≈ ${big(c.nodeUpdates)} node updates`;
}

/**
 * Why `c` is too long to start without --allow-long, or undefined. The
 * message says the estimate, what it counts, the limit and the ways out.
 */
export function costProblem(c: CostEstimate, what: 'engine' | 'pipe' = 'engine'): string | undefined {
  if (!(c.seconds > COST_LIMIT_SECONDS)) return undefined;
  const mesh = what === 'pipe' ? 'pipe.meshSize' : 'numerics.meshSize';
  return (
    `this would take about ${duration(c.seconds)} (an estimate: ${costBreakdown(c, what)}); ` +
    `the limit is ${duration(COST_LIMIT_SECONDS)}: use a coarser ${mesh}${what === 'engine' ? ' or fewer speeds' : ' or an earlier last time'}, or add --allow-long to run it anyway`
  );
}

/** the field a too-long run is most likely due to, for the error line */
export function costCulprit(model: { numerics: { meshSize: number; maxCycles: number } }, fallback: string): string {
  if (model.numerics.meshSize < 0.005) return 'numerics.meshSize';
  if (model.numerics.maxCycles > 60) return 'numerics.maxCycles';
  return fallback;
}
