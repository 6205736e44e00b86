/**
 * Numbers as people read them, one style for every screen and text command:
 * fixed decimals, the minus sign U+2212 "−" (never a hyphen, never "-0.00"),
 * "—" for a value that is not a number. Files (CSV, JSON) do not come through
 * here: they keep plain JavaScript numbers.
 */

/** The one minus sign of the displayed text. */
export const MINUS = '−';

/** fixed decimals; "—" when not finite; "−" for negatives; never "−0.0" */
export function fixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return '—';
  const s = v.toFixed(decimals);
  if (/^-0(\.0*)?$/.test(s)) return s.slice(1);
  return s.startsWith('-') ? MINUS + s.slice(1) : s;
}

/** fixed decimals with the sign always shown: "+3.2", "−1.5", "±0.0" */
export function signedFixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return '—';
  const s = Math.abs(v).toFixed(decimals);
  if (Number(s) === 0) return `±${s}`;
  return (v > 0 ? '+' : MINUS) + s;
}

/** A displayed number back to a JavaScript number (reads "−", "±" and "+"). */
export function parseShown(text: string): number {
  return Number(text.trim().replace(/^±/, '').replace(MINUS, '-'));
}

/** a fraction as a percentage: "97.3 %" */
export function percent(fraction: number, decimals = 1): string {
  return `${fixed(fraction * 100, decimals)} %`;
}

/** a change of a fraction in percentage points: "+3.9 points" (not a relative per cent) */
export function points(now: number, before: number, decimals = 1): string {
  // the difference of the two values as they are shown (each rounded first), so the figures on screen add up
  const k = 10 ** decimals;
  const d = (Math.round(now * 100 * k) - Math.round(before * 100 * k)) / k;
  return `${signedFixed(d, decimals).replace(/^±/, '+')} points`;
}
