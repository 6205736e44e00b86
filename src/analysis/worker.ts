/**
 * The sweep worker: runs chunks of a speed sweep on a worker thread.
 *
 * Protocol (structured-clone messages over the worker's parentPort):
 *   in : { id, model, rpms, assumptions }         one chunk to run (sweep.ts runChunk)
 *   out: { id, progress: rpm }                    after each point
 *        { id, points: SweepPoint[] }             the chunk's results
 *        { id, error: { name, message, code } }   the chunk failed
 *
 * This module starts serving only when it is loaded on a worker thread whose
 * workerData carries SWEEP_WORKER_FLAG; imported anywhere else it does
 * nothing. That lets one file act as the worker in all three layouts (see
 * worker-pool.ts): the .ts source, the compiled dist/analysis/worker.js, and
 * the single-file bundle, which is started as its own worker.
 */
import { isMainThread, parentPort, workerData, type MessagePort } from 'node:worker_threads';
import type { EngineModel } from '../core/model.js';
import type { OutputAssumptions } from './estimates.js';
import { runChunk, type SweepPoint } from './sweep.js';

export const SWEEP_WORKER_FLAG = 'tractwaveSweepWorker';

export interface ChunkJob {
  id: number;
  model: EngineModel;
  rpms: number[];
  assumptions: Partial<OutputAssumptions>;
}

export type ChunkReply =
  | { id: number; progress: number }
  | { id: number; points: SweepPoint[] }
  | { id: number; error: { name: string; message: string; code?: string } };

/** Is this thread a sweep worker (started by worker-pool.ts)? */
export function isSweepWorker(): boolean {
  return !isMainThread && typeof workerData === 'object' && workerData !== null && (workerData as Record<string, unknown>)[SWEEP_WORKER_FLAG] === true;
}

/** Serve chunk jobs on `port` until the parent terminates the thread. */
export function serveSweepChunks(port: MessagePort): void {
  port.on('message', (job: ChunkJob) => {
    try {
      const points = runChunk(job.model, job.rpms, job.assumptions, (p) => port.postMessage({ id: job.id, progress: p.rpm } satisfies ChunkReply));
      port.postMessage({ id: job.id, points } satisfies ChunkReply);
    } catch (e) {
      const err = e instanceof Error ? e : new Error(String(e));
      const code = (err as { code?: unknown }).code;
      port.postMessage({
        id: job.id,
        error: { name: err.name, message: err.message, ...(typeof code === 'string' ? { code } : {}) },
      } satisfies ChunkReply);
    }
  });
}

if (isSweepWorker() && parentPort) serveSweepChunks(parentPort);
