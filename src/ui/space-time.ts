/**
 * The runner's space–time map as text: pressure along the runner (rows, valve
 * end at the top, open end at the bottom) against crank angle (columns).
 * Pure functions over the samples the core computed; no React, no physics.
 *
 * Each cell shows the pressure relative to ambient on a diverging scale of
 * shade characters, so it reads without colour: blocks for pressure above
 * ambient (a compression), dots and dashes for pressure below (an expansion),
 * blank near ambient. Within a cell's crank-angle and position range the
 * sample farthest from ambient is shown, so a narrow pulse is not averaged
 * away on a coarse grid.
 */
import { fixed, MINUS } from '../present/number.js';
import { METRIC, type Units } from '../present/units.js';
import { crankBins } from './chart.js';

/** Shades for pressure above ambient, weak → strong. */
export const ABOVE = ['░', '▒', '▓', '█'] as const;
/** Shades for pressure below ambient, weak → strong. */
export const BELOW = ['·', ':', '~', '='] as const;
// (not '-': beside a negative value in the legend it read as a double minus, "- −6.0")
export const NEAR = ' ';

export interface MapInput {
  /** positions from the upstream end [m], increasing; the valve end is the last */
  x: ArrayLike<number>;
  /** row-major [θ][node] pressures [Pa], `cycle` rows of x.length values */
  pressure: ArrayLike<number>;
  /** ambient (reference) pressure [Pa] */
  ambient: number;
}

export interface MapGrid {
  /** crank window start and span [deg] */
  from: number;
  span: number;
  cols: number;
  rows: number;
}

/** 1-2-5 rounding upwards: the smallest of 1, 2, 2.5, 5 × 10^k that is ≥ v. */
export function niceStep(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  const e = Math.floor(Math.log10(v));
  const base = Math.pow(10, e);
  for (const m of [1, 2, 2.5, 5, 10]) {
    if (m * base >= v * (1 - 1e-12)) return m * base;
  }
  return 10 * base;
}

/** 1-2-5 rounding downwards: the largest of 1, 2, 2.5, 5 × 10^k that is ≤ v. */
export function niceFloor(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  const e = Math.floor(Math.log10(v));
  const base = Math.pow(10, e);
  for (const m of [5, 2.5, 2, 1]) {
    if (m * base <= v * (1 + 1e-12)) return m * base;
  }
  return base;
}

/**
 * The shade step [Pa]: a round value such that the largest deviation from
 * ambient gets the strongest shade (it is at least 3.5 steps).
 */
export function shadeStep(input: MapInput): number {
  let maxAbs = 0;
  for (let i = 0; i < input.pressure.length; i++) {
    const d = Math.abs((input.pressure[i] as number) - input.ambient);
    if (Number.isFinite(d) && d > maxAbs) maxAbs = d;
  }
  return niceFloor(maxAbs / (ABOVE.length - 0.5));
}

/** The shade character for a deviation from ambient `dp` [Pa] with step `step` [Pa]. */
export function shadeOf(dp: number, step: number): string {
  if (!Number.isFinite(dp)) return '?';
  const level = Math.min(ABOVE.length, Math.round(Math.abs(dp) / step));
  if (level === 0) return NEAR;
  return (dp > 0 ? ABOVE : BELOW)[level - 1] as string;
}

/**
 * Node indices covered by each map row, valve end first. With more rows than
 * nodes a node is repeated; with fewer, a row covers a range of nodes.
 */
export function rowNodes(nodeCount: number, rows: number): number[][] {
  const out: number[][] = [];
  if (nodeCount <= 0) return Array.from({ length: rows }, () => []);
  for (let r = 0; r < rows; r++) {
    if (rows === 1) {
      out.push(Array.from({ length: nodeCount }, (_, i) => nodeCount - 1 - i));
      continue;
    }
    if (nodeCount <= rows) {
      const node = Math.round(((nodeCount - 1) * (rows - 1 - r)) / (rows - 1));
      out.push([node]);
    } else {
      // rows split the node range evenly, valve end (highest index) first
      const hiF = nodeCount - (r * nodeCount) / rows;
      const loF = nodeCount - ((r + 1) * nodeCount) / rows;
      const nodes: number[] = [];
      for (let n = Math.ceil(hiF) - 1; n >= Math.floor(loF); n--) nodes.push(n);
      out.push(nodes.length > 0 ? nodes : [Math.max(0, Math.min(nodeCount - 1, Math.round(loF)))]);
    }
  }
  return out;
}

/**
 * The deviation from ambient [Pa] shown in each cell: per row (valve end first)
 * and column, the sample of largest magnitude in the cell.
 */
export function mapCells(input: MapInput, grid: MapGrid): number[][] {
  const nx = input.x.length;
  const bins = crankBins(grid.from, grid.span, grid.cols);
  const rowsOfNodes = rowNodes(nx, grid.rows);
  const cells: number[][] = [];
  for (const nodes of rowsOfNodes) {
    const row: number[] = [];
    for (const bin of bins) {
      let best = 0;
      let bestAbs = -1;
      for (const t of bin) {
        for (const n of nodes) {
          const p = input.pressure[t * nx + n];
          if (p === undefined) continue;
          const d = p - input.ambient;
          const a = Math.abs(d);
          if (a > bestAbs || !Number.isFinite(d)) {
            best = d;
            bestAbs = Number.isFinite(d) ? a : Infinity;
          }
        }
      }
      row.push(bestAbs < 0 ? Number.NaN : best);
    }
    cells.push(row);
  }
  return cells;
}

/** The map as text rows (valve end first), each `grid.cols` characters. */
export function mapLines(input: MapInput, grid: MapGrid, step = shadeStep(input)): string[] {
  return mapCells(input, grid).map((row) => row.map((d) => shadeOf(d, step)).join(''));
}

/**
 * A legend line for the shade scale, fitted to `width` columns. `step` is in
 * Pa; the values are shown against ambient in the gauge unit (kPa or inHg).
 */
export function mapLegend(step: number, width: number, u: Units = METRIC): string {
  const num = (v: number): string => {
    const k = u.num('gauge', v);
    const digits = Math.abs(k) >= 10 ? 0 : Math.abs(k) >= 1 ? 1 : 2;
    return fixed(Math.abs(k), digits);
  };
  const unit = u.label('gauge');
  const below = BELOW.map((ch, i) => `${ch} ${MINUS}${num((i + 1) * step)}`).reverse().join('  ');
  const above = ABOVE.map((ch, i) => `${ch} +${num((i + 1) * step)}`).join('  ');
  const long = `below ambient: ${below}  │ blank: near │  above: ${above} ${unit}`;
  if (long.length <= width) return long;
  const mid = `${below}  │ blank ±${num(step / 2)} │  ${above} ${unit}`;
  if (mid.length <= width) return mid;
  const tight = `${below.replace(/ {2}/g, ' ')} │ ${above.replace(/ {2}/g, ' ')} ${unit}`;
  if (tight.length <= width) return tight;
  const short = `${BELOW.join('')} below  ${ABOVE.join('')} above ambient, step ${num(step)} ${unit}`;
  return short.length <= width ? short : short.slice(0, Math.max(0, width));
}
