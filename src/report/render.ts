/**
 * vega-lite spec → SVG text, in Node without a browser: vega-lite compiles
 * the spec to a vega spec, and a headless vega View (renderer 'none')
 * renders it to SVG. All data are inline values, so nothing is loaded.
 */
import * as vega from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';
import type { ChartSpec } from './charts.js';

export interface RenderedChart {
  name: string;
  title: string;
  svg: string;
}

/** Render one vega-lite spec to an SVG document string. */
export async function renderSvg(spec: TopLevelSpec, opts: { crisp?: boolean } = {}): Promise<string> {
  // vega-lite's notes on merged legends and the like go nowhere: the command's output is the report
  const compiled = compile(spec, { logger: vega.logger(vega.None) }).spec;
  // nothing to load: every chart carries its data; a loader that refuses keeps it so
  const loader = vega.loader();
  loader.load = () => Promise.reject(new Error('report charts load no data from outside'));
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', loader, logLevel: vega.None });
  try {
    return compactSvg(await view.toSVG(), opts.crisp === true);
  } finally {
    view.finalize();
  }
}

/**
 * Round the coordinates in path data and transforms to 2 decimals (a
 * hundredth of a pixel) and write rgb() colours as #rrggbb: vega writes full
 * doubles, which for a heat map of thousands of cells doubles the file for
 * nothing. `crisp` turns anti-aliasing off (no seams between heat-map cells).
 */
export function compactSvg(svg: string, crisp = false): string {
  const round = (m: string) => {
    const r = Math.round(Number(m) * 100) / 100;
    return Object.is(r, -0) ? '0' : String(r);
  };
  const hex = (n: string) => Number(n).toString(16).padStart(2, '0');
  const out = svg
    .replace(/ (fill|stroke)="rgb\((\d+), ?(\d+), ?(\d+)\)"/g, (_all, name: string, r: string, g: string, b: string) => ` ${name}="#${hex(r)}${hex(g)}${hex(b)}"`)
    .replace(/ (d|transform)="([^"]*)"/g, (_all, name: string, value: string) => ` ${name}="${value.replace(/-?\d+\.\d{3,}(?:e[-+]?\d+)?/g, round)}"`);
  return crisp ? out.replace(/^(<svg [^>]*?)( class="marks")/, '$1$2 shape-rendering="crispEdges"') : out;
}

/** Render the charts one after another (vega's rendering is single-threaded anyway). */
export async function renderCharts(charts: readonly ChartSpec[]): Promise<RenderedChart[]> {
  const out: RenderedChart[] = [];
  for (const c of charts) out.push({ name: c.name, title: c.title, svg: await renderSvg(c.spec, { crisp: c.crisp === true }) });
  return out;
}
