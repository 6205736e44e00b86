/**
 * The sweep view as text lines: volumetric efficiency against engine speed,
 * the band shaded, the current speed marked, a pinned baseline curve in dots,
 * the band means of both, the best speed, and the progress of a running
 * sweep. Band means and the best speed come from the analysis module. Pure.
 */
import { bandMean } from '../analysis/sweep.js';
import { axisLines, GLYPH, plotBins, valueRange, type ChartSeries, type ColumnMark } from './chart.js';
import { fixed as fixedNum } from '../present/number.js';
import { etaPct, etaPoints, firstFit, fit, joinFit } from './text.js';
import { padLines } from './valve-screen.js';

export interface Curve {
  rpms: readonly number[];
  /** ηv per speed; null while not yet computed */
  eta: readonly (number | null)[];
  converged?: readonly (boolean | null)[];
  label: string;
}

export interface SweepScreenInput {
  width: number;
  rows: number;
  now?: Curve | undefined;
  before?: Curve | undefined;
  band: { from: number; to: number };
  /** the planned speeds */
  plan: { from: number; to: number; count: number };
  /** the speed of the point shown in the other views [rpm] */
  currentRpm: number;
  status: 'idle' | 'running' | 'done' | 'stopped' | 'failed';
  /** the sweep is older than the latest change to the case */
  stale: boolean;
  /** dyno points on the ηv scale (the case's `measured` sheet), drawn as ● */
  measured?: { points: readonly { rpm: number; eta: number }[]; label: string } | undefined;
}

/** the glyph of a measured dyno point */
export const DYNO_GLYPH = '●';

export const SWEEP_GUTTER = 7;

export interface CurveStats {
  done: number;
  total: number;
  /** band mean ηv (NaN until the band is covered) */
  mean: number;
  bestRpm: number;
  bestEta: number;
  unconverged: number;
}

/** Computed points of a curve, ascending in speed. */
export function computedPoints(c: Curve): { x: number; y: number; converged: boolean }[] {
  const pts: { x: number; y: number; converged: boolean }[] = [];
  c.rpms.forEach((rpm, k) => {
    const y = c.eta[k];
    if (y !== null && y !== undefined && Number.isFinite(y)) pts.push({ x: rpm, y, converged: c.converged?.[k] !== false });
  });
  return pts.sort((a, b) => a.x - b.x);
}

export function curveStats(c: Curve, band: { from: number; to: number }): CurveStats {
  const pts = computedPoints(c);
  let best = pts[0];
  for (const p of pts) if (best === undefined || p.y > best.y) best = p;
  return {
    done: pts.length,
    total: c.rpms.length,
    mean: pts.length === c.rpms.length ? bandMean(pts, band.from, band.to) : Number.NaN,
    bestRpm: best?.x ?? Number.NaN,
    bestEta: best?.y ?? Number.NaN,
    unconverged: pts.filter((p) => !p.converged).length,
  };
}

/**
 * The curve sampled at each column's centre speed, straight lines between
 * neighbouring computed points (NaN where a neighbour is still missing, so a
 * running sweep shows gaps rather than invented values).
 */
export function curveColumns(c: Curve, lo: number, hi: number, cols: number): Float64Array {
  const out = new Float64Array(cols).fill(Number.NaN);
  const order = c.rpms.map((rpm, k) => ({ rpm, y: c.eta[k] })).sort((a, b) => a.rpm - b.rpm);
  for (let col = 0; col < cols; col++) {
    const x = lo + ((col + 0.5) * (hi - lo)) / cols;
    for (let k = 0; k + 1 < order.length; k++) {
      const a = order[k];
      const b = order[k + 1];
      if (!a || !b || x < a.rpm || x > b.rpm) continue;
      if (a.y !== null && a.y !== undefined && b.y !== null && b.y !== undefined && b.rpm > a.rpm) {
        out[col] = a.y + ((x - a.rpm) / (b.rpm - a.rpm)) * (b.y - a.y);
      }
      break;
    }
  }
  return out;
}

export function columnOfRpm(rpm: number, lo: number, hi: number, cols: number): number {
  if (!(hi > lo)) return -1;
  const f = (rpm - lo) / (hi - lo);
  if (f < 0 || f > 1) return -1;
  return Math.min(cols - 1, Math.floor(f * cols));
}

/** A 1-2-5 step for speed tick labels so about `n` fit. */
export function rpmTickStep(lo: number, hi: number, maxTicks: number): number {
  const raw = (hi - lo) / Math.max(1, maxTicks);
  for (const s of [250, 500, 1000, 2000, 2500, 5000, 10000]) if (s >= raw) return s;
  return 20000;
}


export function sweepScreen(i: SweepScreenInput): string[] {
  const w = i.width;
  const g = SWEEP_GUTTER;
  const cols = Math.max(1, w - g);
  const fixed = 1 /* title */ + 2 /* axis */ + 3; /* summary */
  const height = Math.max(3, i.rows - fixed);

  if (!i.now) {
    const lines = [
      fit('Volumetric efficiency against engine speed', w),
      '',
      ...[
        `Press s (or enter) to run the sweep: ${i.plan.count} speeds, ${Math.round(i.plan.from)}–${Math.round(i.plan.to)} rpm.`,
        'It runs in the background: the keys keep working, points appear as they finish.',
        `The band ${Math.round(i.band.from)}–${Math.round(i.band.to)} rpm is shaded; its mean ηv is the figure to compare,`,
        'since a gain at one speed often costs at the next.',
        'After you change the case, the old curve stays as the baseline.',
      ].map((t) => fit(t, w)),
    ];
    return padLines(lines, i.rows, w);
  }

  const all = [...i.now.rpms, ...(i.before?.rpms ?? [])];
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  const nowCols = curveColumns(i.now, lo, hi, cols);
  const beforeCols = i.before ? curveColumns(i.before, lo, hi, cols) : undefined;
  const series: ChartSeries[] = [];
  if (beforeCols) series.push({ values: beforeCols, style: 'dots' });
  series.push({ values: nowCols, style: 'line' });
  const dyno = (i.measured?.points ?? []).filter((p) => p.rpm >= lo && p.rpm <= hi && Number.isFinite(p.eta));
  const range = valueRange(
    [...series.map((s) => s.values), dyno.map((p) => p.eta)],
    { minSpan: 0.05, pad: 0.05 },
  );
  const shade = Array.from({ length: cols }, (_, c) => {
    const x = lo + ((c + 0.5) * (hi - lo)) / cols;
    return x >= i.band.from && x <= i.band.to;
  });
  const bins = Array.from({ length: cols }, (_, c) => [c]);
  const cursorColumn = columnOfRpm(i.currentRpm, lo, hi, cols);
  const chart = plotBins(
    series,
    bins,
    { width: w, height, gutter: g, yMin: range.min, yMax: range.max, formatY: (v) => fixedNum(v * 100, 1), labelEvery: height >= 16 ? 4 : 3 },
    { cursorColumn, shadeColumns: shade },
  );
  // unconverged points as ×
  for (const p of computedPoints(i.now)) {
    if (p.converged) continue;
    const c = columnOfRpm(p.x, lo, hi, cols);
    const r = Math.min(height - 1, Math.max(0, Math.floor(((range.max - p.y) / (range.max - range.min)) * height)));
    const line = chart[r];
    if (line !== undefined && c >= 0) chart[r] = line.slice(0, g + c) + '×' + line.slice(g + c + 1);
  }

  // dyno points as ●
  for (const p of dyno) {
    const c = columnOfRpm(p.rpm, lo, hi, cols);
    const r = Math.min(height - 1, Math.max(0, Math.floor(((range.max - p.eta) / (range.max - range.min)) * height)));
    const line = chart[r];
    if (line !== undefined && c >= 0) chart[r] = line.slice(0, g + c) + DYNO_GLYPH + line.slice(g + c + 1);
  }

  const step = rpmTickStep(lo, hi, Math.floor(cols / 7));
  const marks: ColumnMark[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi; v += step) {
    marks.push({ col: columnOfRpm(v, lo, hi, cols), label: String(v), priority: 1 });
  }
  const axis = axisLines(marks, { width: w, gutter: g, cursorColumn, highlight: shade });

  const s = curveStats(i.now, i.band);
  const b = i.before ? curveStats(i.before, i.band) : undefined;
  const band = `${Math.round(i.band.from)}–${Math.round(i.band.to)} rpm`;
  const diff = b && Number.isFinite(s.mean) && Number.isFinite(b.mean) ? ` (${etaPoints(s.mean, b.mean)})` : '';
  const line1 = joinFit(
    [`Band ${band} ${GLYPH.band}: mean ηv ${etaPct(s.mean)}${diff}`, b ? `baseline ${etaPct(b.mean)}` : ''].filter(Boolean),
    w,
    '   ',
  );
  const line2 = joinFit(
    [
      `Best ${Number.isFinite(s.bestRpm) ? Math.round(s.bestRpm) : '…'} rpm, ηv ${etaPct(s.bestEta)}`,
      b ? `baseline best ${Number.isFinite(b.bestRpm) ? Math.round(b.bestRpm) : '…'} rpm, ηv ${etaPct(b.bestEta)}` : '',
      `${GLYPH.cursor} ${Math.round(i.currentRpm)} rpm shown`,
    ].filter(Boolean),
    w,
    '   ',
  );
  const progress =
    i.status === 'running'
      ? `Running in the background: ${s.done} of ${s.total} points`
      : i.status === 'stopped'
        ? `Stopped at ${s.done} of ${s.total} points (s runs it again)`
        : i.status === 'failed'
          ? `The sweep failed after ${s.done} of ${s.total} points`
          : `${s.total} points${s.unconverged > 0 ? `, ${s.unconverged} not converged (×)` : ''}${i.stale ? ' · the case has changed since: s runs it again' : ''}`;
  const legend =
    (b ? `${GLYPH.flat} now: ${i.now.label}  ${GLYPH.baseline} baseline: ${i.before?.label ?? ''}` : `${GLYPH.flat} ${i.now.label}`) +
    (i.measured && i.measured.points.length > 0 ? `  ${DYNO_GLYPH} ${i.measured.label}` : '');
  const line3 = firstFit([`${progress}   ${legend}`, progress], w);
  const title = firstFit(
    [
      'Volumetric efficiency ηv against engine speed (p pins this curve as the baseline)',
      'Volumetric efficiency ηv [%] against engine speed',
      'ηv against speed',
    ],
    w,
  );
  return padLines([title, ...chart, ...axis, line1, line2, line3], i.rows, w);
}

