/**
 * Parallel speed sweeps on node:worker_threads.
 *
 * The sweep is cut into the same fixed chunks as the serial run (sweep.ts:
 * chunkSpeeds), and each chunk runs whole on one thread, cold first point,
 * warm after. The numbers therefore do not depend on the job count:
 * `--jobs 1` and `--jobs 8` give identical results.
 *
 * With N jobs, N − 1 worker threads are started and this thread is the N-th
 * (a worker costs a start-up and its own compiler warm-up). Workers take
 * chunks from the slow end (low speeds cost the most steps per cycle), two
 * in flight each so they never wait for this thread; this thread takes
 * chunks from the fast end and yields between points to answer them. With
 * one job (or one chunk) no thread is started.
 *
 * Workers are started by worker-start.ts (source, compiled and bundle
 * layouts). The bundle's entry check must stay false on a worker thread: an
 * entry that runs unconditionally must check isMainThread (or isSweepWorker()).
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { SimulationError } from '../core/index.js';
import type { EngineModel } from '../core/model.js';
import type { OutputAssumptions } from './estimates.js';
import { chunkPoints, chunkSpeeds, runChunk, type SweepPoint } from './sweep.js';
import { SWEEP_WORKER_FLAG, type ChunkJob, type ChunkReply } from './worker.js';
import { startModuleWorker } from './worker-start.js';

export interface ParallelSweepOptions {
  /** worker threads to use (default: the number of cores) */
  jobs?: number;
  assumptions?: Partial<OutputAssumptions>;
  /** called after each finished point: how many are done of how many, and its speed */
  onProgress?: (done: number, total: number, rpm: number) => void;
}

export function defaultJobs(): number {
  return Math.max(1, availableParallelism());
}

function startWorker(): Worker {
  return startModuleWorker('analysis/worker', SWEEP_WORKER_FLAG);
}

function rebuildError(e: { name: string; message: string; code?: string }): Error {
  if (e.name === 'SimulationError' && (e.code === 'diverged' || e.code === 'invalid')) return new SimulationError(e.code, e.message);
  return new Error(`sweep worker failed: ${e.message}`);
}

export interface SweepTask {
  model: EngineModel;
  /** speeds, ascending [rpm] */
  rpms: readonly number[];
}

/**
 * Run a sweep over `rpms` (ascending), in parallel when jobs > 1.
 * Results are in the order of `rpms` and identical for any job count.
 */
export async function runSweep(model: EngineModel, rpms: readonly number[], options: ParallelSweepOptions = {}): Promise<SweepPoint[]> {
  const [points] = await runSweeps([{ model, rpms }], options);
  return points ?? [];
}

/**
 * Run several sweeps (e.g. the designs of a tune) through one queue of
 * chunks, so all workers stay busy across designs. Each sweep's points come
 * back in its own order; the numbers are those of runSweepSerial.
 */
export async function runSweeps(tasks: readonly SweepTask[], options: ParallelSweepOptions = {}): Promise<SweepPoint[][]> {
  const chunks = tasks.flatMap((t, task) => chunkSpeeds(t.rpms).map((rpms) => ({ task, rpms })));
  const total = tasks.reduce((n, t) => n + t.rpms.length, 0);
  const assumptions = options.assumptions ?? {};
  const jobs = Math.max(1, Math.min(Math.floor(options.jobs ?? defaultJobs()), chunks.length));
  let done = 0;
  const tick = (rpm: number): void => {
    done++;
    options.onProgress?.(done, total, rpm);
  };
  const results: SweepPoint[][] = new Array<SweepPoint[]>(chunks.length);
  const gather = (): SweepPoint[][] => {
    const out: SweepPoint[][] = tasks.map(() => []);
    chunks.forEach((c, i) => out[c.task]!.push(...(results[i] ?? [])));
    return out;
  };

  if (jobs <= 1) {
    for (let i = 0; i < chunks.length; i++) {
      const c = chunks[i]!;
      results[i] = runChunk(tasks[c.task]!.model, c.rpms, assumptions, (p) => tick(p.rpm));
      // let the event loop breathe between chunks (signals, progress output)
      await new Promise<void>((r) => setImmediate(r));
    }
    return gather();
  }

  // jobs − 1 workers take chunks from the slow (low-speed) end, two in flight
  // each so a worker never waits for this thread; this thread works from the
  // fast end, yielding between points so the workers' messages get answered
  const workers: Worker[] = [];
  let front = 0;
  let back = chunks.length - 1;
  let finished = 0;
  let failure: Error | undefined;
  let resolveAll: () => void = () => {};
  let rejectAll: (e: Error) => void = () => {};
  const allDone = new Promise<void>((res, rej) => {
    resolveAll = res;
    rejectAll = rej;
  });
  allDone.catch(() => {}); // awaited below; this only keeps an early failure from being "unhandled"
  const fail = (e: Error): void => {
    if (failure) return;
    failure = e;
    rejectAll(e);
  };
  const complete = (id: number, points: SweepPoint[]): void => {
    results[id] = points;
    finished++;
    if (finished === chunks.length) resolveAll();
  };
  const feed = (w: Worker): void => {
    if (failure || front > back) return;
    const id = front++;
    const c = chunks[id]!;
    const job: ChunkJob = { id, model: tasks[c.task]!.model, rpms: c.rpms, assumptions };
    w.postMessage(job);
  };
  try {
    for (let i = 0; i < jobs - 1; i++) {
      const w = startWorker();
      workers.push(w);
      w.on('message', (msg: ChunkReply) => {
        if ('progress' in msg) tick(msg.progress);
        else if ('error' in msg) fail(rebuildError(msg.error));
        else {
          complete(msg.id, msg.points);
          feed(w);
        }
      });
      w.on('error', (e) => fail(new Error(`sweep worker failed: ${e instanceof Error ? e.message : String(e)}`)));
      w.on('exit', (code) => {
        if (finished < chunks.length) fail(new Error(`sweep worker stopped early (exit code ${code})`));
      });
      feed(w);
    }
    for (const w of workers) if (back - front + 1 > jobs) feed(w);
    while (!failure && front <= back) {
      const id = back--;
      const c = chunks[id]!;
      const points: SweepPoint[] = [];
      for (const p of chunkPoints(tasks[c.task]!.model, c.rpms, assumptions)) {
        points.push(p);
        tick(p.rpm);
        await new Promise<void>((r) => setImmediate(r));
        if (failure) break;
      }
      if (!failure) complete(id, points);
    }
    await allDone;
  } catch (e) {
    fail(e instanceof Error ? e : new Error(String(e)));
    throw e;
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return gather();
}
