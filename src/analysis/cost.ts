/**
 * What a simulation will cost, known before it runs, from the model alone
 * (mesh size, runner length, speeds, cycle cap): runner points × time steps
 * per cycle × cycles × operating points. A mistyped mesh size
 * (`numerics.meshSize=0.01mm`) or a speed range down to a few rpm would
 * otherwise run for hours without a word.
 *
 *   nodes  n ≈ L/dx + 1                       (core/pipe/mesh.ts; the open-end
 *                                              extension of a few mm is left out)
 *   step   dt = C·dx/max(|u| + a)             (CFL; max(|u| + a) ≈ 1.1·a of the
 *                                              coldest-to-warmest wall or ambient
 *                                              gas, fitted to the bundled cases:
 *                                              within 1 % of the steps they take)
 *   steps per cycle  = (120/N)/dt             (one cycle is two turns)
 *   node updates     = n × steps per cycle × cycles, summed over the points
 *
 * Cycles: a point stops when periodic; the bundled cases take 4–6 cycles from
 * rest, a plenum case up to 28. LIKELY_CYCLES (capped by numerics.maxCycles)
 * is what the estimate counts on; the cap itself is the upper bound.
 *
 * Seconds: node updates / NODE_UPDATES_PER_SECOND per worker, a rate
 * measured on the project's 2-core machine (`npm run bench`; 2–7 million a
 * second seen for the whole engine step). A slower machine takes longer: the
 * figure is an estimate, said so wherever it is shown.
 *
 * Pure: no clock, no I/O.
 */
import { GAMMA, R_AIR } from '../core/gas.js';
import type { EngineModel } from '../core/model.js';
import type { PipeExperimentModel } from '../core/pipe-experiment-model.js';

/** node updates a second, one worker (measured: see above) */
export const NODE_UPDATES_PER_SECOND = 4e6;
/** cycles a point is expected to take (the cap bounds it) */
export const LIKELY_CYCLES = 12;
/** estimated wall time above which a command refuses to start without --allow-long [s] */
export const COST_LIMIT_SECONDS = 15 * 60;
/** estimated wall time above which a terminal shows progress [s] */
export const PROGRESS_AFTER_SECONDS = 3;
/** largest wave speed over the ambient (or wall) sound speed, fitted to the bundled cases */
const WAVE_SPEED_FACTOR = 1.1;
/** in a pipe experiment: shocks and contacts move faster than the initial sound speed */
const PIPE_WAVE_SPEED_FACTOR = 1.5;

export interface CostEstimate {
  /** runner (or pipe) points */
  nodes: number;
  /** time steps per cycle at the slowest speed (a pipe experiment: all steps) */
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

function nodesOf(length: number, meshSize: number): number {
  return Math.max(3, Math.round(length / meshSize) + 1);
}

/** the cost of simulating `model` at each speed of `rpms`, shared by `jobs` workers */
export function engineCost(model: EngineModel, rpms: readonly number[] = [model.rpm], jobs = 1): CostEstimate {
  const L = model.runner.sections.reduce((s, x) => s + x.length, 0);
  const nodes = nodesOf(L, model.numerics.meshSize);
  const dx = L / (nodes - 1);
  const T = Math.max(model.ambient.temperature, model.runner.wallTemperature);
  const waveSpeed = WAVE_SPEED_FACTOR * Math.sqrt(GAMMA * R_AIR * T);
  const dt = (model.numerics.courant * dx) / waveSpeed;
  const maxCycles = model.numerics.maxCycles;
  const cycles = Math.min(maxCycles, LIKELY_CYCLES);
  let steps = 0;
  let slowest = 0;
  for (const rpm of rpms) {
    const s = 120 / rpm / dt;
    steps += s;
    slowest = Math.max(slowest, s);
  }
  const workers = Math.max(1, Math.min(jobs, rpms.length));
  const nodeUpdates = nodes * steps * cycles;
  const maxNodeUpdates = nodes * steps * maxCycles;
  return {
    nodes,
    stepsPerCycle: Math.ceil(slowest),
    cycles,
    maxCycles,
    points: rpms.length,
    jobs: workers,
    nodeUpdates,
    maxNodeUpdates,
    seconds: nodeUpdates / NODE_UPDATES_PER_SECOND / workers,
    maxSeconds: maxNodeUpdates / NODE_UPDATES_PER_SECOND / workers,
  };
}

/** Several designs over the same workers (compare, tune): the sum of their costs. */
export function combinedCost(costs: readonly CostEstimate[], jobs = 1): CostEstimate {
  const first = costs[0];
  if (!first) throw new Error('combinedCost: no costs');
  const points = costs.reduce((t, c) => t + c.points, 0);
  const nodeUpdates = costs.reduce((t, c) => t + c.nodeUpdates, 0);
  const maxNodeUpdates = costs.reduce((t, c) => t + c.maxNodeUpdates, 0);
  const workers = Math.max(1, Math.min(jobs, points));
  return {
    nodes: Math.max(...costs.map((c) => c.nodes)),
    stepsPerCycle: Math.max(...costs.map((c) => c.stepsPerCycle)),
    cycles: first.cycles,
    maxCycles: Math.max(...costs.map((c) => c.maxCycles)),
    points,
    jobs: workers,
    nodeUpdates,
    maxNodeUpdates,
    seconds: nodeUpdates / NODE_UPDATES_PER_SECOND / workers,
    maxSeconds: maxNodeUpdates / NODE_UPDATES_PER_SECOND / workers,
  };
}

/** the cost of a bare pipe experiment to its last sample time */
export function pipeCost(model: PipeExperimentModel): CostEstimate {
  const nodes = nodesOf(model.pipe.length, model.pipe.meshSize);
  const dx = model.pipe.length / (nodes - 1);
  const { left, right } = model.initial;
  const a = Math.sqrt(GAMMA * R_AIR * Math.max(left.temperature, right.temperature));
  const u = Math.max(Math.abs(left.velocity), Math.abs(right.velocity));
  const dt = (model.numerics.courant * dx) / (PIPE_WAVE_SPEED_FACTOR * a + u);
  const tEnd = Math.max(0, ...model.times);
  const steps = Math.ceil(tEnd / dt);
  const nodeUpdates = nodes * steps;
  const seconds = nodeUpdates / NODE_UPDATES_PER_SECOND;
  return { nodes, stepsPerCycle: steps, cycles: 1, maxCycles: 1, points: 1, jobs: 1, nodeUpdates, maxNodeUpdates: nodeUpdates, seconds, maxSeconds: seconds };
}

/** "45 s", "12 min", "3.2 h", "4 days" */
export function duration(seconds: number): string {
  if (!Number.isFinite(seconds)) return 'forever';
  if (seconds < 90) return `${Math.max(1, Math.round(seconds))} s`;
  if (seconds < 90 * 60) return `${Math.round(seconds / 60)} min`;
  if (seconds < 48 * 3600) return `${Number((seconds / 3600).toPrecision(2))} h`;
  return `${Number((seconds / 86400).toPrecision(2))} days`;
}

function big(n: number): string {
  return n < 1e6 ? String(Math.round(n)) : n.toExponential(1).replace('e+', 'e');
}

/** One line on what the estimate counts: "4001 runner points × 166000 steps a cycle × about 12 cycles ..." */
export function costBreakdown(c: CostEstimate, what: 'engine' | 'pipe' = 'engine'): string {
  if (what === 'pipe') return `${c.nodes} points × ${big(c.stepsPerCycle)} time steps = ${big(c.nodeUpdates)} node updates`;
  const points = c.points === 1 ? '' : ` × ${c.points} operating points${c.jobs > 1 ? ` on ${c.jobs} workers` : ''}`;
  return `${c.nodes} runner points × ${big(c.stepsPerCycle)} time steps a cycle × about ${c.cycles} cycles (at most ${c.maxCycles})${points} ≈ ${big(c.nodeUpdates)} node updates`;
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
