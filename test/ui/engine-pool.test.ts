/**
 * The terminal view's engine on the process's one worker pool: it starts no
 * pool of its own, its sweep fills in from the view's speed outwards with
 * the numbers of the serial sweep, and a point after a sweep of the same
 * model starts from the sweep's converged state at the nearest speed.
 * Own regression of our interfaces, no external source.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { runSweepSerial, sweepPoint } from '../../src/analysis/sweep.js';
import { sharedPool, WorkerPool } from '../../src/analysis/worker-pool.js';
import { viewPoint } from '../../src/analysis/worker.js';
import { loadCase } from '../../src/case/load.js';
import type { WarmStart } from '../../src/core/engine.js';
import type { EngineModel } from '../../src/core/model.js';
import { threadEngine } from '../../src/ui/engine-service.js';
import { ROOT } from '../cli/helpers.js';

async function demo(rpm: number): Promise<EngineModel> {
  const m = (await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'], cwd: ROOT })).model;
  return { ...m, rpm };
}

const pools: WorkerPool[] = [];
afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
});

function sweepOn(engine: ReturnType<typeof threadEngine>, model: EngineModel, rpms: number[]): Promise<{ order: number[]; eta: number[] }> {
  const order: number[] = [];
  const eta = new Array<number>(rpms.length).fill(Number.NaN);
  return new Promise((resolve, reject) =>
    engine.runSweep(model, rpms, {
      onPoint: (i, e) => {
        order.push(i);
        eta[i] = e;
      },
      onDone: () => resolve({ order, eta }),
      onError: (m) => reject(new Error(m)),
    }),
  );
}

describe("the view's engine on the shared pool", () => {
  it('uses the workers the process already has: points and sweeps start none', async () => {
    const pool = sharedPool();
    pool.grow(2);
    const before = pool.started;
    const engine = threadEngine({ sweepJobs: 2 });
    const model = await demo(6000);
    await engine.runPoint(model);
    expect(engine.onThread()).toBe(true);
    await sweepOn(engine, model, [5000, 5500, 6000, 6500, 7000]);
    expect(pool.started).toBe(before);
  }, 60_000);

  it('sweeps from the chunk that spans the view speed, with the serial numbers', async () => {
    const pool = new WorkerPool();
    pools.push(pool);
    const model = await demo(6600);
    const rpms = [4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500, 8000, 8500];
    const serial = runSweepSerial(model, rpms).map((p) => p.volumetricEfficiency);
    const two = await sweepOn(threadEngine({ pool, sweepJobs: 2 }), model, rpms);
    expect(two.eta).toEqual(serial);
    // one at a time the order shows: 6000–7500 (spans 6600), then 4000–5500 (1100 rpm away), then 8000–8500 (1400)
    const one = await sweepOn(threadEngine({ pool, sweepJobs: 1 }), model, rpms);
    expect(one.order).toEqual([4, 5, 6, 7, 0, 1, 2, 3, 8, 9]);
    expect(one.eta).toEqual(serial);
  }, 60_000);

  it("a point after a sweep of its model starts from the sweep's state at the nearest speed (the lower of two as near)", async () => {
    const pool = new WorkerPool();
    pools.push(pool);
    const engine = threadEngine({ pool, sweepJobs: 2 });
    const model = await demo(6250);
    const rpms = [5000, 5500, 6000, 6500, 7000];
    await sweepOn(engine, model, rpms);
    const got = await engine.runPoint(model);
    // the state at 6000 rpm: its chunk 5000–6500 from rest, each point from the one before
    let warm: WarmStart | undefined;
    for (const rpm of [5000, 5500, 6000]) warm = sweepPoint(model, rpm, {}, warm).warmStart;
    const expected = viewPoint(model, warm);
    expect(got.result.volumetricEfficiency).toBe(expected.result.volumetricEfficiency);
    expect(Array.from(got.result.trace.valvePressure)).toEqual(Array.from(expected.result.trace.valvePressure));
    // and it is not the point from rest
    expect(got.result.volumetricEfficiency).not.toBe(viewPoint(model).result.volumetricEfficiency);
    // a changed model has no sweep states: the state passed in is used
    const other = { ...model, ambient: { ...model.ambient, temperature: model.ambient.temperature + 5 } };
    const fromGiven = await engine.runPoint(other, expected.warmStart);
    expect(fromGiven.result.volumetricEfficiency).toBe(viewPoint(other, expected.warmStart).result.volumetricEfficiency);
  }, 60_000);
});
