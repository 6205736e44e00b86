/**
 * The one worker of the process's pool (worker-pool.ts): runs single points
 * of the core on a worker thread, for sweeps, tunes, reports and the
 * terminal view alike.
 *
 * Protocol (structured-clone messages over the worker's parentPort):
 *   out: { ready: true }                                      once, when serving
 *   in : { id, kind: 'sweep', model, rpm, assumptions, warmStart? }
 *                                                              one point of a sweep (sweep.ts sweepPoint)
 *   out: { id, point: SweepPoint, warmStart }                  its result and converged state
 *   in : { id, kind: 'view', model, warmStart? }               one point for the terminal view
 *   out: { id, view: { result, warmStart, pulse? } }           the whole result (typed arrays transferred)
 *   out: { id, error: { name, message, code } }                the point failed
 *
 * A point carries its warm start with it: the chain of warm starts (which
 * point starts from which) is decided by whoever sends the jobs, never by
 * the thread that happens to run them, so the numbers do not depend on
 * scheduling.
 *
 * This module starts serving only when it is loaded on a worker thread whose
 * workerData carries SWEEP_WORKER_FLAG; imported anywhere else it does
 * nothing. That lets one file act as the worker in all three layouts (see
 * worker-start.ts): the .ts source, the compiled dist/analysis/worker.js, and
 * the single-file bundle, which is started as its own worker.
 */
import { isMainThread, parentPort, workerData, type MessagePort } from 'node:worker_threads';
import { simulatePoint, type WarmStart } from '../core/engine.js';
import type { EngineModel, PointResult } from '../core/model.js';
import type { OutputAssumptions } from './estimates.js';
import { pulseTiming, type PulseTiming } from './pulse.js';
import { sweepPoint, type SweepPoint } from './sweep.js';

export const SWEEP_WORKER_FLAG = 'tractwaveSweepWorker';

export interface SweepPointJob {
  id: number;
  kind: 'sweep';
  model: EngineModel;
  rpm: number;
  assumptions: Partial<OutputAssumptions>;
  warmStart?: WarmStart;
}

export interface ViewPointJob {
  id: number;
  kind: 'view';
  model: EngineModel;
  warmStart?: WarmStart;
}

export type PointJob = SweepPointJob | ViewPointJob;

/** A point for the terminal view: the whole result, its converged state and the pulse timing (absent when it cannot be judged). */
export interface ViewPoint {
  result: PointResult;
  warmStart: WarmStart;
  pulse?: PulseTiming;
}

export interface JobError {
  name: string;
  message: string;
  code?: string;
}

export type WorkerReply =
  | { ready: true }
  | { id: number; point: SweepPoint; warmStart: WarmStart }
  | { id: number; view: ViewPoint }
  | { id: number; error: JobError };

/** Is this thread a pool worker (started by worker-pool.ts)? */
export function isSweepWorker(): boolean {
  return !isMainThread && typeof workerData === 'object' && workerData !== null && (workerData as Record<string, unknown>)[SWEEP_WORKER_FLAG] === true;
}

/** One point for the view (also run on the main thread by the view's inline engine). */
export function viewPoint(model: EngineModel, warm?: WarmStart): ViewPoint {
  const { result, warmStart } = simulatePoint(model, warm ? { warmStart: warm } : {});
  let pulse: PulseTiming | undefined;
  try {
    pulse = pulseTiming(result, model);
  } catch {
    pulse = undefined; // the point stands without its verdict
  }
  return { result, warmStart, ...(pulse ? { pulse } : {}) };
}

/** An error as plain data, to cross the thread boundary. */
export function jobError(e: unknown): JobError {
  const err = e instanceof Error ? e : new Error(String(e));
  const code = (err as { code?: unknown }).code;
  return { name: err.name, message: err.message, ...(typeof code === 'string' ? { code } : {}) };
}

/** Run one job; errors come back as a reply, never thrown. */
export function runJob(job: PointJob): WorkerReply {
  try {
    if (job.kind === 'view') return { id: job.id, view: viewPoint(job.model, job.warmStart) };
    const { point, warmStart } = sweepPoint(job.model, job.rpm, job.assumptions, job.warmStart);
    return { id: job.id, point, warmStart };
  } catch (e) {
    return { id: job.id, error: jobError(e) };
  }
}

/** The buffers of a result's typed arrays, to transfer instead of copy. */
export function resultBuffers(r: PointResult): ArrayBuffer[] {
  const arrays = [...Object.values(r.trace), r.runnerMap.x, r.runnerMap.pressure, ...r.pipes.flatMap((p) => [p.x, p.pressure])];
  const seen = new Set<ArrayBuffer>();
  for (const a of arrays) if (a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  return [...seen];
}

/** Serve jobs on `port` until the parent terminates the thread. */
export function servePoints(port: MessagePort): void {
  port.on('message', (job: PointJob) => {
    const reply = runJob(job);
    port.postMessage(reply, 'view' in reply ? resultBuffers(reply.view.result) : []);
  });
  port.postMessage({ ready: true } satisfies WorkerReply);
}

if (isSweepWorker() && parentPort) servePoints(parentPort);
