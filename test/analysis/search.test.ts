/**
 * The design search (src/analysis/search.ts) and the Nelder–Mead wrapper
 * around the fmin package (src/analysis/nelder-mead.ts), on functions whose
 * best point is known exactly (analytic test functions, no simulation): the
 * walk must end near that point, sit on a boundary when the best lies
 * beyond the range, keep whole-number axes on their grid, keep to its budget,
 * and walk the same way every time.
 */
import { describe, expect, it } from 'vitest';
import { nelderMead } from '../../src/analysis/nelder-mead.js';
import { DesignSearch, RESOLUTION, type SearchAxis } from '../../src/analysis/search.js';

function axis(path: string, from: number, to: number, step: number, discrete = false): SearchAxis {
  const values: number[] = [];
  for (let v = from; v <= to + 1e-9; v += step) values.push(Number(v.toPrecision(12)));
  return { path, from, to, step, discrete, values };
}

/** run a search to its end against a score function */
function walk(s: DesignSearch, score: (v: readonly number[]) => number): string {
  for (let k = 0; k < 10000; k++) {
    const r = s.next();
    if (r.kind === 'done') return r.reason;
    s.tell(r.values, score(r.values));
  }
  throw new Error('the search did not end');
}

describe('the Nelder–Mead wrapper (fmin 0.0.4)', () => {
  it('loads and finds the minimum of a quadratic bowl, (3, −1), from (1, 1)', () => {
    // f = (x − 3)² + 2(y + 1)²: minimum 0 at (3, −1), exactly
    const r = nelderMead((x) => (x[0]! - 3) ** 2 + 2 * (x[1]! + 1) ** 2, [1, 1], { maxIterations: 400, tolerance: 1e-10, nonZeroDelta: 2 });
    expect(r.x[0]).toBeCloseTo(3, 4);
    expect(r.x[1]).toBeCloseTo(-1, 4);
    expect(r.fx).toBeLessThan(1e-8);
  });
  it('does not change its starting point', () => {
    const x0 = [1, 1];
    nelderMead((x) => (x[0]! - 2) ** 2 + x[1]! ** 2, x0, { maxIterations: 50, tolerance: 1e-6, nonZeroDelta: 2 });
    expect(x0).toEqual([1, 1]);
  });
});

describe('DesignSearch on a hump with a known top', () => {
  // a smooth hump, top 1.2 at runner 0.37 m (range 0.25–0.50, step 0.025) and closes 61 (range 30–80, step 5)
  const axes = [axis('runner.length', 0.25, 0.5, 0.025), axis('intake.closes', 30, 80, 5)];
  const hump = (v: readonly number[]) => 1.2 - 8 * (v[0]! - 0.37) ** 2 - 1e-4 * (v[1]! - 61) ** 2;

  it('ends within half a STEP of the top, in far fewer designs than the grid (121)', () => {
    const s = new DesignSearch(axes, 60);
    walk(s, hump);
    const best = s.best()!;
    expect(Math.abs(best.values[0]! - 0.37)).toBeLessThanOrEqual(0.5 * 0.025);
    expect(Math.abs(best.values[1]! - 61)).toBeLessThanOrEqual(0.5 * 5);
    expect(s.evaluations.length).toBeLessThanOrEqual(60);
    expect(s.evaluations.length).toBeLessThan(121 / 2);
  });

  it('stays inside the ranges, on a tenth of each STEP, and never simulates a design twice', () => {
    const s = new DesignSearch(axes, 60);
    walk(s, hump);
    const keys = new Set<string>();
    for (const e of s.evaluations) {
      axes.forEach((a, k) => {
        const v = e.values[k]!;
        expect(v).toBeGreaterThanOrEqual(a.from);
        expect(v).toBeLessThanOrEqual(a.to);
        const steps = (v - a.from) / a.step / RESOLUTION;
        expect(Math.abs(steps - Math.round(steps))).toBeLessThan(1e-6);
      });
      keys.add(e.values.join(','));
    }
    expect(keys.size).toBe(s.evaluations.length);
  });

  it('walks the same way every time', () => {
    const a = new DesignSearch(axes, 30);
    const b = new DesignSearch(axes, 30);
    walk(a, hump);
    walk(b, hump);
    expect(a.evaluations).toEqual(b.evaluations);
  });

  it('keeps to its budget', () => {
    const s = new DesignSearch(axes, 7);
    expect(walk(s, hump)).toBe('budget spent');
    expect(s.evaluations).toHaveLength(7);
  });
});

describe('DesignSearch at the edge of a range', () => {
  it('sits on the boundary when the best lies beyond it', () => {
    // rising all the way: the best inside [30, 80] is 80
    const s = new DesignSearch([axis('intake.closes', 30, 80, 5)], 40);
    walk(s, (v) => v[0]! / 100);
    expect(s.best()!.values).toEqual([80]);
  });
});

describe('DesignSearch with a whole-number axis', () => {
  it('searches each valve count on its own and never sets a fraction of a valve', () => {
    const axes = [axis('intake.valves', 1, 2, 1, true), axis('runner.length', 0.2, 0.4, 0.02)];
    // two valves are better, and their best runner is shorter
    const score = (v: readonly number[]) => (v[0] === 2 ? 1.1 - 20 * (v[1]! - 0.27) ** 2 : 1.0 - 20 * (v[1]! - 0.33) ** 2);
    const s = new DesignSearch(axes, 40);
    expect(s.combinationCount).toBe(2);
    expect(s.share).toBe(20);
    walk(s, score);
    for (const e of s.evaluations) expect([1, 2]).toContain(e.values[0]);
    const best = s.best()!;
    expect(best.values[0]).toBe(2);
    expect(Math.abs(best.values[1]! - 0.27)).toBeLessThanOrEqual(0.01);
    expect(s.evaluations.filter((e) => e.values[0] === 1).length).toBeLessThanOrEqual(20);
  });
});
