/**
 * Starting a worker thread for a module of src/ ('analysis/worker', the
 * pool's worker for sweeps and the terminal view's points), in whichever of the
 * three layouts the code is running:
 *   - .ts source (vitest, tsx): Node 20 cannot start a .ts worker. The
 *     module and its imports are bundled once per process in memory with
 *     esbuild (a development dependency, there whenever the sources run) and
 *     started as an eval script; without esbuild, an eval bootstrap
 *     registers tsx's ESM loader in the worker and imports the .ts module
 *     (slower: every worker transforms the sources again);
 *   - compiled (dist/…/*.js): new Worker(dist/<module>.js);
 *   - bundle (dist/tractwave.mjs and the chunks it loads, all in dist/):
 *     a module's import.meta.url is that of its file in dist/. The build
 *     leaves a worker-only bundle there (WORKER_BUNDLES), which starts
 *     fastest, and the compiled module (dist/<module>.js) from its tsc
 *     step; failing both, the worker imports the file this code sits in
 *     through an eval bootstrap, so the worker's process.argv[1] is
 *     '[worker eval]' and the "am I the entry script?" check stays false;
 *     the bundled-in worker module acts on its workerData flag.
 */
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

export type WorkerModule = 'analysis/worker';
export type WorkerLayout = 'source' | 'compiled' | 'bundle';

/** Worker-only bundles the build leaves beside the main bundle (scripts/bundle.mjs). */
export const WORKER_BUNDLES: Readonly<Record<WorkerModule, string>> = {
  'analysis/worker': 'sweep-worker.mjs',
};

/** How workers are started in the layout of the file at `moduleUrl` (this one by default). */
export function workerLayout(moduleUrl: string = import.meta.url): WorkerLayout {
  if (/\.[cm]?tsx?$/.test(moduleUrl)) return 'source';
  if (/\/analysis\/worker-start\.js$/.test(moduleUrl)) return 'compiled';
  return 'bundle';
}

const bundledSources = new Map<WorkerModule, string | null>();

/** A module of src/ and its imports as one CommonJS script, built once in memory by esbuild. */
function bundledSource(module: WorkerModule, here: string): string | undefined {
  if (!bundledSources.has(module)) {
    try {
      const esbuild = createRequire(here)('esbuild') as typeof import('esbuild');
      const out = esbuild.buildSync({
        entryPoints: [fileURLToPath(new URL(`../${module}.ts`, here))],
        bundle: true,
        platform: 'node',
        format: 'cjs',
        target: 'node20',
        write: false,
        logLevel: 'silent',
      });
      bundledSources.set(module, out.outputFiles[0]?.text ?? null);
    } catch {
      bundledSources.set(module, null);
    }
  }
  return bundledSources.get(module) ?? undefined;
}

export interface StartOptions {
  /** pipe the worker's stderr to the parent instead of sharing it */
  stderr?: boolean;
}

/** Start `module` on a worker thread with `{ [flag]: true }` as its workerData. */
export function startModuleWorker(module: WorkerModule, flag: string, options: StartOptions = {}): Worker {
  const here = import.meta.url;
  const opts = { workerData: { [flag]: true }, stderr: options.stderr === true };
  switch (workerLayout(here)) {
    case 'source': {
      const code = bundledSource(module, here);
      if (code !== undefined) return new Worker(code, { ...opts, eval: true });
      const tsxApi = pathToFileURL(createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
      const target = new URL(`../${module}.ts`, here).href;
      const boot =
        `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(target)}); })` +
        `.catch((e) => { console.error(e); process.exit(1); });`;
      return new Worker(boot, { ...opts, eval: true });
    }
    case 'compiled':
      return new Worker(new URL(`../${module}.js`, here), opts);
    case 'bundle': {
      // the worker-only bundle, else the compiled module the build's tsc step leaves
      for (const beside of [new URL(`./${WORKER_BUNDLES[module]}`, here), new URL(`./${module}.js`, here)]) {
        if (existsSync(beside)) return new Worker(beside, opts);
      }
      return new Worker(`import(${JSON.stringify(here)}).catch((e) => { console.error(e); process.exit(1); });`, { ...opts, eval: true });
    }
  }
}
