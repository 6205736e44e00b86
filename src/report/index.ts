/**
 * The HTML report: results → chart specs → SVG → one self-contained HTML
 * string. `gatherReport` runs the simulations (the same functions as `run`
 * and `sweep`); `buildReport` turns its data into the document and the
 * charts. Writing files is the caller's (cli/commands/report.ts, the
 * terminal view).
 */
import { MASS_IMBALANCE_LIMIT } from '../analysis/mass-balance.js';
import { reportCharts, speedVeChart, valveChart, type ChartSpec } from './charts.js';
import type { ReportData } from './gather.js';
import { reportHtml, type ReportMeta } from './html.js';
import { renderCharts, renderSvg, type RenderedChart } from './render.js';
import { units } from './units.js';

export { gatherReport, simulateOperatingPoint, type ReportData, type ReportDesign, type ReportRequest, type OperatingPoint } from './gather.js';
export { reportHtml, esc, type ReportMeta } from './html.js';
export { renderSvg, renderCharts, type RenderedChart } from './render.js';
export { reportCharts, speedVeChart, valveChart, type ChartSpec } from './charts.js';
export { networkLine } from './network-line.js';
export { units, UNIT_SYSTEMS, type UnitSystem } from './units.js';

export interface BuiltReport {
  html: string;
  charts: RenderedChart[];
}

/** The document and its charts (each also usable on its own, e.g. for slides). */
export async function buildReport(data: ReportData, meta: ReportMeta): Promise<BuiltReport> {
  const specs: ChartSpec[] = reportCharts(data, units(meta.units), { massLimit: MASS_IMBALANCE_LIMIT });
  const charts = await renderCharts(specs);
  return { html: reportHtml(data, meta, charts), charts };
}
