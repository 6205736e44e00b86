/**
 * The benchmark (`npm run bench`): speed of the runner update against a C
 * floor, whole-engine speed, cost growth with the mesh, parallel sweeps,
 * start-up and memory — all measured side by side in this one run, then one
 * summary table, also written to bench/RESULTS.md with the machine's
 * description and the date.
 *
 * Each solver measurement runs in its own child process (bench/probe.ts) so
 * the JIT compiles one scheme at a time and resident sizes belong to one job.
 * Timed figures are the best of a few repeats (the least disturbed by other
 * work on the machine); start-up figures are medians of 5.
 *
 * Accuracy per second: ηv of each scheme at each mesh against a 1.25 mm
 * reference (conservative scheme) at the 30 sweep speeds, the time of one
 * point, the curve of error against cost, and the 30-point sweep at the
 * demo's own mesh checked against the reference at every point.
 *
 * Options: --quick (fewer repeats, for trying the bench itself);
 * --only=rates|growth|accuracy|sweeps|startup|pool (one section; RESULTS.md is not written).
 */
import { spawn, spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const PROBE = join(ROOT, 'bench', 'probe.ts');
const C_SOURCE = resolve(ROOT, '../shared/bench/ref_moc.c');
const BIN = join(ROOT, 'bin', 'tractwave.js');
const BUNDLE = join(ROOT, 'dist', 'tractwave.mjs');
const DEMO = join(ROOT, 'cases', 'demo.yaml');
const RESULTS = join(ROOT, 'bench', 'RESULTS.md');

const QUICK = process.argv.includes('--quick');
/** --only=rates|growth|sweeps|startup: one section, for looking into it (RESULTS.md is then not written) */
const ONLY = process.argv.find((a) => a.startsWith('--only='))?.slice(7);
/** the fine mesh of the rate comparison [m] */
const FINE_MESH = 0.004;
const SCHEMES = ['characteristics', 'conservative'] as const;
type Scheme = (typeof SCHEMES)[number];
const SWEEP_POINTS = 30;
const SWEEP_RANGE = '3000:10250:250'; // 30 speeds, as bench/probe.ts sweeps them

// ------------------------------------------------------------------ summary

interface Row {
  group: string;
  item: string;
  value: string;
  /** target or reference, and whether it is met */
  target: string;
}

const rows: Row[] = [];
/** markdown lines from bench/pool.ts, appended to RESULTS.md */
const poolLines: string[] = [];
const notes: string[] = [];

function row(group: string, item: string, value: string, target = ''): void {
  rows.push({ group, item, value, target });
}

function note(text: string): void {
  notes.push(text);
  console.log(`  note: ${text}`);
}

function heading(text: string): void {
  console.log(`\n== ${text}`);
}

const mega = (r: number) => `${(r / 1e6).toFixed(2)} M/s`;
const ms = (s: number) => `${(s * 1000).toFixed(0)} ms`;
const mib = (b: number) => `${(b / 2 ** 20).toFixed(0)} MiB`;

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : 0.5 * (s[m - 1]! + s[m]!);
}

/** least-squares slope of log y against log x */
export function logLogSlope(x: readonly number[], y: readonly number[]): number {
  const lx = x.map(Math.log);
  const ly = y.map(Math.log);
  const n = lx.length;
  const mx = lx.reduce((a, b) => a + b, 0) / n;
  const my = ly.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (lx[i]! - mx) * (ly[i]! - my);
    sxx += (lx[i]! - mx) ** 2;
  }
  return sxy / sxx;
}

// ------------------------------------------------------------------ child processes

function run(cmd: string, args: readonly string[], timeoutMs = 180_000): SpawnSyncReturns<string> {
  return spawnSync(cmd, args, { cwd: ROOT, encoding: 'utf8', timeout: timeoutMs, maxBuffer: 64 * 2 ** 20 });
}

/** Run one probe measurement; its last stdout line is JSON. */
function probe<T>(...args: (string | number)[]): T {
  const r = run(process.execPath, ['--import', 'tsx', PROBE, ...args.map(String)]);
  const last = (r.stdout ?? '').trim().split('\n').pop() ?? '';
  if (r.status !== 0 || !last.startsWith('{')) {
    throw new Error(`probe ${args.join(' ')} failed (exit ${r.status}${r.signal ? `, ${r.signal}` : ''}): ${(r.stderr ?? '').trim().split('\n').slice(0, 4).join(' | ')}`);
  }
  return JSON.parse(last) as T;
}

/** Wall time [s] of a whole process, from spawn to exit. */
function timeProcess(cmd: string, args: readonly string[]): { seconds: number; status: number | null; stderr: string; stdout: string } {
  const t0 = performance.now();
  const r = run(cmd, args);
  return { seconds: (performance.now() - t0) / 1000, status: r.status, stderr: r.stderr ?? '', stdout: r.stdout ?? '' };
}

// ------------------------------------------------------------------ 1. update rates against the C floor

interface PipeProbe {
  scheme: Scheme;
  nodes: number;
  steps: number;
  seconds: number;
  rate: number;
}
interface EngineProbe extends PipeProbe {
  cycles: number;
  massImbalance: number;
  volumetricEfficiency: number;
}

function hasGcc(): boolean {
  const r = spawnSync('gcc', ['--version'], { encoding: 'utf8' });
  return r.status === 0;
}

/** Compile the C floor; undefined (with a note) when it cannot be built. */
function buildCFloor(tmp: string): string | undefined {
  if (!existsSync(C_SOURCE)) {
    note(`C floor skipped: ${C_SOURCE} not found`);
    return undefined;
  }
  if (!hasGcc()) {
    note('C floor skipped: gcc is not installed');
    return undefined;
  }
  const exe = join(tmp, 'ref_moc');
  const r = run('gcc', ['-O2', '-o', exe, C_SOURCE, '-lm']);
  if (r.status !== 0) {
    note(`C floor skipped: gcc failed: ${(r.stderr ?? '').trim().split('\n')[0]}`);
    return undefined;
  }
  return exe;
}

/** C floor rate at `nodes` points: calibrated to about `seconds` per run, best of 3. */
function cFloorRate(exe: string, nodes: number, seconds: number): number {
  const once = (steps: number): number => {
    const r = run(exe, [String(nodes), String(steps)]);
    const v = Number((r.stdout ?? '').trim());
    if (r.status !== 0 || !(v > 0)) throw new Error(`ref_moc failed: ${r.stderr}`);
    return v;
  };
  const calib = once(20000);
  const steps = Math.max(20000, Math.round((calib * seconds) / nodes));
  let best = 0;
  for (let k = 0; k < 3; k++) best = Math.max(best, once(steps));
  return best;
}

function rates(tmp: string): void {
  heading(`Node-update rate on the demo engine at a ${FINE_MESH * 1000} mm mesh (node updates per second = nodes × steps / seconds)`);
  const secs = QUICK ? 0.2 : 0.5;
  const pipe: Partial<Record<Scheme, PipeProbe>> = {};
  const engine: Partial<Record<Scheme, EngineProbe>> = {};
  for (const s of SCHEMES) {
    const p = probe<PipeProbe>('pipe', s, FINE_MESH, secs);
    pipe[s] = p;
    console.log(`  pipe update, closed ends, ${s.padEnd(15)} ${mega(p.rate).padStart(11)}  (${p.nodes} nodes, ${p.steps} steps, ${p.seconds.toFixed(3)} s)`);
  }
  for (const s of SCHEMES) {
    const e = probe<EngineProbe>('engine', s, FINE_MESH, QUICK ? 1 : 3);
    engine[s] = e;
    console.log(
      `  whole engine (simulatePoint),  ${s.padEnd(15)} ${mega(e.rate).padStart(11)}  (${e.nodes} nodes, ${e.steps} steps, ${e.cycles} cycles, ${e.seconds.toFixed(3)} s; ` +
        `ηv ${e.volumetricEfficiency.toFixed(4)}, imbalance ${(100 * e.massImbalance).toFixed(3)} %)`,
    );
  }
  const nodes = pipe.characteristics?.nodes ?? engine.conservative?.nodes ?? 0;
  const exe = buildCFloor(tmp);
  let c: number | undefined;
  if (exe) {
    c = cFloorRate(exe, nodes, secs);
    console.log(`  C floor (gcc -O2 ref_moc.c)    ${''.padEnd(15)} ${mega(c).padStart(11)}  (${nodes} nodes)`);
  }
  // the same floor in TypeScript: what the language and JIT cost alone
  const port = (() => {
    const steps = Math.max(20000, Math.round(((c ?? 5e7) * secs) / nodes));
    let best = 0;
    for (let k = 0; k < 3; k++) {
      const r = run(process.execPath, ['--import', 'tsx', join(ROOT, 'bench', 'ref-moc.ts'), String(nodes), String(steps)]);
      const v = Number((r.stdout ?? '').trim());
      if (r.status !== 0 || !(v > 0)) throw new Error(`bench/ref-moc.ts failed: ${r.stderr}`);
      best = Math.max(best, v);
    }
    return best;
  })();
  console.log(`  the same floor in TypeScript (bench/ref-moc.ts) ${mega(port).padStart(11)}  (${nodes} nodes${c !== undefined ? `; C is ${(c / port).toFixed(2)}× faster: the language's share of the gap` : ''})`);
  for (const s of SCHEMES) {
    const p = pipe[s]!;
    const e = engine[s]!;
    const ratio = c !== undefined ? c / p.rate : undefined;
    const ratioE = c !== undefined ? c / e.rate : undefined;
    if (ratio !== undefined) console.log(`  ratio C / ${s}: pipe update ${ratio.toFixed(2)}×, whole engine ${ratioE!.toFixed(2)}×   (target: at most 2×)`);
    row('Update rate (4 mm, demo)', `${s}: pipe update`, mega(p.rate), ratio !== undefined ? `C ${ratio.toFixed(2)}× faster (target ≤ 2×: ${ratio <= 2 ? 'met' : 'missed'})` : 'no C floor');
    row(
      'Update rate (4 mm, demo)',
      `${s}: whole engine`,
      mega(e.rate),
      ratioE !== undefined ? `C ${ratioE.toFixed(2)}× faster${s === 'conservative' ? ` (target ≤ 5×: ${ratioE <= 5 ? 'met' : 'missed'})` : ''}` : '',
    );
    row('Update rate (4 mm, demo)', `${s}: time outside the pipe kernel`, `${(100 * (1 - e.rate / p.rate)).toFixed(0)} %`, 'boundaries, valves, volumes, samples and maps: 1 − whole-engine rate / pipe-update rate');
  }
  if (c !== undefined) row('Update rate (4 mm, demo)', `C floor, ${nodes} nodes`, mega(c), 'gcc -O2, homentropic, closed ends');
  row('Update rate (4 mm, demo)', 'the C floor ported to TypeScript', mega(port), c !== undefined ? `C ${(c / port).toFixed(2)}× faster (language and JIT alone)` : '');
  for (const s of SCHEMES)
    row(
      'Update rate (4 mm, demo)',
      `${s}: work per node vs the floor`,
      `${(port / pipe[s]!.rate).toFixed(2)}×`,
      `TypeScript floor rate / pipe-update rate: the extra physics per node${s === 'conservative' ? ` (target ≤ 4×: ${port / pipe[s]!.rate <= 4 ? 'met' : 'missed'})` : ''}`,
    );

  // the shipped command line (cold process: includes JIT warm-up), for what a user sees
  if (existsSync(BUNDLE) || existsSync(join(ROOT, 'dist', 'cli', 'main.js'))) {
    for (const s of SCHEMES) {
      const r = timeProcess(process.execPath, [BIN, 'run', DEMO, '--json', '--set', `numerics.meshSize=${FINE_MESH * 1000}mm`, '--set', `numerics.scheme=${s}`]);
      if (r.status !== 0) {
        note(`tractwave run (${s}) failed with exit ${r.status}: ${r.stderr.trim().split('\n')[0]}`);
        continue;
      }
      const j = JSON.parse(r.stdout) as { stats: { nodes: number; steps: number; wallSeconds: number } };
      const rate = (j.stats.nodes * j.stats.steps) / j.stats.wallSeconds;
      console.log(`  tractwave run --json, ${s}: ${mega(rate)} (cold process, ${j.stats.wallSeconds.toFixed(3)} s solve, ${r.seconds.toFixed(2)} s process)`);
      row('Update rate (4 mm, demo)', `${s}: \`tractwave run\` (cold)`, mega(rate), `${r.seconds.toFixed(2)} s for the whole command`);
    }
  }
}

// ------------------------------------------------------------------ 2. cost growth

interface GrowthProbe {
  scheme: Scheme;
  rows: { meshSize: number; nodes: number; stepsPerCycle: number; secondsPerCycle: number }[];
}

function growth(): void {
  heading('Cost growth: time per cycle against mesh size (fit: time ∝ nodes^k)');
  const meshes = [0.016, 0.008, 0.004, 0.002];
  for (const s of SCHEMES) {
    const g = probe<GrowthProbe>('growth', s, meshes.join(','), QUICK ? 2 : 3);
    for (const r of g.rows) {
      console.log(`  ${s.padEnd(15)} ${(r.meshSize * 1000).toFixed(0).padStart(2)} mm  ${String(r.nodes).padStart(4)} nodes  ${r.stepsPerCycle.toFixed(0).padStart(5)} steps/cycle  ${(r.secondsPerCycle * 1000).toFixed(1).padStart(7)} ms/cycle`);
    }
    const k = logLogSlope(
      g.rows.map((r) => r.nodes),
      g.rows.map((r) => r.secondsPerCycle),
    );
    const kFine = logLogSlope(
      g.rows.slice(-2).map((r) => r.nodes),
      g.rows.slice(-2).map((r) => r.secondsPerCycle),
    );
    console.log(`  ${s}: fitted exponent k = ${k.toFixed(2)} over 16–2 mm (4→2 mm alone: ${kFine.toFixed(2)}); expected about 2, above 2.2 is a defect`);
    const per = g.rows.map((r) => `${(r.meshSize * 1000).toFixed(0)} mm ${(r.secondsPerCycle * 1000).toFixed(1)}`).join(', ');
    row('Cost growth', `${s}: ms per cycle`, per, '');
    row('Cost growth', `${s}: exponent k`, k.toFixed(2), `expected ≈ 2, defect above 2.2: ${k > 2.2 ? 'DEFECT' : 'ok'}`);
  }
}

// ------------------------------------------------------------------ 3. accuracy per second

/** the 30 sweep speeds [rpm] */
const SWEEP_RPMS = Array.from({ length: SWEEP_POINTS }, (_, i) => 3000 + 250 * i);
/** the reference mesh [m] */
const REF_MESH = 0.00125;
const ACC_MESHES = [0.04, 0.03, 0.02, 0.015, 0.01, 0.005, 0.0025];

interface AccuracyProbe {
  scheme: Scheme;
  rpms: number[];
  rows: { meshSize: number; nodes: number; eta: number[]; seconds: number[]; cycles: number[] }[];
}

/** one probe in a child process, asynchronously (to run two side by side) */
function probeAsync<T>(...args: (string | number)[]): Promise<T> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['--import', 'tsx', PROBE, ...args.map(String)], { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString('utf8')));
    child.stderr.on('data', (d: Buffer) => (err += d.toString('utf8')));
    child.on('exit', (code) => {
      const last = out.trim().split('\n').pop() ?? '';
      if (code !== 0 || !last.startsWith('{')) fail(new Error(`probe ${args.join(' ')} failed (exit ${code}): ${err.trim().split('\n').slice(0, 4).join(' | ')}`));
      else done(JSON.parse(last) as T);
    });
  });
}

const referenceEta = new Map<number, number>();

/** ηv at the given speeds on the 1.25 mm mesh (conservative scheme), the missing ones computed in two processes side by side */
async function reference(rpms: readonly number[] = SWEEP_RPMS): Promise<Map<number, number>> {
  const need = rpms.filter((r) => !referenceEta.has(r));
  if (need.length === 0) return referenceEta;
  const t0 = performance.now();
  const halves = [need.filter((_, i) => i % 2 === 0), need.filter((_, i) => i % 2 === 1)].filter((h) => h.length > 0);
  const got = await Promise.all(halves.map((h) => probeAsync<AccuracyProbe>('accuracy', 'conservative', REF_MESH, h.join(','))));
  for (const g of got) g.rpms.forEach((r, i) => referenceEta.set(r, g.rows[0]!.eta[i]!));
  console.log(`  reference: conservative scheme, ${REF_MESH * 1000} mm mesh, ${need.length} speeds (${((performance.now() - t0) / 1000).toFixed(0)} s on two processes)`);
  return referenceEta;
}

/** the worst and mean |error| [%] of ηv against the reference over the given speeds */
function errors(rpms: readonly number[], eta: readonly number[], ref: Map<number, number>): { worst: number; mean: number; at: number } {
  let worst = 0;
  let sum = 0;
  let at = rpms[0] ?? 0;
  rpms.forEach((r, i) => {
    const e = Math.abs(eta[i]! / ref.get(r)! - 1) * 100;
    sum += e;
    if (e > worst) {
      worst = e;
      at = r;
    }
  });
  return { worst, mean: sum / rpms.length, at };
}

/** a small text plot of worst error [%] (log) against time per point [ms] (log), one letter per scheme */
function curvePlot(points: { scheme: Scheme; ms: number; err: number; mesh: number }[]): string[] {
  const W = 60;
  const H = 14;
  const lx = points.map((p) => Math.log10(p.ms));
  const ly = points.map((p) => Math.log10(Math.max(p.err, 1e-4)));
  const x0 = Math.floor(Math.min(...lx));
  const x1 = Math.ceil(Math.max(...lx));
  const y0 = Math.floor(Math.min(...ly));
  const y1 = Math.ceil(Math.max(...ly));
  const grid = Array.from({ length: H + 1 }, () => Array.from({ length: W + 1 }, () => ' '));
  const yTarget = Math.log10(0.2);
  const rowOf = (y: number) => Math.round(((y1 - y) / Math.max(1e-9, y1 - y0)) * H);
  if (yTarget >= y0 && yTarget <= y1) for (let c = 0; c <= W; c++) grid[rowOf(yTarget)]![c] = '·';
  points.forEach((p, k) => {
    const c = Math.round(((lx[k]! - x0) / Math.max(1e-9, x1 - x0)) * W);
    grid[rowOf(ly[k]!)]![c] = p.scheme === 'conservative' ? 'c' : 'm';
  });
  const labels = new Map<number, string>();
  for (let d = y0; d <= y1; d++) labels.set(rowOf(d), `${Number((10 ** d).toPrecision(1))}`);
  const lines = grid.map((g, r) => `${(labels.get(r) ?? '').padStart(6)} |${g.join('')}`);
  lines.push(`${''.padStart(6)} +${'-'.repeat(W + 1)}`);
  const ticks = Array.from({ length: x1 - x0 + 1 }, (_, i) => 10 ** (x0 + i));
  let axis = ''.padStart(8);
  ticks.forEach((t, i) => {
    const col = 8 + Math.round((i / Math.max(1, x1 - x0)) * W);
    axis = axis.padEnd(col) + `${t} ms`;
  });
  lines.push(axis);
  lines.push('worst |ηv error| [%] against time per point [ms], both axes logarithmic; c conservative, m characteristics; ··· the 0.2 % target');
  return lines;
}

const curveLines: string[] = [];

async function accuracyPerSecond(): Promise<void> {
  heading(`Accuracy per second: ηv against a ${REF_MESH * 1000} mm reference (conservative) at the ${SWEEP_POINTS} sweep speeds, time per point (cold start)`);
  const speeds = QUICK ? SWEEP_RPMS.filter((_, i) => i % 5 === 0) : SWEEP_RPMS.filter((_, i) => i % 2 === 0);
  const ref = await reference(QUICK ? speeds : SWEEP_RPMS);
  const meshes = QUICK ? [0.02, 0.01, 0.005] : ACC_MESHES;
  const pts: { scheme: Scheme; ms: number; err: number; mesh: number }[] = [];
  const probes = await Promise.all(SCHEMES.map((s) => probeAsync<AccuracyProbe>('accuracy', s, meshes.join(','), speeds.join(','))));
  for (const a of probes) {
    for (const r of a.rows) {
      const e = errors(a.rpms, r.eta, ref);
      const msPer = (1000 * r.seconds.reduce((x, y) => x + y, 0)) / r.seconds.length;
      const cyc = r.cycles.reduce((x, y) => x + y, 0) / r.cycles.length;
      pts.push({ scheme: a.scheme, ms: msPer, err: e.worst, mesh: r.meshSize });
      const mm = (r.meshSize * 1000).toFixed(r.meshSize < 0.01 ? 1 : 0);
      console.log(
        `  ${a.scheme.padEnd(15)} ${mm.padStart(4)} mm  ${String(r.nodes).padStart(4)} nodes  worst ${e.worst.toFixed(3)} % (at ${e.at} rpm), mean ${e.mean.toFixed(3)} %  ${msPer.toFixed(1).padStart(6)} ms/point  ${cyc.toFixed(1)} cycles`,
      );
      row(
        'Accuracy per second',
        `${a.scheme}, ${mm} mm (${r.nodes} nodes)`,
        `worst ${e.worst.toFixed(3)} %, mean ${e.mean.toFixed(3)} %`,
        `${msPer.toFixed(1)} ms/point, ${cyc.toFixed(1)} cycles (target ≤ 0.2 %: ${e.worst <= 0.2 ? 'met' : 'missed'})`,
      );
    }
  }
  note(
    `accuracy rows: ${speeds.length} of the ${SWEEP_POINTS} sweep speeds (${speeds[0]}–${speeds[speeds.length - 1]} rpm), each point from a cold start at the demo's tolerance; the two schemes ran side by side (two processes), so their times are comparable with each other, not with the single-process rates`,
  );
  curveLines.push(...curvePlot(pts));
  for (const l of curveLines) console.log(`  ${l}`);
}

// ------------------------------------------------------------------ 4. sweeps and memory

interface SweepProbe {
  missing?: string;
  meshSize: number;
  rpms: number[];
  eta: number[];
  jobs: number;
  points: number;
  seconds: number;
  unconverged: number;
  worstImbalance: number;
  maxRss: number;
}

/**
 * The built CLI's sweep (--json), through a small wrapper module that reports
 * the process's peak resident size on stderr. Gives the whole process's wall
 * time and the sweep's own wall time (stats.wallSeconds of the JSON).
 */
function cliSweep(jobs: number, tmp: string): { seconds: number; sweepSeconds: number; maxRss: number } | undefined {
  const entry = existsSync(BUNDLE) ? BUNDLE : join(ROOT, 'dist', 'cli', 'main.js');
  if (!existsSync(entry)) return undefined;
  const wrapper = join(tmp, 'cli-sweep.mjs');
  writeFileSync(
    wrapper,
    `const { main } = await import(${JSON.stringify(pathToFileURL(entry).href)});\n` +
      `process.on('exit', () => process.stderr.write('\\nBENCH_MAXRSS ' + process.resourceUsage().maxRSS + '\\n'));\n` +
      `await main(process.argv.slice(2));\n`,
  );
  const r = timeProcess(process.execPath, [wrapper, 'sweep', DEMO, '--rpm', SWEEP_RANGE, '--jobs', String(jobs), '--json']);
  const m = /BENCH_MAXRSS (\d+)/.exec(r.stderr);
  let sweepSeconds = Number.NaN;
  try {
    sweepSeconds = (JSON.parse(r.stdout) as { stats: { wallSeconds: number } }).stats.wallSeconds;
  } catch {
    /* reported below */
  }
  if (r.status !== 0 || !m || !Number.isFinite(sweepSeconds)) {
    note(`tractwave sweep --jobs ${jobs} failed (exit ${r.status}): ${r.stderr.trim().split('\n')[0]}`);
    return undefined;
  }
  return { seconds: r.seconds, sweepSeconds, maxRss: Number(m[1]) * 1024 };
}

async function sweeps(tmp: string): Promise<void> {
  heading(`Speed sweep, ${SWEEP_POINTS} points (${SWEEP_RANGE} rpm, demo case, its own mesh), 1 and 2 workers`);
  const cores = os.availableParallelism();
  if (cores < 2) note(`only ${cores} core: the 2-worker speed-up cannot be measured`);
  const best: Record<number, SweepProbe | undefined> = { 1: undefined, 2: undefined };
  const order = QUICK ? [1, 2] : [1, 2, 1, 2];
  for (const jobs of order) {
    const s = probe<SweepProbe>('sweep', jobs, SWEEP_POINTS);
    if (s.missing) {
      note(`sweep skipped: ${s.missing}`);
      return;
    }
    console.log(`  runSweep, ${jobs} worker${jobs > 1 ? 's' : ' '}: ${s.seconds.toFixed(2)} s  (${s.points} points, ${s.unconverged} unconverged, worst imbalance ${(100 * s.worstImbalance).toFixed(3)} %, peak RSS ${mib(s.maxRss)})`);
    const b = best[jobs];
    if (!b || s.seconds < b.seconds) best[jobs] = { ...s, maxRss: Math.max(s.maxRss, b?.maxRss ?? 0) };
    else b.maxRss = Math.max(b.maxRss, s.maxRss);
  }
  const one = best[1]!;
  const two = best[2]!;
  const speedUp = one.seconds / two.seconds;
  console.log(`  speed-up on 2 workers: ${speedUp.toFixed(2)}  (target ≥ 1.6 on 2 cores)`);
  const meshMm = `${(one.meshSize * 1000).toFixed(0)} mm`;
  row('Sweep (30 points)', `runSweep (demo mesh ${meshMm}), 1 worker`, `${one.seconds.toFixed(2)} s`, `target ≤ 0.3 s: ${one.seconds <= 0.3 ? 'met' : 'missed'}`);
  row('Sweep (30 points)', `runSweep (demo mesh ${meshMm}), 2 workers`, `${two.seconds.toFixed(2)} s`, `speed-up ${speedUp.toFixed(2)} (target ≥ 1.6: ${speedUp >= 1.6 ? 'met' : 'missed'})`);
  if (!QUICK) {
    const ref = await reference();
    const e = errors(one.rpms, one.eta, ref);
    console.log(`  ηv of the 1-worker sweep against the ${REF_MESH * 1000} mm reference: worst ${e.worst.toFixed(3)} % (at ${e.at} rpm), mean ${e.mean.toFixed(3)} %`);
    row('Sweep (30 points)', `ηv of that sweep vs the ${REF_MESH * 1000} mm reference`, `worst ${e.worst.toFixed(3)} % (${e.at} rpm)`, `every point within 0.2 %: ${e.worst <= 0.2 ? 'met' : 'missed'}`);
  }

  // the same sweep with four times the work per point (4 mm mesh): thread start-up and warm-up weigh less
  if (!QUICK) {
    const f1 = probe<SweepProbe>('sweep', 1, SWEEP_POINTS, FINE_MESH);
    const f2 = probe<SweepProbe>('sweep', 2, SWEEP_POINTS, FINE_MESH);
    const suF = f1.seconds / f2.seconds;
    console.log(`  at a ${FINE_MESH * 1000} mm mesh: 1 worker ${f1.seconds.toFixed(2)} s, 2 workers ${f2.seconds.toFixed(2)} s, speed-up ${suF.toFixed(2)}`);
    row('Sweep (30 points)', `runSweep at ${FINE_MESH * 1000} mm, 1 / 2 workers`, `${f1.seconds.toFixed(2)} s / ${f2.seconds.toFixed(2)} s`, `speed-up ${suF.toFixed(2)} (target ≥ 1.6: ${suF >= 1.6 ? 'met' : 'missed'})`);
  }
  const ch = probe<{ chunks: number; total: number; makespan2: number; bound: number }>('chunks', SWEEP_POINTS);
  console.log(
    `  chunk work (CPU time, one thread): ${ch.chunks} chunks, ${ch.total.toFixed(2)} s in all; on two workers the longest share is ${ch.makespan2.toFixed(2)} s: ` +
      `the chunking allows a speed-up of ${ch.bound.toFixed(2)} before thread start-up`,
  );
  row('Sweep (30 points)', 'work-balance bound on 2 workers', ch.bound.toFixed(2), `${ch.chunks} chunks, ${ch.total.toFixed(2)} s CPU in all`);
  // the built command: best of two each, alternating
  let c1: ReturnType<typeof cliSweep>;
  let c2: ReturnType<typeof cliSweep>;
  for (let k = 0; k < (QUICK ? 1 : 2); k++) {
    const a = cliSweep(1, tmp);
    const b = cliSweep(2, tmp);
    if (a && (!c1 || a.sweepSeconds < c1.sweepSeconds)) c1 = { ...a, maxRss: Math.max(a.maxRss, c1?.maxRss ?? 0) };
    if (b && (!c2 || b.sweepSeconds < c2.sweepSeconds)) c2 = { ...b, maxRss: Math.max(b.maxRss, c2?.maxRss ?? 0) };
  }
  if (c1 && c2) {
    const su = c1.sweepSeconds / c2.sweepSeconds;
    const suP = c1.seconds / c2.seconds;
    console.log(
      `  tractwave sweep --json: sweep ${c1.sweepSeconds.toFixed(2)} s on 1 job, ${c2.sweepSeconds.toFixed(2)} s on 2 (speed-up ${su.toFixed(2)}); ` +
        `whole command ${c1.seconds.toFixed(2)} s / ${c2.seconds.toFixed(2)} s (speed-up ${suP.toFixed(2)})`,
    );
    row('Sweep (30 points)', '`tractwave sweep`, --jobs 1 / 2', `${c1.sweepSeconds.toFixed(2)} s / ${c2.sweepSeconds.toFixed(2)} s`, `speed-up ${su.toFixed(2)} (target ≥ 1.6: ${su >= 1.6 ? 'met' : 'missed'})`);
    row('Sweep (30 points)', '`tractwave sweep`, whole process, 1 / 2', `${c1.seconds.toFixed(2)} s / ${c2.seconds.toFixed(2)} s`, `speed-up ${suP.toFixed(2)} (start-up included)`);
  }

  heading('Memory: peak resident size (maxRSS)');
  const idle = probe<{ maxRss: number }>('idle');
  console.log(`  probe process with the case loaded, no simulation: ${mib(idle.maxRss)}`);
  console.log(`  30-point sweep, 1 worker: ${mib(one.maxRss)}; 2 workers: ${mib(two.maxRss)}`);
  row('Memory (peak RSS)', '30-point sweep, 1 / 2 workers (tsx)', `${mib(one.maxRss)} / ${mib(two.maxRss)}`, `baseline (tsx, case loaded) ${mib(idle.maxRss)}`);
  if (c1 && c2) {
    console.log(`  tractwave sweep: --jobs 1 ${mib(c1.maxRss)}; --jobs 2 ${mib(c2.maxRss)}`);
    row('Memory (peak RSS)', '`tractwave sweep`, --jobs 1 / 2', `${mib(c1.maxRss)} / ${mib(c2.maxRss)}`, '');
  }
}

// ------------------------------------------------------------------ 4. start-up

const ANSI = /\u001b\[[0-9;?]*[ -/]*[@-~]|\u001b[()][A-Za-z0-9]|\u001b[=>78]/g;

/**
 * Launch `command` under a pseudo-terminal (script(1)) and time the first
 * frame (the first output with at least 40 visible characters) and the first
 * frame that shows a simulated result (it contains `resultMark`); then quit
 * with 'q' and, if needed, end the process group we started.
 */
function ptyFirstFrame(command: string, resultMark: RegExp, timeoutMs = 15_000): Promise<{ frame?: number; result?: number; text: string }> {
  return new Promise((done) => {
    const t0 = performance.now();
    const child = spawn('script', ['-qfc', `stty cols 100 rows 30; exec ${command}`, '/dev/null'], {
      cwd: ROOT,
      stdio: ['pipe', 'pipe', 'pipe'],
      detached: true,
      env: { ...process.env, TERM: 'xterm-256color' },
    });
    let raw = '';
    let frame: number | undefined;
    let result: number | undefined;
    let text = '';
    let finished = false;
    const killGroup = (): void => {
      if (child.pid === undefined) return;
      try {
        process.kill(-child.pid, 'SIGTERM');
      } catch {
        /* already gone */
      }
    };
    const finish = (): void => {
      if (finished) return;
      finished = true;
      clearTimeout(guard);
      child.stdin.write('q');
      const hard = setTimeout(killGroup, 3000);
      child.once('exit', () => clearTimeout(hard));
      done({ ...(frame !== undefined ? { frame } : {}), ...(result !== undefined ? { result } : {}), text });
    };
    const guard = setTimeout(() => {
      finish();
      killGroup();
    }, timeoutMs);
    child.stdout.on('data', (d: Buffer) => {
      raw += d.toString('utf8');
      const visible = raw.replace(ANSI, '').replace(/\s+/g, ' ');
      const now = performance.now() - t0;
      if (frame === undefined && visible.trim().length >= 40) {
        frame = now;
        text = visible.trim().slice(0, 160);
      }
      if (result === undefined && resultMark.test(visible)) {
        result = now;
        finish();
      }
    });
    child.on('exit', () => finish());
  });
}

async function startup(): Promise<void> {
  heading('Start-up (median of 5)');
  const n = QUICK ? 3 : 5;
  const nodeE0: number[] = [];
  const check: number[] = [];
  const ptyBase: number[] = [];
  const frame: number[] = [];
  const result: number[] = [];
  const built = existsSync(BUNDLE) || existsSync(join(ROOT, 'dist', 'cli', 'main.js'));
  if (!built) note('start-up of the command skipped: not built (npm run build)');
  const havePty = spawnSync('script', ['-qfc', 'true', '/dev/null'], { encoding: 'utf8', timeout: 10_000 }).status === 0;
  if (!havePty) note('first-frame timing skipped: script(1) is not available to give the view a pseudo-terminal');
  let frameText = '';
  for (let k = 0; k < n; k++) {
    nodeE0.push(timeProcess(process.execPath, ['-e', '0']).seconds);
    if (!built) continue;
    const c = timeProcess(process.execPath, [BIN, 'check', DEMO]);
    if (c.status !== 0) {
      note(`tractwave check failed (exit ${c.status}): ${c.stderr.trim().split('\n')[0]}`);
      break;
    }
    check.push(c.seconds);
    if (!havePty) continue;
    const b = await ptyFirstFrame(`${JSON.stringify(process.execPath)} -e "process.stdout.write('x'.repeat(60))"`, /x{40}/);
    if (b.frame !== undefined) ptyBase.push(b.frame / 1000);
    const f = await ptyFirstFrame(`${JSON.stringify(process.execPath)} ${JSON.stringify(BIN)} ${JSON.stringify(DEMO)}`, /ηv\s*\d/);
    if (f.frame !== undefined) frame.push(f.frame / 1000);
    if (f.result !== undefined) result.push(f.result / 1000);
    if (f.text) frameText = f.text;
  }
  const m0 = median(nodeE0);
  console.log(`  node -e 0: ${ms(m0)}`);
  row('Start-up (median)', '`node -e 0`', ms(m0), 'reference');
  if (check.length) {
    console.log(`  tractwave check cases/demo.yaml: ${ms(median(check))} (${(median(check) / m0).toFixed(1)}× node -e 0)`);
    row('Start-up (median)', '`tractwave check` demo, to exit', ms(median(check)), `${(median(check) / m0).toFixed(1)}× node -e 0`);
  }
  if (ptyBase.length) {
    console.log(`  pseudo-terminal launch baseline (script + node printing at once): ${ms(median(ptyBase))}`);
    row('Start-up (median)', 'pty baseline (script + node -e print)', ms(median(ptyBase)), 'reference for the view');
  }
  if (frame.length) {
    console.log(`  terminal view, first frame: ${ms(median(frame))}; first frame with a result (ηv): ${result.length ? ms(median(result)) : 'not seen'}`);
    console.log(`    first frame began: "${frameText.slice(0, 100)}"`);
    row('Start-up (median)', 'terminal view, first frame', ms(median(frame)), ptyBase.length ? `${ms(median(frame) - median(ptyBase))} over the pty baseline` : '');
    if (result.length) row('Start-up (median)', 'terminal view, first result shown', ms(median(result)), 'demo at 6500 rpm');
  } else if (built && havePty) note('the terminal view drew no frame under script(1) within 15 s');
}

// ------------------------------------------------------------------ machine, staleness, output

function newestMtime(dir: string): number {
  let t = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) t = Math.max(t, newestMtime(p));
    else t = Math.max(t, statSync(p).mtimeMs);
  }
  return t;
}

function machine(): string {
  const cpu = os.cpus()[0]?.model?.trim() ?? 'unknown CPU';
  return `${cpu}, ${os.cpus().length} cores (${os.availableParallelism()} available), ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB, ${os.type()} ${os.release()}, Node ${process.version}`;
}

function table(): string[] {
  const head = ['Group', 'Measure', 'Value', 'Target / reference'];
  const body = rows.map((r) => [r.group, r.item, r.value, r.target]);
  const w = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i]!.length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(w[i]!)).join(' | ')} |`;
  return [line(head), `|${w.map((x) => '-'.repeat(x + 2)).join('|')}|`, ...body.map(line)];
}

function writeResults(date: string, load: string, seconds: number): void {
  const md = [
    '# Benchmark results',
    '',
    'Written by `npm run bench` (bench/run.ts); every figure below was measured in the same run.',
    '',
    `- Machine: ${machine()}`,
    `- Date: ${date}`,
    `- Load average at the start: ${load} (other work on the machine slows the figures)`,
    `- Bench wall time: ${seconds.toFixed(0)} s${QUICK ? ' (--quick)' : ''}`,
    '',
    ...table(),
    '',
    'Rates are node updates per second: mesh points × time steps / seconds. "Pipe update" drives one',
    'scheme alone between two closed ends on the demo runner\'s mesh (the work the C floor does);',
    '"whole engine" is `simulatePoint` on the demo (boundaries, cylinder, sampling included).',
    'The C floor (../shared/bench/ref_moc.c, gcc -O2) is a homentropic characteristics update without',
    'entropy levels, heat transfer or mass correction: a floor for the cost, not a physics reference.',
    '',
    ...(curveLines.length ? ['Error against cost (accuracy rows above):', '', '```', ...curveLines, '```', ''] : []),
    ...(notes.length ? ['Notes:', '', ...notes.map((n) => `- ${n}`), ''] : []),
    ...(poolLines.length ? ['## Worker pool and view (bench/pool.ts)', '', ...poolLines, ''] : []),
  ].join('\n');
  const tmp = `${RESULTS}.${process.pid}.tmp`;
  writeFileSync(tmp, md, 'utf8');
  renameSync(tmp, RESULTS);
}

async function main(): Promise<void> {
  const t0 = performance.now();
  const date = new Date().toISOString().replace(/\.\d+Z$/, 'Z');
  const load = os.loadavg().map((x) => x.toFixed(2)).join(', ');
  console.log(`tractwave benchmark — ${date}\n${machine()}\nload average ${load}`);
  if (existsSync(BUNDLE) && newestMtime(join(ROOT, 'src')) > statSync(BUNDLE).mtimeMs)
    note('dist/tractwave.mjs is older than src/: the command-line figures are for the last build (npm run build)');
  const tmp = mkdtempSync(join(os.tmpdir(), 'tractwave-bench-'));
  try {
    if (!ONLY || ONLY === 'rates') rates(tmp);
    if (!ONLY || ONLY === 'growth') growth();
    if (!ONLY || ONLY === 'accuracy') await accuracyPerSecond();
    if (!ONLY || ONLY === 'sweeps') await sweeps(tmp);
    if (!ONLY || ONLY === 'startup') await startup();
    // the worker pool's and the view's measurements (bench/pool.ts, another owner): `benchPool()` returns markdown lines
    if (existsSync(join(ROOT, 'bench', 'pool.ts')) && (!ONLY || ONLY === 'pool')) poolLines.push(...String(await ((await import(pathToFileURL(join(ROOT, 'bench', 'pool.ts')).href)) as { benchPool: () => Promise<string> }).benchPool()).split('\n'));
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
  const seconds = (performance.now() - t0) / 1000;
  heading(`Summary (${machine()}; ${date})`);
  for (const l of table()) console.log(l);
  if (ONLY) console.log(`\n--only=${ONLY}: ${RESULTS} not written (bench took ${seconds.toFixed(0)} s)`);
  else {
    writeResults(date, load, seconds);
    console.log(`\nwrote ${RESULTS} (bench took ${seconds.toFixed(0)} s)`);
  }
}

await main();
