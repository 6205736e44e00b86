/**
 * The dependency rule of DEVELOPERS.md for the presentation layer: src/present
 * imports no cli, ui or report; core, case and analysis import no present
 * (units are display only). Our own architecture check, no external source.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : /\.tsx?$/.test(f) ? [p] : [];
  });
}

function importsOf(file: string): string[] {
  return [...readFileSync(file, 'utf8').matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map((m) => m[1]!);
}

describe('the presentation layer keeps the dependency direction', () => {
  it('src/present imports nothing of src/cli, src/ui or src/report', () => {
    for (const f of files('src/present')) for (const i of importsOf(f)) expect(i, `${f} imports ${i}`).not.toMatch(/\/(cli|ui|report)\//);
  });
  it('src/core, src/case and src/analysis import nothing of src/present', () => {
    for (const d of ['src/core', 'src/case', 'src/analysis']) for (const f of files(d)) for (const i of importsOf(f)) expect(i, `${f} imports ${i}`).not.toMatch(/present\//);
  });
  it('the text commands and the view format through it: no kPa, mm or mg helpers of their own', () => {
    const own = /export (const|function) (kPa|kpa|kpaSigned|mm|mg|gps|cc|cm2)\b/;
    for (const f of ['src/cli/format.ts', 'src/ui/text.ts']) expect(readFileSync(f, 'utf8')).not.toMatch(own);
  });
});
