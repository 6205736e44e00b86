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
 * Starting a worker in the three ways the code is run (as the analysis
 * module's worker pool does):
 *   - .ts source (vitest, tsx): the worker module and its imports bundled
 *     once in memory by esbuild and started as an eval script; without
 *     esbuild, an eval bootstrap registers tsx's ESM loader and imports the
 *     .ts module (slower);
 *   - compiled (dist/ui/engine-service.js): the .js module beside it;
 *   - single-file bundle: a worker-only bundle beside it (WORKER_BUNDLES:
 *     dist/point-worker.mjs, dist/sweep-worker.mjs) when the build makes
 *     one, else the compiled module beside it (dist/ui/worker.js,
 *     dist/analysis/worker.js, left by the tsc step of the build), else the
 *     bundle itself with the worker's flag in workerData. The bundle serves
 *     sweep chunks that way; it serves points only if its entry loads
 *     ui/worker.js, else that worker exits unused and points run on this
 *     thread.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
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

type Layout = 'source' | 'compiled' | 'bundle';

export function workerLayout(moduleUrl: string = import.meta.url): Layout {
  if (/\.[cm]?tsx?$/.test(moduleUrl)) return 'source';
  if (/\/ui\/engine-service\.js$/.test(moduleUrl)) return 'compiled';
  return 'bundle';
}

/** Worker-only bundles the build may leave beside the main bundle, by module. */
export const WORKER_BUNDLES: Readonly<Record<string, string>> = {
  'ui/worker': 'point-worker.mjs',
  'analysis/worker': 'sweep-worker.mjs',
};

const bundledSources = new Map<string, string | null>();

/** A module of src/ and its imports as one CommonJS script, built once in memory by esbuild (source layout). */
function bundledSource(module: string, here: string): string | undefined {
  if (!bundledSources.has(module)) {
    try {
      const esbuild = createRequire(here)('esbuild') as typeof import('esbuild');
      const out = esbuild.buildSync({
        entryPoints: [fileURLToPath(new URL(`../${module}.ts`, here))],
        bundle: true,
        platform: 'node',
        format: 'cjs',
        target: 'node20',
        write: false,
        logLevel: 'silent',
      });
      bundledSources.set(module, out.outputFiles[0]?.text ?? null);
    } catch {
      bundledSources.set(module, null);
    }
  }
  return bundledSources.get(module) ?? undefined;
}

/**
 * Start a worker for a module of src/ (e.g. 'ui/worker'), in whichever
 * layout this file runs (see the file header).
 */
function startWorker(module: string, flag: string): Worker {
  const here = import.meta.url;
  const workerData = { [flag]: true };
  const opts = { workerData, stderr: true } as const;
  switch (workerLayout(here)) {
    case 'source': {
      const code = bundledSource(module, here);
      if (code !== undefined) return quiet(new Worker(code, { ...opts, eval: true }));
      const tsxApi = pathToFileURL(createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
      const target = new URL(`../${module}.ts`, here).href;
      const boot =
        `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); })` +
        `.catch((e) => { console.error(e); process.exit(1); });`;
      return quiet(new Worker(boot, { ...opts, eval: true }));
    }
    case 'compiled':
      return quiet(new Worker(new URL(`../${module}.js`, here), opts));
    case 'bundle': {
      const small = WORKER_BUNDLES[module];
      for (const beside of [small ? new URL(`./${small}`, here) : undefined, new URL(`./${module}.js`, here)]) {
        if (beside && existsSync(beside)) return quiet(new Worker(beside, opts));
      }
      // the main bundle itself, through an eval bootstrap so the worker's
      // process.argv[1] is '[worker eval]' and the bundle's entry check stays false
      return quiet(new Worker(`import(${JSON.stringify(here)}).catch((e) => { console.error(e); process.exit(1); });`, { ...opts, eval: true }));
    }
  }
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
