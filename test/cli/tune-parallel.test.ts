/**
 * The shards of a tune run by GNU parallel (Debian's `parallel`; .ci/run
 * installs it) as separate processes, their parts collected from standard
 * output into one file, one part a line — then merged: the same JSON as the
 * unsharded tune, byte for byte. Own regression of our interfaces.
 *
 * Without `parallel` on the machine the test is skipped, except under CI
 * (CI=true), where a missing `parallel` is a failure of the set-up.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/main.js';
import { ROOT } from './helpers.js';

const hasParallel = spawnSync('parallel', ['--version'], { encoding: 'utf8' }).status === 0;
const inCi = process.env.CI === 'true';

const TUNE = [
  'tune',
  'cases/kart-single.yaml',
  '--vary',
  'runner.sections.1.length=200mm:300mm:50mm',
  '--vary',
  'intake.closes=35:55:20',
  '--rpm',
  '4000:7000:1000',
  '--set',
  'numerics.meshSize=20mm',
  '--jobs',
  '1',
];

describe('GNU parallel runs the shards as separate processes', () => {
  it('is installed where CI runs', () => {
    if (inCi) expect(hasParallel, 'GNU parallel is missing: .ci/run installs it with apt-get').toBe(true);
  });

  it.skipIf(!hasParallel)('three processes, one part each; merged = the unsharded tune', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-parallel-'));
    const parts = join(dir, 'parts.jsonl');
    // parallel runs `node --import tsx src/cli/main.ts tune ... --shard {}/3 --json` for {} = 1, 2, 3,
    // two at a time, and prints each job's whole output when it ends (--group, its default)
    const cmd = `node --import tsx src/cli/main.ts ${TUNE.join(' ')} --shard {}/3 --json`;
    const r = spawnSync('sh', ['-c', `parallel -j 2 --halt now,fail=1 '${cmd}' ::: 1 2 3 > '${parts}'`], {
      cwd: ROOT,
      encoding: 'utf8',
      timeout: 120_000,
      env: { ...process.env, HOME: dir },
    });
    expect(r.status, r.stderr).toBe(0);
    const lines = readFileSync(parts, 'utf8').trim().split('\n');
    expect(lines).toHaveLength(3);
    // three processes: each line a different shard
    expect(lines.map((l) => JSON.parse(l).shard.index).sort()).toEqual([1, 2, 3]);

    const merged = memoryIo({ cwd: ROOT });
    expect(await runCli(['merge', parts, '--json'], merged), merged.err()).toBe(0);
    const whole = memoryIo({ cwd: ROOT });
    expect(await runCli([...TUNE, '--json'], whole), whole.err()).toBe(0);
    expect(merged.out()).toBe(whole.out());
    expect(JSON.parse(whole.out()).designs).toHaveLength(6);
  });
});
