/** Locating files shipped with the package (the demo case), independent of the cwd. */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

/** The directory holding tractwave's package.json (works from src/, dist/ and the bundle). */
export function packageRoot(): string {
  if (cached) return cached;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const pj = join(dir, 'package.json');
    if (existsSync(pj)) {
      try {
        if ((JSON.parse(readFileSync(pj, 'utf8')) as { name?: string }).name === 'tractwave') return (cached = dir);
      } catch {
        // not ours; keep looking
      }
    }
    const up = dirname(dir);
    if (up === dir) throw new Error('cannot find the tractwave package directory');
    dir = up;
  }
}

export function defaultCasePath(): string {
  return join(packageRoot(), 'cases', 'demo.yaml');
}

export function packageVersion(): string {
  try {
    return (JSON.parse(readFileSync(join(packageRoot(), 'package.json'), 'utf8')) as { version?: string }).version ?? 'unknown';
  } catch {
    return 'unknown';
  }
}
