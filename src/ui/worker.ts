/**
 * The point worker: runs one operating point of the core on a worker thread,
 * so the terminal view keeps answering keys while the solver works.
 *
 * Protocol (structured-clone messages over parentPort):
 *   out: { ready: true }                                  once, when serving
 *   in : { id, model, warmStart? }                        one point to run
 *   out: { id, ok: true, result, warmStart, pulse }       its result (typed arrays transferred)
 *        { id, ok: false, error: { name, message, code } } it failed
 *
 * It serves only on a worker thread whose workerData carries UI_WORKER_FLAG;
 * imported anywhere else it does nothing (so a single-file bundle can start
 * itself as this worker).
 */
import { isMainThread, parentPort, workerData, type MessagePort } from 'node:worker_threads';
import { simulatePoint, type WarmStart } from '../core/engine.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { summarisePulse } from './pulse-summary.js';
import type { PulseSummary } from './state.js';

export const UI_WORKER_FLAG = 'tractwaveUiWorker';

export interface PointJob {
  id: number;
  model: EngineModel;
  warmStart?: WarmStart;
}

export type PointReply =
  | { ready: true }
  | { id: number; ok: true; result: PointResult; warmStart: WarmStart; pulse?: PulseSummary }
  | { id: number; ok: false; error: { name: string; message: string; code?: string } };

export function isUiWorker(): boolean {
  return (
    !isMainThread &&
    typeof workerData === 'object' &&
    workerData !== null &&
    (workerData as Record<string, unknown>)[UI_WORKER_FLAG] === true
  );
}

/** Run one job; errors come back as a message, never thrown. */
export function runPointJob(job: PointJob): PointReply {
  try {
    const { result, warmStart } = simulatePoint(job.model, job.warmStart ? { warmStart: job.warmStart } : {});
    let pulse: PulseSummary | undefined;
    try {
      pulse = summarisePulse(result, job.model);
    } catch {
      pulse = undefined; // the point stands without its verdict
    }
    return { id: job.id, ok: true, result, warmStart, ...(pulse ? { pulse } : {}) };
  } catch (e) {
    const err = e instanceof Error ? e : new Error(String(e));
    const code = (err as { code?: unknown }).code;
    return { id: job.id, ok: false, error: { name: err.name, message: err.message, ...(typeof code === 'string' ? { code } : {}) } };
  }
}

/** The buffers of a result's typed arrays, to transfer instead of copy. */
export function resultBuffers(r: PointResult): ArrayBuffer[] {
  const arrays = [...Object.values(r.trace), r.runnerMap.x, r.runnerMap.pressure, ...r.pipes.flatMap((p) => [p.x, p.pressure])];
  const seen = new Set<ArrayBuffer>();
  for (const a of arrays) if (a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  return [...seen];
}

export function servePoints(port: MessagePort): void {
  port.on('message', (job: PointJob) => {
    const reply = runPointJob(job);
    port.postMessage(reply, 'ok' in reply && reply.ok ? resultBuffers(reply.result) : []);
  });
  port.postMessage({ ready: true } satisfies PointReply);
}

if (isUiWorker() && parentPort) servePoints(parentPort);
