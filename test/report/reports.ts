/**
 * Reports of the bundled cases, made once per test file through the command
 * line (in-process), in a temporary folder; and small readers of their HTML.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli, ROOT } from '../cli/helpers.js';

/** the bundled engine cases (every case in cases/ but the bare-pipe experiments) */
export const BUNDLED: readonly string[] = readdirSync(join(ROOT, 'cases'))
  .filter((f) => f.endsWith('.yaml') && !f.startsWith('pipe-'))
  // a copy the terminal view saved beside a bundled case is the user's
  .filter((f) => !readFileSync(join(ROOT, 'cases', f), 'utf8').startsWith('# Saved by tractwave from '))
  .map((f) => f.replace(/\.yaml$/, ''))
  .sort();

export interface MadeReport {
  name: string;
  file: string;
  html: string;
  code: number;
  out: string;
  err: string;
}

export function tempDir(prefix = 'tractwave-report-'): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Run `tractwave report ARGS --out DIR/NAME.html` and read the file. */
export async function makeReport(dir: string, name: string, args: string[]): Promise<MadeReport> {
  const file = join(dir, `${name}.html`);
  const r = await cli(['report', ...args, '--out', file]);
  const html = r.code === 0 ? readFileSync(file, 'utf8') : '';
  return { name, file, html, code: r.code, out: r.out, err: r.err };
}

/** The SVG documents inside the report's chart figures, by chart name. */
export function chartsOf(html: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of html.matchAll(/<figure class="chart" data-chart="([^"]+)">(<svg[\s\S]*?<\/svg>)/g)) out.set(m[1]!, m[2]!);
  return out;
}

/** The texts of the axis titles (or, with `role` 'legend', the legend titles) vega wrote into an SVG. */
export function axisTitles(svg: string, role: 'axis' | 'legend' = 'axis'): string[] {
  const titles: string[] = [];
  for (const m of svg.matchAll(new RegExp(`role-${role}-title"[^>]*>([\\s\\S]*?)<\\/g>`, 'g'))) {
    const texts = [...m[1]!.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((t) => t[1]!);
    if (texts.length > 0) titles.push(texts.join(' '));
  }
  return titles;
}

/** Every `data-key="K" data-si="V"` pair inside `fragment`, as K → V (numbers parsed; the first of each key). */
export function siValues(fragment: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of fragment.matchAll(/data-key="([^"]+)" data-si="([^"]*)"/g)) if (!out.has(m[1]!)) out.set(m[1]!, m[2]!);
  return out;
}

/** The HTML of the element with this id up to the end of its section. */
export function sectionById(html: string, id: string): string {
  const at = html.indexOf(`id="${id}"`);
  if (at < 0) return '';
  const end = html.indexOf('</section>', at);
  return html.slice(at, end < 0 ? undefined : end);
}

export function readText(file: string): string {
  return readFileSync(file, 'utf8');
}
