/**
 * One benchmark measurement per process (started by bench/run.ts), so that
 * each scheme is compiled by the JIT on its own and the peak resident size
 * belongs to one job only. Prints one JSON line on stdout.
 *
 *   probe.ts pipe    SCHEME MESH_M SECONDS   pure pipe update, closed ends
 *   probe.ts engine  SCHEME MESH_M REPEATS   whole engine (simulatePoint)
 *   probe.ts growth  SCHEME MESHES CYCLES    time per cycle at each mesh ("0.016,0.008")
 *   probe.ts sweep   JOBS POINTS [MESH_M]    speed sweep through the analysis runner (default: the demo's mesh)
 *   probe.ts chunks  POINTS                  CPU time per sweep chunk, two-worker bound
 *   probe.ts accuracy SCHEME MESHES RPMS     ηv and time per point (cold start) at each mesh and speed ("0.02,0.01" "3000,3250")
 *   probe.ts idle                            imports only (baseline resident size)
 *
 * Rates are node updates per second: mesh points × time steps / seconds
 * spent in the timed loop. Every engine run uses the bundled demo case.
 */
import { performance } from 'node:perf_hooks';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { EngineModel, SchemeName } from '../src/core/model.js';
import { simulatePoint, openEndCorrection, withEndCorrection } from '../src/core/engine.js';
import { buildMesh } from '../src/core/pipe/mesh.js';
import { createPipeScheme } from '../src/core/pipe/factory.js';
import type { PipeScheme } from '../src/core/pipe/scheme.js';
import { closedEnd } from '../src/core/boundary/closed.js';
import { newEndState, type Incoming } from '../src/core/boundary/types.js';
import { loadCase } from '../src/case/load.js';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
export const DEMO_CASE = join(ROOT, 'cases', 'demo.yaml');

function emit(value: unknown): void {
  process.stdout.write(`${JSON.stringify(value)}\n`);
}

function maxRssBytes(): number {
  return process.resourceUsage().maxRSS * 1024;
}

export async function demoModel(overrides: Partial<EngineModel['numerics']> = {}): Promise<EngineModel> {
  const loaded = await loadCase(DEMO_CASE);
  return { ...loaded.model, numerics: { ...loaded.model.numerics, ...overrides } };
}

function scheme(arg: string | undefined): SchemeName {
  if (arg === 'characteristics' || arg === 'conservative') return arg;
  throw new Error(`probe: unknown scheme '${arg}'`);
}

function num(arg: string | undefined, what: string): number {
  const v = Number(arg);
  if (!Number.isFinite(v) || v <= 0) throw new Error(`probe: bad ${what} '${arg}'`);
  return v;
}

/**
 * Advance `pipe` by `steps` CFL steps between two closed ends: the same work
 * per node and step as the C floor (interior update, both ends, CFL scan).
 */
function closedPipeSteps(pipe: PipeScheme, steps: number, courant: number): number {
  const incL: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const incR: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const left = newEndState();
  const right = newEndState();
  const t0 = performance.now();
  for (let s = 0; s < steps; s++) {
    const dt = pipe.maxStableDt(courant);
    pipe.incoming('left', dt, incL);
    pipe.incoming('right', dt, incR);
    closedEnd.solve(incL, left);
    closedEnd.solve(incR, right);
    pipe.step(dt, left, right);
  }
  return (performance.now() - t0) / 1000;
}

/** Pure pipe-update rate on the demo runner's mesh (end correction included, as the engine builds it). */
async function pipeRate(name: SchemeName, meshSize: number, seconds: number): Promise<void> {
  const model = await demoModel({ meshSize, scheme: name });
  const sections = withEndCorrection(model.runner.sections, openEndCorrection(model));
  const mesh = buildMesh(sections, meshSize);
  const pipe = createPipeScheme(name, mesh, {
    friction: model.runner.friction,
    heatTransfer: model.runner.heatTransfer,
    wallTemperature: model.runner.wallTemperature,
  });
  const n = mesh.n;
  // a smooth pressure pulse (+30 % peak) at 30 % of the length, gas at rest: it rings between the closed ends
  const p = new Float64Array(n);
  const u = new Float64Array(n);
  const T = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = mesh.x[i]! / mesh.length;
    p[i] = model.ambient.pressure * (1 + 0.3 * Math.exp(-200 * (x - 0.3) ** 2));
    T[i] = model.ambient.temperature;
  }
  pipe.setState(p, u, T);
  const courant = model.numerics.courant;
  // warm the JIT, then size the timed runs to about `seconds` each
  const warm = closedPipeSteps(pipe, 20000, courant);
  const steps = Math.max(20000, Math.round((20000 * seconds) / Math.max(warm, 1e-3)));
  let best = Infinity;
  for (let r = 0; r < 3; r++) best = Math.min(best, closedPipeSteps(pipe, steps, courant));
  if (!pipe.healthy()) throw new Error(`probe: the ${name} pipe went unhealthy during the benchmark`);
  emit({ kind: 'pipe', scheme: name, nodes: n, steps, seconds: best, rate: (n * steps) / best });
}

/** Run the model repeatedly for about `seconds`, so the JIT has compiled the hot paths before timing. */
function warmUp(model: EngineModel, seconds: number): void {
  const start = performance.now();
  do simulatePoint(model);
  while (performance.now() - start < seconds * 1000);
}

/** Whole-engine rate: nodes × steps / wall time of simulatePoint on the demo, the best run after a warm-up. */
async function engineRate(name: SchemeName, meshSize: number, repeats: number): Promise<void> {
  const model = await demoModel({ meshSize, scheme: name });
  warmUp(model, 0.6);
  let best = Infinity;
  let nodes = 0;
  let steps = 0;
  let cycles = 0;
  let imbalance = 0;
  let eta = 0;
  // at least `repeats` runs and about a second in all: one run at 4 mm takes a tenth of that
  const start = performance.now();
  for (let r = 0; r < repeats || performance.now() - start < 1000; r++) {
    const t0 = performance.now();
    const { result } = simulatePoint(model);
    const s = (performance.now() - t0) / 1000;
    if (s < best) best = s;
    nodes = result.stats.nodes;
    steps = result.stats.steps;
    cycles = result.cycles;
    imbalance = result.massImbalance;
    eta = result.volumetricEfficiency;
  }
  emit({ kind: 'engine', scheme: name, nodes, steps, cycles, seconds: best, rate: (nodes * steps) / best, massImbalance: imbalance, volumetricEfficiency: eta });
}

/** Time per cycle at each mesh size, a fixed number of cycles each (tolerance set so none stops early). */
async function growth(name: SchemeName, meshes: number[], cycles: number): Promise<void> {
  const base = await demoModel({ scheme: name, maxCycles: cycles, tolerance: 1e-300 });
  warmUp({ ...base, numerics: { ...base.numerics, meshSize: 0.008 } }, 0.6);
  const rows: { meshSize: number; nodes: number; stepsPerCycle: number; secondsPerCycle: number }[] = [];
  for (const meshSize of meshes) {
    const model: EngineModel = { ...base, numerics: { ...base.numerics, meshSize } };
    let best = Infinity;
    let nodes = 0;
    let steps = 0;
    let ran = 0;
    // repeat until about 0.25 s were spent (at least twice): coarse meshes take milliseconds per run
    const start = performance.now();
    for (let r = 0; r < 2 || performance.now() - start < 250; r++) {
      const t0 = performance.now();
      const { result } = simulatePoint(model);
      const s = (performance.now() - t0) / 1000;
      ran = result.cycles;
      nodes = result.stats.nodes;
      steps = result.stats.steps;
      best = Math.min(best, s / ran);
    }
    rows.push({ meshSize, nodes, stepsPerCycle: steps / ran, secondsPerCycle: best });
  }
  emit({ kind: 'growth', scheme: name, rows });
}

/** A speed sweep of `points` speeds from 3000 rpm in 250 rpm steps, on `jobs` workers, with the analysis runner. */
async function sweep(jobs: number, points: number, meshSize?: number): Promise<void> {
  let runSweep: ((m: EngineModel, rpms: readonly number[], o: { jobs: number }) => Promise<{ converged: boolean; massImbalance: number; volumetricEfficiency: number; rpm: number }[]>) | undefined;
  try {
    ({ runSweep } = await import('../src/analysis/worker-pool.js'));
  } catch (e) {
    emit({ kind: 'sweep', missing: `src/analysis/worker-pool.ts could not be loaded (${(e as Error).message})` });
    return;
  }
  const model = await demoModel(meshSize !== undefined ? { meshSize } : {});
  const rpms = Array.from({ length: points }, (_, i) => 3000 + 250 * i);
  const t0 = performance.now();
  const out = await runSweep(model, rpms, { jobs });
  const seconds = (performance.now() - t0) / 1000;
  const worstImbalance = out.reduce((w, p) => Math.max(w, Math.abs(p.massImbalance)), 0);
  emit({
    kind: 'sweep',
    jobs,
    points: out.length,
    seconds,
    unconverged: out.filter((p) => !p.converged).length,
    worstImbalance,
    maxRss: maxRssBytes(),
    meshSize: model.numerics.meshSize,
    rpms: out.map((p) => p.rpm),
    eta: out.map((p) => p.volumetricEfficiency),
  });
}

/**
 * ηv and the time of one point, started cold (no warm start, as a single
 * `tractwave run`), at every mesh and speed; the JIT is warmed first.
 */
async function accuracy(name: SchemeName, meshes: number[], rpms: number[]): Promise<void> {
  const base = await demoModel({ scheme: name });
  warmUp({ ...base, numerics: { ...base.numerics, meshSize: 0.01 } }, 0.6);
  const rows: { meshSize: number; nodes: number; eta: number[]; seconds: number[]; cycles: number[] }[] = [];
  for (const meshSize of meshes) {
    const eta: number[] = [];
    const seconds: number[] = [];
    const cycles: number[] = [];
    let nodes = 0;
    for (const rpm of rpms) {
      const model: EngineModel = { ...base, rpm, numerics: { ...base.numerics, meshSize } };
      const t0 = performance.now();
      const { result } = simulatePoint(model);
      seconds.push((performance.now() - t0) / 1000);
      eta.push(result.volumetricEfficiency);
      cycles.push(result.cycles);
      nodes = result.stats.nodes;
    }
    rows.push({ meshSize, nodes, eta, seconds, cycles });
  }
  emit({ kind: 'accuracy', scheme: name, rpms, rows });
}

/**
 * CPU time of each sweep chunk run alone in this thread, and the makespan of
 * handing them to two workers in order (each to whichever is free first):
 * the speed-up the chunking allows on an idle machine, before thread start-up.
 */
async function chunks(points: number): Promise<void> {
  const { chunkSpeeds, runChunk } = await import('../src/analysis/sweep.js');
  const model = await demoModel();
  const rpms = Array.from({ length: points }, (_, i) => 3000 + 250 * i);
  runChunk(model, rpms.slice(0, 2)); // warm-up
  const cpu: number[] = [];
  for (const c of chunkSpeeds(rpms)) {
    const t0 = process.cpuUsage();
    runChunk(model, c);
    const u = process.cpuUsage(t0);
    cpu.push((u.user + u.system) / 1e6);
  }
  const total = cpu.reduce((a, b) => a + b, 0);
  const busy = [0, 0];
  for (const c of cpu) busy[busy[0]! <= busy[1]! ? 0 : 1]! += c;
  emit({ kind: 'chunks', chunks: cpu.length, total, makespan2: Math.max(...busy), bound: total / Math.max(...busy) });
}

async function main(argv: string[]): Promise<void> {
  const [what, a, b, c] = argv;
  switch (what) {
    case 'pipe':
      return pipeRate(scheme(a), num(b, 'mesh size'), num(c, 'seconds'));
    case 'engine':
      return engineRate(scheme(a), num(b, 'mesh size'), Math.round(num(c, 'repeats')));
    case 'growth':
      return growth(
        scheme(a),
        (b ?? '').split(',').map((s) => num(s, 'mesh size')),
        Math.round(num(c, 'cycles')),
      );
    case 'sweep':
      return sweep(Math.round(num(a, 'jobs')), Math.round(num(b, 'points')), c === undefined ? undefined : num(c, 'mesh size'));
    case 'chunks':
      return chunks(Math.round(num(a, 'points')));
    case 'accuracy':
      return accuracy(
        scheme(a),
        (b ?? '').split(',').map((x) => num(x, 'mesh size')),
        (c ?? '').split(',').map((x) => num(x, 'speed')),
      );
    case 'idle':
      await demoModel();
      emit({ kind: 'idle', maxRss: maxRssBytes() });
      return;
    default:
      throw new Error(`probe: unknown measurement '${what}'`);
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  main(process.argv.slice(2)).catch((e: unknown) => {
    process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    process.exit(1);
  });
}
