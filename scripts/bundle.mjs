// Single-file ESM bundles: the command line (dist/tractwave.mjs) and the
// pool's worker (dist/sweep-worker.mjs: sweep points and the view's points).
// Start-up matters over SSH: one file parses faster than hundreds of modules.
// See STACK.md: platform node, format esm, NODE_ENV=production, a
// createRequire banner (for CommonJS dependencies that call require), and
// react-devtools-core (an optional Ink dependency) replaced by an empty stub.
import { build } from 'esbuild';
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
  define: { 'process.env.NODE_ENV': '"production"' },
  banner: { js: "import { createRequire as __twCreateRequire } from 'node:module'; const require = __twCreateRequire(import.meta.url);" },
  plugins: [stubs],
  jsx: 'automatic',
  legalComments: 'none',
  logLevel: 'warning',
};

await build({ ...common, entryPoints: [join(root, 'src/cli/main.ts')], outfile: join(root, 'dist/tractwave.mjs') });
// The sweep worker on its own (physics and case loading only, no Ink): a
// worker thread loads it in tens of milliseconds instead of the whole CLI.
await build({ ...common, entryPoints: [join(root, 'src/analysis/worker.ts')], outfile: join(root, 'dist/sweep-worker.mjs') });
