/**
 * Sweeps through the real core on our own demo case, on a coarse mesh
 * (20 mm) to stay fast. The trade facts checked here are common practice
 * (no source); the ringing check names its sources.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { bandMean, runSweepSerial, type SweepPoint } from '../../src/analysis/sweep.js';
import { runSweep } from '../../src/analysis/worker-pool.js';
import { loadCase } from '../../src/case/load.js';
import { runCli } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';
import { SimulationError } from '../../src/core/index.js';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const DEMO = 'cases/demo.yaml';
const COARSE = 'numerics.meshSize=20mm';

async function demo(...sets: string[]) {
  return (await loadCase(DEMO, { set: [COARSE, ...sets], cwd: ROOT })).model;
}

const grid = (from: number, to: number, step: number) => Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step);
const best = (pts: readonly SweepPoint[]) => pts.reduce((a, b) => (b.volumetricEfficiency > a.volumetricEfficiency ? b : a));
const curve = (pts: readonly SweepPoint[]) => pts.map((p) => ({ x: p.rpm, y: p.volumetricEfficiency }));

describe('runner length and cam timing (common practice, no source)', () => {
  it('a longer runner moves the speed of best ηv down, a shorter one up', async () => {
    const rpms = grid(3000, 11000, 500);
    const short = runSweepSerial(await demo('runner.length=250mm'), rpms);
    const mid = runSweepSerial(await demo('runner.length=350mm'), rpms);
    const long = runSweepSerial(await demo('runner.length=450mm'), rpms);
    expect(best(long).rpm).toBeLessThan(best(mid).rpm + 1e-9);
    expect(best(short).rpm).toBeGreaterThan(best(mid).rpm - 1e-9);
    expect(best(long).rpm).toBeLessThan(best(short).rpm);
  });

  it('a late intake closing lowers low-speed ηv and raises high-speed ηv', async () => {
    const rpms = [2500, 3000, 3500, 9000, 9500, 10000];
    const early = runSweepSerial(await demo('intake.closes=40'), rpms);
    const late = runSweepSerial(await demo('intake.closes=80'), rpms);
    const low = (p: SweepPoint[]) => bandMean(curve(p), 2500, 3500);
    const high = (p: SweepPoint[]) => bandMean(curve(p), 9000, 10000);
    expect(low(late)).toBeLessThan(low(early));
    expect(high(late)).toBeGreaterThan(high(early));
  });
});

describe('ringing of the runner while the valve is shut', () => {
  it('agrees within 5 % with the quarter-wave estimate', async () => {
    // Kinsler et al., Fundamentals of Acoustics: closed–open pipe f = a/(4(L+δ));
    // Levine & Schwinger, Phys. Rev. 73 (1948): unflanged δ = 0.6133 r.
    // The simulated frequency is measured from the closed-valve part of the
    // valve-end pressure trace; the estimate uses the runner's mean sound speed.
    const pts = runSweepSerial(await demo(), [3000, 4000, 5000, 6000]);
    for (const p of pts) {
      expect(p.pulse.ringingSource).toBe('trace');
      const ratio = p.pulse.ringingFrequency / p.pulse.quarterWaveFrequency;
      expect(Math.abs(ratio - 1)).toBeLessThan(0.05);
    }
    // (the estimate's formula is checked against the REFERENCES.md example in estimates.test.ts;
    // the engine's own ringing on a fine mesh within 1 % in test/core/open-end-ringing.test.ts)
  });
});

describe('parallel sweeps', () => {
  it('--jobs 1 and --jobs 2 give identical numbers', async () => {
    const m = await demo();
    const rpms = grid(4000, 9000, 500);
    const one = await runSweep(m, rpms, { jobs: 1 });
    const two = await runSweep(m, rpms, { jobs: 2 });
    expect(two.length).toBe(rpms.length);
    expect(JSON.stringify(two)).toBe(JSON.stringify(one));
    // and both equal the plain serial run
    expect(JSON.stringify(runSweepSerial(m, rpms))).toBe(JSON.stringify(one));
  });
});

async function cliJson(argv: string[]): Promise<Record<string, unknown>> {
  const io = memoryIo({ cwd: ROOT });
  const code = await runCli(argv, io);
  expect(io.err()).not.toMatch(/error/);
  expect(code).toBe(0);
  return JSON.parse(io.out()) as Record<string, unknown>;
}

describe('sweep and tune agree', () => {
  it("a sweep's band mean equals the tune figure for the same design", async () => {
    const common = ['--rpm', '4000:9000:500', '--band', '5250:8250', '--set', COARSE];
    const sweep = (await cliJson(['sweep', DEMO, ...common, '--jobs', '1', '--json'])) as {
      band: { meanVolumetricEfficiency: number; from: number; to: number };
      points: { rpm: number }[];
    };
    const tune = (await cliJson([
      'tune',
      DEMO,
      ...common,
      '--vary',
      'runner.length=340mm:380mm:40mm',
      '--jobs',
      '2',
      '--json',
    ])) as { designs: { values: Record<string, number>; meanVolumetricEfficiency: number }[] };
    const same = tune.designs.find((d) => Math.abs((d.values['runner.length'] ?? 0) - 0.38) < 1e-12);
    expect(same).toBeDefined();
    expect(sweep.points).toHaveLength(11);
    expect(sweep.band.from).toBe(5250);
    expect(same!.meanVolumetricEfficiency).toBe(sweep.band.meanVolumetricEfficiency);
    // the other design differs: the figure really depends on the design
    const other = tune.designs.find((d) => d !== same)!;
    expect(other.meanVolumetricEfficiency).not.toBe(sweep.band.meanVolumetricEfficiency);
  });
});

describe('failures and progress', () => {
  it.each([[1], [2]])('a point the core refuses fails the whole sweep with the core error (--jobs %d)', async (jobs) => {
    // rpm −1 sits in the first chunk, which a worker takes when jobs > 1
    const m = await demo();
    const rpms = [-1, 6000, 6500, 7000, 9000];
    const err = await runSweep(m, rpms, { jobs }).then(
      () => undefined,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(SimulationError);
    expect((err as SimulationError).code).toBe('invalid');
    expect((err as Error).message).toMatch(/rpm must be positive/);
  });

  it('shows progress on stderr only when it is a terminal', async () => {
    const argv = ['sweep', DEMO, '--rpm', '6000:7000:500', '--set', COARSE, '--jobs', '1'];
    const tty = memoryIo({ cwd: ROOT, stderrIsTTY: true });
    expect(await runCli(argv, tty)).toBe(0);
    expect(tty.err()).toMatch(/sweep: 3\/3 points/);
    expect(tty.err()).toContain('\r\x1b[K');
    const pipe = memoryIo({ cwd: ROOT });
    expect(await runCli(argv, pipe)).toBe(0);
    expect(pipe.err()).not.toMatch(/points/);
  });
});

import { workerLayout } from '../../src/analysis/worker-start.js';

describe('how the sweep worker is started', () => {
  it.each([
    ['file:///x/src/analysis/worker-start.ts', 'source'],
    ['file:///x/dist/analysis/worker-start.js', 'compiled'],
    ['file:///x/dist/tractwave.mjs', 'bundle'],
  ] as const)('%s → %s', (url, layout) => {
    expect(workerLayout(url)).toBe(layout);
  });
  it('this test runs the source layout', () => {
    expect(workerLayout()).toBe('source');
  });
});
