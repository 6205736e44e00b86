/**
 * The terminal view on the real core (the bundled demo case on a coarse
 * mesh): the worker thread gives the same numbers as this thread, the sweep
 * threads give the numbers of the serial sweep the `sweep` command runs, and
 * the screen shows what the core and the analysis computed.
 */
import React from 'react';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { cleanup, render } from 'ink-testing-library';
import { runSweepSerial } from '../../src/analysis/sweep.js';
import { pulseTiming } from '../../src/analysis/pulse.js';
import { App } from '../../src/ui/app.js';
import { openCase, type CaseSession } from '../../src/ui/case-session.js';
import { inlineEngine, threadEngine } from '../../src/ui/engine-service.js';
import { stripAnsi } from '../../src/ui/text.js';
import type { Edit } from '../../src/ui/state.js';

const DEMO = fileURLToPath(new URL('../../cases/demo.yaml', import.meta.url));
const COARSE: Edit = { path: 'numerics.meshSize', value: '20 mm' };

async function coarseDemo(): Promise<CaseSession> {
  const s = await openCase(DEMO);
  return { ...s, build: (edits) => s.build([COARSE, ...edits]) };
}

const engines: { close: () => Promise<void> }[] = [];
afterAll(async () => {
  cleanup();
  await Promise.all(engines.map((e) => e.close()));
});

describe('the engine service on the real core', () => {
  it('runs a point on the worker thread with the numbers of this thread, trace and verdict included', async () => {
    const session = await coarseDemo();
    const model = session.build([]);
    const threads = threadEngine({ sweepJobs: 2 });
    engines.push(threads);
    expect(await threads.whenReady()).toBe(true);
    const [viaWorker, here] = await Promise.all([threads.runPoint(model), inlineEngine().runPoint(model)]);
    expect(threads.onThread()).toBe(true);
    expect(viaWorker.result.trace.valvePressure).toHaveLength(720);
    expect(viaWorker.result.volumetricEfficiency).toBe(here.result.volumetricEfficiency);
    expect(Array.from(viaWorker.result.trace.valvePressure)).toEqual(Array.from(here.result.trace.valvePressure));
    expect(viaWorker.pulse?.verdict).toBe(pulseTiming(here.result, model).verdict);
  }, 30_000);

  it('runs a sweep on threads with the numbers of the serial sweep, and can be stopped', async () => {
    const session = await coarseDemo();
    const model = session.build([]);
    const rpms = [4000, 4500, 5000, 5500, 6000, 6500, 7000, 7500];
    const threads = threadEngine({ sweepJobs: 2 });
    engines.push(threads);
    const got = new Array<number>(rpms.length).fill(Number.NaN);
    await new Promise<void>((resolve, reject) => {
      threads.runSweep(model, rpms, {
        onPoint: (i, eta) => {
          got[i] = eta;
        },
        onDone: resolve,
        onError: (m) => reject(new Error(m)),
      });
    });
    const serial = runSweepSerial(model, rpms).map((p) => p.volumetricEfficiency);
    expect(got).toEqual(serial);

    // the kept threads run the next sweep to the same numbers
    const again = new Array<number>(rpms.length).fill(Number.NaN);
    await new Promise<void>((resolve, reject) => {
      threads.runSweep(model, rpms, { onPoint: (i, eta) => (again[i] = eta), onDone: resolve, onError: (m) => reject(new Error(m)) });
    });
    expect(again).toEqual(serial);

    // a stopped sweep reports nothing more: a sweep started after it runs to its end on the same
    // threads (each takes its work in order), so anything the stopped one still had to say came before
    let after = 0;
    const h = threads.runSweep(model, rpms, { onPoint: () => after++, onDone: () => after++, onError: () => after++ });
    h.cancel();
    await new Promise<void>((resolve, reject) => {
      threads.runSweep(model, rpms, { onPoint: () => {}, onDone: resolve, onError: (m) => reject(new Error(m)) });
    });
    expect(after).toBe(0);
  }, 60_000);
});

describe('the screen on the real core', () => {
  it('shows the computed pressure at the cursor and the analysis verdict, and steps to IVC', async () => {
    const session = await coarseDemo();
    const model = session.build([]);
    const app = render(<App session={session} engine={inlineEngine()} size={{ columns: 80, rows: 24 }} color={false} />);
    const current = (): string => stripAnsi(app.lastFrame() ?? '');
    /** poll until `cond` holds on the frame; fail after 20 s saying what was awaited */
    const waitFor = async (cond: (f: string) => boolean, what: string): Promise<string> => {
      const t0 = Date.now();
      while (!cond(current())) {
        if (Date.now() - t0 > 20_000) throw new Error(`${what} never showed; the frame is:\n${current()}`);
        await new Promise((r) => setTimeout(r, 10));
      }
      return current();
    };
    let frame = await waitFor((f) => f.includes('At IVC'), 'the first computed point (At IVC)');
    const { result } = (await inlineEngine().runPoint(model));
    const p0 = ((result.trace.valvePressure[0] ?? 0) / 1000).toFixed(1);
    expect(frame).toContain(`Pressure at the valve  ${p0} kPa`);
    const verdict = pulseTiming(result, model).verdict;
    expect(frame.replace(/\s+/g, ' ')).toContain(verdict.slice(0, 40));
    // n steps through the valve events in crank order; IVC is one of them
    const ivc = Math.round(result.events.ivc);
    for (let k = 0; k < 4 && !frame.includes(`θ ${String(ivc).padStart(3)}°`); k++) {
      const before = frame;
      app.stdin.write('n');
      frame = await waitFor((f) => f !== before, `the cursor moving to the next valve event (key n, press ${k + 1})`);
    }
    expect(frame).toContain(`θ ${String(ivc).padStart(3)}°`);
    const pIvc = ((result.trace.valvePressure[ivc] ?? 0) / 1000).toFixed(1);
    expect(frame).toContain(`Pressure at the valve  ${pIvc} kPa`);
    for (const line of frame.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  }, 30_000);
});
