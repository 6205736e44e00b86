/**
 * Parallel speed sweeps on node:worker_threads.
 *
 * The sweep is cut into the same fixed chunks as the serial run (sweep.ts:
 * chunkSpeeds), and each chunk runs whole on one thread, cold first point,
 * warm after. Chunks are handed out in ascending speed order (slow speeds
 * cost the most steps per cycle, so they go first) to whichever worker is
 * free. The numbers therefore do not depend on the job count: `--jobs 1`
 * and `--jobs 8` give identical results. With one job (or one chunk) no
 * thread is started.
 *
 * Starting the worker, in the three ways the code is run:
 *   - .ts source (vitest, tsx): Node 20 cannot start a .ts worker, so the
 *     worker is an eval bootstrap that registers tsx's ESM loader (resolved
 *     from this package's node_modules) and then imports worker.ts;
 *   - compiled (dist/analysis/worker-pool.js): new Worker(dist/analysis/worker.js);
 *   - single-file bundle (dist/tractwave.mjs): every module shares the
 *     bundle's import.meta.url, so the worker imports the bundle itself,
 *     through an eval bootstrap. worker.ts, bundled in, serves chunks when
 *     workerData carries SWEEP_WORKER_FLAG. On that thread process.argv[1]
 *     is '[worker eval]', so an entry check that compares argv[1] with the
 *     bundle's path does not start the command line; an entry that runs
 *     unconditionally must check isMainThread (or isSweepWorker()).
 */
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { SimulationError } from '../core/index.js';
import type { EngineModel } from '../core/model.js';
import type { OutputAssumptions } from './estimates.js';
import { chunkSpeeds, runChunk, type SweepPoint } from './sweep.js';
import { SWEEP_WORKER_FLAG, type ChunkJob, type ChunkReply } from './worker.js';

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

/** How the worker is started in this layout (exported for tests and docs). */
export function workerLayout(moduleUrl: string = import.meta.url): 'source' | 'compiled' | 'bundle' {
  if (/\.[cm]?ts$/.test(moduleUrl)) return 'source';
  if (/\/analysis\/worker-pool\.js$/.test(moduleUrl)) return 'compiled';
  return 'bundle';
}

function startWorker(): Worker {
  const here = import.meta.url;
  const workerData = { [SWEEP_WORKER_FLAG]: true };
  switch (workerLayout(here)) {
    case 'source': {
      // tsx's ESM API: require.resolve finds its CommonJS twin beside it
      const tsxApi = pathToFileURL(createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
      const target = new URL('./worker.ts', here).href;
      const code =
        `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); })` +
        `.catch((e) => { console.error(e); process.exit(1); });`;
      return new Worker(code, { eval: true, workerData });
    }
    case 'compiled':
      return new Worker(new URL('./worker.js', here), { workerData });
    case 'bundle':
      // an eval bootstrap, so the worker's process.argv[1] is '[worker eval]',
      // not the bundle: the bundle's "am I the entry script?" check stays false
      // and only worker.ts (bundled in) acts, on SWEEP_WORKER_FLAG
      return new Worker(`import(${JSON.stringify(here)}).catch((e) => { console.error(e); process.exit(1); });`, {
        eval: true,
        workerData,
      });
  }
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

  const workers: Worker[] = [];
  let next = 0;
  let finished = 0;
  try {
    await new Promise<void>((resolve, reject) => {
      let failed = false;
      const fail = (e: Error): void => {
        if (failed) return;
        failed = true;
        reject(e);
      };
      const feed = (w: Worker): void => {
        if (failed || next >= chunks.length) return;
        const id = next++;
        const c = chunks[id]!;
        const job: ChunkJob = { id, model: tasks[c.task]!.model, rpms: c.rpms, assumptions };
        w.postMessage(job);
      };
      for (let i = 0; i < jobs; i++) {
        const w = startWorker();
        workers.push(w);
        w.on('message', (msg: ChunkReply) => {
          if ('progress' in msg) tick(msg.progress);
          else if ('error' in msg) fail(rebuildError(msg.error));
          else {
            results[msg.id] = msg.points;
            finished++;
            if (finished === chunks.length) resolve();
            else feed(w);
          }
        });
        w.on('error', (e) => fail(new Error(`sweep worker failed: ${e instanceof Error ? e.message : String(e)}`)));
        w.on('exit', (code) => {
          if (finished < chunks.length) fail(new Error(`sweep worker stopped early (exit code ${code})`));
        });
        feed(w);
      }
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return gather();
}
