/**
 * Comparing two designs' curves over the same speeds — pure.
 *
 * difference d(N) = ηv_B(N) − ηv_A(N) [-]; a speed counts as even when
 * |d| ≤ tolerance (default 0.001, i.e. 0.1 percentage point: well inside
 * what the model can tell apart). Consecutive speeds with the same winner
 * form one span.
 */

export type Winner = 'A' | 'B' | 'even';

export interface WinSpan {
  winner: Winner;
  /** first and last speed of the span [rpm] */
  from: number;
  to: number;
  /** largest |difference| inside the span [-] */
  largestDifference: number;
}

export function winnerAt(a: number, b: number, tolerance = 0.001): Winner {
  const d = b - a;
  if (!(Math.abs(d) > tolerance)) return 'even';
  return d > 0 ? 'B' : 'A';
}

/** Spans of consecutive speeds where the same design wins. */
export function winningSpans(rpms: readonly number[], a: readonly number[], b: readonly number[], tolerance = 0.001): WinSpan[] {
  const out: WinSpan[] = [];
  for (let i = 0; i < rpms.length; i++) {
    const ai = a[i] ?? Number.NaN;
    const bi = b[i] ?? Number.NaN;
    const w = winnerAt(ai, bi, tolerance);
    const d = Math.abs(bi - ai);
    const last = out[out.length - 1];
    if (last && last.winner === w) {
      last.to = rpms[i]!;
      last.largestDifference = Math.max(last.largestDifference, d);
    } else out.push({ winner: w, from: rpms[i]!, to: rpms[i]!, largestDifference: d });
  }
  return out;
}
