/**
 * Design search over a speed band — the pure part.
 *
 * A tune varies up to four case values over a grid (each design is one
 * combination; the grid is never built whole: see designAt and shard.ts), sweeps every design over the same speeds and ranks the
 * designs by their band-mean ηv (sweep.ts: bandMean — the area under the
 * curve over the band divided by the band width). A band average, not a
 * peak, is the figure of merit: a design that peaks high at one speed often
 * gives it back at the next.
 *
 * Values are carried as given (SI numbers for the JSON, and the text used to
 * apply them to the case).
 */
import { gridPosition, gridSize } from './shard.js';
import { bandMean, type SweepPoint } from './sweep.js';

export interface VaryAxis {
  /** case path, e.g. "runner.length" */
  path: string;
  /** the values in SI (model) units, one per grid step */
  values: readonly number[];
  /** the same values as --set text, e.g. "250 mm" */
  setValues: readonly string[];
}

export interface DesignPoint {
  /** path → SI value */
  values: Record<string, number>;
  /** "path=value" overrides that make this design */
  sets: string[];
  /** position in the grid, one index per axis */
  index: number[];
}

/**
 * Design number `i` of the grid over `axes` (grid order: the first axis
 * varies slowest; see shard.ts for the arithmetic). Nothing else is built.
 */
export function designAt(axes: readonly VaryAxis[], i: number): DesignPoint {
  const index = gridPosition(
    axes.map((a) => a.values.length),
    i,
  );
  const values: Record<string, number> = {};
  const sets: string[] = [];
  axes.forEach((axis, k) => {
    const j = index[k]!;
    const v = axis.values[j]!;
    values[axis.path] = v;
    sets.push(`${axis.path}=${axis.setValues[j] ?? String(v)}`);
  });
  return { values, sets, index };
}

/** All combinations of the axes, the first axis varying slowest (small grids only: see designAt). */
export function designGrid(axes: readonly VaryAxis[]): DesignPoint[] {
  const total = gridSize(axes.map((a) => a.values.length));
  return Array.from({ length: total }, (_, i) => designAt(axes, i));
}

/** What ranking reads of a simulated speed. */
export interface RankPoint {
  rpm: number;
  volumetricEfficiency: number;
  converged: boolean;
}

export interface RankedDesign<P extends RankPoint = SweepPoint> {
  values: Record<string, number>;
  /** band-mean ηv [-] */
  meanVolumetricEfficiency: number;
  /** speed of this design's highest simulated ηv [rpm] */
  peakRpm: number;
  peakVolumetricEfficiency: number;
  /** 1 = best */
  rank: number;
  /** position in the grid, one index per axis */
  index: number[];
  /** position in the list of designs that was ranked */
  order: number;
  unconverged: number;
  points: P[];
}

/**
 * Rank designs by band-mean ηv, best first (ties keep the given order).
 * `points` holds each design's sweep, in the order of `designs`. The band
 * mean is sweep.ts's bandMean over the design's curve (so a tune figure
 * equals the sweep figure of the same design), the peak the first highest
 * point.
 */
export function rankDesigns<P extends RankPoint>(
  designs: readonly Pick<DesignPoint, 'values' | 'index'>[],
  points: readonly (readonly P[])[],
  band: { from: number; to: number },
): RankedDesign<P>[] {
  const rows = designs.map((d, i) => {
    const pts = [...(points[i] ?? [])];
    let best: P | undefined;
    for (const p of pts) if (best === undefined || p.volumetricEfficiency > best.volumetricEfficiency) best = p;
    return {
      values: d.values,
      meanVolumetricEfficiency: bandMean(
        pts.map((p) => ({ x: p.rpm, y: p.volumetricEfficiency })),
        band.from,
        band.to,
      ),
      peakRpm: best?.rpm ?? Number.NaN,
      peakVolumetricEfficiency: best?.volumetricEfficiency ?? Number.NaN,
      rank: 0,
      index: d.index,
      order: i,
      unconverged: pts.filter((p) => !p.converged).length,
      points: pts,
    };
  });
  const key = (v: number): number => (Number.isNaN(v) ? Number.NEGATIVE_INFINITY : v);
  rows.sort((a, b) => key(b.meanVolumetricEfficiency) - key(a.meanVolumetricEfficiency) || a.order - b.order);
  return rows.map((r, k) => ({ ...r, rank: k + 1 }));
}

/**
 * The paths whose best value lies at an end of its range (a grid axis of
 * more than one value whose best position is its first or last): the best
 * design may lie beyond the range. `position` is the best design's value
 * position per axis (grid) or its value itself compared with the range
 * ends (search: pass `atEnd` per axis).
 */
export function edgePaths(axes: readonly { path: string; size: number }[], atEnd: (k: number) => boolean): string[] {
  return axes.flatMap((a, k) => (a.size > 1 && atEnd(k) ? [a.path] : []));
}

export interface ShadeScale {
  /** characters from lowest to highest */
  shades: string;
  lo: number;
  hi: number;
}

/** The heat-map shades, lowest to highest: readable without colour. */
export const HEAT_SHADES = '.:-=+*#%@';

/** Which shade a value gets on the scale (0 … shades.length − 1). */
export function shadeIndex(value: number, scale: ShadeScale): number {
  const n = scale.shades.length;
  if (!Number.isFinite(value)) return -1;
  if (!(scale.hi > scale.lo)) return n - 1;
  const f = (value - scale.lo) / (scale.hi - scale.lo);
  return Math.max(0, Math.min(n - 1, Math.floor(f * n)));
}

/** The value range each shade stands for: [from, to) of shade k. */
export function shadeRanges(scale: ShadeScale): { shade: string; from: number; to: number }[] {
  const n = scale.shades.length;
  const w = (scale.hi - scale.lo) / n;
  return [...scale.shades].map((shade, k) => ({ shade, from: scale.lo + k * w, to: scale.lo + (k + 1) * w }));
}
