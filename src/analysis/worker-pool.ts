/**
 * The process's one pool of worker threads, and the parallel speed sweeps
 * that run on it.
 *
 * The pool (`sharedPool()`): worker threads (worker.ts) that each run one
 * point at a time, started on demand (or ahead of need with `prestartPool`,
 * in parallel with loading the case) and kept for the rest of the process —
 * a second sweep, the next design of a tune, or the terminal view's next
 * point finds them started and their compiler warm. Idle workers are
 * unreferenced, so a command's process ends when its work does. Jobs wait in
 * one queue, the most urgent first (the view's points before sweep points),
 * first come first served within a level.
 *
 * The sweeps (`runSweeps`, `startSweeps`): every sweep is cut into the same
 * fixed chunks as the serial run (sweep.ts chunkSpeeds). A chunk is a chain:
 * its first point starts cold, each next point from the converged state of
 * the point before it. The state travels with the job, so any worker can run
 * any point; the chain itself is fixed by the speeds alone. The numbers
 * therefore do not depend on the job count or on which thread ran what:
 * `--jobs 1` and `--jobs 8` give identical results.
 *
 * Scheduling: at most `jobs` points of a batch are in flight, one per chain;
 * a free slot goes to the chain with the most work left (longest remaining
 * chain first, by cost.ts's estimate per point: the low speeds cost the most
 * steps), or, for the view, to the chain nearest the speed the user looks at
 * (`focusRpm`), so the curve fills in from the cursor outwards. Work moves a
 * point at a time, so the threads finish together to within one point.
 *
 * With one job no thread is started: the chains run here, yielding to the
 * event loop between points. So do they when no worker can start in this
 * layout (the pool's `failure`), with the same numbers.
 *
 * Workers are started by worker-start.ts (source, compiled and bundle
 * layouts). The bundle's entry check must stay false on a worker thread: an
 * entry that runs unconditionally must check isMainThread (or isSweepWorker()).
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import type { WarmStart } from '../core/engine.js';
import { SimulationError } from '../core/index.js';
import type { EngineModel } from '../core/model.js';
import { pointSeconds } from './cost.js';
import type { OutputAssumptions } from './estimates.js';
import { chunkSpeeds, sweepPoint, type SweepPoint } from './sweep.js';
import { SWEEP_WORKER_FLAG, type JobError, type PointJob, type SweepPointJob, type ViewPoint, type ViewPointJob, type WorkerReply } from './worker.js';
import { startModuleWorker } from './worker-start.js';

export function defaultJobs(): number {
  return Math.max(1, availableParallelism());
}

/** A job's failure as an Error again: the core's SimulationError keeps its class and code. */
export function rebuildError(e: JobError): Error {
  if (e.name === 'SimulationError' && (e.code === 'diverged' || e.code === 'invalid')) return new SimulationError(e.code, e.message);
  return new Error(`sweep worker failed: ${e.message}`);
}

/** How urgent a job is: lower runs first. */
export const PRIORITY = { view: 0, sweep: 1 } as const;

type JobBody = Omit<SweepPointJob, 'id'> | Omit<ViewPointJob, 'id'>;
type SweepOut = { point: SweepPoint; warmStart: WarmStart };

interface Queued {
  body: JobBody;
  priority: number;
  seq: number;
  resolve: (reply: WorkerReply) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  job?: Queued | undefined;
  /** answered at least once (ready or a reply): a worker that never did cannot start here */
  served: boolean;
}

export interface WorkerPoolOptions {
  /** start a worker (default: worker.ts through worker-start.ts); tests count starts through it */
  start?: () => Worker;
}

export class WorkerPool {
  private readonly slots: Slot[] = [];
  private queue: Queued[] = [];
  private seq = 0;
  private nextId = 0;
  private startedCount = 0;
  private closed = false;
  private broken: Error | undefined;
  private readyWaiters: ((ok: boolean) => void)[] = [];
  private readonly start: () => Worker;

  constructor(options: WorkerPoolOptions = {}) {
    // the worker shares this process's stderr: a piped one that is read keeps the process alive, and the worker writes there only when it cannot start
    this.start = options.start ?? (() => startModuleWorker('analysis/worker', SWEEP_WORKER_FLAG));
  }

  /** workers started over the pool's life (a replacement after a crash counts too) */
  get started(): number {
    return this.startedCount;
  }

  /** workers running now */
  get size(): number {
    return this.slots.length;
  }

  /** whether some worker has answered (false until the first is up, or when none can start) */
  get up(): boolean {
    return this.slots.some((s) => s.served);
  }

  /** the reason no worker can run here, once that is known */
  get failure(): Error | undefined {
    return this.broken;
  }

  /** Start workers until there are `n` (none when closed or broken). Returns at once. */
  grow(n: number): void {
    while (!this.closed && !this.broken && this.slots.length < n) this.spawn();
  }

  /** Resolves true when a worker is serving, false when none can start (or the pool is closed). */
  whenReady(): Promise<boolean> {
    if (this.up) return Promise.resolve(true);
    if (this.broken || this.closed || this.slots.length === 0) return Promise.resolve(false);
    return new Promise((r) => this.readyWaiters.push(r));
  }

  /** Run one job on a worker (grow the pool first: a job waits for a free worker). */
  run(body: JobBody, priority: number): Promise<WorkerReply> {
    if (this.closed) return Promise.reject(new Error('the worker pool is closed'));
    if (this.broken) return Promise.reject(this.broken);
    return new Promise<WorkerReply>((resolve, reject) => {
      this.queue.push({ body, priority, seq: this.seq++, resolve, reject });
      if (this.slots.length === 0) this.grow(1);
      this.dispatch();
    });
  }

  /** One sweep point (sweep.ts sweepPoint) on a worker. */
  async sweepPoint(model: EngineModel, rpm: number, assumptions: Partial<OutputAssumptions>, warm: WarmStart | undefined): Promise<SweepOut> {
    const reply = await this.run({ kind: 'sweep', model, rpm, assumptions, ...(warm ? { warmStart: warm } : {}) }, PRIORITY.sweep);
    if ('error' in reply) throw rebuildError(reply.error);
    if (!('point' in reply)) throw new Error('sweep worker failed: unexpected reply');
    return { point: reply.point, warmStart: reply.warmStart };
  }

  /** One point for the terminal view on a worker, ahead of any sweep points waiting. A failure rejects with the job's error as data. */
  async viewPoint(model: EngineModel, warm: WarmStart | undefined): Promise<ViewPoint | { error: JobError }> {
    const reply = await this.run({ kind: 'view', model, ...(warm ? { warmStart: warm } : {}) }, PRIORITY.view);
    if ('error' in reply) return { error: reply.error };
    if (!('view' in reply)) throw new Error('point worker failed: unexpected reply');
    return reply.view;
  }

  /** Stop every worker; waiting and running jobs fail. */
  async close(): Promise<void> {
    this.closed = true;
    const gone = new Error('the worker pool is closed');
    for (const q of this.queue) q.reject(gone);
    this.queue = [];
    const slots = this.slots.splice(0);
    for (const s of slots) s.job?.reject(gone);
    for (const r of this.readyWaiters.splice(0)) r(false);
    await Promise.all(slots.map((s) => s.worker.terminate()));
  }

  private spawn(): void {
    let worker: Worker;
    try {
      worker = this.start();
    } catch (e) {
      this.breakDown(new Error(`no worker thread could be started: ${e instanceof Error ? e.message : String(e)}`));
      return;
    }
    this.startedCount++;
    worker.unref();
    const slot: Slot = { worker, served: false };
    this.slots.push(slot);
    worker.on('message', (msg: WorkerReply) => {
      if (!slot.served) {
        slot.served = true;
        for (const r of this.readyWaiters.splice(0)) r(true);
      }
      if ('ready' in msg) return;
      const job = slot.job;
      slot.job = undefined;
      worker.unref();
      // the next job goes out before this one's caller hears of it, so the
      // most urgent waiting job gets the free worker
      this.dispatch();
      job?.resolve(msg);
    });
    let gone = false;
    const down = (why: string): void => {
      if (gone) return;
      gone = true;
      const k = this.slots.indexOf(slot);
      if (k >= 0) this.slots.splice(k, 1);
      const err = new Error(`sweep worker stopped early (${why})`);
      slot.job?.reject(err);
      slot.job = undefined;
      if (this.closed) return;
      // a worker that never answered will not: this layout cannot run workers
      if (!slot.served && !this.slots.some((s) => s.served)) return this.breakDown(new Error(`no worker thread could be started (${why})`));
      if (this.queue.length > 0) this.grow(1);
      this.dispatch();
    };
    worker.on('error', (e) => down(e instanceof Error ? e.message : String(e)));
    worker.on('exit', (code) => down(`exit code ${code}`));
  }

  private breakDown(e: Error): void {
    this.broken = e;
    for (const q of this.queue) q.reject(e);
    this.queue = [];
    for (const r of this.readyWaiters.splice(0)) r(false);
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (slot.job || this.queue.length === 0) continue;
      let best = 0;
      for (let k = 1; k < this.queue.length; k++) {
        const a = this.queue[k]!;
        const b = this.queue[best]!;
        if (a.priority < b.priority || (a.priority === b.priority && a.seq < b.seq)) best = k;
      }
      const job = this.queue.splice(best, 1)[0]!;
      slot.job = job;
      slot.worker.ref();
      slot.worker.postMessage({ ...job.body, id: ++this.nextId } as PointJob);
    }
  }
}

let shared: WorkerPool | undefined;

/** The process's pool, made on first use and kept. */
export function sharedPool(): WorkerPool {
  if (!shared) shared = new WorkerPool();
  return shared;
}

/** Start the workers `jobs` will need now (jobs ≥ 2), so they load while the case does. */
export function prestartPool(jobs: number): void {
  if (jobs >= 2) sharedPool().grow(jobs);
}

/** Close the process's pool (the next use makes a new one). */
export async function closeSharedPool(): Promise<void> {
  const p = shared;
  shared = undefined;
  await p?.close();
}

// ------------------------------------------------------------------ sweeps

export interface SweepTask {
  model: EngineModel;
  /** speeds, ascending [rpm] */
  rpms: readonly number[];
}

export interface ParallelSweepOptions {
  /** points in flight at once (default: the number of cores); 1 runs on this thread */
  jobs?: number;
  assumptions?: Partial<OutputAssumptions>;
  /** called after each finished point: how many are done of how many, and its speed */
  onProgress?: (done: number, total: number, rpm: number) => void;
  /** called with each finished point: its sweep, its index in that sweep's speeds, its converged state */
  onPoint?: (task: number, index: number, point: SweepPoint, warmStart: WarmStart) => void;
  /** run the chains nearest this speed first (the view's cursor) instead of the longest first */
  focusRpm?: number;
  /** the pool to run on (default: the process's) */
  pool?: WorkerPool;
}

export interface SweepRun {
  /** each sweep's points in its own order; rejects with the first failure */
  done: Promise<SweepPoint[][]>;
  /** stop: nothing more is reported, `done` resolves with the points finished so far (the rest are holes); points already running finish on their workers and are dropped */
  cancel: () => void;
}

interface Chain {
  task: number;
  /** index of the chain's first speed in its sweep */
  offset: number;
  rpms: readonly number[];
  next: number;
  warm?: WarmStart | undefined;
  busy: boolean;
  /** estimated seconds per point, in chain order */
  cost: number[];
}

/** Run several sweeps (e.g. the designs of a tune) through one queue of chains; see the header. */
export function startSweeps(tasks: readonly SweepTask[], options: ParallelSweepOptions = {}): SweepRun {
  const chains: Chain[] = [];
  tasks.forEach((t, task) => {
    let offset = 0;
    for (const rpms of chunkSpeeds(t.rpms)) {
      chains.push({ task, offset, rpms, next: 0, busy: false, cost: rpms.map((r) => safeCost(t.model, r)) });
      offset += rpms.length;
    }
  });
  const total = tasks.reduce((n, t) => n + t.rpms.length, 0);
  const assumptions = options.assumptions ?? {};
  const jobs = Math.max(1, Math.min(Math.floor(options.jobs ?? defaultJobs()), chains.length));
  const out: SweepPoint[][] = tasks.map((t) => new Array<SweepPoint>(t.rpms.length));
  let done = 0;
  let stopped = false;
  let failed = false;
  /** a chain's point is done: keep its state for the chain's next point and report it */
  const record = (c: Chain, point: SweepPoint, warmStart: WarmStart): void => {
    const index = c.offset + c.next;
    c.warm = warmStart;
    c.next++;
    out[c.task]![index] = point;
    done++;
    options.onProgress?.(done, total, point.rpm);
    options.onPoint?.(c.task, index, point, warmStart);
  };
  const focus = options.focusRpm;
  const remaining = (c: Chain): number => c.cost.slice(c.next).reduce((s, x) => s + x, 0);
  /** how far the speeds a chain has still to run lie from the focus (0 when they span it) */
  const gap = (c: Chain, at: number): number => Math.max(0, c.rpms[c.next]! - at, at - c.rpms[c.rpms.length - 1]!);
  /** the free chain to advance next: nearest the focus, else the most work left (ties: first in order) */
  const pick = (): Chain | undefined => {
    let best: Chain | undefined;
    let bestKey = Number.POSITIVE_INFINITY;
    for (const c of chains) {
      if (c.busy || c.next >= c.rpms.length) continue;
      const key = focus !== undefined ? gap(c, focus) : -remaining(c);
      if (key < bestKey) {
        best = c;
        bestKey = key;
      }
    }
    return best;
  };

  /** the chains' remaining points on this thread, yielding to the event loop between points */
  const here = async (): Promise<SweepPoint[][]> => {
    for (let c = pick(); c && !stopped; c = pick()) {
      const { point, warmStart } = sweepPoint(tasks[c.task]!.model, c.rpms[c.next]!, assumptions, c.warm);
      record(c, point, warmStart);
      // let the event loop breathe between points (signals, progress output, keys)
      await new Promise<void>((r) => setImmediate(r));
    }
    return out;
  };
  const pool = jobs > 1 && total > 0 ? (options.pool ?? sharedPool()) : undefined;
  if (!pool || pool.failure) {
    // one job, or no worker can start here: the same chains on this thread, so the same numbers
    return { done: here(), cancel: () => (stopped = true) };
  }

  pool.grow(jobs);
  let inFlight = 0;
  let settle: { resolve: (v: SweepPoint[][]) => void; reject: (e: Error) => void } = { resolve: () => {}, reject: () => {} };
  const doneP = new Promise<SweepPoint[][]>((resolve, reject) => (settle = { resolve, reject }));
  let alone = false;
  const fail = (e: Error): void => {
    if (failed || stopped) return;
    if (pool.failure) {
      // the workers could not start after all: finish here once the points in flight are back
      alone = true;
      if (inFlight === 0) here().then(settle.resolve, settle.reject);
      return;
    }
    failed = true;
    settle.reject(e);
  };
  const feed = (): void => {
    while (!failed && !stopped && !alone && inFlight < jobs) {
      const c = pick();
      if (!c) break;
      c.busy = true;
      inFlight++;
      pool.sweepPoint(tasks[c.task]!.model, c.rpms[c.next]!, assumptions, c.warm).then(
        ({ point, warmStart }) => {
          inFlight--;
          c.busy = false;
          if (failed || stopped) return;
          record(c, point, warmStart);
          if (done === total) settle.resolve(out);
          else if (alone) fail(pool.failure!);
          else feed();
        },
        (e: unknown) => {
          inFlight--;
          c.busy = false;
          fail(e instanceof Error ? e : new Error(String(e)));
        },
      );
    }
  };
  feed();
  return {
    done: doneP,
    cancel: () => {
      if (stopped) return;
      stopped = true;
      if (!failed) settle.resolve(out);
    },
  };
}

function safeCost(model: EngineModel, rpm: number): number {
  let s = Number.NaN;
  try {
    if (rpm > 0) s = pointSeconds(model, rpm);
  } catch {
    // a model the core will refuse: the point fails when it runs
  }
  return Number.isFinite(s) && s > 0 ? s : 1 / Math.max(1, Math.abs(rpm));
}

/**
 * Run several sweeps through one queue of chains, so all workers stay busy
 * across designs. Each sweep's points come back in its own order; the
 * numbers are those of runSweepSerial.
 */
export async function runSweeps(tasks: readonly SweepTask[], options: ParallelSweepOptions = {}): Promise<SweepPoint[][]> {
  return startSweeps(tasks, options).done;
}

/**
 * Run a sweep over `rpms` (ascending), in parallel when jobs > 1.
 * Results are in the order of `rpms` and identical for any job count.
 */
export async function runSweep(model: EngineModel, rpms: readonly number[], options: ParallelSweepOptions = {}): Promise<SweepPoint[]> {
  const [points] = await runSweeps([{ model, rpms }], options);
  return points ?? [];
}
