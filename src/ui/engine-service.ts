/**
 * Running the core for the terminal view without freezing the keys.
 *
 * `threadEngine()` runs everything on the process's one worker pool
 * (analysis/worker-pool.ts), started when the view opens and kept while it
 * is open: single points go ahead of any sweep points waiting, and sweeps run
 * in the same fixed warm-start chunks as `tractwave sweep`, so the curve
 * shown here has the command's numbers. A sweep fills in from the speed the
 * view is at outwards (the chunks nearest it first). Stopping a sweep drops
 * its points; a point already running finishes on its worker, which stays
 * warm for the next.
 *
 * Warm starts: a point starts from the converged state of its nearest
 * converged neighbour — the nearest speed of the last sweep of exactly this
 * model when there is one (so stepping the speed after a sweep starts each
 * point from the sweep's state there), else the point shown before it (the
 * view passes that one in).
 *
 * `inlineEngine()` runs everything on the calling thread, yielding to the
 * event loop between points; tests use it, and the thread engine falls back
 * to it when no worker can be started.
 */
import { availableParallelism } from 'node:os';
import type { WarmStart } from '../core/engine.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { chunkSpeeds, runChunk } from '../analysis/sweep.js';
import { closeSharedPool, sharedPool, startSweeps, type WorkerPool } from '../analysis/worker-pool.js';
import { viewPoint, jobError, type JobError, type ViewPoint } from '../analysis/worker.js';
import { summariseTiming } from './pulse-summary.js';
import type { PulseSummary } from './state.js';

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

function toOutcome(v: ViewPoint): PointOutcome {
  return { result: v.result, warmStart: v.warmStart, pulse: v.pulse ? summariseTiming(v.pulse) : undefined };
}

function toRunError(e: JobError): RunError {
  const bad = e.name === 'SimulationError' && e.code === 'invalid';
  return new RunError(e.name === 'SimulationError' ? `The simulation ${e.code === 'diverged' ? 'diverged' : 'could not start'}: ${e.message}` : e.message, bad);
}

/** One point on this thread, as the worker would run it. */
function pointHere(model: EngineModel, warmStart?: WarmStart): PointOutcome {
  let v: ViewPoint;
  try {
    v = viewPoint(model, warmStart);
  } catch (e) {
    throw toRunError(jobError(e));
  }
  return toOutcome(v);
}

const nextTurn = (): Promise<void> => new Promise((r) => setImmediate(r));

/** Everything on this thread, one point per event-loop turn. */
export function inlineEngine(): EngineService {
  return {
    async runPoint(model, warmStart) {
      await nextTurn();
      return pointHere(model, warmStart);
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

export interface ThreadEngineOptions {
  /** points of a sweep in flight at once (default: the cores, at least 2, at most 4) */
  sweepJobs?: number;
  /** the pool (default: the process's) */
  pool?: WorkerPool;
}

/** The model without its speed, as a key: points of one sweep share it. */
function modelKey(model: EngineModel): string {
  return JSON.stringify({ ...model, rpm: 0 });
}

/**
 * Points and sweeps on the process's worker pool (see the header). The
 * workers start at once; a point asked for before one is up waits for it
 * (a fraction of a second from the build, longer from the .ts sources).
 */
export function threadEngine(options: ThreadEngineOptions = {}): EngineService & { onThread: () => boolean; whenReady: () => Promise<boolean> } {
  const inline = inlineEngine();
  const pool = options.pool ?? sharedPool();
  const jobs = Math.max(1, Math.floor(options.sweepJobs ?? Math.min(4, Math.max(2, availableParallelism()))));
  pool.grow(jobs);
  let closed = false;
  let served = false;
  /** the converged states of the last finished sweep, by speed, and the model they belong to */
  let neighbours: { key: string; states: Map<number, WarmStart> } | undefined;

  const nearestState = (model: EngineModel): WarmStart | undefined => {
    if (!neighbours || neighbours.states.size === 0 || neighbours.key !== modelKey(model)) return undefined;
    // the nearest speed; of two as near, the lower (the states arrive in no fixed order)
    let best: WarmStart | undefined;
    let bestRpm = Number.POSITIVE_INFINITY;
    let gap = Number.POSITIVE_INFINITY;
    for (const [rpm, state] of neighbours.states) {
      const d = Math.abs(rpm - model.rpm);
      if (d < gap || (d === gap && rpm < bestRpm)) {
        gap = d;
        bestRpm = rpm;
        best = state;
      }
    }
    return best;
  };

  return {
    /** whether the last point ran on a worker thread (false: on this thread) */
    onThread: () => served,
    /** resolves when a worker is up (true) or cannot be (false) */
    whenReady: () => pool.whenReady(),

    async runPoint(model, warmStart) {
      const warm = nearestState(model) ?? warmStart;
      if (closed || pool.failure) {
        served = false;
        return inline.runPoint(model, warm);
      }
      let reply: Awaited<ReturnType<WorkerPool['viewPoint']>>;
      try {
        reply = await pool.viewPoint(model, warm);
      } catch (e) {
        // the pool cannot run workers here (or stopped): this thread runs the point
        if (pool.failure && !closed) {
          served = false;
          return inline.runPoint(model, warm);
        }
        throw new RunError(`the simulation thread stopped (${e instanceof Error ? e.message : String(e)})`, false);
      }
      served = true;
      if ('error' in reply) throw toRunError(reply.error);
      return toOutcome(reply);
    },

    runSweep(model, rpms, cb) {
      if (closed || pool.failure) return inline.runSweep(model, rpms, cb);
      const key = modelKey(model);
      const states = new Map<number, WarmStart>();
      let over = false;
      let fallback: SweepHandle | undefined;
      const run = startSweeps([{ model, rpms }], {
        jobs,
        pool,
        focusRpm: model.rpm,
        onPoint: (_task, index, p, state) => {
          states.set(p.rpm, state);
          cb.onPoint(index, p.volumetricEfficiency, p.converged);
        },
      });
      run.done.then(
        () => {
          if (over) return;
          over = true;
          neighbours = { key, states };
          cb.onDone();
        },
        (e: unknown) => {
          if (over) return;
          if (pool.failure && !closed) {
            // no worker can start here: run the sweep on this thread instead
            fallback = inline.runSweep(model, rpms, cb);
            return;
          }
          over = true;
          const err = e instanceof Error ? e : new Error(String(e));
          cb.onError(err.name === 'SimulationError' ? `The sweep diverged: ${err.message}` : err.message);
        },
      );
      return {
        cancel() {
          over = true;
          run.cancel();
          fallback?.cancel();
        },
      };
    },

    async close() {
      closed = true;
      // the process's pool is closed through its owner, so the next user gets a new one
      await (options.pool ? pool.close() : closeSharedPool());
    },
  };
}
