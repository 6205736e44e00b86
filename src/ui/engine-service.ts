/**
 * Running the core for the terminal view without freezing the keys.
 *
 * `threadEngine()` runs single points on a worker thread of our own
 * (worker.ts) and sweeps on the analysis module's sweep workers
 * (analysis/worker.ts), in the same fixed warm-start chunks as
 * `tractwave sweep`, so the curve shown here has the command's numbers.
 * A running sweep is stopped by terminating its threads.
 *
 * `inlineEngine()` runs everything on the calling thread, yielding to the
 * event loop between points; tests use it, and the thread engine falls back
 * to it when a worker cannot be started.
 *
 * Workers start through analysis/worker-start.ts, in each of the source,
 * compiled and bundle layouts. From the single-file bundle the point worker
 * is dist/point-worker.mjs (or dist/ui/worker.js); if neither is there it
 * starts the bundle itself, which serves sweep chunks but not points, so
 * that worker exits unused and points run on this thread.
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { startModuleWorker, type WorkerModule } from '../analysis/worker-start.js';
import type { WarmStart } from '../core/engine.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { chunkSpeeds, runChunk } from '../analysis/sweep.js';
import { SWEEP_WORKER_FLAG, type ChunkJob, type ChunkReply } from '../analysis/worker.js';
import type { PulseSummary } from './state.js';
import { UI_WORKER_FLAG, runPointJob, type PointJob, type PointReply } from './worker.js';

export interface PointOutcome {
  result: PointResult;
  warmStart: WarmStart;
  pulse?: PulseSummary | undefined;
}

/** A failed run: `badInput` when the model's values are at fault (SimulationError 'invalid'). */
export class RunError extends Error {
  constructor(
    message: string,
    readonly badInput: boolean,
  ) {
    super(message);
    this.name = 'RunError';
  }
}

export interface SweepCallbacks {
  /** a finished point: its index in `rpms`, ηv, and whether it converged */
  onPoint: (index: number, volumetricEfficiency: number, converged: boolean) => void;
  onDone: () => void;
  onError: (message: string) => void;
}

export interface SweepHandle {
  cancel: () => void;
}

export interface EngineService {
  runPoint: (model: EngineModel, warmStart?: WarmStart) => Promise<PointOutcome>;
  runSweep: (model: EngineModel, rpms: readonly number[], cb: SweepCallbacks) => SweepHandle;
  close: () => Promise<void>;
}

function replyToOutcome(reply: PointReply): PointOutcome {
  if (!('id' in reply)) throw new Error('unexpected worker reply');
  if (reply.ok) return { result: reply.result, warmStart: reply.warmStart, pulse: reply.pulse };
  const bad = reply.error.name === 'SimulationError' && reply.error.code === 'invalid';
  throw new RunError(
    reply.error.name === 'SimulationError' ? `The simulation ${reply.error.code === 'diverged' ? 'diverged' : 'could not start'}: ${reply.error.message}` : reply.error.message,
    bad,
  );
}

const nextTurn = (): Promise<void> => new Promise((r) => setImmediate(r));

/** Everything on this thread, one point per event-loop turn. */
export function inlineEngine(): EngineService {
  let id = 0;
  return {
    async runPoint(model, warmStart) {
      await nextTurn();
      const job: PointJob = { id: ++id, model, ...(warmStart ? { warmStart } : {}) };
      return replyToOutcome(runPointJob(job));
    },
    runSweep(model, rpms, cb) {
      let cancelled = false;
      const order = rpms.map((rpm, index) => ({ rpm, index }));
      void (async () => {
        try {
          let start = 0;
          for (const chunk of chunkSpeeds(rpms)) {
            await nextTurn();
            if (cancelled) return;
            const points = runChunk(model, chunk);
            points.forEach((p, k) => {
              const at = order[start + k];
              if (!cancelled && at) cb.onPoint(at.index, p.volumetricEfficiency, p.converged);
            });
            start += chunk.length;
          }
          if (!cancelled) cb.onDone();
        } catch (e) {
          if (!cancelled) cb.onError(e instanceof Error ? e.message : String(e));
        }
      })();
      return {
        cancel() {
          cancelled = true;
        },
      };
    },
    async close() {},
  };
}

/** Start a module of src/ (e.g. 'ui/worker') on a worker thread (analysis/worker-start.ts). */
function startWorker(module: WorkerModule, flag: string): Worker {
  return quiet(startModuleWorker(module, flag, { stderr: true }));
}

/** A worker's stderr must not write over the screen: read and drop it. */
function quiet(w: Worker): Worker {
  w.stderr.resume();
  return w;
}

export interface ThreadEngineOptions {
  /** sweep threads (default: cores − 1, at least 1, at most 4) */
  sweepJobs?: number;
}

/**
 * Points on a worker of our own, sweeps on the analysis module's workers.
 * The point worker starts at once; until it is up (seconds under tsx, a
 * fraction of a second compiled) points run on this thread. Sweep threads
 * are kept between sweeps; stopping a sweep ends the threads still busy
 * with it.
 */
export function threadEngine(
  options: ThreadEngineOptions = {},
): EngineService & { onThread: () => boolean; whenReady: () => Promise<boolean> } {
  const inline = inlineEngine();
  let pointWorker: Worker | undefined;
  let up = false;
  let broken = false;
  let nextId = 0;
  const pending = new Map<number, { resolve: (o: PointOutcome) => void; reject: (e: Error) => void }>();

  const failAll = (e: Error): void => {
    for (const p of pending.values()) p.reject(e);
    pending.clear();
  };

  let signalReady: (ok: boolean) => void = () => undefined;
  let readyPromise = Promise.resolve(false);
  const startPointWorker = (): void => {
    if (broken || pointWorker) return;
    readyPromise = new Promise<boolean>((r) => (signalReady = r));
    let w: Worker;
    try {
      w = startWorker('ui/worker', UI_WORKER_FLAG);
    } catch {
      broken = true;
      signalReady(false);
      return;
    }
    pointWorker = w;
    let served = false;
    w.on('message', (msg: PointReply) => {
      if ('ready' in msg) {
        served = true;
        up = true;
        signalReady(true);
        return;
      }
      const p = pending.get(msg.id);
      if (!p) return;
      pending.delete(msg.id);
      try {
        p.resolve(replyToOutcome(msg));
      } catch (e) {
        p.reject(e instanceof Error ? e : new Error(String(e)));
      }
    });
    let gone = false;
    const down = (why: string): void => {
      if (gone) return;
      gone = true;
      pointWorker = undefined;
      up = false;
      // one that never served will not: run points on this thread from now on
      if (!served) broken = true;
      signalReady(false);
      failAll(new RunError(`the simulation thread stopped (${why})`, false));
    };
    w.on('error', (e) => down(e instanceof Error ? e.message : String(e)));
    w.on('exit', (code) => down(`exit code ${code}`));
  };
  startPointWorker();

  // sweep threads: idle ones wait for the next sweep
  const idle: Worker[] = [];
  const allSweep = new Set<Worker>();
  const handlers = new Map<Worker, (msg: ChunkReply | { crashed: string }) => void>();
  const acquire = (): Worker => {
    const reuse = idle.pop();
    if (reuse) return reuse;
    const w = startWorker('analysis/worker', SWEEP_WORKER_FLAG);
    allSweep.add(w);
    w.on('message', (msg: ChunkReply) => handlers.get(w)?.(msg));
    const crash = (why: string): void => {
      allSweep.delete(w);
      const k = idle.indexOf(w);
      if (k >= 0) idle.splice(k, 1);
      handlers.get(w)?.({ crashed: why });
      handlers.delete(w);
    };
    w.on('error', (e) => crash(`sweep thread failed: ${e instanceof Error ? e.message : String(e)}`));
    w.on('exit', (code) => crash(`sweep thread stopped early (exit code ${code})`));
    return w;
  };
  const release = (w: Worker): void => {
    handlers.delete(w);
    if (allSweep.has(w)) idle.push(w);
  };
  const kill = (w: Worker): void => {
    handlers.delete(w);
    allSweep.delete(w);
    void w.terminate();
  };

  let served = false;
  return {
    /** whether the last point ran on the worker thread (false: on this thread) */
    onThread: () => served,
    /** resolves when the point worker is up (true) or cannot be (false) */
    whenReady: () => readyPromise,

    async runPoint(model, warmStart) {
      if (!up || !pointWorker) {
        startPointWorker();
        served = false;
        return inline.runPoint(model, warmStart);
      }
      served = true;
      const w = pointWorker;
      const id = ++nextId;
      return new Promise<PointOutcome>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        const job: PointJob = { id, model, ...(warmStart ? { warmStart } : {}) };
        w.postMessage(job);
      });
    },

    runSweep(model, rpms, cb) {
      const chunks = chunkSpeeds(rpms);
      const jobs = Math.max(1, Math.min(options.sweepJobs ?? Math.min(4, availableParallelism() - 1), chunks.length));
      const mine = new Set<Worker>();
      const busy = new Set<Worker>();
      let over = false;
      let next = 0;
      let finished = 0;
      const offsets: number[] = [];
      chunks.reduce((at, c) => (offsets.push(at), at + c.length), 0);
      const end = (): void => {
        over = true;
        for (const w of mine) {
          if (busy.has(w)) kill(w);
          else release(w);
        }
        mine.clear();
        busy.clear();
      };
      const fail = (message: string): void => {
        if (over) return;
        end();
        cb.onError(message);
      };
      const feed = (w: Worker): void => {
        if (over) return;
        if (next >= chunks.length) {
          busy.delete(w);
          return;
        }
        const id = next++;
        const job: ChunkJob = { id, model, rpms: chunks[id] ?? [], assumptions: {} };
        busy.add(w);
        w.postMessage(job);
      };
      let fallback: SweepHandle | undefined;
      for (let k = 0; k < jobs; k++) {
        let w: Worker;
        try {
          w = acquire();
        } catch {
          if (mine.size === 0) fallback = inline.runSweep(model, rpms, cb);
          break;
        }
        mine.add(w);
        handlers.set(w, (msg) => {
          if (over) return;
          if ('crashed' in msg) return fail(msg.crashed);
          if ('progress' in msg) return;
          if ('error' in msg) return fail(msg.error.name === 'SimulationError' ? `The sweep diverged: ${msg.error.message}` : msg.error.message);
          const at = offsets[msg.id] ?? 0;
          msg.points.forEach((p, j) => cb.onPoint(at + j, p.volumetricEfficiency, p.converged));
          finished++;
          busy.delete(w);
          if (finished === chunks.length) {
            end();
            cb.onDone();
          } else feed(w);
        });
        feed(w);
      }
      return {
        cancel() {
          fallback?.cancel();
          end();
        },
      };
    },

    async close() {
      const all = [...allSweep];
      allSweep.clear();
      idle.length = 0;
      handlers.clear();
      const w = pointWorker;
      pointWorker = undefined;
      broken = true;
      failAll(new RunError('closed', false));
      await Promise.all([...all.map((t) => t.terminate()), w ? w.terminate() : Promise.resolve(0)]);
    },
  };
}
