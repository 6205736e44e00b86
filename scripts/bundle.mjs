// ESM bundles: the command line (dist/tractwave.mjs, with chunks beside it) and the
// pool's worker (dist/sweep-worker.mjs: sweep points and the view's points).
// Start-up matters over SSH: a few files parse faster than hundreds of modules.
// See STACK.md: platform node, format esm, NODE_ENV=production, a
// createRequire banner (for CommonJS dependencies that call require), and
// react-devtools-core (an optional Ink dependency) replaced by an empty stub.
import { build } from 'esbuild';
import { inkLineFix } from './ink-line-fix.mjs';
import { readdirSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/** An empty module for Ink's optional react-devtools-core import. */
const stubs = {
  name: 'tractwave-stubs',
  setup(b) {
    b.onResolve({ filter: /^react-devtools-core$/ }, () => ({ path: 'react-devtools-core', namespace: 'stub' }));
    b.onLoad({ filter: /.*/, namespace: 'stub' }, () => ({ contents: 'export default { connectToDevTools() {} };', loader: 'js' }));
  },
};

const common = {
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // __TRACTWAVE_INK_LINE_FIX__: this bundle carries the fix of Ink's line-by-line renderer (ink-line-fix.mjs)
  define: { 'process.env.NODE_ENV': '"production"', __TRACTWAVE_INK_LINE_FIX__: 'true' },
  banner: { js: "import { createRequire as __twCreateRequire } from 'node:module'; const require = __twCreateRequire(import.meta.url);" },
  plugins: [stubs, inkLineFix],
  jsx: 'automatic',
  legalComments: 'none',
  logLevel: 'warning',
};

// The command line is split at its dynamic imports (the terminal view with
// Ink and React, the report with its plotting library): a text command
// parses only what it runs, the rest loads when first used. The chunks sit
// beside the entry in dist/, so a module's import.meta.url stays in dist/.
for (const f of readdirSync(join(root, 'dist'))) if (/^chunk-.*\.mjs$/.test(f)) rmSync(join(root, 'dist', f));
await build({
  ...common,
  entryPoints: { tractwave: join(root, 'src/cli/main.ts') },
  outdir: join(root, 'dist'),
  outExtension: { '.js': '.mjs' },
  splitting: true,
  chunkNames: 'chunk-[hash]',
});
// The sweep worker on its own (physics and case loading only, no Ink): a
// worker thread loads it in tens of milliseconds instead of the whole CLI.
await build({ ...common, entryPoints: [join(root, 'src/analysis/worker.ts')], outfile: join(root, 'dist/sweep-worker.mjs') });
