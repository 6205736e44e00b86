/**
 * Band mean (area under the curve over the band / band width, trapezoid rule)
 * and the design ranking built on it. The trapezoid rule is exact for data
 * linear in speed, so a linear curve has a known mean: its value at mid-band.
 */
import { describe, expect, it } from 'vitest';
import { bandMean, chunkSpeeds, interpolate, summariseSweep, type SweepPoint } from '../../src/analysis/sweep.js';
import { designGrid, rankDesigns, shadeIndex, shadeRanges, HEAT_SHADES } from '../../src/analysis/tune.js';

const line = (a: number, b: number, xs: number[]) => xs.map((x) => ({ x, y: a + b * x }));
const speeds = (from: number, to: number, step: number) => Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step);

describe('bandMean', () => {
  it.each([
    // a, b, band lo, hi
    [0.8, 0, 4000, 8000],
    [0.5, 5e-5, 4000, 8000],
    [1.2, -4e-5, 3000, 9000],
    [0.9, 2e-5, 4100, 7900], // band ends between grid points: interpolated
    [0.9, 2e-5, 5123, 5377],
  ])('is exact for a linear curve y = %d + %d·N over %d–%d', (a, b, lo, hi) => {
    const curve = line(a, b, speeds(3000, 9000, 250));
    expect(bandMean(curve, lo, hi)).toBeCloseTo(a + (b * (lo + hi)) / 2, 12);
  });

  it('weights by width (uneven spacing)', () => {
    // a step curve sampled unevenly: trapezoids by hand
    const curve = [
      { x: 0, y: 0 },
      { x: 1, y: 1 },
      { x: 3, y: 1 },
    ];
    // area 0.5 + 2 = 2.5 over width 3
    expect(bandMean(curve, 0, 3)).toBeCloseTo(2.5 / 3, 14);
  });

  it('of a triangle peak is half the peak (not the peak)', () => {
    const curve = [
      { x: 5000, y: 0 },
      { x: 6000, y: 1 },
      { x: 7000, y: 0 },
    ];
    expect(bandMean(curve, 5000, 7000)).toBeCloseTo(0.5, 14);
  });

  it('is NaN outside the swept speeds, the point value for a zero-width band', () => {
    const curve = line(1, 0, speeds(3000, 9000, 250));
    expect(bandMean(curve, 2000, 8000)).toBeNaN();
    expect(bandMean(curve, 4000, 9500)).toBeNaN();
    expect(bandMean(line(0, 1, [0, 10]), 4, 4)).toBeCloseTo(4, 14);
    expect(interpolate(line(0, 1, [0, 10]), 2.5)).toBeCloseTo(2.5, 14);
  });
});

describe('chunks', () => {
  it('are fixed by position, not by the number of workers', () => {
    const c = chunkSpeeds(speeds(3000, 5250, 250), 4);
    expect(c).toEqual([
      [3000, 3250, 3500, 3750],
      [4000, 4250, 4500, 4750],
      [5000, 5250],
    ]);
  });
});

function fakePoints(eta: (rpm: number) => number, rpms: number[]): SweepPoint[] {
  return rpms.map((rpm) => ({ rpm, volumetricEfficiency: eta(rpm), converged: true }) as SweepPoint);
}

describe('summary and ranking', () => {
  it('best speed is the highest point', () => {
    const pts = fakePoints((n) => 1 - ((n - 6500) / 5000) ** 2, speeds(3000, 9000, 250));
    const s = summariseSweep(pts, { from: 5000, to: 8000 });
    expect(s.bestRpm).toBe(6500);
    expect(s.band.from).toBe(5000);
    expect(s.unconverged).toBe(0);
  });

  it('ranks by band mean, best first, not by peak', () => {
    const rpms = speeds(3000, 9000, 250);
    // design A: a tall narrow peak; design B: lower but broad over the band
    const a = fakePoints((n) => (Math.abs(n - 6000) < 300 ? 1.3 : 0.8), rpms);
    const b = fakePoints(() => 1.0, rpms);
    const grid = designGrid([{ path: 'runner.length', values: [0.3, 0.4], setValues: ['300 mm', '400 mm'] }]);
    const ranked = rankDesigns(grid, [a, b], { from: 5000, to: 8000 });
    expect(ranked[0]!.values).toEqual({ 'runner.length': 0.4 });
    expect(ranked[0]!.rank).toBe(1);
    expect(ranked[1]!.peakVolumetricEfficiency).toBeCloseTo(1.3, 12);
    expect(ranked[0]!.meanVolumetricEfficiency).toBeGreaterThan(ranked[1]!.meanVolumetricEfficiency);
  });

  it('designGrid makes every combination, the first axis slowest', () => {
    const g = designGrid([
      { path: 'a', values: [1, 2], setValues: ['1', '2'] },
      { path: 'b', values: [10, 20, 30], setValues: ['10 mm', '20 mm', '30 mm'] },
    ]);
    expect(g).toHaveLength(6);
    expect(g[0]!.sets).toEqual(['a=1', 'b=10 mm']);
    expect(g[5]!.values).toEqual({ a: 2, b: 30 });
    expect(g[4]!.index).toEqual([1, 1]);
  });

  it('shades cover the scale end to end', () => {
    const scale = { shades: HEAT_SHADES, lo: 0.8, hi: 1.2 };
    expect(shadeIndex(0.8, scale)).toBe(0);
    expect(shadeIndex(1.2, scale)).toBe(HEAT_SHADES.length - 1);
    expect(shadeIndex(1.0, scale)).toBe(Math.floor(HEAT_SHADES.length / 2));
    const r = shadeRanges(scale);
    expect(r[0]!.from).toBeCloseTo(0.8, 12);
    expect(r[r.length - 1]!.to).toBeCloseTo(1.2, 12);
  });
});

import { winnerAt, winningSpans } from '../../src/analysis/compare.js';

describe('compare: where each design wins', () => {
  it('groups consecutive speeds with the same winner', () => {
    const rpms = [3000, 4000, 5000, 6000, 7000, 8000];
    const a = [0.9, 0.95, 1.0, 1.0, 0.9, 0.85];
    const b = [0.85, 0.9, 1.0005, 1.05, 1.0, 0.8];
    const spans = winningSpans(rpms, a, b);
    expect(spans.map((s) => [s.winner, s.from, s.to])).toEqual([
      ['A', 3000, 4000],
      ['even', 5000, 5000],
      ['B', 6000, 7000],
      ['A', 8000, 8000],
    ]);
    expect(spans[2]!.largestDifference).toBeCloseTo(0.1, 12);
  });
  it.each([
    [1, 1.002, 'B'],
    [1, 0.998, 'A'],
    [1, 1.0009, 'even'],
    [1, Number.NaN, 'even'],
  ] as const)('a %d, b %d → %s', (a, b, w) => {
    expect(winnerAt(a, b)).toBe(w);
  });
});
