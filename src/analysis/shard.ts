/**
 * Design grids by arithmetic, and their deterministic slices (shards).
 *
 * A tune grid over axes of sizes n₁ … n_k holds n₁·…·n_k designs. Design
 * number i (0 ≤ i < total, "grid order": the first axis varies slowest) has
 * the axis positions of i written in the mixed radix (n₁, …, n_k):
 *   i = ((j₁·n₂ + j₂)·n₃ + j₃)·… + j_k.
 * So the grid is never built to be counted or cut: the count is a product,
 * a design is found from its number, and a slice lists only its numbers.
 *
 * Shard K of N (1 ≤ K ≤ N) holds the designs i with i mod N = K − 1, in grid
 * order. Dealt out like cards, neighbouring designs (which cost about the
 * same) go to different shards, so the shards take about equally long. The
 * slicing depends only on the grid and N: the same on any machine.
 *
 * Shard numbers from a scheduler (`--shard auto`): see `shardFromEnvironment`.
 */

/** Number of designs in a grid of axes of these sizes (may exceed 2^53 only for absurd grids: then Infinity). */
export function gridSize(sizes: readonly number[]): number {
  if (sizes.length === 0) return 0;
  let n = 1;
  for (const s of sizes) {
    n *= s;
    if (!Number.isSafeInteger(n)) return Number.POSITIVE_INFINITY;
  }
  return n;
}

/** Axis positions of design number `i` (grid order: first axis slowest). */
export function gridPosition(sizes: readonly number[], i: number): number[] {
  const out = new Array<number>(sizes.length).fill(0);
  let r = i;
  for (let k = sizes.length - 1; k >= 0; k--) {
    const n = sizes[k]!;
    out[k] = r % n;
    r = Math.floor(r / n);
  }
  return out;
}

/** Design number of axis positions (inverse of gridPosition). */
export function gridNumber(sizes: readonly number[], position: readonly number[]): number {
  let i = 0;
  for (let k = 0; k < sizes.length; k++) i = i * sizes[k]! + (position[k] ?? 0);
  return i;
}

export interface Shard {
  /** 1 … count */
  index: number;
  count: number;
}

/** How many designs shard K of N holds out of `total`. */
export function shardSize(total: number, shard: Shard): number {
  const first = shard.index - 1;
  return first >= total ? 0 : Math.floor((total - 1 - first) / shard.count) + 1;
}

/** The design numbers of shard K of N, ascending (the whole grid for 1/1). */
export function shardDesigns(total: number, shard: Shard): number[] {
  const out: number[] = [];
  for (let i = shard.index - 1; i < total; i += shard.count) out.push(i);
  return out;
}

/** A shard request that cannot be met; `option` names what to fix. */
export class ShardInputError extends Error {
  constructor(
    readonly option: string,
    readonly detail: string,
  ) {
    super(`${option}: ${detail}`);
    this.name = 'ShardInputError';
  }
}

/** the environment variables `--shard auto` reads (documented in the README) */
export const SHARD_ENVIRONMENT = {
  slurm: ['SLURM_ARRAY_TASK_ID', 'SLURM_ARRAY_TASK_COUNT', 'SLURM_ARRAY_TASK_MIN', 'SLURM_ARRAY_TASK_MAX', 'SLURM_ARRAY_TASK_STEP'],
  kubernetes: ['JOB_COMPLETION_INDEX'],
} as const;

export type Environment = Readonly<Record<string, string | undefined>>;

const WHOLE = /^\s*\d+\s*$/;

function whole(env: Environment, name: string): number | undefined {
  const v = env[name];
  if (v === undefined || v.trim() === '') return undefined;
  if (!WHOLE.test(v)) throw new ShardInputError('--shard', `${name} is '${v}', not a whole number`);
  return Number(v);
}

/**
 * The shard a scheduler gave this process.
 *
 * - Slurm job arrays (`sbatch --array=...`): SLURM_ARRAY_TASK_ID is this
 *   task's index, SLURM_ARRAY_TASK_COUNT the number of tasks, and
 *   SLURM_ARRAY_TASK_MIN / _MAX the lowest and highest index. The indices
 *   must form one evenly spaced range (0-9, 1-10, 0-30:10; SLURM_ARRAY_TASK_STEP
 *   when Slurm sets it, else (MAX − MIN)/(COUNT − 1)); shard K = (ID − MIN)/step + 1
 *   of N = COUNT. A list with gaps (--array=1,4,9) cannot be mapped and is refused.
 * - Kubernetes Indexed Jobs (completionMode: Indexed): JOB_COMPLETION_INDEX
 *   is the 0-based index; shard K = index + 1. Kubernetes does not put the
 *   number of completions into the pod's environment, so N must be given:
 *   `--shard auto/N` with N = the Job's spec.completions.
 *
 * `count` is N from `--shard auto/N` (undefined for plain `--shard auto`); under
 * Slurm it must equal SLURM_ARRAY_TASK_COUNT.
 */
export function shardFromEnvironment(env: Environment, count: number | undefined): Shard & { source: string } {
  const slurmId = whole(env, 'SLURM_ARRAY_TASK_ID');
  const k8sIndex = whole(env, 'JOB_COMPLETION_INDEX');
  if (slurmId !== undefined && k8sIndex !== undefined)
    throw new ShardInputError('--shard', 'both SLURM_ARRAY_TASK_ID and JOB_COMPLETION_INDEX are set; give the shard as --shard K/N');
  if (slurmId !== undefined) {
    const n = whole(env, 'SLURM_ARRAY_TASK_COUNT');
    const min = whole(env, 'SLURM_ARRAY_TASK_MIN');
    const max = whole(env, 'SLURM_ARRAY_TASK_MAX');
    if (n === undefined || min === undefined || max === undefined)
      throw new ShardInputError('--shard', 'SLURM_ARRAY_TASK_ID is set but not SLURM_ARRAY_TASK_COUNT, _MIN and _MAX (is this a job array task?)');
    if (n < 1) throw new ShardInputError('--shard', `SLURM_ARRAY_TASK_COUNT is ${n}`);
    if (count !== undefined && count !== n)
      throw new ShardInputError('--shard', `auto/${count} but the Slurm array has ${n} tasks (SLURM_ARRAY_TASK_COUNT); use --shard auto`);
    let step = whole(env, 'SLURM_ARRAY_TASK_STEP');
    if (step === undefined) step = n === 1 ? 1 : (max - min) / (n - 1);
    const k = (slurmId - min) / step;
    const even = Number.isInteger(step) && step >= 1 && max - min === step * (n - 1);
    if (!even || !Number.isInteger(k) || k < 0 || k >= n)
      throw new ShardInputError(
        '--shard',
        `the Slurm array's indices (${min} to ${max}, ${n} tasks, this one ${slurmId}) are not one evenly spaced range; ` +
          'submit it as --array=1-N (or 0-(N-1)), or give --shard K/N yourself',
      );
    return { index: k + 1, count: n, source: `Slurm array task ${slurmId} (indices ${min}–${max}, ${n} tasks)` };
  }
  if (k8sIndex !== undefined) {
    if (count === undefined)
      throw new ShardInputError(
        '--shard',
        'JOB_COMPLETION_INDEX is set, but Kubernetes does not tell a pod how many completions its Job has: write --shard auto/N with N = the Job\'s spec.completions',
      );
    if (k8sIndex >= count)
      throw new ShardInputError('--shard', `JOB_COMPLETION_INDEX is ${k8sIndex}, outside 0 to ${count - 1} for auto/${count} (is N the Job's spec.completions?)`);
    return { index: k8sIndex + 1, count, source: `Kubernetes completion index ${k8sIndex} of ${count}` };
  }
  throw new ShardInputError(
    '--shard',
    'auto needs a Slurm array task (SLURM_ARRAY_TASK_ID ...) or a Kubernetes indexed job (JOB_COMPLETION_INDEX); neither is set. Give --shard K/N',
  );
}

/** the most shards a grid may be cut into */
export const MAX_SHARDS = 100000;

/** Parse `--shard K/N`, `--shard auto` or `--shard auto/N`. */
export function parseShard(text: string, env: Environment): Shard & { source: string } {
  const t = text.trim();
  const m = /^(auto|\d+)(?:\/(\d+))?$/.exec(t);
  if (!m) throw new ShardInputError('--shard', `expected K/N (e.g. 2/8), auto or auto/N, got '${text}'`);
  const count = m[2] === undefined ? undefined : Number(m[2]);
  if (count !== undefined && !(count >= 1 && count <= MAX_SHARDS)) throw new ShardInputError('--shard', `N must be from 1 to ${MAX_SHARDS}, got ${m[2]}`);
  if (m[1] === 'auto') return shardFromEnvironment(env, count);
  if (count === undefined) throw new ShardInputError('--shard', `expected K/N (e.g. 2/8), got '${text}'`);
  const index = Number(m[1]);
  if (!(index >= 1 && index <= count)) throw new ShardInputError('--shard', `K must be from 1 to N (${count}), got ${m[1]}`);
  return { index, count, source: `--shard ${index}/${count}` };
}

/**
 * JSON with object keys sorted at every level: the same text for the same
 * data whatever order its keys were built in (what a fingerprint is taken of).
 * Non-finite numbers are written as the strings "NaN", "Infinity", "-Infinity".
 */
export function canonicalJson(value: unknown): string {
  if (typeof value === 'number') return Number.isFinite(value) ? JSON.stringify(value) : JSON.stringify(String(value));
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v)).join(',')}]`;
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
}
