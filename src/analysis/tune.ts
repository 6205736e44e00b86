/**
 * Design search over a speed band — the pure part.
 *
 * A tune varies one or two case values over a grid (each design is one
 * combination), sweeps every design over the same speeds and ranks the
 * designs by their band-mean ηv (sweep.ts: bandMean — the area under the
 * curve over the band divided by the band width). A band average, not a
 * peak, is the figure of merit: a design that peaks high at one speed often
 * gives it back at the next.
 *
 * Values are carried as given (SI numbers for the JSON, and the text used to
 * apply them to the case).
 */
import { summariseSweep, type SweepPoint } from './sweep.js';

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

/** All combinations of the axes, the first axis varying slowest. */
export function designGrid(axes: readonly VaryAxis[]): DesignPoint[] {
  let out: DesignPoint[] = [{ values: {}, sets: [], index: [] }];
  for (const axis of axes) {
    const next: DesignPoint[] = [];
    for (const d of out) {
      axis.values.forEach((v, i) => {
        next.push({
          values: { ...d.values, [axis.path]: v },
          sets: [...d.sets, `${axis.path}=${axis.setValues[i] ?? String(v)}`],
          index: [...d.index, i],
        });
      });
    }
    out = next;
  }
  return axes.length === 0 ? [] : out;
}

export interface RankedDesign {
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
  unconverged: number;
  points: SweepPoint[];
}

/**
 * Rank designs by band-mean ηv, best first (ties keep grid order). `points`
 * holds each design's sweep, in the order of `designs`.
 */
export function rankDesigns(
  designs: readonly DesignPoint[],
  points: readonly (readonly SweepPoint[])[],
  band: { from: number; to: number },
): RankedDesign[] {
  const rows = designs.map((d, i) => {
    const pts = [...(points[i] ?? [])];
    const s = summariseSweep(pts, band);
    return {
      values: d.values,
      meanVolumetricEfficiency: s.band.meanVolumetricEfficiency,
      peakRpm: s.bestRpm,
      peakVolumetricEfficiency: s.bestVolumetricEfficiency,
      rank: 0,
      index: d.index,
      unconverged: s.unconverged,
      points: pts,
      order: i,
    };
  });
  rows.sort((a, b) => b.meanVolumetricEfficiency - a.meanVolumetricEfficiency || a.order - b.order);
  return rows.map(({ order: _order, ...r }, k) => ({ ...r, rank: k + 1 }));
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
