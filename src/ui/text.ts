/**
 * Text helpers of the terminal view: the shared presentation layer
 * (src/present). Quantities with a unit go through a `Units` formatter so the
 * `u` key switches every screen between metric and imperial.
 */
import { fixed, percent, points } from '../present/number.js';

export { fit, joinFit, firstFit, wrapWords, stripAnsi } from '../present/text.js';

/** ηv as the text commands show it: a percentage with one decimal, "109.4 %" */
export function etaPct(v: number): string {
  return Number.isFinite(v) ? percent(v, 1) : '…';
}

/** a change of ηv in percentage points, "+3.9 points" (not a relative per cent); the difference of the two values as etaPct shows them */
export function etaPoints(now: number, before: number): string {
  return points(now, before, 1);
}

/** A fraction → "97.3 %". */
export function pct(f: number, decimals = 1): string {
  return Number.isFinite(f) ? `${fixed(f * 100, decimals)} %` : '—';
}
