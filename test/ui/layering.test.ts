/**
 * The dependency direction DEVELOPERS.md draws: the terminal view (src/ui)
 * takes nothing from the commands (src/cli) — what both need lives in
 * case, analysis or core — and core imports nothing of the others.
 * Common practice (a layered design), checked on the import lines.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../cli/helpers.js';

function sources(dir: string): string[] {
  return readdirSync(join(ROOT, dir), { recursive: true, encoding: 'utf8' })
    .filter((f) => /\.tsx?$/.test(f))
    .map((f) => join(dir, f));
}

function imports(file: string): string[] {
  const text = readFileSync(join(ROOT, file), 'utf8');
  return [...text.matchAll(/^\s*(?:import|export)\b[^'"]*from\s+['"]([^'"]+)['"]/gm), ...text.matchAll(/import\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1] ?? '');
}

describe('layering (DEVELOPERS.md)', () => {
  it('src/ui imports nothing from src/cli', () => {
    const bad = sources('src/ui').flatMap((f) => imports(f).filter((i) => /(^|\/)cli\//.test(i)).map((i) => `${f} → ${i}`));
    expect(bad).toEqual([]);
  });
  it('src/core imports nothing of case, analysis, cli, ui or report', () => {
    const bad = sources('src/core').flatMap((f) => imports(f).filter((i) => /\.\.\/(\.\.\/)*(case|analysis|cli|ui|report)\//.test(i)).map((i) => `${f} → ${i}`));
    expect(bad).toEqual([]);
  });
});
