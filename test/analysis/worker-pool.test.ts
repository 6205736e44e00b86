/**
 * The process's one worker pool: started once and reused, the most urgent
 * job first, a crashed worker replaced, idle workers never holding the
 * process open; and sweeps whose numbers do not depend on the job count or
 * on the order the points run in (each point's warm start is its chunk
 * predecessor's converged state, whichever thread computed it).
 * Own regression of our interfaces, no external source.
 */
import { spawnSync } from 'node:child_process';
import { EventEmitter } from 'node:events';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { runSweepSerial } from '../../src/analysis/sweep.js';
import { PRIORITY, runSweep, runSweeps, sharedPool, startSweeps, WorkerPool } from '../../src/analysis/worker-pool.js';
import type { PointJob, WorkerReply } from '../../src/analysis/worker.js';
import { loadCase } from '../../src/case/load.js';
import { cli, ROOT } from '../cli/helpers.js';

async function demo(...sets: string[]) {
  return (await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm', ...sets], cwd: ROOT })).model;
}

/** A stand-in worker thread: keeps the jobs it is sent and answers when told. */
class FakeWorker extends EventEmitter {
  readonly jobs: PointJob[] = [];
  /** whether it holds the process open (ref) or not (unref) */
  referenced = true;
  postMessage(job: PointJob): void {
    this.jobs.push(job);
  }
  /** answer the oldest unanswered job */
  answer(): void {
    const job = this.jobs[this.answered++]!;
    this.emit('message', { id: job.id, error: { name: 'Error', message: `done ${job.kind} ${'rpm' in job ? job.rpm : ''}` } } satisfies WorkerReply);
  }
  answered = 0;
  ref(): void {
    this.referenced = true;
  }
  unref(): void {
    this.referenced = false;
  }
  async terminate(): Promise<number> {
    this.emit('exit', 1);
    return 1;
  }
}

function fakePool(): { pool: WorkerPool; workers: FakeWorker[] } {
  const workers: FakeWorker[] = [];
  const pool = new WorkerPool({
    start: () => {
      const w = new FakeWorker();
      workers.push(w);
      queueMicrotask(() => w.emit('message', { ready: true } satisfies WorkerReply));
      return w as unknown as Worker;
    },
  });
  return { pool, workers };
}

const flush = (): Promise<void> => new Promise((r) => setImmediate(r));

describe('the pool (fake workers)', () => {
  it('sends the view point ahead of sweep points that waited longer, first come first served within a level', async () => {
    const { pool, workers } = fakePool();
    pool.grow(1);
    const model = await demo();
    const done: string[] = [];
    const note = (p: Promise<WorkerReply>): void => void p.then((r) => done.push('error' in r ? r.error.message : '?'));
    note(pool.run({ kind: 'sweep', model, rpm: 3000, assumptions: {} }, PRIORITY.sweep));
    note(pool.run({ kind: 'sweep', model, rpm: 4000, assumptions: {} }, PRIORITY.sweep));
    note(pool.run({ kind: 'sweep', model, rpm: 5000, assumptions: {} }, PRIORITY.sweep));
    note(pool.run({ kind: 'view', model }, PRIORITY.view));
    const w = workers[0]!;
    // one job at a time on a worker: the first sweep point went out at once; a busy worker holds the process open
    expect(w.jobs.map((j) => j.kind)).toEqual(['sweep']);
    expect(w.referenced).toBe(true);
    for (let k = 0; k < 4; k++) {
      w.answer();
      await flush();
    }
    expect(done).toEqual(['done sweep 3000', 'done view ', 'done sweep 4000', 'done sweep 5000']);
    expect(w.jobs.map((j) => ('rpm' in j ? j.rpm : 'view'))).toEqual([3000, 'view', 4000, 5000]);
    // an idle worker does not hold the process open
    expect(w.referenced).toBe(false);
    expect(pool.started).toBe(1);
    await pool.close();
  });

  it('replaces a worker that stops with work waiting; its job fails, the next runs on the new one', async () => {
    const { pool, workers } = fakePool();
    pool.grow(1);
    await pool.whenReady();
    const model = await demo();
    const first = pool.run({ kind: 'sweep', model, rpm: 3000, assumptions: {} }, PRIORITY.sweep);
    const second = pool.run({ kind: 'sweep', model, rpm: 4000, assumptions: {} }, PRIORITY.sweep);
    workers[0]!.emit('exit', 1);
    await expect(first).rejects.toThrow(/stopped early/);
    expect(pool.started).toBe(2);
    workers[1]!.answer();
    await expect(second).resolves.toMatchObject({ error: { message: 'done sweep 4000' } });
    await pool.close();
  });

  it('gives up (and says why) when no worker ever answers, instead of starting them forever', async () => {
    const pool = new WorkerPool({
      start: () => {
        const w = new FakeWorker();
        queueMicrotask(() => w.emit('exit', 1));
        return w as unknown as Worker;
      },
    });
    const model = await demo();
    await expect(pool.run({ kind: 'view', model }, PRIORITY.view)).rejects.toThrow(/stopped early|could be started/);
    expect(pool.failure?.message).toMatch(/no worker thread could be started/);
    expect(pool.started).toBe(1);
    await expect(pool.run({ kind: 'view', model }, PRIORITY.view)).rejects.toThrow(/no worker thread/);
  });
});

describe('a layout where no worker can start', () => {
  it('the sweep runs on this thread instead, to the same numbers', async () => {
    const dead = (): WorkerPool =>
      new WorkerPool({
        start: () => {
          const w = new FakeWorker();
          queueMicrotask(() => w.emit('exit', 1));
          return w as unknown as Worker;
        },
      });
    const model = await demo();
    const rpms = [5000, 5500, 6000, 6500, 7000];
    const serial = JSON.stringify(runSweepSerial(model, rpms));
    // found out during the sweep (the first points fail), and known before it
    const pool = dead();
    expect(JSON.stringify(await runSweep(model, rpms, { jobs: 2, pool }))).toBe(serial);
    expect(pool.failure).toBeDefined();
    expect(JSON.stringify(await runSweep(model, rpms, { jobs: 2, pool }))).toBe(serial);
  }, 60_000);
});

describe('one pool per process, on the real core', () => {
  it('two sweeps start the workers once; the numbers are those of the serial run', async () => {
    const model = await demo();
    const rpms = [4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500, 8000];
    const pool = sharedPool();
    const before = pool.started;
    const a = await runSweep(model, rpms, { jobs: 2 });
    const afterFirst = pool.started;
    const b = await runSweep(model, rpms, { jobs: 2 });
    expect(sharedPool()).toBe(pool);
    expect(afterFirst - before).toBeLessThanOrEqual(2);
    expect(pool.started).toBe(afterFirst); // the second sweep started nothing
    expect(pool.size).toBeGreaterThanOrEqual(2);
    const serial = JSON.stringify(runSweepSerial(model, rpms));
    expect(JSON.stringify(a)).toBe(serial);
    expect(JSON.stringify(b)).toBe(serial);
  }, 60_000);

  it('the order points run in does not change them: longest chain first, nearest a speed first, several sweeps at once', async () => {
    const m1 = await demo();
    const m2 = await demo('runner.length=300mm');
    const rpms = [3000, 3500, 4000, 4500, 5000, 5500, 6000, 6500, 7000];
    const serial = [JSON.stringify(runSweepSerial(m1, rpms)), JSON.stringify(runSweepSerial(m2, rpms))];
    const [f] = await startSweeps([{ model: m1, rpms }], { jobs: 2, focusRpm: 6500 }).done;
    expect(JSON.stringify(f)).toBe(serial[0]);
    // on one thread the order is plain to see: the chunk holding 6500 rpm (5000–6500), then 7000 (500 rpm
    // away), then 3000–4500; each chunk from its first speed, as its warm starts go
    const order: number[] = [];
    const [g] = await startSweeps([{ model: m1, rpms }], { jobs: 1, focusRpm: 6500, onPoint: (_t, i) => order.push(i) }).done;
    expect(order).toEqual([4, 5, 6, 7, 8, 0, 1, 2, 3]);
    expect(JSON.stringify(g)).toBe(serial[0]);
    const both = await runSweeps(
      [
        { model: m1, rpms },
        { model: m2, rpms },
      ],
      { jobs: 2 },
    );
    expect(both.map((p) => JSON.stringify(p))).toEqual(serial);
    const inline = await runSweeps(
      [
        { model: m1, rpms },
        { model: m2, rpms },
      ],
      { jobs: 1 },
    );
    expect(inline.map((p) => JSON.stringify(p))).toEqual(serial);
  }, 60_000);

  it('a stopped sweep reports nothing more and the pool runs the next one', async () => {
    const model = await demo();
    const rpms = [4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500];
    let after = 0;
    const run = startSweeps([{ model, rpms }], { jobs: 2, onPoint: () => after++ });
    run.cancel();
    const next = await runSweep(model, rpms, { jobs: 2 });
    expect(next).toHaveLength(rpms.length);
    expect(after).toBe(0);
  }, 60_000);

  it('tune --jobs 1 and --jobs 2 print the same JSON', async () => {
    const argv = ['tune', 'cases/demo.yaml', '--vary', 'runner.length=300mm:340mm:40mm', '--rpm', '5000:7000:500', '--set', 'numerics.meshSize=20mm', '--json'];
    const one = await cli([...argv, '--jobs', '1']);
    const two = await cli([...argv, '--jobs', '2']);
    expect(one.code, one.err).toBe(0);
    expect(two.code, two.err).toBe(0);
    expect(JSON.parse(two.out).designs).toHaveLength(2);
    expect(two.out).toBe(one.out);
  }, 60_000);

  it('a process that swept on workers ends when its work does (idle workers hold nothing open)', () => {
    const src = (f: string): string => JSON.stringify(pathToFileURL(join(ROOT, 'src', f)).href);
    const script = [
      `const { loadCase } = await import(${src('case/load.ts')});`,
      `const { runSweep } = await import(${src('analysis/worker-pool.ts')});`,
      "const m = (await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'] })).model;",
      'const p = await runSweep(m, [5000, 5500, 6000, 6500, 7000], { jobs: 2 });',
      'console.log(p.length);',
    ].join('\n');
    const file = join(mkdtempSync(join(tmpdir(), 'tw-pool-')), 'sweep.mjs');
    writeFileSync(file, script);
    const r = spawnSync(process.execPath, ['--import', 'tsx', file], { cwd: ROOT, encoding: 'utf8', timeout: 50_000 });
    expect(r.signal, 'the process had to be killed: something kept it open').toBeNull();
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe('5');
  }, 60_000);
});
