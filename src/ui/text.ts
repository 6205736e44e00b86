/**
 * Small text helpers for the terminal view: number formats in the units the
 * view shows, fitting text into a fixed width, word wrapping. Pure.
 */

/** Pa → "101.3" (kPa, one decimal). */
export function kpa(pa: number, decimals = 1): string {
  return Number.isFinite(pa) ? (pa / 1000).toFixed(decimals) : '—';
}

/** Pa difference → "+3.2" / "−1.5" (kPa, sign always shown). */
export function kpaSigned(dpa: number, decimals = 1): string {
  if (!Number.isFinite(dpa)) return '—';
  const v = dpa / 1000;
  const s = Math.abs(v).toFixed(decimals);
  if (Number(s) === 0) return `±${s}`;
  return (v > 0 ? '+' : '−') + s;
}

/** kg/s → "12.3" g/s with a sign for reverse flow. */
export function gps(kgps: number, decimals = 1): string {
  if (!Number.isFinite(kgps)) return '—';
  const v = kgps * 1000;
  const s = Math.abs(v).toFixed(decimals);
  if (Number(s) === 0) return s;
  return (v < 0 ? '−' : '') + s;
}

/** kg → "412.3" mg. */
export function mg(kg: number, decimals = 1): string {
  return Number.isFinite(kg) ? (kg * 1e6).toFixed(decimals) : '—';
}

/** m → "6.20" mm. */
export function mm(m: number, decimals = 2): string {
  return Number.isFinite(m) ? (m * 1000).toFixed(decimals) : '—';
}

/** A fraction → "97.3 %". */
export function pct(f: number, decimals = 1): string {
  return Number.isFinite(f) ? `${(f * 100).toFixed(decimals)} %` : '—';
}

/** Exactly `w` columns: cut with an ellipsis or padded with spaces. */
export function fit(text: string, w: number): string {
  if (w <= 0) return '';
  if (text.length <= w) return text + ' '.repeat(w - text.length);
  if (w === 1) return '…';
  return text.slice(0, w - 1) + '…';
}

/** Join parts with a separator, leaving out parts from the end until it fits. */
export function joinFit(parts: readonly string[], w: number, sep = '  '): string {
  const kept = [...parts];
  while (kept.length > 1 && kept.join(sep).length > w) kept.pop();
  return fit(kept.join(sep), w);
}

/** The first of several alternatives (longest first) that fits in `w`. */
export function firstFit(options: readonly string[], w: number): string {
  for (const o of options) if (o.length <= w) return fit(o, w);
  return fit(options[options.length - 1] ?? '', w);
}

/** Word-wrap into at most `maxLines` lines of exactly `w` columns (the last marked "…" when cut). */
export function wrapWords(text: string, w: number, maxLines: number): string[] {
  if (w <= 0 || maxLines <= 0) return [];
  const lines: string[] = [];
  let cur = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    const piece = word.length > w ? word.slice(0, w) : word;
    if (!cur) cur = piece;
    else if (cur.length + 1 + piece.length <= w) cur += ` ${piece}`;
    else {
      lines.push(cur);
      cur = piece;
    }
  }
  if (cur) lines.push(cur);
  if (lines.length > maxLines) {
    const kept = lines.slice(0, maxLines);
    const last = kept[maxLines - 1] as string;
    kept[maxLines - 1] = last.length + 2 <= w ? `${last} …` : `${last.slice(0, Math.max(0, w - 1))}…`;
    return kept.map((l) => fit(l, w));
  }
  return lines.map((l) => fit(l, w));
}

/** Strip ANSI escape sequences (for width checks). */
export function stripAnsi(s: string): string {
  // eslint-disable-next-line no-control-regex
  return s.replace(/\u001b\[[0-9;?]*[ -/]*[@-~]/g, '').replace(/\u001b\][^\u0007]*\u0007/g, '');
}

/** ηv as the text commands show it: a percentage with one decimal, "109.4 %" */
export function etaPct(v: number): string {
  return Number.isFinite(v) ? `${(v * 100).toFixed(1)} %` : '…';
}

/** a change of ηv in percentage points, "+3.9 points" (not a relative per cent); the difference of the two values as etaPct shows them */
export function etaPoints(now: number, before: number): string {
  const d = (Math.round(now * 1000) - Math.round(before * 1000)) / 10;
  return `${d >= 0 ? '+' : '−'}${Math.abs(d).toFixed(1)} points`;
}
