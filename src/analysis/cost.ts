/**
 * A rough cost estimate of simulating speeds, made before anything runs.
 *
 * One point costs cycles × steps per cycle × time per step. The time step is
 * set by the CFL condition, Δt = C·Δx/(|u| + a); with a the ambient speed of
 * sound and the measured ratio of steps to the ambient estimate (STEP_RATIO,
 * about 1.2: the hot gas and the flow speed shorten the step):
 *   steps per cycle ≈ STEP_RATIO · (120/N) / (C·Δx/a),   N in rpm.
 * The time per step grows with the mesh nodes n: PER_STEP + PER_NODE·n (the
 * boundaries, valves and cylinder are a fixed part of each step). Cycles per
 * point: a warm-started sweep converges in about CYCLES_AMBIENT cycles on an
 * open runner and CYCLES_PLENUM with a plenum (it fills slowly).
 *
 * The constants were measured on the project's reference machine (2 shared
 * cores, Node 20; 2026-12) over the bundled cases at 5, 10 and 20 mm meshes,
 * both schemes: the estimate is within about a factor of two of what a run
 * then takes there. Another machine is faster or slower by its own factor.
 */
import { GAMMA, R_AIR, totalLength, type EngineModel } from '../core/index.js';

const STEP_RATIO = 1.2;
/** [s] per time step, fixed part */
const PER_STEP = 6e-6;
/** [s] per time step and mesh node */
const PER_NODE = 1e-7;
const CYCLES_AMBIENT = 6;
const CYCLES_PLENUM = 14;

/** Estimated seconds to simulate one speed of this model on one job. */
export function pointSeconds(model: EngineModel, rpm: number): number {
  // the runner's mesh as core/pipe/mesh.ts lays it (nothing allocated)
  const length = totalLength(model.runner.sections);
  const nodes = Math.max(3, Math.round(length / model.numerics.meshSize) + 1);
  const dx = length / (nodes - 1);
  const a = Math.sqrt(GAMMA * R_AIR * model.ambient.temperature);
  const dt = (model.numerics.courant * dx) / a;
  const steps = (STEP_RATIO * (120 / rpm)) / dt;
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
