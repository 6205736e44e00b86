/**
 * Design search without a grid: walk towards the best band-mean ηv with the
 * Nelder–Mead downhill simplex (nelder-mead.ts, from the fmin package), so a
 * good design is found with a fraction of the simulations a grid needs.
 *
 * The variables. Each continuous axis (a --vary path=FROM:TO:STEP) is searched
 * over [FROM, TO] as a continuous value, in the unit it was typed in. Inside
 * the search it is counted in STEPs from FROM: x ∈ [0, m], m = (TO − FROM)/STEP.
 * Values are resolved to a tenth of STEP (RESOLUTION) — a shop cannot cut
 * finer than that anyway, and a design met twice is simulated once. Whole-
 * number axes (valve counts) are not searched: every combination of their
 * grid values gets a search of its own over the continuous axes, with an
 * equal share of the budget.
 *
 * The method, per combination:
 *  - start at the middle of every range, first simplex one quarter of each
 *    range (at least one STEP) along each axis;
 *  - the simplex minimises f = −(band mean ηv)/1e-4, i.e. it maximises the
 *    band mean counted in hundredths of a point; a point outside the ranges
 *    is evaluated at the nearest point inside (clamped), plus a penalty that
 *    grows with the distance outside, so the walk comes back in but can sit
 *    on a boundary when the best design is there;
 *  - fmin's release cannot shrink the simplex (see nelder-mead.ts): where it
 *    would, the walk stops; it is then restarted from its best point with a
 *    simplex half the size, until the simplex is below half a STEP;
 *  - it ends there, or when its share of the budget (the most designs to
 *    simulate) is spent; the best design simulated is the answer.
 *
 * Nelder–Mead finds a local best. Over a speed band the band mean changes
 * smoothly with runner length and cam timing, usually with one hump inside a
 * sensible range; a range that spans two wave orders can hold two, and the
 * walk may settle on either. The grid (`tune` without --search) is the
 * check when in doubt.
 *
 * The search is deterministic: the same case, ranges and budget give the same
 * walk. It is written as ask/tell: `next()` says which design to simulate
 * (or that it is done), `tell()` gives back its band mean. fmin wants a plain
 * synchronous function, so `next()` replays the method from the start over
 * the results known so far and stops at the first design not yet simulated;
 * with a few hundred designs at most, the replays cost nothing next to one
 * simulation.
 */
import { nelderMead } from './nelder-mead.js';

export interface SearchAxis {
  path: string;
  /** range and step in the unit typed */
  from: number;
  to: number;
  step: number;
  /** whole numbers only (valve counts): kept on its grid values */
  discrete: boolean;
  /** the grid values (used for discrete axes) */
  values: readonly number[];
}

/** values are resolved to this fraction of STEP */
export const RESOLUTION = 0.1;
/** objective units: a hundredth of a point of ηv */
const F_UNIT = 1e-4;
/** penalty per (distance outside the range / simplex size)² [objective units] */
const PENALTY = 1e4;

export interface SearchEvaluation {
  /** values in the unit typed, one per axis (axis order) */
  values: number[];
  /** band-mean ηv [-] (NaN when it could not be formed) */
  score: number;
}

export type SearchRequest = { kind: 'evaluate'; values: number[] } | { kind: 'done'; reason: string };

class Need {
  constructor(readonly values: number[]) {}
}
class Spent {}

function clean(x: number): number {
  return Number(x.toPrecision(12));
}

/** every combination of the discrete axes' values (first axis slowest); [[]] when none */
function combinations(lists: readonly (readonly number[])[]): number[][] {
  let out: number[][] = [[]];
  for (const l of lists) out = out.flatMap((c) => l.map((v) => [...c, v]));
  return out;
}

export class DesignSearch {
  private readonly scores = new Map<string, number>();
  private readonly order: SearchEvaluation[] = [];
  private readonly continuous: number[];
  private readonly discrete: number[];
  private readonly combos: number[][];

  constructor(
    readonly axes: readonly SearchAxis[],
    /** the most designs to simulate, in all */
    readonly budget: number,
  ) {
    this.continuous = axes.flatMap((a, k) => (!a.discrete && a.to > a.from ? [k] : []));
    this.discrete = axes.flatMap((a, k) => (a.discrete || !(a.to > a.from) ? [k] : []));
    this.combos = combinations(this.discrete.map((k) => (axes[k]!.discrete ? axes[k]!.values : [axes[k]!.from])));
  }

  /** designs per combination of whole-number values */
  get share(): number {
    return Math.max(1, Math.floor(this.budget / this.combos.length));
  }

  /** the combinations of whole-number values, each searched on its own */
  get combinationCount(): number {
    return this.combos.length;
  }

  /** What to simulate next, or that the search is over. */
  next(): SearchRequest {
    let spent = false;
    for (const combo of this.combos) {
      try {
        this.walk(combo);
      } catch (e) {
        if (e instanceof Need) return { kind: 'evaluate', values: e.values };
        if (e instanceof Spent) {
          spent = true;
          continue;
        }
        throw e;
      }
    }
    return { kind: 'done', reason: spent ? 'budget spent' : 'simplex smaller than half a step' };
  }

  /** The band mean of a design `next()` asked for. */
  tell(values: readonly number[], score: number): void {
    const key = values.join(',');
    if (this.scores.has(key)) return;
    this.scores.set(key, score);
    this.order.push({ values: [...values], score });
  }

  /** every design simulated, in the order simulated */
  get evaluations(): readonly SearchEvaluation[] {
    return this.order;
  }

  /** the best design simulated so far (the first of equals) */
  best(): SearchEvaluation | undefined {
    let b: SearchEvaluation | undefined;
    for (const e of this.order) if (Number.isFinite(e.score) && (b === undefined || e.score > b.score)) b = e;
    return b;
  }

  private used(combo: readonly number[]): number {
    let n = 0;
    for (const e of this.order) if (this.discrete.every((k, j) => e.values[k] === combo[j])) n++;
    return n;
  }

  /** the values of a design: the combination's whole numbers and x (in steps) on the continuous axes */
  private design(combo: readonly number[], x: readonly number[]): number[] {
    const v = new Array<number>(this.axes.length);
    this.discrete.forEach((k, j) => (v[k] = combo[j]!));
    this.continuous.forEach((k, j) => {
      const a = this.axes[k]!;
      v[k] = clean(a.from + x[j]! * a.step);
    });
    return v;
  }

  private score(combo: readonly number[], x: readonly number[]): number {
    const values = this.design(combo, x);
    const s = this.scores.get(values.join(','));
    if (s !== undefined) return s;
    if (this.used(combo) >= this.share) throw new Spent();
    throw new Need(values);
  }

  /** one combination's walk, replayed over what is known (throws Need or Spent) */
  private walk(combo: readonly number[]): void {
    const axes = this.continuous.map((k) => this.axes[k]!);
    if (axes.length === 0) {
      this.score(combo, []);
      return;
    }
    const span = axes.map((a) => (a.to - a.from) / a.step);
    const snap = (x: number, j: number): number => {
      const inside = Math.min(span[j]!, Math.max(0, x));
      const r = Math.round(inside / RESOLUTION) * RESOLUTION;
      return Math.min(span[j]!, Math.max(0, Number(r.toFixed(6))));
    };
    let start = span.map((m, j) => snap(m / 2, j));
    let h = span.map((m) => Math.max(1, m / 4));
    const ones = axes.map(() => 1);
    for (let round = 0; round < 12 && h.some((s) => s >= 0.5); round++) {
      const from = start;
      const size = h;
      const toX = (y: readonly number[]): number[] => y.map((yj, j) => from[j]! + (yj - 1) * size[j]!);
      const f = (y: readonly number[]): number => {
        const raw = toX(y);
        const x = raw.map((v, j) => snap(v, j));
        let outside = 0;
        raw.forEach((v, j) => {
          const d = (v < 0 ? -v : v > span[j]! ? v - span[j]! : 0) / size[j]!;
          outside += d * d;
        });
        const s = this.score(combo, x);
        const value = Number.isFinite(s) ? -s / F_UNIT : 1e12;
        return value + PENALTY * outside;
      };
      const r = nelderMead(f, ones, { maxIterations: 200 * axes.length, tolerance: 0.5, nonZeroDelta: 2 });
      start = toX(r.x).map((v, j) => snap(v, j));
      h = h.map((s) => s / 2);
    }
  }
}
