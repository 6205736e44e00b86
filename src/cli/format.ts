/** Number formatting for text output (SI values in, display units out). */

/** fixed decimals, or '—' for non-finite */
export function fix(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return '—';
  const s = v.toFixed(decimals);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s; // no "-0.00"
}

export const pct = (fraction: number, d = 1) => `${fix(fraction * 100, d)} %`;
export const kPa = (pa: number, d = 1) => `${fix(pa / 1000, d)} kPa`;
export const mg = (kg: number, d = 1) => `${fix(kg * 1e6, d)} mg`;
export const gps = (kgps: number, d = 1) => `${fix(kgps * 1000, d)} g/s`;
export const mm = (m: number, d = 1) => `${fix(m * 1000, d)} mm`;
export const cc = (m3: number, d = 1) => `${fix(m3 * 1e6, d)} cc`;
export const cm2 = (m2: number, d = 2) => `${fix(m2 * 1e4, d)} cm²`;
export const deg = (v: number, d = 0) => `${fix(v, d)}°`;
export const hz = (v: number, d = 1) => `${fix(v, d)} Hz`;
export const rpm = (v: number) => `${fix(v, 0)} rpm`;

/** "30° BTDC" / "5° ATDC" from a card value that may be negative */
export function card(value: number, positive: string, negative: string, d = 0): string {
  const v = Number(fix(value, d));
  return v < 0 ? `${fix(-v, d)}° ${negative}` : `${fix(v, d)}° ${positive}`;
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

/** a plain table of string cells, right-aligned except the first column */
export function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, j) => Math.max(h.length, ...rows.map((r) => (r[j] ?? '').length)));
  const line = (cells: readonly string[]) =>
    '  ' + cells.map((c, j) => (j === 0 ? c.padEnd(widths[j]!) : c.padStart(widths[j]!))).join('  ') + '\n';
  return line(header) + rows.map(line).join('');
}
