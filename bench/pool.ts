/**
 * The worker pool and the view over a slow link, measured (issue 14 item 4
 * and the SSH target):
 *
 *   1. `tractwave sweep` of 30 points as a whole process (start-up, case,
 *      workers, sweep, output), --jobs 1 against --jobs 2, and whether the
 *      two print the same points;
 *   2. the view's sweep after an edit on the kept pool: the first point, the
 *      point at the view's speed and the whole curve, and one point's re-run
 *      after a Case-view edit, on the engine alone and end to end in the
 *      running view (key to redraw);
 *   3. the bytes the view writes per frame while it plays the cycle at
 *      80×24, Ink's full redraw against its line-by-line one (the view's
 *      setting), and the frames per second.
 *
 * Run alone with `node --import tsx bench/pool.ts` (it builds nothing: run
 * `npm run build` first so the process figures use the bundle), or call
 * `benchPool()` from bench/run.ts: it returns markdown lines.
 * Timed figures are the best of a few repeats (the least disturbed by other
 * work on the shared machine), with the median beside them.
 */
import { spawnSync } from 'node:child_process';
import { EventEmitter } from 'node:events';
import { existsSync } from 'node:fs';
import os from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath, pathToFileURL } from 'node:url';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const BIN = join(ROOT, 'bin', 'tractwave.js');
const DEMO = join(ROOT, 'cases', 'demo.yaml');
const RANGE = '3000:10250:250'; // 30 speeds
// the view runs from the bundle, which is built with NODE_ENV=production: React's production build
if (process.env['NODE_ENV'] === undefined) process.env['NODE_ENV'] = 'production';
const QUICK = process.argv.includes('--quick');
/** --only=process|view|edit|bytes: one section */
const ONLY = process.argv.find((a) => a.startsWith('--only='))?.slice(7);

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n === 0 ? Number.NaN : n % 2 ? s[(n - 1) / 2]! : 0.5 * (s[n / 2 - 1]! + s[n / 2]!);
}

const f = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : 'n/a');

// ------------------------------------------------------------ 1. the process

interface ProcessRun {
  seconds: number;
  /** the sweep alone, as the command reports it (stats.wallSeconds) */
  sweepSeconds: number;
  points: string;
}

function sweepProcess(jobs: number, sets: readonly string[] = []): ProcessRun {
  const t0 = performance.now();
  const setArgs = sets.flatMap((x) => ['--set', x]);
  const r = spawnSync(process.execPath, [BIN, 'sweep', DEMO, '--rpm', RANGE, ...setArgs, '--jobs', String(jobs), '--json'], { encoding: 'utf8', timeout: 300_000 });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`tractwave sweep --jobs ${jobs} failed (${r.status}): ${r.stderr}`);
  const json = JSON.parse(r.stdout) as { points: unknown[]; stats: { wallSeconds: number } };
  if (json.points.length !== 30) throw new Error(`expected 30 points, got ${json.points.length}`);
  return { seconds, sweepSeconds: json.stats.wallSeconds, points: JSON.stringify(json.points) };
}

/**
 * What a second thread gives on this machine now: the same arithmetic loop
 * on one worker, then on two at once. On a quiet 2-core machine two threads
 * take about the time of one (2× the throughput); when other work already
 * fills the cores they take about twice as long, and no sweep can gain.
 */
async function machineParallelism(): Promise<number> {
  const { Worker } = await import('node:worker_threads');
  const code =
    "const { parentPort } = require('node:worker_threads');" +
    "parentPort.on('message', (n) => { let x = 0; for (let i = 0; i < n; i++) x = (x * 1103515245 + 12345) & 0x7fffffff; parentPort.postMessage(x); });";
  const N = 1e8;
  const timed = async (k: number): Promise<number> => {
    const ws = Array.from({ length: k }, () => new Worker(code, { eval: true }));
    // warm each one up first (start-up and compiling are not what is measured)
    await Promise.all(ws.map((w) => new Promise((r) => (w.once('message', r), w.postMessage(1e6)))));
    const t0 = performance.now();
    await Promise.all(ws.map((w) => new Promise((r) => (w.once('message', r), w.postMessage(N)))));
    const t = performance.now() - t0;
    await Promise.all(ws.map((w) => w.terminate()));
    return t;
  };
  const one = Math.min(await timed(1), await timed(1));
  const two = Math.min(await timed(2), await timed(2));
  return (2 * one) / two;
}

/** CPU seconds of every thread but the main one in a process that runs the 30-point sweep once on its main thread (Linux only) */
function helperThreadsCpu(): number | undefined {
  if (!existsSync('/proc/self/task') || !existsSync(join(ROOT, 'dist', 'analysis', 'sweep.js'))) return undefined;
  const script =
    `const { readdirSync, readFileSync } = await import('node:fs');` +
    `const { loadCase } = await import(${JSON.stringify(pathToFileURL(join(ROOT, 'dist', 'case', 'load.js')).href)});` +
    `const { runSweepSerial } = await import(${JSON.stringify(pathToFileURL(join(ROOT, 'dist', 'analysis', 'sweep.js')).href)});` +
    `const m = (await loadCase(${JSON.stringify(DEMO)})).model; const rpms = []; for (let r = 3000; r <= 10250; r += 250) rpms.push(r);` +
    `const cpu = (t) => { const s = readFileSync('/proc/self/task/' + t + '/stat', 'utf8'); const f = s.slice(s.lastIndexOf(')') + 2).split(' '); return Number(f[11]) + Number(f[12]); };` +
    `const others = () => readdirSync('/proc/self/task').filter((t) => Number(t) !== process.pid).reduce((a, t) => a + cpu(t), 0);` +
    `const h0 = others(); runSweepSerial(m, rpms); process.stdout.write(String((others() - h0) / 100));`;
  const runs: number[] = [];
  for (let k = 0; k < 3; k++) {
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8', timeout: 120_000 });
    const v = Number(r.stdout);
    if (r.status === 0 && Number.isFinite(v)) runs.push(v);
  }
  return runs.length > 0 ? median(runs) : undefined;
}

async function processSection(out: string[]): Promise<void> {
  const gain = await machineParallelism();
  out.push(
    `- what a second thread gives on this machine now (the same arithmetic loop on 1 and on 2 threads at once, best of 2): ${f(gain)}× the throughput of one ` +
      `(2 on a quiet 2-core machine; near 1 when other work fills the cores, and then no sweep can gain either)`,
  );
  if (!existsSync(join(ROOT, 'dist', 'tractwave.mjs'))) {
    out.push('- `tractwave sweep` as a process: not measured (run `npm run build` first)');
    return;
  }
  const repeats = QUICK ? 2 : 5;
  const one: ProcessRun[] = [];
  const two: ProcessRun[] = [];
  let same = true;
  const load = os.loadavg()[0] ?? Number.NaN;
  for (let k = 0; k < repeats; k++) {
    // alternate, so a disturbance on the machine falls on both
    const a = sweepProcess(1);
    const b = sweepProcess(2);
    one.push(a);
    two.push(b);
    if (a.points !== b.points) same = false;
  }
  const best = (runs: ProcessRun[], k: 'seconds' | 'sweepSeconds'): number => Math.min(...runs.map((r) => r[k]));
  const med = (runs: ProcessRun[], k: 'seconds' | 'sweepSeconds'): number => median(runs.map((r) => r[k]));
  const rest = (runs: ProcessRun[]): number => median(runs.map((r) => r.seconds - r.sweepSeconds));
  out.push(
    `- \`tractwave sweep\` of 30 points as a whole process (bundle, ${repeats} runs each, best / median; load average ${f(load, 1)} on ${os.availableParallelism()} cores): ` +
      `--jobs 1 ${f(best(one, 'seconds'))} / ${f(med(one, 'seconds'))} s, --jobs 2 ${f(best(two, 'seconds'))} / ${f(med(two, 'seconds'))} s; ` +
      `two workers ${f(best(one, 'seconds') / best(two, 'seconds'))}× (median ${f(med(one, 'seconds') / med(two, 'seconds'))}×; target ≥ 1.7×); points bit-identical: ${same ? 'yes' : 'NO'}`,
    `- of which the sweep itself (the command's stats.wallSeconds): --jobs 1 ${f(best(one, 'sweepSeconds'))} s, --jobs 2 ${f(best(two, 'sweepSeconds'))} s ` +
      `(${f(best(one, 'sweepSeconds') / best(two, 'sweepSeconds'))}×); the rest (start-up, case, output; the same for both) ${f(rest(one))} / ${f(rest(two))} s median`,
  );
  // where a thread's time goes: the same sweep twice on one thread (the second with the compiler warm)
  const built = existsSync(join(ROOT, 'dist', 'analysis', 'sweep.js'));
  if (built) {
    const code =
      `const { parentPort } = require('node:worker_threads');` +
      `(async () => { const { loadCase } = await import(${JSON.stringify(pathToFileURL(join(ROOT, 'dist', 'case', 'load.js')).href)});` +
      `const { runSweepSerial } = await import(${JSON.stringify(pathToFileURL(join(ROOT, 'dist', 'analysis', 'sweep.js')).href)});` +
      `const m = (await loadCase(${JSON.stringify(DEMO)})).model; const rpms = []; for (let r = 3000; r <= 10250; r += 250) rpms.push(r);` +
      `const t0 = performance.now(); runSweepSerial(m, rpms); const t1 = performance.now(); runSweepSerial(m, rpms);` +
      `parentPort.postMessage([t1 - t0, performance.now() - t1]); })();`;
    const { Worker } = await import('node:worker_threads');
    const times: number[][] = [];
    for (let k = 0; k < 2; k++) {
      const w = new Worker(code, { eval: true });
      times.push(await new Promise<number[]>((r) => w.once('message', r)));
      await w.terminate();
    }
    const cold = Math.min(...times.map((t) => t[0]!));
    const warm = Math.min(...times.map((t) => t[1]!));
    out.push(
      `- one thread, the same 30-point sweep twice: first ${f(cold / 1000)} s, second ${f(warm / 1000)} s: each new thread pays about ${f((cold - warm) / 1000)} s ` +
        `compiling (V8's compiler threads then compete with the sweep's for the 2 cores), which a second worker cannot halve, nor the process start-up above`,
    );
    // the CPU V8's helper threads (optimising compiler, garbage collector) spend on one thread's cold sweep: Linux /proc, per thread
    const helper = helperThreadsCpu();
    // Amdahl's bound from the parts measured above: the serial part S (start-up, case, output), the one-thread sweep P (cold) and
    // Pw (warm), and the helper threads' CPU H per thread that computes; two workers carry 2H + Pw on the 2 cores after S
    const S = rest(one);
    const P1 = best(one, 'sweepSeconds');
    const Pw = warm / 1000;
    if (helper !== undefined) {
      const bound = (S + P1) / (S + helper + Pw / 2);
      out.push(
        `- V8's helper threads (optimising compiler, garbage collector) use ${f(helper)} s of CPU for one thread's cold 30-point sweep (/proc per thread); ` +
          `with one job they run on the idle second core, with two jobs each worker brings its own and they share the 2 cores with the sweep`,
        `- what two workers can give at most here, from these parts (Amdahl): (S + P) / (S + H + Pw/2) with S ${f(S)} s serial (start-up, case, output), ` +
          `P ${f(P1)} s of sweep on one thread, H ${f(helper)} s helper CPU per worker, Pw ${f(Pw)} s of warm sweep: ${f(bound)}× ` +
          `(target ≥ 1.7×: ${bound >= 1.7 ? 'reachable' : 'out of reach for a sweep this short'}; measured ${f(best(one, 'seconds') / best(two, 'seconds'))}×)`,
      );
    }
  }
  const fine = ['numerics.meshSize=4mm'];
  const f1 = Math.min(...[0, 1].map(() => sweepProcess(1, fine).sweepSeconds));
  const f2 = Math.min(...[0, 1].map(() => sweepProcess(2, fine).sweepSeconds));
  out.push(`- the same sweep on a 4 mm mesh (more work per point; best of 2): the sweep itself --jobs 1 ${f(f1)} s, --jobs 2 ${f(f2)} s (${f(f1 / f2)}×)`);
}

// ------------------------------------------------------- 2. the view's sweep

async function viewSweepSection(out: string[]): Promise<void> {
  // the compiled modules when built (the view's speed), else the sources
  const built = existsSync(join(ROOT, 'dist', 'ui', 'engine-service.js'));
  const base = built ? pathToFileURL(join(ROOT, 'dist')).href : pathToFileURL(join(ROOT, 'src')).href;
  const ext = built ? 'js' : 'ts';
  const { openCase } = (await import(`${base}/ui/case-session.${ext}`)) as typeof import('../src/ui/case-session.js');
  const { threadEngine } = (await import(`${base}/ui/engine-service.${ext}`)) as typeof import('../src/ui/engine-service.js');
  const session = await openCase(DEMO);
  const plan = session.sweepPlan.rpms;
  const engine = threadEngine();
  const tStart = performance.now();
  const ready = await engine.whenReady();
  const startMs = performance.now() - tStart;
  const sweep = (edits: Parameters<typeof session.build>[0]): Promise<{ first: number; cursor: number; all: number }> =>
    new Promise((res, rej) => {
      const model = session.build(edits);
      const cursorIndex = plan.reduce((best, r, i) => (Math.abs(r - model.rpm) < Math.abs((plan[best] ?? 0) - model.rpm) ? i : best), 0);
      const t0 = performance.now();
      let first = Number.NaN;
      let cursor = Number.NaN;
      engine.runSweep(model, plan, {
        onPoint: (i) => {
          const t = performance.now() - t0;
          if (Number.isNaN(first)) first = t;
          if (i === cursorIndex) cursor = t;
        },
        onDone: () => res({ first, cursor, all: performance.now() - t0 }),
        onError: (m) => rej(new Error(m)),
      });
    });
  // the first sweep warms the workers; then edits, as a tuner would make them
  await sweep([]);
  const lengths = QUICK ? ['305 mm', '310 mm'] : ['305 mm', '310 mm', '315 mm', '320 mm', '325 mm'];
  const runs: { first: number; cursor: number; all: number }[] = [];
  for (const v of lengths) runs.push(await sweep([{ path: 'runner.length', value: v }]));
  const best = (k: 'first' | 'cursor' | 'all'): number => Math.min(...runs.map((r) => r[k]));
  const med = (k: 'first' | 'cursor' | 'all'): number => median(runs.map((r) => r[k]));
  out.push(
    `- the view's sweep after an edit (${plan.length} points, ${built ? 'compiled' : 'sources'}, pool kept warm, ${runs.length} edits of the runner length, best / median; load average ${f(os.loadavg()[0] ?? Number.NaN, 1)}): ` +
      `first point ${f(best('first'), 0)} / ${f(med('first'), 0)} ms, the point at the view's speed ${f(best('cursor'), 0)} / ${f(med('cursor'), 0)} ms, ` +
      `the whole curve ${f(best('all'), 0)} / ${f(med('all'), 0)} ms (target ≤ 1000 ms); workers up ${ready ? `in ${f(startMs, 0)} ms` : 'NOT (ran on this thread)'}`,
  );
  const { VIEW_DEBOUNCE_MS } = (await import(`${base}/ui/index.${built ? 'js' : 'tsx'}`)) as typeof import('../src/ui/index.js');
  // one point after a Case-view edit, warm-started from the point before it
  let warm = (await engine.runPoint(session.build([]))).warmStart;
  const times: number[] = [];
  const cycles: number[] = [];
  for (const v of ['61', '62', '63', '64', '65', '66']) {
    const model = session.build([{ path: 'intake.closes', value: v }]);
    const t0 = performance.now();
    const o = await engine.runPoint(model, warm);
    times.push(performance.now() - t0);
    cycles.push(o.result.cycles);
    warm = o.warmStart;
  }
  out.push(
    `- one point's re-run after a Case-view edit (intake closes 61…66° ABDC one degree at a time, ${session.values['rpm'] ?? '?'} rpm, warm from the point before): ` +
      `best ${f(Math.min(...times), 0)} ms, median ${f(median(times), 0)} ms, ${Math.min(...cycles)}–${Math.max(...cycles)} cycles ` +
      `(target ≤ 100 ms with the redraw; the view waits ${VIEW_DEBOUNCE_MS} ms after the last key first)`,
  );
  await engine.close();
}

// --------------------------------------------------- 3. bytes per frame

/** A terminal of 80×24 that counts what is written; writes less than 5 ms apart belong to one frame. */
class CountingStdout extends EventEmitter {
  readonly isTTY = true;
  columns = 80;
  rows = 24;
  bytes = 0;
  writes = 0;
  frames = 0;
  private last = Number.NEGATIVE_INFINITY;
  write = (chunk: string | Uint8Array): boolean => {
    this.bytes += typeof chunk === 'string' ? Buffer.byteLength(chunk) : chunk.length;
    this.writes++;
    const now = performance.now();
    if (now - this.last > 5) this.frames++;
    this.last = now;
    return true;
  };
}

class FakeStdin extends EventEmitter {
  readonly isTTY = true;
  private data: string | null = null;
  send(text: string): void {
    this.data = text;
    this.emit('readable');
    this.emit('data', text);
  }
  read = (): string | null => {
    const d = this.data;
    this.data = null;
    return d;
  };
  setEncoding(): void {}
  setRawMode(): void {}
  resume(): void {}
  pause(): void {}
  ref(): void {}
  unref(): void {}
}

interface FrameFigures {
  bytesPerFrame: number;
  framesPerSecond: number;
}

async function playBytes(incremental: boolean, color: boolean, view: string): Promise<FrameFigures> {
  // Ink holds every frame back when it believes it runs under CI, and its colours follow the
  // process's own stdout (a pipe here); both are read once, when Ink loads: say it is a terminal
  for (const key of ['CI', 'CONTINUOUS_INTEGRATION']) if (key in process.env) process.env[key] = 'false';
  process.env['FORCE_COLOR'] = '1';
  const built = existsSync(join(ROOT, 'dist', 'ui', 'app.js'));
  const base = built ? pathToFileURL(join(ROOT, 'dist')).href : pathToFileURL(join(ROOT, 'src')).href;
  const ext = built ? 'js' : 'tsx';
  const React = (await import('react')).default;
  const { render } = await import('ink');
  const { App } = (await import(`${base}/ui/app.${ext}`)) as typeof import('../src/ui/app.js');
  const { openCase } = (await import(`${base}/ui/case-session.${built ? 'js' : 'ts'}`)) as typeof import('../src/ui/case-session.js');
  const { inlineEngine } = (await import(`${base}/ui/engine-service.${built ? 'js' : 'ts'}`)) as typeof import('../src/ui/engine-service.js');
  const { VIEW_RENDER_OPTIONS } = (await import(`${base}/ui/index.${built ? 'js' : 'tsx'}`)) as typeof import('../src/ui/index.js');
  const session = await openCase(DEMO);
  const stdout = new CountingStdout();
  const stdin = new FakeStdin();
  const app = render(React.createElement(App, { session, engine: inlineEngine(), color, teach: true }), {
    ...VIEW_RENDER_OPTIONS,
    incrementalRendering: incremental,
    patchConsole: false,
    stdout: stdout as unknown as NodeJS.WriteStream,
    stdin: stdin as unknown as NodeJS.ReadStream,
    stderr: new CountingStdout() as unknown as NodeJS.WriteStream,
  });
  const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));
  // wait for the first point (the frames grow once it is there), then pick the view
  for (let t = 0; stdout.writes < 3 && t < 200; t++) await sleep(50);
  await sleep(1500);
  stdin.send(view);
  await sleep(300);
  stdin.send(' ');
  await sleep(300);
  const b0 = stdout.bytes;
  const w0 = stdout.frames;
  const t0 = performance.now();
  await sleep(QUICK ? 1500 : 3000);
  const seconds = (performance.now() - t0) / 1000;
  const frames = stdout.frames - w0;
  const bytes = stdout.bytes - b0;
  stdin.send(' ');
  app.unmount();
  app.cleanup();
  return { bytesPerFrame: frames > 0 ? bytes / frames : Number.NaN, framesPerSecond: frames / seconds };
}

async function bytesSection(out: string[]): Promise<void> {
  for (const [view, name] of [
    ['1', 'Valve'],
    ['2', 'Runner'],
  ] as const) {
    for (const color of [true, false]) {
      const full = await playBytes(false, color, view);
      const diff = await playBytes(true, color, view);
      out.push(
        `- playing the cycle in the ${name} view at 80×24${color ? ', colour' : ', no colour'}: full redraw ${f(full.bytesPerFrame / 1024)} KB/frame at ${f(full.framesPerSecond, 1)} frames/s; ` +
          `line by line (the bundle's setting, Ink's renderer with scripts/ink-line-fix.mjs: the same bytes within a character a frame) ${f(diff.bytesPerFrame / 1024)} KB/frame at ${f(diff.framesPerSecond, 1)} frames/s (target ≤ 1.5 KB at ≥ 20 frames/s)`,
      );
    }
  }
}

/**
 * A Case-view edit in the running view, end to end: from the key that
 * commits the value to the first write to the terminal after the point came
 * back (the view's debounce, the point on a warm worker, the redraw).
 * Runner diameter 40 → 41, 42, … mm: the mesh keeps its points, so each
 * point starts from the one before it.
 */
async function editSection(out: string[]): Promise<void> {
  for (const key of ['CI', 'CONTINUOUS_INTEGRATION']) if (key in process.env) process.env[key] = 'false';
  process.env['FORCE_COLOR'] = '1';
  const built = existsSync(join(ROOT, 'dist', 'ui', 'app.js'));
  const base = built ? pathToFileURL(join(ROOT, 'dist')).href : pathToFileURL(join(ROOT, 'src')).href;
  const [js, jsx] = built ? ['js', 'js'] : ['ts', 'tsx'];
  const React = (await import('react')).default;
  const { render } = await import('ink');
  const { App } = (await import(`${base}/ui/app.${jsx}`)) as typeof import('../src/ui/app.js');
  const { openCase } = (await import(`${base}/ui/case-session.${js}`)) as typeof import('../src/ui/case-session.js');
  const { threadEngine } = (await import(`${base}/ui/engine-service.${js}`)) as typeof import('../src/ui/engine-service.js');
  const { VIEW_RENDER_OPTIONS, VIEW_DEBOUNCE_MS } = (await import(`${base}/ui/index.${jsx}`)) as typeof import('../src/ui/index.js');
  const session = await openCase(DEMO);
  const threads = threadEngine();
  let pointDoneAt = Number.NaN;
  let points = 0;
  const engine: typeof threads = {
    ...threads,
    runPoint: async (model, warm) => {
      const o = await threads.runPoint(model, warm);
      pointDoneAt = performance.now();
      points++;
      return o;
    },
  };
  const stdout = new CountingStdout();
  let drawnAt = Number.NaN;
  const write = stdout.write;
  stdout.write = (chunk) => {
    if (Number.isNaN(drawnAt) && !Number.isNaN(pointDoneAt)) drawnAt = performance.now();
    return write(chunk);
  };
  const stdin = new FakeStdin();
  const app = render(React.createElement(App, { session, engine, color: true, debounceMs: VIEW_DEBOUNCE_MS }), {
    ...VIEW_RENDER_OPTIONS,
    patchConsole: false,
    stdout: stdout as unknown as NodeJS.WriteStream,
    stdin: stdin as unknown as NodeJS.ReadStream,
    stderr: new CountingStdout() as unknown as NodeJS.WriteStream,
  });
  const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));
  const until = async (cond: () => boolean, what: string): Promise<void> => {
    for (let t = 0; !cond(); t++) {
      if (t > 600) throw new Error(`${what} never happened`);
      await sleep(10);
    }
  };
  await until(() => points >= 1, 'the first point');
  await sleep(500);
  stdin.send('4'); // the Case view
  await sleep(100);
  stdin.send('\u001b[B'); // runner length
  await sleep(50);
  stdin.send('\u001b[B'); // runner diameter
  await sleep(50);
  const times: number[] = [];
  for (const mm of ['41', '42', '43', '44', '45', '46']) {
    stdin.send('\r');
    await sleep(50);
    for (const ch of mm) {
      stdin.send(ch);
      await sleep(20);
    }
    const before = points;
    pointDoneAt = Number.NaN;
    drawnAt = Number.NaN;
    const t0 = performance.now();
    stdin.send('\r');
    await until(() => points > before && !Number.isNaN(drawnAt), `the point after runner diameter ${mm} mm`);
    times.push(drawnAt - t0);
    await sleep(200);
  }
  app.unmount();
  app.cleanup();
  await threads.close();
  out.push(
    `- a Case-view edit in the view, key to redraw (runner diameter 41…46 mm, colour, 80×24, pool kept warm; load average ${f(os.loadavg()[0] ?? Number.NaN, 1)}): ` +
      `best ${f(Math.min(...times), 0)} ms, median ${f(median(times), 0)} ms, of which ${VIEW_DEBOUNCE_MS} ms the view's wait after the last key (target ≤ 100 ms)`,
  );
}

/** All the sections as markdown lines (bench/run.ts prints and appends them). */
export async function benchPool(): Promise<string> {
  const out: string[] = ['### Worker pool and the view over a slow link (bench/pool.ts)', ''];
  const sections = { process: processSection, view: viewSweepSection, edit: editSection, bytes: bytesSection };
  for (const [name, section] of Object.entries(sections)) {
    if (ONLY !== undefined && ONLY !== name) continue;
    try {
      await section(out);
    } catch (e) {
      out.push(`- ${section.name}: failed: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  return out.join('\n');
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  console.log(await benchPool());
  process.exit(0);
}
