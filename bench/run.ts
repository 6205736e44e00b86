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
 * Options: --quick (fewer repeats, for trying the bench itself);
 * --only=rates|growth|sweeps|startup (one section; RESULTS.md is not written).
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
    row('Update rate (4 mm, demo)', `${s}: whole engine`, mega(e.rate), ratioE !== undefined ? `C ${ratioE.toFixed(2)}× faster` : '');
  }
  if (c !== undefined) row('Update rate (4 mm, demo)', `C floor, ${nodes} nodes`, mega(c), 'gcc -O2, homentropic, closed ends');
  row('Update rate (4 mm, demo)', 'the C floor ported to TypeScript', mega(port), c !== undefined ? `C ${(c / port).toFixed(2)}× faster (language and JIT alone)` : '');
  for (const s of SCHEMES)
    row('Update rate (4 mm, demo)', `${s}: work per node vs the floor`, `${(port / pipe[s]!.rate).toFixed(2)}×`, 'TypeScript floor rate / pipe-update rate: the extra physics per node');

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

// ------------------------------------------------------------------ 3. sweeps and memory

interface SweepProbe {
  missing?: string;
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

function sweeps(tmp: string): void {
  heading(`Speed sweep, ${SWEEP_POINTS} points (${SWEEP_RANGE} rpm, demo case, its 10 mm mesh), 1 and 2 workers`);
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
  row('Sweep (30 points)', 'runSweep (demo mesh 10 mm), 1 worker', `${one.seconds.toFixed(2)} s`, '');
  row('Sweep (30 points)', 'runSweep (demo mesh 10 mm), 2 workers', `${two.seconds.toFixed(2)} s`, `speed-up ${speedUp.toFixed(2)} (target ≥ 1.6: ${speedUp >= 1.6 ? 'met' : 'missed'})`);

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
    ...(notes.length ? ['Notes:', '', ...notes.map((n) => `- ${n}`), ''] : []),
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
    if (!ONLY || ONLY === 'sweeps') sweeps(tmp);
    if (!ONLY || ONLY === 'startup') await startup();
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
