/**
 * Laying out text: fitting into a fixed width, word wrapping, two-column rows
 * and plain tables. Used by the text commands and the terminal view alike.
 * Pure.
 */
import { fixed } from './number.js';

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

/** "30° BTDC" / "5° ATDC" from a card value that may be negative */
export function card(value: number, positive: string, negative: string, d = 0): string {
  const v = Number(fixed(Math.abs(value), d)) * Math.sign(value);
  return v < 0 ? `${fixed(-v, d)}° ${negative}` : `${fixed(v, d)}° ${positive}`;
}

/** two columns: label padded to `width` (at least two spaces between) */
export function row(label: string, value: string, width = 26): string {
  return `  ${label.padEnd(width)}${label.length >= width - 1 ? '  ' : ''}${value}\n`;
}

/** wrap text at word boundaries to `width` columns; later lines indented by `indent` */
export function wrap(text: string, width = 78, indent = '    '): string {
  const words = text.split(/\s+/).filter((w) => w !== '');
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    const limit = lines.length === 0 ? width : width - indent.length;
    if (cur !== '' && cur.length + 1 + w.length > limit) {
      lines.push(cur);
      cur = w;
    } else cur = cur === '' ? w : `${cur} ${w}`;
  }
  if (cur !== '') lines.push(cur);
  return lines.map((l, i) => (i === 0 ? l : indent + l)).join('\n') + '\n';
}

/**
 * A plain table of string cells, right-aligned except the first column. The
 * header may be one row, or several (`[words, units]`) so that the columns
 * can be spelt out without widening the table.
 */
export function table(header: readonly string[] | readonly (readonly string[])[], rows: readonly (readonly string[])[]): string {
  const heads: readonly (readonly string[])[] = typeof header[0] === 'string' || header.length === 0 ? [header as readonly string[]] : (header as readonly (readonly string[])[]);
  const n = Math.max(...heads.map((h) => h.length));
  const widths = Array.from({ length: n }, (_, j) => Math.max(...heads.map((h) => (h[j] ?? '').length), ...rows.map((r) => (r[j] ?? '').length)));
  const line = (cells: readonly string[]) =>
    ('  ' + widths.map((wd, j) => (j === 0 ? (cells[j] ?? '').padEnd(wd) : (cells[j] ?? '').padStart(wd))).join('  ')).trimEnd() + '\n';
  return heads.map(line).join('') + rows.map(line).join('');
}
