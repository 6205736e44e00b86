#!/usr/bin/env node
// tractwave launcher: the single-file bundle when built, else the compiled modules.
import { existsSync } from 'node:fs';

const bundle = new URL('../dist/tractwave.mjs', import.meta.url);
const modules = new URL('../dist/cli/main.js', import.meta.url);
const entry = existsSync(bundle) ? bundle : existsSync(modules) ? modules : undefined;
if (!entry) {
  process.stderr.write('error: tractwave is not built: run `npm run build` (or `npx tsx src/cli/main.ts ...` from the checkout)\n');
  process.exit(1);
}
const { main } = await import(entry.href);
await main();
