/**
 * Grid arithmetic and shards (src/analysis/shard.ts): a design is found from
 * its number without building the grid, the N shards of a grid hold every
 * design exactly once, and `--shard auto` reads the shard from the variables
 * that the schedulers document:
 *  - Slurm, "Job Array Support" (slurm.schedmd.com/job_array.html) and the
 *    sbatch manual: SLURM_ARRAY_TASK_ID (this task's index),
 *    SLURM_ARRAY_TASK_COUNT (number of tasks), SLURM_ARRAY_TASK_MIN / _MAX
 *    (lowest / highest index), SLURM_ARRAY_TASK_STEP (the step of --array=A-B:S);
 *    e.g. --array=2-5 gives COUNT 4, MIN 2, MAX 5.
 *  - Kubernetes, "Indexed Job for Parallel Processing with Static Work
 *    Assignment" (kubernetes.io/docs/tasks/job/indexed-parallel-processing-static):
 *    completionMode Indexed gives each pod JOB_COMPLETION_INDEX, 0 to
 *    spec.completions − 1; the number of completions is not in the pod's
 *    environment (so --shard auto/N).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  canonicalJson,
  gridNumber,
  gridPosition,
  gridSize,
  parseShard,
  shardDesigns,
  shardFromEnvironment,
  shardSize,
} from '../../src/analysis/shard.js';
import { designAt, designGrid, edgePaths } from '../../src/analysis/tune.js';

describe('grid arithmetic', () => {
  it('counts a grid as the product of its axes, without building it', () => {
    expect(gridSize([11, 8, 8, 6])).toBe(4224);
    expect(gridSize([])).toBe(0);
    // 2000 values on four axes: 1.6e13 designs, counted, never listed
    expect(gridSize([2000, 2000, 2000, 2000])).toBe(1.6e13);
    expect(gridSize([2e6, 2e6, 2e6, 2e6])).toBe(Number.POSITIVE_INFINITY);
  });

  it('numbers designs with the first axis slowest, and back', () => {
    const sizes = [3, 4, 2];
    expect(gridPosition(sizes, 0)).toEqual([0, 0, 0]);
    expect(gridPosition(sizes, 1)).toEqual([0, 0, 1]);
    expect(gridPosition(sizes, 2)).toEqual([0, 1, 0]);
    expect(gridPosition(sizes, 23)).toEqual([2, 3, 1]);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 1, maxLength: 4 }), fc.nat(), (s, r) => {
        const i = r % gridSize(s);
        expect(gridNumber(s, gridPosition(s, i))).toBe(i);
      }),
    );
  });

  it('designAt gives the design designGrid lists at that place', () => {
    const axes = [
      { path: 'a', values: [1, 2, 3], setValues: ['1', '2', '3'] },
      { path: 'b', values: [0.1, 0.2], setValues: ['100 mm', '200 mm'] },
      { path: 'c', values: [5, 6], setValues: ['5', '6'] },
    ];
    const all = designGrid(axes);
    expect(all).toHaveLength(12);
    all.forEach((d, i) => expect(designAt(axes, i)).toEqual(d));
    expect(designAt(axes, 7).sets).toEqual(['a=2', 'b=200 mm', 'c=6']);
  });

  it('edges: an axis of several values whose best position is at an end', () => {
    const axes = [
      { path: 'runner.length', size: 5 },
      { path: 'intake.closes', size: 3 },
      { path: 'inlet.volume', size: 1 },
    ];
    expect(edgePaths(axes, (k) => [4, 1, 0][k] === 0 || [4, 1, 0][k] === axes[k]!.size - 1)).toEqual(['runner.length']);
    expect(edgePaths(axes, () => false)).toEqual([]);
  });
});

describe('shards', () => {
  it.each([
    [10, 3],
    [6, 3],
    [2, 5],
    [97, 8],
    [1, 1],
  ])('the %d designs of a grid cut into %d shards: each once, sizes within one', (total, n) => {
    const seen = new Array<number>(total).fill(0);
    const sizes: number[] = [];
    for (let k = 1; k <= n; k++) {
      const list = shardDesigns(total, { index: k, count: n });
      expect(list.length).toBe(shardSize(total, { index: k, count: n }));
      expect([...list].sort((a, b) => a - b)).toEqual(list);
      for (const i of list) seen[i]!++;
      sizes.push(list.length);
    }
    expect(seen.every((c) => c === 1)).toBe(true);
    expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
  });

  it('deals designs like cards: shard K holds i with i mod N = K − 1', () => {
    expect(shardDesigns(10, { index: 2, count: 3 })).toEqual([1, 4, 7]);
    expect(shardDesigns(2, { index: 4, count: 5 })).toEqual([]);
  });

  it.each([
    ['2/8', { index: 2, count: 8 }],
    ['1/1', { index: 1, count: 1 }],
    [' 8/8 ', { index: 8, count: 8 }],
  ])('--shard %s', (text, want) => {
    expect(parseShard(text, {})).toMatchObject(want);
  });

  it.each([
    ['0/3', /K must be from 1 to N/],
    ['4/3', /K must be from 1 to N/],
    ['3', /expected K\/N/],
    ['a/b', /expected K\/N/],
    ['1/0', /N must be from 1/],
    ['-1/3', /expected K\/N/],
    ['auto', /neither is set/],
  ])('--shard %s is refused', (text, message) => {
    expect(() => parseShard(text, {})).toThrow(message);
  });
});

describe('--shard auto under a Slurm job array', () => {
  const slurm = (id: number, count: number, min: number, max: number, step?: number) => ({
    SLURM_ARRAY_TASK_ID: String(id),
    SLURM_ARRAY_TASK_COUNT: String(count),
    SLURM_ARRAY_TASK_MIN: String(min),
    SLURM_ARRAY_TASK_MAX: String(max),
    ...(step !== undefined ? { SLURM_ARRAY_TASK_STEP: String(step) } : {}),
  });
  it.each([
    // --array, task id → shard K/N
    ['--array=1-4', slurm(1, 4, 1, 4), 1, 4],
    ['--array=1-4', slurm(4, 4, 1, 4), 4, 4],
    ['--array=0-9', slurm(0, 10, 0, 9), 1, 10],
    ['--array=0-9', slurm(7, 10, 0, 9), 8, 10],
    ['--array=2-5 (the documented example)', slurm(3, 4, 2, 5), 2, 4],
    ['--array=1-7:2', slurm(5, 4, 1, 7, 2), 3, 4],
    ['--array=0-30:10 (no STEP variable: from MIN, MAX, COUNT)', slurm(20, 4, 0, 30), 3, 4],
    ['--array=1-20%4 (a throttle changes nothing)', slurm(20, 20, 1, 20), 20, 20],
  ])('%s', (_what, env, index, count) => {
    expect(parseShard('auto', env)).toMatchObject({ index, count });
  });

  it('auto/N must agree with the array size', () => {
    expect(parseShard('auto/4', slurm(2, 4, 1, 4))).toMatchObject({ index: 2, count: 4 });
    expect(() => parseShard('auto/5', slurm(2, 4, 1, 4))).toThrow(/has 4 tasks/);
  });

  it('refuses arrays that are not one evenly spaced range, and half a job array', () => {
    expect(() => parseShard('auto', slurm(4, 3, 1, 9))).toThrow(/not one evenly spaced range/); // --array=1,4,9
    expect(() => parseShard('auto', { SLURM_ARRAY_TASK_ID: '3' })).toThrow(/SLURM_ARRAY_TASK_COUNT/);
    expect(() => parseShard('auto', { ...slurm(3, 4, 1, 4), SLURM_ARRAY_TASK_ID: 'x' })).toThrow(/not a whole number/);
  });
});

describe('--shard auto under a Kubernetes indexed job', () => {
  it('takes the 0-based completion index and the count from auto/N', () => {
    expect(parseShard('auto/5', { JOB_COMPLETION_INDEX: '0' })).toMatchObject({ index: 1, count: 5 });
    expect(parseShard('auto/5', { JOB_COMPLETION_INDEX: '4' })).toMatchObject({ index: 5, count: 5 });
  });
  it('needs the count said explicitly, and an index inside it', () => {
    expect(() => parseShard('auto', { JOB_COMPLETION_INDEX: '2' })).toThrow(/spec\.completions/);
    expect(() => parseShard('auto/3', { JOB_COMPLETION_INDEX: '3' })).toThrow(/outside 0 to 2/);
  });
  it('refuses to guess when both schedulers seem to be there', () => {
    expect(() => shardFromEnvironment({ JOB_COMPLETION_INDEX: '1', SLURM_ARRAY_TASK_ID: '1' }, 3)).toThrow(/both/);
  });
});

describe('canonical JSON (what a fingerprint is taken of)', () => {
  it('is the same for the same data whatever the key order', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { y: 2, x: 1 }], c: 'x' } })).toBe(canonicalJson({ a: { c: 'x', d: [1, { x: 1, y: 2 }] }, b: 1 }));
    expect(canonicalJson({ b: 1, a: 2 })).toBe('{"a":2,"b":1}');
  });
  it('keeps what plain JSON loses', () => {
    expect(canonicalJson([Number.NaN, Number.POSITIVE_INFINITY, null])).toBe('["NaN","Infinity",null]');
    expect(canonicalJson({ a: 1 })).not.toBe(canonicalJson({ a: 1.0000000000000002 }));
  });
});
