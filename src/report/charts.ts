/**
 * The report's charts as vega-lite specifications: pure functions from the
 * report data to plain JSON specs (render.ts turns them into SVG).
 *
 * Readable in grey-scale print and by colour-blind readers: lines differ by
 * dash pattern and point shape as well as by colour, the colours are from
 * the Okabe–Ito palette (Okabe & Ito, "Color Universal Design", 2008), and
 * the runner map uses the viridis scale, whose lightness rises steadily
 * (van der Walt & Smith, matplotlib, 2015). Every axis title carries its unit.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { PipeMap } from '../core/model.js';
import type { OperatingPoint, ReportData } from './gather.js';
import { fixed, type Units } from './units.js';

/** Okabe–Ito colours */
export const COLOURS = {
  blue: '#0072B2',
  vermillion: '#D55E00',
  black: '#000000',
  green: '#009E73',
  orange: '#E69F00',
  sky: '#56B4E9',
  purple: '#CC79A7',
} as const;

const BAND_FILL = '#d9d9d9';
const EVENT_GREY = '#555555';
const WIDTH = 620;

export interface ChartSpec {
  /** file-name stem, e.g. "speed-ve", "valve-7250rpm" */
  name: string;
  /** caption in the report */
  title: string;
  spec: TopLevelSpec;
  /** draw without anti-aliasing (a heat map: no hairline seams between its cells) */
  crisp?: boolean;
}

const CONFIG = {
  aria: false,
  font: 'sans-serif',
  background: 'white',
  padding: 6,
  axis: { labelFontSize: 10, titleFontSize: 11, titleFontWeight: 'normal', grid: true, gridColor: '#e6e6e6' },
  legend: { labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'normal', orient: 'bottom', direction: 'horizontal', labelLimit: 360 },
  view: { stroke: '#999999' },
  title: { fontSize: 13, fontWeight: 'normal', anchor: 'start' },
} as const;

type Json = Record<string, unknown>;

/**
 * Give every layer (nested layers too) the shared x axis `x`: its title,
 * scale and axis, with the layer's own field. A layer placed by x datum
 * (a horizontal rule) keeps its own. (An x encoding inherited from the
 * parent would leak its field into the data filter of such a layer and drop it.)
 */
function withX(layers: Json[], x: Json): Json[] {
  return layers.map((l) => {
    if (Array.isArray(l['layer'])) return { ...l, layer: withX(l['layer'] as Json[], x) };
    const enc = { ...((l['encoding'] as Json | undefined) ?? {}) };
    const own = enc['x'] as Json | undefined;
    if (own && own['datum'] !== undefined) return l;
    enc['x'] = { ...x, ...(own ?? {}), title: x['title'], scale: x['scale'], axis: x['axis'] };
    if (own === undefined || own['field'] === undefined) (enc['x'] as Json)['field'] = x['field'];
    return { ...l, encoding: enc };
  });
}

function top(spec: Json): TopLevelSpec {
  return { config: CONFIG, ...spec } as unknown as TopLevelSpec;
}

// ------------------------------------------------------------------ speed curves

interface SeriesStyle {
  name: string;
  colour: string;
  dash: number[];
  shape: string;
}

/** What the speed charts read of the report data (a sweep alone has no compared design). */
export type CurveInput = Pick<ReportData, 'rpms' | 'band' | 'curve' | 'estimates' | 'measured'> & {
  design: { name: string };
  compare?: { design: { name: string }; curve: ReportData['curve'] } | undefined;
};

function seriesOf(data: CurveInput): SeriesStyle[] {
  const s: SeriesStyle[] = [{ name: data.design.name, colour: COLOURS.blue, dash: [1, 0], shape: 'circle' }];
  if (data.compare) {
    const name = data.compare.design.name === data.design.name ? `${data.compare.design.name} (compared)` : data.compare.design.name;
    s.push({ name, colour: COLOURS.vermillion, dash: [7, 3], shape: 'square' });
  }
  return s;
}

const MEASURED_NAME = 'measured (dyno sheet)';

function seriesScales(series: SeriesStyle[], withMeasured: boolean): { color: Json; shape: Json; dash: Json } {
  const names = series.map((s) => s.name);
  return {
    color: { domain: [...names, ...(withMeasured ? [MEASURED_NAME] : [])], range: [...series.map((s) => s.colour), ...(withMeasured ? [COLOURS.black] : [])] },
    shape: { domain: [...names, ...(withMeasured ? [MEASURED_NAME] : [])], range: [...series.map((s) => s.shape), ...(withMeasured ? ['cross'] : [])] },
    dash: { domain: names, range: series.map((s) => s.dash) },
  };
}

function bandLayer(band: { from: number; to: number }): Json {
  return {
    data: { values: [{ from: band.from, to: band.to }] },
    mark: { type: 'rect', color: BAND_FILL, opacity: 0.6 },
    encoding: { x: { field: 'from', type: 'quantitative' }, x2: { field: 'to' } },
  };
}

function bandLabel(band: { from: number; to: number }): Json {
  return {
    data: { values: [{ at: (band.from + band.to) / 2, text: `band ${fixed(band.from, 0)}–${fixed(band.to, 0)} rpm` }] },
    mark: { type: 'text', baseline: 'top', dy: 4, fontSize: 10, color: '#444444', y: 0 },
    encoding: { x: { field: 'at', type: 'quantitative' }, text: { field: 'text' } },
  };
}

/** the line and point layers of one quantity for every design and the measured sheet */
function curveLayers(rows: Json[], measured: Json[], series: SeriesStyle[], yField: string, legend: boolean): Json[] {
  const sc = seriesScales(series, measured.length > 0);
  const legendOf = (title: string): Json | null => (legend ? { title, orient: 'bottom' } : null);
  const layers: Json[] = [
    {
      data: { values: rows },
      mark: { type: 'line', strokeWidth: 2 },
      encoding: {
        x: { field: 'rpm', type: 'quantitative' },
        y: { field: yField, type: 'quantitative' },
        color: { field: 'series', type: 'nominal', scale: sc.color, legend: legendOf('design') },
        strokeDash: { field: 'series', type: 'nominal', scale: sc.dash, legend: null },
      },
    },
    {
      data: { values: [...rows, ...measured] },
      mark: { type: 'point', filled: true, size: 36 },
      encoding: {
        x: { field: 'rpm', type: 'quantitative' },
        y: { field: yField, type: 'quantitative' },
        color: { field: 'series', type: 'nominal', scale: sc.color, legend: legendOf('design') },
        shape: { field: 'series', type: 'nominal', scale: sc.shape, legend: legendOf('design') },
      },
    },
  ];
  return layers;
}

function speedAxis(data: CurveInput, title = true): Json {
  const lo = data.rpms[0]!;
  const hi = data.rpms[data.rpms.length - 1]!;
  return {
    field: 'rpm',
    type: 'quantitative',
    title: title ? 'engine speed [rpm]' : null,
    scale: { domain: [lo, hi], nice: false, zero: false },
    axis: { format: 'd', tickCount: 8 },
  };
}

/** ηv against speed: band, band mean, best speed, tuned speeds, compared design, measured ηv. */
export function speedVeChart(data: CurveInput): ChartSpec {
  const series = seriesOf(data);
  const rows: Json[] = data.curve.points.map((p) => ({ rpm: p.rpm, ve: p.volumetricEfficiency * 100, series: series[0]!.name }));
  if (data.compare) for (const p of data.compare.curve.points) rows.push({ rpm: p.rpm, ve: p.volumetricEfficiency * 100, series: series[1]!.name });
  const measured: Json[] = (data.measured?.points ?? [])
    .filter((p) => p.volumetricEfficiency !== undefined)
    .map((p) => ({ rpm: p.rpm, ve: p.volumetricEfficiency! * 100, series: MEASURED_NAME }));
  const lo = data.rpms[0]!;
  const hi = data.rpms[data.rpms.length - 1]!;
  const s = data.curve.summary;
  const tuned = data.estimates.tunedSpeeds.filter((t) => t.rpm >= lo && t.rpm <= hi);
  const curve = curveLayers(rows, measured, series, 've', true);
  (curve[0]!['encoding'] as Json)['y'] = { field: 've', type: 'quantitative', title: 'volumetric efficiency ηv [%]', scale: { zero: false, nice: true } };
  const layers: Json[] = [
    bandLayer(data.band),
    bandLabel(data.band),
    {
      data: { values: tuned.map((t) => ({ rpm: t.rpm, text: `order ${t.order}` })) },
      layer: [
        { mark: { type: 'rule', color: COLOURS.green, strokeDash: [2, 3], strokeWidth: 1.5 }, encoding: { x: { field: 'rpm', type: 'quantitative' } } },
        {
          mark: { type: 'text', angle: 270, align: 'right', baseline: 'bottom', dx: -18, dy: -3, fontSize: 10, color: COLOURS.green, y: 0 },
          encoding: { x: { field: 'rpm', type: 'quantitative' }, text: { field: 'text' } },
        },
      ],
    },
    ...curve,
    {
      data: { values: [{ from: data.band.from, to: data.band.to, ve: s.band.meanVolumetricEfficiency * 100, text: `band mean ${fixed(s.band.meanVolumetricEfficiency * 100, 1)} %` }] },
      layer: [
        { mark: { type: 'rule', color: COLOURS.black, strokeDash: [5, 2], strokeWidth: 1.5 }, encoding: { x: { field: 'from', type: 'quantitative' }, x2: { field: 'to' }, y: { field: 've', type: 'quantitative' } } },
        { mark: { type: 'text', align: 'left', baseline: 'bottom', dy: -3, fontSize: 10 }, encoding: { x: { field: 'from', type: 'quantitative' }, y: { field: 've', type: 'quantitative' }, text: { field: 'text' } } },
      ],
    },
    {
      data: { values: [{ rpm: s.bestRpm, ve: s.bestVolumetricEfficiency * 100, text: `best ${fixed(s.bestVolumetricEfficiency * 100, 1)} % at ${fixed(s.bestRpm, 0)} rpm` }] },
      layer: [
        { mark: { type: 'point', shape: 'diamond', size: 140, filled: false, strokeWidth: 2, color: COLOURS.black }, encoding: { x: { field: 'rpm', type: 'quantitative' }, y: { field: 've', type: 'quantitative' } } },
        { mark: { type: 'text', align: 'center', baseline: 'bottom', dy: -9, fontSize: 10, fontWeight: 'bold' }, encoding: { x: { field: 'rpm', type: 'quantitative' }, y: { field: 've', type: 'quantitative' }, text: { field: 'text' } } },
      ],
    },
  ];
  return {
    name: 'speed-ve',
    title: 'Volumetric efficiency against engine speed',
    spec: top({
      width: WIDTH,
      height: 220,
      resolve: { scale: { color: 'shared', shape: 'shared' } },
      layer: withX(layers, speedAxis(data)),
    }),
  };
}

/** Estimated brake torque and power against speed (two panels), compared design, measured points. */
export function speedOutputChart(data: ReportData, u: Units): ChartSpec {
  const series = seriesOf(data);
  const rows = (points: ReportData['curve']['points'], name: string): Json[] =>
    points.map((p) => ({ rpm: p.rpm, torque: u.num('torque', p.torque), power: u.num('power', p.power), series: name }));
  const all = [...rows(data.curve.points, series[0]!.name), ...(data.compare ? rows(data.compare.curve.points, series[1]!.name) : [])];
  const m = data.measured?.points ?? [];
  const mTorque = m.filter((p) => p.torque !== undefined).map((p) => ({ rpm: p.rpm, torque: u.num('torque', p.torque!), series: MEASURED_NAME }));
  const mPower = m.filter((p) => p.power !== undefined).map((p) => ({ rpm: p.rpm, power: u.num('power', p.power!), series: MEASURED_NAME }));
  const withMeasured = mTorque.length > 0 || mPower.length > 0;
  const panel = (field: 'torque' | 'power', measured: Json[], title: string, legend: boolean, xTitle: boolean): Json => {
    const layers = curveLayers(all, withMeasured && measured.length === 0 ? [] : measured, series, field, legend);
    // the same legend entries in both panels: keep the measured entry's scale even where this panel has none
    const sc = seriesScales(series, withMeasured);
    for (const l of layers) {
      const enc = l['encoding'] as Json;
      enc['color'] = { ...(enc['color'] as Json), scale: sc.color };
      if (enc['shape']) enc['shape'] = { ...(enc['shape'] as Json), scale: sc.shape };
    }
    (layers[0]!['encoding'] as Json)['y'] = { field, type: 'quantitative', title, scale: { zero: false, nice: true } };
    return {
      width: WIDTH,
      height: 120,
      layer: withX([bandLayer(data.band), ...layers], speedAxis(data, xTitle)),
    };
  };
  return {
    name: 'speed-output',
    title: 'Estimated brake torque and power against engine speed',
    spec: top({
      vconcat: [
        panel('torque', mTorque, `brake torque ${u.bracket('torque')}`, true, false),
        panel('power', mPower, `brake power ${u.bracket('power')}`, true, true),
      ],
      resolve: { scale: { color: 'shared', shape: 'shared', strokeDash: 'shared' } },
      spacing: 10,
    }),
  };
}

/** Mass balance error and cycles to converge at every speed, with the limits. */
export function balanceChart(data: ReportData, limit: number, maxCycles: number): ChartSpec {
  const series = seriesOf(data);
  const rows: Json[] = data.curve.points.map((p) => ({ rpm: p.rpm, imbalance: p.massImbalance * 100, cycles: p.cycles, state: p.converged ? 'converged' : 'not converged', series: series[0]!.name }));
  if (data.compare)
    for (const p of data.compare.curve.points)
      rows.push({ rpm: p.rpm, imbalance: p.massImbalance * 100, cycles: p.cycles, state: p.converged ? 'converged' : 'not converged', series: series[1]!.name });
  const sc = seriesScales(series, false);
  const pts = (field: string, title: string, legend: boolean, xTitle: boolean, rule: Json[]): Json => ({
    width: WIDTH,
    height: 90,
    layer: withX([
      {
        data: { values: rule },
        mark: { type: 'rule', color: COLOURS.black, strokeDash: [4, 3] },
        encoding: { x: { datum: data.rpms[0]!, type: 'quantitative' }, x2: { datum: data.rpms[data.rpms.length - 1]! }, y: { field: 'y', type: 'quantitative' } },
      },
      {
        data: { values: rows },
        mark: { type: 'line', strokeWidth: 1.5 },
        encoding: {
          x: { field: 'rpm', type: 'quantitative' },
          y: { field, type: 'quantitative', title },
          color: { field: 'series', type: 'nominal', scale: sc.color, legend: legend ? { title: 'design' } : null },
          strokeDash: { field: 'series', type: 'nominal', scale: sc.dash, legend: null },
        },
      },
      {
        data: { values: rows },
        mark: { type: 'point', size: 40, strokeWidth: 1.5 },
        encoding: {
          x: { field: 'rpm', type: 'quantitative' },
          y: { field, type: 'quantitative' },
          color: { field: 'series', type: 'nominal', scale: sc.color, legend: legend ? { title: 'design' } : null },
          shape: { field: 'state', type: 'nominal', scale: { domain: ['converged', 'not converged'], range: ['circle', 'triangle-up'] }, legend: legend ? { title: 'cycle to cycle', symbolStrokeColor: COLOURS.black } : null },
          fill: { field: 'state', type: 'nominal', scale: { domain: ['converged', 'not converged'], range: ['white', COLOURS.black] }, legend: null },
        },
      },
    ], speedAxis(data, xTitle)),
  });
  return {
    name: 'mass-balance',
    title: 'Mass balance and convergence at every speed',
    spec: top({
      vconcat: [
        pts('imbalance', 'mass imbalance [%]', true, false, [{ y: limit * 100 }, { y: -limit * 100 }]),
        pts('cycles', 'cycles run [-]', true, true, [{ y: maxCycles }]),
      ],
      resolve: { scale: { color: 'shared', shape: 'shared', fill: 'shared' } },
      spacing: 10,
    }),
  };
}

// ------------------------------------------------------------------ one operating point

/** The dead centres and valve events to mark on a crank-angle axis, θ in [0, 720]. */
export function crankMarks(events: OperatingPoint['result']['events']): { theta: number; text: string; kind: 'centre' | 'valve' }[] {
  const w = (t: number) => ((t % 720) + 720) % 720;
  return [
    { theta: 0, text: 'TDC', kind: 'centre' as const },
    { theta: 180, text: 'BDC', kind: 'centre' as const },
    { theta: 360, text: 'TDC', kind: 'centre' as const },
    { theta: 540, text: 'BDC', kind: 'centre' as const },
    { theta: 720, text: 'TDC', kind: 'centre' as const },
    { theta: w(events.ivo), text: 'IVO', kind: 'valve' as const },
    { theta: w(events.ivc), text: 'IVC', kind: 'valve' as const },
    { theta: w(events.evo), text: 'EVO', kind: 'valve' as const },
    { theta: w(events.evc), text: 'EVC', kind: 'valve' as const },
  ];
}

/** the intake-open span(s) over [0, 720], split where it wraps */
function openSpans(ivo: number, ivc: number): { from: number; to: number }[] {
  return ivo <= ivc ? [{ from: ivo, to: ivc }] : [{ from: ivo, to: 720 }, { from: 0, to: ivc }];
}

function crankAxis(title: boolean): Json {
  return {
    field: 'crank',
    type: 'quantitative',
    title: title ? 'crank angle θ [deg] (0 = TDC at the start of the intake stroke)' : null,
    scale: { domain: [0, 720], nice: false },
    axis: { values: [0, 90, 180, 270, 360, 450, 540, 630, 720] },
  };
}

function eventLayers(p: OperatingPoint, labels: boolean): Json[] {
  const marks = crankMarks(p.result.events);
  const layers: Json[] = [
    {
      data: { values: openSpans(p.result.events.ivo, p.result.events.ivc) },
      mark: { type: 'rect', color: BAND_FILL, opacity: 0.5 },
      encoding: { x: { field: 'from', type: 'quantitative' }, x2: { field: 'to' } },
    },
    {
      data: { values: marks },
      mark: { type: 'rule', strokeWidth: 1 },
      encoding: {
        x: { field: 'theta', type: 'quantitative' },
        color: { field: 'kind', type: 'nominal', scale: { domain: ['centre', 'valve'], range: ['#aaaaaa', EVENT_GREY] }, legend: null },
        strokeDash: { field: 'kind', type: 'nominal', scale: { domain: ['centre', 'valve'], range: [[1, 0], [4, 3]] }, legend: null },
      },
    },
  ];
  if (labels) {
    // the dead centres on the first line of labels, the valve events on a second (they can sit close together)
    layers.push({
      data: { values: marks.map((m) => ({ ...m, row: m.kind === 'centre' ? 0 : 1 })) },
      mark: { type: 'text', baseline: 'bottom', fontSize: 10, y: { expr: '-3 - 12 * datum.row' } },
      encoding: { x: { field: 'theta', type: 'quantitative' }, text: { field: 'text' } },
    });
  }
  return layers;
}

/** Pressure at the valve, valve flow and cylinder mass against crank angle, events marked. */
export function valveChart(p: OperatingPoint, u: Units, reference: number): ChartSpec {
  const t = p.result.trace;
  const rows: Json[] = [];
  for (let i = 0; i < t.crank.length; i++) {
    rows.push({
      crank: t.crank[i],
      pressure: u.num('pressure', t.valvePressure[i]!),
      flow: u.num('massFlow', t.valveFlow[i]!),
      mass: u.num('mass', t.cylinderMass[i]!),
    });
  }
  const peak = p.pulse.peakOffsetFromIvc !== null ? ((p.pulse.effect === 'helping' ? p.pulse.peakAfterIvc : null) ?? p.pulse.lastPeakBeforeIvc) : null;
  const panel = (field: string, title: string, colour: string, extra: Json[], labels: boolean, xTitle: boolean): Json => ({
    width: WIDTH,
    height: field === 'pressure' ? 150 : 110,
    layer: withX(
      [
        ...eventLayers(p, labels),
        ...extra,
        {
          data: { values: rows },
          mark: { type: 'line', strokeWidth: 1.8, color: colour },
          encoding: { x: { field: 'crank', type: 'quantitative' }, y: { field, type: 'quantitative', title, scale: { zero: false, nice: true }, axis: { titleFontSize: 10, tickCount: 4 } } },
        },
      ],
      crankAxis(xTitle),
    ),
  });
  const refLabel = p.pulse.referenceKind === 'ambient' ? 'ambient' : 'plenum mean';
  const pressureExtra: Json[] = [
    {
      data: { values: [{ y: u.num('pressure', reference), text: refLabel }] },
      layer: [
        { mark: { type: 'rule', color: COLOURS.black, strokeDash: [2, 2] }, encoding: { x: { datum: 0, type: 'quantitative' }, x2: { datum: 720 }, y: { field: 'y', type: 'quantitative' } } },
        { mark: { type: 'text', align: 'right', baseline: 'bottom', dx: -3, dy: -2, fontSize: 10 }, encoding: { x: { datum: 720, type: 'quantitative' }, y: { field: 'y', type: 'quantitative' }, text: { field: 'text' } } },
      ],
    },
  ];
  if (peak) {
    const off = peak.offsetFromIvc;
    pressureExtra.push({
      data: { values: [{ crank: peak.crank, y: u.num('pressure', peak.pressure), text: `peak ${fixed(Math.abs(off), 0)}° ${off <= 0 ? 'before' : 'after'} IVC` }] },
      layer: [
        { mark: { type: 'point', shape: 'triangle-down', size: 80, filled: true, color: COLOURS.vermillion, yOffset: -7 }, encoding: { x: { field: 'crank', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' } } },
        { mark: { type: 'text', align: 'left', baseline: 'bottom', dx: 6, dy: -8, fontSize: 10, fontWeight: 'bold' }, encoding: { x: { field: 'crank', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' }, text: { field: 'text' } } },
      ],
    });
  }
  const zero: Json[] = [
    { data: { values: [{ y: 0 }] }, mark: { type: 'rule', color: COLOURS.black, strokeWidth: 0.8 }, encoding: { x: { datum: 0, type: 'quantitative' }, x2: { datum: 720 }, y: { field: 'y', type: 'quantitative' } } },
  ];
  return {
    name: `valve-${fixed(p.rpm, 0)}rpm`,
    title: `Pressure at the valve, valve flow and cylinder mass at ${fixed(p.rpm, 0)} rpm`,
    spec: top({
      vconcat: [
        panel('pressure', `valve pressure ${u.bracket('pressure')}`, COLOURS.blue, pressureExtra, true, false),
        panel('flow', `valve flow ${u.bracket('massFlow')}`, COLOURS.vermillion, zero, false, false),
        panel('mass', `cylinder mass ${u.bracket('mass')}`, COLOURS.green, [], false, true),
      ],
      spacing: 8,
    }),
  };
}

/** degrees per column of the runner map (averaged), and the most rows it keeps */
export const MAP_DEGREES = 3;
export const MAP_MAX_ROWS = 24;

/** A pipe's space–time map (the runner's by default) averaged into MAP_DEGREES-wide columns and at most MAP_MAX_ROWS positions. */
export function mapCells(
  p: OperatingPoint,
  map: { x: Float64Array; pressure: Float64Array } = p.result.runnerMap,
): { crank: number; crank2: number; x: number; x2: number; pressure: number }[] {
  const { x, pressure } = map;
  const nx = x.length;
  const rows = pressure.length / nx;
  const keep = Math.min(nx, MAP_MAX_ROWS);
  const cells: { crank: number; crank2: number; x: number; x2: number; pressure: number }[] = [];
  const L = nx > 1 ? x[nx - 1]! : 0;
  const picked: number[] = [];
  for (let j = 0; j < keep; j++) picked.push(keep === 1 ? 0 : Math.round((j * (nx - 1)) / (keep - 1)));
  // rows meet half-way between the positions kept, so the map has no seams
  const edge = (j: number): number => (j <= 0 ? 0 : j >= keep ? L : (x[picked[j - 1]!]! + x[picked[j]!]!) / 2);
  for (let j = 0; j < keep; j++) {
    const k = picked[j]!;
    for (let t0 = 0; t0 < rows; t0 += MAP_DEGREES) {
      let s = 0;
      let n = 0;
      for (let t = t0; t < Math.min(rows, t0 + MAP_DEGREES); t++) {
        s += pressure[t * nx + k]!;
        n++;
      }
      cells.push({ crank: t0, crank2: Math.min(720, t0 + MAP_DEGREES), x: edge(j), x2: edge(j + 1), pressure: s / n });
    }
  }
  return cells;
}

/** Pressure along the runner against crank angle (valve end at the top), as a heat map. */
export function runnerMapChart(p: OperatingPoint, u: Units, upstream: 'ambient' | 'plenum'): ChartSpec {
  const end = upstream === 'plenum' ? 'plenum end' : 'open end';
  return mapChart(p, u, mapCells(p), {
    name: `runner-${fixed(p.rpm, 0)}rpm`,
    title: `Pressure along the runner against crank angle at ${fixed(p.rpm, 0)} rpm`,
    yTitle: `distance from the ${end} ${u.bracket('length')}`,
  });
}

/** the chart name of a pipe's map other than the runner's: "pipe-snorkel-6500rpm" */
export function pipeMapName(pipe: Pick<PipeMap, 'name'>, rpm: number): string {
  const slug = pipe.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'pipe';
  return `pipe-${slug}-${fixed(rpm, 0)}rpm`;
}

/** Pressure along another pipe of the case (snorkel, exhaust pipe, resonator) against crank angle, its start at the bottom. */
export function pipeMapChart(p: OperatingPoint, u: Units, pipe: PipeMap): ChartSpec {
  return mapChart(p, u, mapCells(p, pipe), {
    name: pipeMapName(pipe, p.rpm),
    title: `Pressure along the ${pipe.name} against crank angle at ${fixed(p.rpm, 0)} rpm`,
    yTitle: `distance from the ${pipe.start} ${u.bracket('length')}`,
  });
}

function mapChart(
  p: OperatingPoint,
  u: Units,
  raw: { crank: number; crank2: number; x: number; x2: number; pressure: number }[],
  o: { name: string; title: string; yTitle: string },
): ChartSpec {
  // each cell reaches a little into the next one, which is drawn over it: with crisp edges (no
  // anti-aliasing) cells that only touch at a fractional pixel leave a one-pixel seam of background
  const xMax = raw.reduce((m, c) => Math.max(m, c.x2), 0);
  const cells = raw.map((c) => ({
    crank: c.crank,
    crank2: Math.min(720, c.crank2 + 0.5),
    x: u.num('length', c.x),
    x2: u.num('length', Math.min(xMax, c.x2 + 0.01 * xMax)),
    p: Number(u.num('pressure', c.pressure).toFixed(3)),
  }));
  const marks = crankMarks(p.result.events);
  return {
    name: o.name,
    title: o.title,
    crisp: true,
    spec: top({
      width: WIDTH,
      height: 200,
      layer: [
        {
          data: { values: cells },
          mark: { type: 'rect' },
          encoding: {
            x: { ...crankAxis(true), field: 'crank' },
            x2: { field: 'crank2' },
            y: { field: 'x', type: 'quantitative', title: o.yTitle, scale: { nice: false, zero: true } },
            y2: { field: 'x2' },
            color: {
              field: 'p',
              type: 'quantitative',
              title: `pressure ${u.bracket('pressure')}`,
              scale: { scheme: 'viridis' },
              legend: { orient: 'right', direction: 'vertical', gradientLength: 180, format: '.1f' },
            },
          },
        },
        {
          data: { values: marks },
          layer: [
            { mark: { type: 'rule', color: 'white', strokeWidth: 2.5, opacity: 0.8 }, encoding: { x: { field: 'theta', type: 'quantitative' } } },
            { mark: { type: 'rule', color: COLOURS.black, strokeDash: [4, 3], strokeWidth: 1 }, encoding: { x: { field: 'theta', type: 'quantitative' } } },
            {
              mark: { type: 'text', baseline: 'bottom', fontSize: 10, y: { expr: "datum.kind === 'centre' ? -3 : -15" } },
              encoding: { x: { field: 'theta', type: 'quantitative' }, text: { field: 'text' } },
            },
          ],
        },
      ],
    }),
  };
}

/** All charts of a report, in the order they appear. */
export function reportCharts(data: ReportData, u: Units, opts: { massLimit: number }): ChartSpec[] {
  const reference = (p: OperatingPoint) => p.pulse.referencePressure;
  const upstream = data.design.model.inlet.kind;
  return [
    speedVeChart(data),
    speedOutputChart(data, u),
    ...data.points.flatMap((p) => [
      valveChart(p, u, reference(p)),
      runnerMapChart(p, u, upstream),
      ...p.result.pipes.filter((m) => m.role !== 'runner').map((m) => pipeMapChart(p, u, m)),
    ]),
    balanceChart(data, opts.massLimit, data.design.model.numerics.maxCycles),
  ];
}
