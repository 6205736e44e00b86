/**
 * tune at scale (issue 15) and the stronger tune (issue 12, item 4):
 *  - three shards merged give the unsharded tune, byte for byte (JSON, text, CSV);
 *  - merge refuses a missing, duplicated, foreign or damaged part (exit 2 naming it);
 *  - --shard auto picks the slice from a Slurm array task's and a Kubernetes
 *    indexed job's variables (the names as documented: see test/analysis/shard.test.ts);
 *  - the design cap is counted before anything is built; --vary rpm is refused;
 *  - edges: the paths whose best value is at an end of its range.
 * Own regression checks of our interfaces (no external source): a coarse
 * 20 mm mesh and a few speeds keep them fast.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/main.js';
import { ROOT } from './helpers.js';

const DEMO = join(ROOT, 'cases/demo.yaml');
const GRID = [
  'tune',
  DEMO,
  '--vary',
  'runner.length=250mm:450mm:100mm',
  '--vary',
  'intake.closes=50:70:20',
  '--rpm',
  '5000:8000:1000',
  '--set',
  'numerics.meshSize=20mm',
];

async function run(argv: string[], opts: { cwd?: string; env?: Record<string, string> } = {}) {
  const io = memoryIo({ cwd: opts.cwd ?? ROOT, env: opts.env ?? {} });
  const code = await runCli(argv, io);
  return { code, out: io.out(), err: io.err() };
}

/** exit 2, one line `error: <what>: ...`, no stack trace, nothing on stdout */
function refused(r: { code: number; out: string; err: string }, what: string, fragment: RegExp): void {
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  const lines = r.err.trim().split('\n');
  expect(lines, r.err).toHaveLength(1);
  expect(lines[0]!.startsWith(`error: ${what}: `), lines[0]).toBe(true);
  expect(lines[0]).toMatch(fragment);
  expect(r.err).not.toMatch(/\n\s+at \S/);
}

let dir = '';
const part = (k: number) => join(dir, `part-${k}.json`);

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tw-shards-'));
  for (const k of [1, 2, 3]) {
    const r = await run([...GRID, '--jobs', '1', '--shard', `${k}/3`, '--json']);
    expect(r.code, r.err).toBe(0);
    writeFileSync(part(k), r.out);
  }
});

describe('three shards merged equal the unsharded tune', () => {
  it('JSON: identical text', async () => {
    const whole = await run([...GRID, '--jobs', '2', '--json']);
    expect(whole.code, whole.err).toBe(0);
    const merged = await run(['merge', part(3), part(1), part(2), '--json']);
    expect(merged.code, merged.err).toBe(0);
    expect(merged.out).toBe(whole.out);
    const j = JSON.parse(whole.out);
    expect(j.designs).toHaveLength(6);
    expect(j.stats).toEqual({ designs: 6, points: 24 });
    // the same warnings on stderr
    expect(merged.err).toBe(whole.err);
  });

  it('text report and CSV: identical', async () => {
    const whole = await run([...GRID, '--jobs', '2']);
    const merged = await run(['merge', part(1), part(2), part(3)]);
    expect(whole.code).toBe(0);
    expect(merged.out).toBe(whole.out);
    expect(merged.out).toContain('best over the band');
    const out = mkdtempSync(join(tmpdir(), 'tw-merge-csv-'));
    expect((await run([...GRID, '--csv', 'whole.csv'], { cwd: out })).code).toBe(0);
    expect((await run(['merge', part(1), part(2), part(3), '--csv', 'merged.csv'], { cwd: out })).code).toBe(0);
    expect(readFileSync(join(out, 'merged.csv'), 'utf8')).toBe(readFileSync(join(out, 'whole.csv'), 'utf8'));
    // and merge, like tune, does not overwrite a file without --force
    refused(await run(['merge', part(1), part(2), part(3), '--csv', 'merged.csv'], { cwd: out }), '--csv', /already exists/);
  });

  it('a part holds its slice only: the designs i with i mod 3 = K − 1', () => {
    const p = JSON.parse(readFileSync(part(2), 'utf8'));
    expect(p.designs.map((d: { number: number }) => d.number)).toEqual([1, 4]);
    expect(p.shard).toEqual({ index: 2, count: 3 });
    expect(p.gridDesigns).toBe(6);
    expect(p.fingerprint).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(p.options).toEqual({ vary: ['runner.length=250mm:450mm:100mm', 'intake.closes=50:70:20'], set: ['numerics.meshSize=20mm'], rpm: '5000:8000:1000', band: null });
  });
});

describe('merge refuses parts that do not make one whole tune', () => {
  it('a missing shard, naming it', async () => {
    refused(await run(['merge', part(1), part(3)]), 'shard 2/3', /missing/);
  });

  it('a shard given twice, naming the second', async () => {
    const copy = join(dir, 'copy-of-2.json');
    writeFileSync(copy, readFileSync(part(2)));
    refused(await run(['merge', part(1), part(2), copy, part(3)]), copy, /shard 2\/3 again/);
    refused(await run(['merge', part(1), part(2), part(2), part(3)]), part(2), /given twice/);
  });

  it('a foreign shard (other options, or another shard count), naming it', async () => {
    const other = join(dir, 'other-band.json');
    const r = await run([...GRID, '--band', '6000:8000', '--shard', '2/3', '--json']);
    expect(r.code).toBe(0);
    writeFileSync(other, r.out);
    refused(await run(['merge', part(1), other, part(3)]), other, /another tune/);
    const half = join(dir, 'half.json');
    writeFileSync(half, (await run([...GRID, '--shard', '2/2', '--json'])).out);
    refused(await run(['merge', part(1), half, part(3)]), half, /cut into 3 shards/);
  });

  it('a damaged, edited or cut-short part, or a file that is no part', async () => {
    const text = readFileSync(part(2), 'utf8');
    const edited = join(dir, 'edited.json');
    writeFileSync(edited, text.replace(/"volumetricEfficiency":1\.(\d)/, (_m, d: string) => `"volumetricEfficiency":1.${(Number(d) + 1) % 10}`));
    expect(readFileSync(edited, 'utf8')).not.toBe(text);
    refused(await run(['merge', part(1), edited, part(3)]), edited, /checksum does not match/);
    const recased = join(dir, 'recased.json');
    writeFileSync(recased, text.replace('"bore":"97 mm"', '"bore":"98 mm"'));
    expect(readFileSync(recased, 'utf8')).not.toBe(text);
    refused(await run(['merge', part(1), recased, part(3)]), recased, /fingerprint does not match/);
    const cut = join(dir, 'cut.json');
    writeFileSync(cut, text.slice(0, 200));
    refused(await run(['merge', part(1), cut, part(3)]), cut, /not JSON/);
    const sweep = join(dir, 'sweep.json');
    writeFileSync(sweep, '{"points": []}\n');
    refused(await run(['merge', sweep]), sweep, /not a tune part/);
    refused(await run(['merge']), 'merge', /missing PART/);
    refused(await run(['merge', join(dir, 'nowhere.json')]), join(dir, 'nowhere.json'), /not found/);
  });

  it('reads several parts from one file, one per line (what GNU parallel collects)', async () => {
    const lines = join(dir, 'parts.jsonl');
    writeFileSync(lines, [3, 1, 2].map((k) => readFileSync(part(k), 'utf8')).join(''));
    const whole = await run(['merge', part(1), part(2), part(3), '--json']);
    const merged = await run(['merge', lines, '--json']);
    expect(merged.code, merged.err).toBe(0);
    expect(merged.out).toBe(whole.out);
  });
});

describe('--shard auto', () => {
  const partText = (k: number) => readFileSync(part(k), 'utf8');
  it('in a Slurm array task (--array=1-3, task 2) runs shard 2/3', async () => {
    const env = { SLURM_ARRAY_JOB_ID: '4711', SLURM_ARRAY_TASK_ID: '2', SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_MAX: '3' };
    const r = await run([...GRID, '--shard', 'auto', '--json'], { env });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toBe(partText(2));
    expect(r.err).toContain('Slurm array task 2');
  });
  it('in a Slurm array submitted as --array=0-2, task 0 runs shard 1/3', async () => {
    const env = { SLURM_ARRAY_TASK_ID: '0', SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '0', SLURM_ARRAY_TASK_MAX: '2' };
    expect((await run([...GRID, '--shard', 'auto', '--json'], { env })).out).toBe(partText(1));
  });
  it('in a Kubernetes indexed job (completion index 2 of 3) runs shard 3/3', async () => {
    const r = await run([...GRID, '--shard', 'auto/3', '--json'], { env: { JOB_COMPLETION_INDEX: '2' } });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toBe(partText(3));
  });
  it('refuses when no scheduler says which shard, or the count is not given', async () => {
    refused(await run([...GRID, '--shard', 'auto', '--json']), '--shard', /neither is set/);
    refused(await run([...GRID, '--shard', 'auto', '--json'], { env: { JOB_COMPLETION_INDEX: '1' } }), '--shard', /spec\.completions/);
  });
});

describe('the design cap and what is not a design value', () => {
  it('a grid of 10^12 designs is refused by counting, before the case file is even read', async () => {
    // the case file does not exist: the grid is refused first, so nothing was built
    const huge = ['tune', 'no-such-case.yaml', ...['runner.length=1mm:1000mm:1mm', 'runner.diameter=1mm:1000mm:1mm', 'intake.closes=1:1000:1', 'intake.opens=1:1000:1'].flatMap((v) => ['--vary', v])];
    refused(await run(huge), '--vary', /1000000000000 designs is too many/);
    refused(await run([...huge, '--shard', '1/100000']), '--vary', /even cut into shards/);
  });

  it('a grid over the one-run cap is refused, pointing to --shard; a shard over it too', async () => {
    const big = ['tune', DEMO, '--vary', 'runner.length=200mm:400mm:5mm', '--vary', 'intake.closes=30:80:1']; // 41 × 51 = 2091
    refused(await run(big), '--vary', /2091 designs is too many for one run.*--shard K\/N \(N ≥ 2\)/);
    refused(await run([...big, '--shard', '1/1']), '--shard', /at least 2 shards/);
  });

  it('rpm is swept, not varied', async () => {
    refused(await run(['tune', DEMO, '--vary', 'rpm=5000:8000:500']), '--vary rpm', /rpm is swept.*--rpm/);
  });

  it.each([
    [['--search', '--shard', '1/2'], '--shard', /cannot be cut into shards/],
    [['--budget', '10'], '--budget', /only applies with --search/],
    [['--search', '--budget', '2'], '--budget', /from 3/],
    [['--shard', '1/2', '--csv', 'x.csv'], '--csv', /ask merge for the CSV/],
    [['--vary', 'intake.valves=1:4:1', '--search', '--budget', '3'], '--budget', /4 combinations of intake\.valves/],
  ])('%j is refused', async (extra, what, fragment) => {
    refused(await run([...GRID, ...extra]), what, fragment);
  });
});

describe('edges: a best value at an end of its range', () => {
  // runner 300 mm, 6 speeds: ηv over the band rises with later closing up to about 65° ABDC
  // (late closing gains at high speed and costs at low speed: common practice)
  const base = ['tune', DEMO, '--set', 'numerics.meshSize=20mm', '--set', 'runner.length=300mm', '--rpm', '4000:9000:1000', '--band', '5000:8000', '--json'];
  it('lists the path and warns to widen the range when the best is at an end', async () => {
    const r = await run([...base, '--vary', 'intake.closes=30:55:25']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.designs[0].values['intake.closes']).toBe(55);
    expect(j.edges).toEqual(['intake.closes']);
    expect(r.err).toMatch(/warning: the best design has intake\.closes = 55, the high end of its range 30–55: .*widen the range/s);
  });
  it('lists nothing when the best lies inside every range', async () => {
    const r = await run([...base, '--vary', 'intake.closes=30:80:25']);
    const j = JSON.parse(r.out);
    expect(j.designs[0].values['intake.closes']).toBe(55);
    expect(j.edges).toEqual([]);
    expect(r.err).not.toMatch(/widen/);
  });
  it('cam shift is a design value in degrees (and moves the events: test/case/cam-shift.test.ts)', async () => {
    const r = await run([...base, '--vary', 'intake.shift=-10:10:10']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.designs.map((d: { values: Record<string, number> }) => d.values['intake.shift']).sort((a: number, b: number) => a - b)).toEqual([-10, 0, 10]);
    // the three timings give three different band means: the shift reaches the simulation
    expect(new Set(j.designs.map((d: { meanVolumetricEfficiency: number }) => d.meanVolumetricEfficiency)).size).toBe(3);
  });
});

describe('--search on a terminal', () => {
  it('prints each design as it is simulated, then the walk and the ranking', async () => {
    const r = await run(['tune', DEMO, '--vary', 'runner.length=300mm:400mm:25mm', '--rpm', '5000:8000:1000', '--set', 'numerics.meshSize=20mm', '--search', '--budget', '5']);
    expect(r.code, r.err).toBe(0);
    const evals = [...r.out.matchAll(/^ +(\d+) {2}(\d+(?:\.\d+)?) mm {2}→ band mean ηv (\d+\.\d\d) %/gm)];
    expect(evals.map((m) => Number(m[1]))).toEqual([1, 2, 3, 4, 5]);
    // the first design is the middle of the range
    expect(evals[0]![2]).toBe('350');
    const flat = r.out.replace(/\s+/g, ' ');
    expect(flat).toContain('with the Nelder–Mead simplex (fmin 0.0.4)');
    expect(flat).toMatch(/the walk \(each design that beat all before it\): 350 mm/);
    expect(flat).toContain('5 designs simulated (budget spent)');
    expect(r.out).toContain('best over the band');
    for (const line of r.out.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  });
});
