/**
 * The runner view as text lines: the space–time map of pressure along the
 * runner (valve end at the top, open end at the bottom) against crank angle,
 * the cursor marked above and below the map, the shade legend, and the
 * values at the cursor. Pure.
 *
 * The same screen shows any other pipe of the case (snorkel, exhaust pipe,
 * resonator) when `pipe` says which: its name, its two ends' words, and
 * whether its x = 0 end is drawn at the top (the exhaust pipe: valve on top).
 */
import { columnOfCrank, crankAxis, cycleMarks, fitLeft } from './chart.js';
import { mapLegend, mapLines, shadeStep, type MapInput } from './space-time.js';
import { firstFit, fit } from './text.js';
import { METRIC, type Units } from '../present/units.js';
import { padLines } from './valve-screen.js';

export interface RunnerScreenInput {
  width: number;
  rows: number;
  crank: number;
  from: number;
  span: number;
  map: MapInput;
  events: { ivo: number; ivc: number; evo: number; evc: number };
  /** total runner length [m] */
  runnerLength: number;
  /** what the upstream end opens into */
  upstream: 'ambient' | 'plenum';
  /** wave round trip [crank deg], from the pulse timing */
  roundTripDeg?: number | undefined;
  rpm: number;
  /** another pipe than the runner, or the runner among several pipes */
  pipe?: PipeShown | undefined;
  /**
   * the pressure at the valve [Pa] per crank degree (the trace the Valve view and the
   * teaching line read): the readout's valve end, so every screen gives one figure
   */
  valvePressure?: ArrayLike<number> | undefined;
  /** display units (the u key); metric when not given */
  units?: Units | undefined;
}

/** Which pipe the view shows and how its ends are named. */
export interface PipeShown {
  /** "runner", "snorkel", "exhaust", "resonator-1" */
  name: string;
  /** physical length [m] */
  length: number;
  /** words for the end drawn at the top and at the bottom (at most 7 characters each) */
  top: string;
  bottom: string;
  /** the map's x = 0 end is at the top (otherwise at the bottom) */
  startOnTop: boolean;
  /** its place among the case's pipes (↑ ↓ pick), from 0 */
  index: number;
  count: number;
}

/** The map with its nodes in reverse order (x = 0 last), so the start end is drawn at the top. */
export function reversedMap(map: MapInput): MapInput {
  const nx = map.x.length;
  const rows = Math.floor(map.pressure.length / Math.max(1, nx));
  const x = new Float64Array(nx);
  const p = new Float64Array(rows * nx);
  const L = map.x[nx - 1] ?? 0;
  for (let k = 0; k < nx; k++) x[k] = L - (map.x[nx - 1 - k] ?? 0);
  for (let r = 0; r < rows; r++) for (let k = 0; k < nx; k++) p[r * nx + k] = map.pressure[r * nx + nx - 1 - k] ?? Number.NaN;
  return { x, pressure: p, ambient: map.ambient };
}

export const RUNNER_GUTTER = 8;

/** The pressure [Pa] at node `n` at crank angle `crank`. */
function sample(map: MapInput, crank: number, n: number): number {
  return map.pressure[crank * map.x.length + n] ?? Number.NaN;
}

export function runnerScreen(i: RunnerScreenInput): string[] {
  const w = i.width;
  const u = i.units ?? METRIC;
  const G = u.label('gauge');
  const g = RUNNER_GUTTER;
  const cols = Math.max(1, w - g);
  const fixed = 1 /* title */ + 1 /* marker */ + 2 /* axis */ + 1 /* legend */ + 1; /* readout */
  const mapRows = Math.max(3, i.rows - fixed);
  const pipe = i.pipe;
  const map = pipe?.startOnTop ? reversedMap(i.map) : i.map;
  const step = shadeStep(map);
  const body = mapLines(map, { from: i.from, span: i.span, cols, rows: mapRows }, step);
  const lenMm = u.value('length', pipe ? pipe.length : i.runnerLength, u.system === 'metric' ? 0 : 1);
  const lenUnit = u.label('length');
  const upstreamName = i.upstream === 'plenum' ? 'plenum' : 'open';
  const topName = pipe ? pipe.top : 'valve';
  const bottomName = pipe ? pipe.bottom : upstreamName;
  const gutterFor = (r: number): string => {
    const two = mapRows >= 7;
    if (r === 0) return topName;
    if (r === 1 && two) return 'end';
    if (r === mapRows - 1) return two ? 'end' : bottomName;
    if (r === mapRows - 2 && two) return bottomName;
    if (r === Math.floor(mapRows / 2) && mapRows >= 5) return `↕${lenMm}${lenUnit}`; // the length the axis spans, not a position on it
    return '';
  };
  const mapped = body.map((line, r) => fitLeft(gutterFor(r), g - 1) + (r === 0 || r === mapRows - 1 ? '┤' : '│') + line);

  const cc = columnOfCrank(i.crank, i.from, i.span, cols);
  const marker = new Array<string>(cols).fill(' ');
  if (cc >= 0) marker[cc] = '▼';
  const markerLine = ' '.repeat(g) + marker.join('');
  const axis = crankAxis(cycleMarks(i.events), { width: w, gutter: g, from: i.from, span: i.span, cursor: i.crank });

  const name = (pipe?.name ?? 'runner').replace(/-(\d+)$/, ' $1');
  const which = pipe && pipe.count > 1 ? ` · pipe ${pipe.index + 1}/${pipe.count} (↑↓)` : '';
  const title = firstFit(
    [
      `Pressure along the ${name}, ${topName} end at the top, ${bottomName} end at the bottom (${lenMm} ${lenUnit})${which}`,
      `Pressure along the ${name}: ${topName} end top, ${bottomName} end bottom${which}`,
      `Pressure along the ${name}${which}`,
      `Pressure along the ${name}`,
    ],
    w,
  );
  const nx = map.x.length;
  // the valve end of the runner reads the valve trace (the map's end point is the pipe's last node)
  const valveOnTop = topName === 'valve' && (!pipe || pipe.name === 'runner') && i.valvePressure !== undefined;
  const atTop = (valveOnTop ? (i.valvePressure![i.crank] ?? Number.NaN) : sample(map, i.crank, nx - 1)) - map.ambient;
  const atBottom = sample(map, i.crank, 0) - map.ambient;
  const trip = i.roundTripDeg !== undefined && Number.isFinite(i.roundTripDeg) ? `${Math.round(i.roundTripDeg)}°` : '—';
  const tripText = name === 'runner' ? [` · wave round trip ${trip} at ${Math.round(i.rpm)} rpm`, ` · round trip ${trip}`, `, trip ${trip}`] : ['', '', ''];
  const readout = firstFit(
    [
      `At ${i.crank}°: ${topName} end ${u.signed('gauge', atTop)} ${G}, ${bottomName} end ${u.signed('gauge', atBottom)} ${G} vs ambient${tripText[0]}`,
      `At ${i.crank}°: ${topName} end ${u.signed('gauge', atTop)} ${G}, ${bottomName} end ${u.signed('gauge', atBottom)} ${G}${tripText[1]}`,
      `${i.crank}°: ${topName} ${u.signed('gauge', atTop)} ${G}, ${bottomName} ${u.signed('gauge', atBottom)} ${G}${tripText[2]}`,
    ],
    w,
  );
  const legend = fit(mapLegend(step, w, u), w);
  return padLines([title, markerLine, ...mapped, ...axis, legend, readout], i.rows, w);
}
