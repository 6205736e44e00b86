/**
 * The runner view as text lines: the space–time map of pressure along the
 * runner (valve end at the top, open end at the bottom) against crank angle,
 * the cursor marked above and below the map, the shade legend, and the
 * values at the cursor. Pure.
 */
import { columnOfCrank, crankAxis, cycleMarks, fitLeft } from './chart.js';
import { mapLegend, mapLines, shadeStep, type MapInput } from './space-time.js';
import { firstFit, fit, kpaSigned } from './text.js';
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
}

export const RUNNER_GUTTER = 8;

/** The pressure [Pa] at node `n` at crank angle `crank`. */
function sample(map: MapInput, crank: number, n: number): number {
  return map.pressure[crank * map.x.length + n] ?? Number.NaN;
}

export function runnerScreen(i: RunnerScreenInput): string[] {
  const w = i.width;
  const g = RUNNER_GUTTER;
  const cols = Math.max(1, w - g);
  const fixed = 1 /* title */ + 1 /* marker */ + 2 /* axis */ + 1 /* legend */ + 1; /* readout */
  const mapRows = Math.max(3, i.rows - fixed);
  const step = shadeStep(i.map);
  const body = mapLines(i.map, { from: i.from, span: i.span, cols, rows: mapRows }, step);
  const lenMm = Math.round(i.runnerLength * 1000);
  const upstreamName = i.upstream === 'plenum' ? 'plenum' : 'open';
  const gutterFor = (r: number): string => {
    const two = mapRows >= 7;
    if (r === 0) return 'valve';
    if (r === 1 && two) return 'end';
    if (r === mapRows - 1) return two ? 'end' : upstreamName;
    if (r === mapRows - 2 && two) return upstreamName;
    if (r === Math.floor(mapRows / 2) && mapRows >= 5) return `↕${lenMm}mm`; // the length the axis spans, not a position on it
    return '';
  };
  const mapped = body.map((line, r) => fitLeft(gutterFor(r), g - 1) + (r === 0 || r === mapRows - 1 ? '┤' : '│') + line);

  const cc = columnOfCrank(i.crank, i.from, i.span, cols);
  const marker = new Array<string>(cols).fill(' ');
  if (cc >= 0) marker[cc] = '▼';
  const markerLine = ' '.repeat(g) + marker.join('');
  const axis = crankAxis(cycleMarks(i.events), { width: w, gutter: g, from: i.from, span: i.span, cursor: i.crank });

  const title = firstFit(
    [
      `Pressure along the runner, valve end at the top, ${i.upstream === 'plenum' ? 'plenum' : 'open'} end at the bottom (${lenMm} mm)`,
      `Pressure along the runner: valve end top, ${upstreamName} end bottom`,
      'Pressure along the runner',
    ],
    w,
  );
  const nx = i.map.x.length;
  const atValve = sample(i.map, i.crank, nx - 1) - i.map.ambient;
  const atOpen = sample(i.map, i.crank, 0) - i.map.ambient;
  const trip = i.roundTripDeg !== undefined && Number.isFinite(i.roundTripDeg) ? `${Math.round(i.roundTripDeg)}°` : '—';
  const readout = firstFit(
    [
      `At ${i.crank}°: valve end ${kpaSigned(atValve)} kPa, ${upstreamName} end ${kpaSigned(atOpen)} kPa vs ambient · wave round trip ${trip} at ${Math.round(i.rpm)} rpm`,
      `At ${i.crank}°: valve end ${kpaSigned(atValve)} kPa, ${upstreamName} end ${kpaSigned(atOpen)} kPa · round trip ${trip}`,
      `${i.crank}°: valve ${kpaSigned(atValve)} kPa, ${upstreamName} ${kpaSigned(atOpen)} kPa, trip ${trip}`,
    ],
    w,
  );
  const legend = fit(mapLegend(step, w), w);
  return padLines([title, markerLine, ...mapped, ...axis, legend, readout], i.rows, w);
}
