/**
 * Progress of a long run on a terminal: the cycle against the cap and the
 * time left at most, only when stderr is a terminal and the estimate is
 * above a few seconds; the line is cleared at the end.
 */
import { describe, expect, it } from 'vitest';
import { engineCost, PROGRESS_AFTER_SECONDS, type CostEstimate } from '../../src/analysis/cost.js';
import { cycleProgress } from '../../src/cli/progress.js';
import { memoryIo } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/main.js';
import { ROOT } from './helpers.js';
import { testEngine } from '../support/engine-fixture.js';

const long: CostEstimate = { ...engineCost(testEngine()), seconds: 20, maxSeconds: 50, maxCycles: 30 };

describe('cycle progress', () => {
  it('shows the cycle of at most the cap, then clears the line', () => {
    const io = memoryIo({ stderrIsTTY: true });
    const bar = cycleProgress(io, long)!;
    expect(bar).toBeDefined();
    bar.tick(1);
    bar.tick(2);
    bar.done();
    const err = io.err();
    expect(err).toContain('run: cycle 1 of at most 30 (estimated 20 s, at most 50 s)');
    expect(err).toContain('run: cycle 3 of at most 30');
    expect(err).toMatch(/at most \d+ s left\)/);
    expect(err.endsWith('\r\x1b[K')).toBe(true);
  });
  it('is not shown off a terminal, nor for a short run', () => {
    expect(cycleProgress(memoryIo({ stderrIsTTY: false }), long)).toBeUndefined();
    expect(cycleProgress(memoryIo({ stderrIsTTY: true }), { ...long, seconds: PROGRESS_AFTER_SECONDS / 2 })).toBeUndefined();
  });
  it('a run estimated above a few seconds shows it on a terminal stderr, and stdout is unchanged', async () => {
    const argv = ['run', 'cases/demo.yaml', '--rpm', '4000', '--set', 'numerics.meshSize=1mm'];
    expect(engineCost(testEngine({ rpm: 4000, meshSize: 0.001 })).seconds).toBeGreaterThan(PROGRESS_AFTER_SECONDS);
    const io = memoryIo({ stderrIsTTY: true, cwd: ROOT });
    expect(await runCli(argv, io)).toBe(0);
    expect(io.err()).toMatch(/run: cycle 1 of at most 30/);
    expect(io.out()).not.toContain('\x1b');
  }, 60_000);
});
