/**
 * Pure text charts for the terminal view: no React, no terminal, no physics.
 *
 * A chart is drawn into a fixed grid of `height` rows × `width` columns
 * (the y-label gutter included) and returned as plain strings, one per row,
 * each exactly `width` characters wide. The views colour the strings by
 * character class (see `GLYPH`); without colour the glyphs alone tell the
 * series apart, so the charts read the same under NO_COLOR.
 *
 * Crank-angle charts take a window of the 720° cycle: `from` (deg) and
 * `span` (deg). The window wraps around the cycle end, since the cycle is
 * periodic: degree 725 is degree 5 of the same converged cycle.
 */

/** The characters the charts draw with; views colour by these. */
export const GLYPH = {
  /** the current result's line */
  flat: '─',
  steep: '│',
  /** the line turning: in from the left then down / up, or out to the right after going down / up */
  downIn: '╮',
  downOut: '╰',
  upIn: '╯',
  upOut: '╭',
  /** the pinned baseline */
  baseline: '·',
  /** a second quantity drawn beside the current line (the exhaust-port pressure) */
  second: '∘',
  /** measured data beside the model (a pressure trace, a lift log, dyno points) */
  measured: '•',
  /** the horizontal reference (ambient pressure, zero flow) */
  reference: '┈',
  /** the cursor column */
  cursor: '┆',
  /** the edges of the band (sweep chart) */
  band: '╎',
} as const;

export const LINE_GLYPHS: ReadonlySet<string> = new Set([
  GLYPH.flat,
  GLYPH.steep,
  GLYPH.downIn,
  GLYPH.downOut,
  GLYPH.upIn,
  GLYPH.upOut,
]);

export interface ChartSeries {
  /** samples, one per x step (crank degree for crank charts) */
  values: ArrayLike<number>;
  /** 'line' for the current result, 'dots' for a baseline, 'second' for a second quantity of the current result, 'measured' for measured data */
  style: 'line' | 'dots' | 'second' | 'measured';
}

export interface ChartFrame {
  /** total width in columns, gutter included */
  width: number;
  /** rows of plot area */
  height: number;
  /** width of the y-label gutter (labels right-aligned, then an edge char) */
  gutter: number;
  yMin: number;
  yMax: number;
  /** format of the y labels */
  formatY: (value: number) => string;
  /** draw a horizontal reference line at this value */
  reference?: number;
  /** label every this many rows between the top and bottom labels too (the row's middle value); default: top and bottom only */
  labelEvery?: number;
}

/** The value range of some series, widened so a flat line still has room. */
export function valueRange(
  series: readonly ArrayLike<number>[],
  opts: { include?: number[]; minSpan?: number; pad?: number } = {},
): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (const s of series) {
    for (let i = 0; i < s.length; i++) {
      const v = s[i] as number;
      if (!Number.isFinite(v)) continue;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  for (const v of opts.include ?? []) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!Number.isFinite(min) || !Number.isFinite(max)) return { min: 0, max: 1 };
  const minSpan = opts.minSpan ?? 0;
  if (max - min < minSpan) {
    const mid = (max + min) / 2;
    min = mid - minSpan / 2;
    max = mid + minSpan / 2;
  }
  if (max === min) {
    min -= 0.5;
    max += 0.5;
  }
  const pad = (opts.pad ?? 0) * (max - min);
  return { min: min - pad, max: max + pad };
}

/** Row (0 = top) of a value in a plot of `height` rows over [yMin, yMax]. */
export function rowOf(value: number, yMin: number, yMax: number, height: number): number {
  if (height <= 1) return 0;
  const f = (yMax - value) / (yMax - yMin);
  const r = Math.floor(f * height);
  return Math.min(height - 1, Math.max(0, r));
}

/**
 * Columns of a crank window: column c covers crank degrees
 * [from + c·span/cols, from + (c+1)·span/cols), wrapped into 0..719.
 * Returns, per column, the integer sample indices it covers (at least one);
 * with no more columns than degrees each degree belongs to exactly one column.
 */
export function crankBins(from: number, span: number, cols: number, cycle = 720): number[][] {
  const bins: number[][] = [];
  for (let c = 0; c < cols; c++) {
    const a = from + (c * span) / cols;
    const b = from + ((c + 1) * span) / cols;
    // the whole degrees in [a, b); a column narrower than a degree shows the degree it lies in
    const first = Math.ceil(a - 1e-9);
    const last = Math.ceil(b - 1e-9) - 1;
    const bin: number[] = [];
    for (let d = first; d <= last; d++) bin.push(mod(d, cycle));
    if (bin.length === 0) bin.push(mod(Math.floor(a), cycle));
    bins.push(bin);
  }
  return bins;
}

/** Column of a crank angle in a window, or -1 when outside it. */
export function columnOfCrank(theta: number, from: number, span: number, cols: number, cycle = 720): number {
  const rel = mod(theta - from, cycle);
  if (rel >= span) return -1;
  return Math.min(cols - 1, Math.floor((rel * cols) / span));
}

export function mod(a: number, m: number): number {
  return ((a % m) + m) % m;
}

/** The left edge of a crank window of `span` degrees centred on the cursor (full cycle: 0). */
export function windowStart(cursor: number, span: number, cycle = 720): number {
  if (span >= cycle) return 0;
  return mod(Math.round(cursor - span / 2), cycle);
}

/**
 * Draw series over pre-computed column bins into a grid.
 * `bins[c]` lists the sample indices of column c; the line of each column
 * joins the previous column's last sample so steep parts stay connected.
 */
export function plotBins(
  series: readonly ChartSeries[],
  bins: readonly (readonly number[])[],
  frame: ChartFrame,
  /** shadeColumns: the columns of the band; its first and last are drawn as edges */
  opts: { cursorColumn?: number; shadeColumns?: readonly boolean[] } = {},
): string[] {
  const plotWidth = Math.max(1, frame.width - frame.gutter);
  const cols = Math.min(plotWidth, bins.length);
  const H = Math.max(1, frame.height);
  const grid: string[][] = [];
  for (let r = 0; r < H; r++) grid.push(new Array<string>(plotWidth).fill(' '));

  // band edges underneath everything
  if (opts.shadeColumns) {
    const inBand = opts.shadeColumns.slice(0, cols);
    const first = inBand.indexOf(true);
    const last = inBand.lastIndexOf(true);
    for (const c of first >= 0 ? [first, last] : []) for (let r = 0; r < H; r++) setCell(grid, r, c, GLYPH.band);
  }
  if (frame.reference !== undefined && frame.reference >= frame.yMin && frame.reference <= frame.yMax) {
    const rr = rowOf(frame.reference, frame.yMin, frame.yMax, H);
    for (let c = 0; c < cols; c++) setCell(grid, rr, c, GLYPH.reference);
  }
  if (opts.cursorColumn !== undefined && opts.cursorColumn >= 0 && opts.cursorColumn < cols) {
    for (let r = 0; r < H; r++) setCell(grid, r, opts.cursorColumn, GLYPH.cursor);
  }
  // baselines first, then second quantities, so the current line is drawn on top
  const rank = { dots: 0, second: 1, measured: 1, line: 2 } as const;
  const ordered = [...series].sort((a, b) => rank[a.style] - rank[b.style]);
  for (const s of ordered) {
    let prevRow: number | undefined;
    for (let c = 0; c < cols; c++) {
      const bin = bins[c] ?? [];
      let lo = Infinity;
      let hi = -Infinity;
      let firstRow: number | undefined;
      let lastRow: number | undefined;
      for (const i of bin) {
        const v = s.values[i];
        if (v === undefined || !Number.isFinite(v)) continue;
        const r = rowOf(v, frame.yMin, frame.yMax, H);
        if (r < lo) lo = r;
        if (r > hi) hi = r;
        if (firstRow === undefined) firstRow = r;
        lastRow = r;
      }
      if (lastRow === undefined || firstRow === undefined) {
        prevRow = undefined;
        continue;
      }
      if (s.style !== 'line') {
        const g = s.style === 'dots' ? GLYPH.baseline : s.style === 'measured' ? GLYPH.measured : GLYPH.second;
        for (let r = lo; r <= hi; r++) if (!LINE_GLYPHS.has(grid[r]?.[c] ?? '')) setCell(grid, r, c, g);
        prevRow = lastRow;
        continue;
      }
      // the line comes in at the previous column's level and leaves at this column's last sample
      const enter = prevRow ?? firstRow;
      lo = Math.min(lo, enter);
      hi = Math.max(hi, enter);
      if (lo === hi) setCell(grid, lo, c, GLYPH.flat);
      else {
        for (let r = lo; r <= hi; r++) setCell(grid, r, c, GLYPH.steep);
        if (enter < lastRow) {
          setCell(grid, enter, c, GLYPH.downIn);
          setCell(grid, lastRow, c, GLYPH.downOut);
        } else if (enter > lastRow) {
          setCell(grid, enter, c, GLYPH.upIn);
          setCell(grid, lastRow, c, GLYPH.upOut);
        }
      }
      prevRow = lastRow;
    }
  }

  const lines: string[] = [];
  const labelW = Math.max(0, frame.gutter - 1);
  const topLabel = frame.formatY(frame.yMax);
  const bottomLabel = frame.formatY(frame.yMin);
  const refRow =
    frame.reference !== undefined && frame.reference > frame.yMin && frame.reference < frame.yMax
      ? rowOf(frame.reference, frame.yMin, frame.yMax, H)
      : -1;
  for (let r = 0; r < H; r++) {
    let label = '';
    // the row the reference line is drawn on is labelled with it, even the top or bottom row
    // (a zero line on a row labelled −17.8 reads wrong)
    if (r === refRow && H >= 3) label = frame.formatY(frame.reference as number);
    else if (r === 0) label = topLabel;
    else if (r === H - 1) label = bottomLabel;
    else if (frame.labelEvery && frame.labelEvery >= 2 && r % frame.labelEvery === 0 && H - 1 - r >= 2)
      label = frame.formatY(frame.yMax - ((r + 0.5) * (frame.yMax - frame.yMin)) / H);
    const gutter = frame.gutter > 0 ? fitLeft(label, labelW) + (label ? '┤' : '│') : '';
    lines.push(gutter + (grid[r] ?? []).join(''));
  }
  return lines;
}

function setCell(grid: string[][], r: number, c: number, ch: string): void {
  const row = grid[r];
  if (row && c >= 0 && c < row.length) row[c] = ch;
}

/** Right-align text in `w` columns, cutting from the left when too long. */
export function fitLeft(text: string, w: number): string {
  if (w <= 0) return '';
  if (text.length >= w) return text.slice(text.length - w);
  return ' '.repeat(w - text.length) + text;
}

/** Left-align text in exactly `w` columns (cut or padded). */
export function fitRight(text: string, w: number): string {
  if (w <= 0) return '';
  if (text.length >= w) return text.slice(0, w);
  return text + ' '.repeat(w - text.length);
}

export interface CrankChartOptions {
  width: number;
  height: number;
  gutter: number;
  /** crank window start [deg] and span [deg] */
  from: number;
  span: number;
  yMin: number;
  yMax: number;
  formatY: (value: number) => string;
  reference?: number;
  /** crank angle of the cursor [deg] */
  cursor?: number;
}

/** A chart of per-degree samples against crank angle. */
export function crankChart(series: readonly ChartSeries[], o: CrankChartOptions): string[] {
  const cols = Math.max(1, o.width - o.gutter);
  const bins = crankBins(o.from, o.span, cols);
  const frame: ChartFrame = {
    width: o.width,
    height: o.height,
    gutter: o.gutter,
    yMin: o.yMin,
    yMax: o.yMax,
    formatY: o.formatY,
    ...(o.reference !== undefined ? { reference: o.reference } : {}),
  };
  const cursorColumn = o.cursor !== undefined ? columnOfCrank(o.cursor, o.from, o.span, cols) : -1;
  return plotBins(series, bins, frame, { cursorColumn });
}

export interface AxisMark {
  /** crank angle [deg] */
  at: number;
  label: string;
  /** lower numbers are placed first and win collisions */
  priority: number;
}

/** The crank-angle marks of one cycle: TDC/BDC and the four valve events. */
export function cycleMarks(events: { ivo: number; ivc: number; evo: number; evc: number }): AxisMark[] {
  return [
    { at: events.ivo, label: 'IVO', priority: 0 },
    { at: events.ivc, label: 'IVC', priority: 0 },
    { at: 0, label: 'TDC', priority: 1 },
    { at: 180, label: 'BDC', priority: 1 },
    { at: 360, label: 'TDC', priority: 1 },
    { at: 540, label: 'BDC', priority: 1 },
    { at: events.evo, label: 'EVO', priority: 2 },
    { at: events.evc, label: 'EVC', priority: 2 },
  ];
}

export interface ColumnMark {
  col: number;
  label: string;
  /** lower numbers are placed first and win collisions */
  priority: number;
  /** tick character (default ┬) */
  tick?: string;
}

/**
 * Two rows under a chart: a tick row (`┬` at each mark, `▲` at the cursor,
 * `═` along the highlighted columns) and a label row. Labels are centred on
 * their tick when there is room, nudged sideways when not (up to one label's
 * width past the tick, so an event a few degrees from TDC keeps its name),
 * and left out (lowest priority first) when they cannot fit; a left-out mark
 * keeps its tick.
 */
export function axisLines(
  marks: readonly ColumnMark[],
  o: { width: number; gutter: number; cursorColumn?: number; highlight?: readonly boolean[] },
): [string, string] {
  const cols = Math.max(1, o.width - o.gutter);
  const ticks = new Array<string>(cols).fill('─');
  if (o.highlight) for (let c = 0; c < cols; c++) if (o.highlight[c]) ticks[c] = '═';
  const labels = new Array<string>(cols).fill(' ');
  const taken = new Array<boolean>(cols).fill(false);
  const placed = marks
    .filter((m) => m.col >= 0 && m.col < cols)
    .sort((a, b) => a.priority - b.priority || a.col - b.col);
  for (const m of placed) ticks[m.col] = m.tick ?? '┬';
  for (const m of placed) {
    const w = m.label.length;
    const centred = m.col - Math.floor(w / 2);
    const candidates = [centred, m.col, m.col - w + 1, centred + 1, centred - 1, m.col + 1, m.col - w];
    // crowded (an event a few degrees from TDC): further out, the nearest first, up to one label's width past the tick
    for (let d = 2; d <= w + 1; d++) candidates.push(m.col + d, m.col - w + 1 - d);
    for (const start of candidates) {
      if (start < 0 || start + w > cols) continue;
      let free = true;
      // keep one blank column between labels
      for (let i = Math.max(0, start - 1); i < Math.min(cols, start + w + 1); i++) {
        if (taken[i]) free = false;
      }
      if (!free) continue;
      for (let i = 0; i < w; i++) {
        labels[start + i] = m.label[i] as string;
        taken[start + i] = true;
      }
      break;
    }
  }
  if (o.cursorColumn !== undefined && o.cursorColumn >= 0 && o.cursorColumn < cols) ticks[o.cursorColumn] = '▲';
  const pad = o.gutter > 0 ? ' '.repeat(o.gutter - 1) : '';
  const edge = o.gutter > 0 ? '└' : '';
  return [pad + edge + ticks.join(''), ' '.repeat(o.gutter) + labels.join('')];
}

/** The axis rows under a crank chart, with the cycle's marks placed by crank angle. */
export function crankAxis(
  marks: readonly AxisMark[],
  o: { width: number; gutter: number; from: number; span: number; cursor?: number },
): [string, string] {
  const cols = Math.max(1, o.width - o.gutter);
  const placed: ColumnMark[] = marks.map((m) => ({
    col: columnOfCrank(m.at, o.from, o.span, cols),
    label: m.label,
    priority: m.priority,
  }));
  const cursorColumn = o.cursor !== undefined ? columnOfCrank(o.cursor, o.from, o.span, cols) : -1;
  return axisLines(placed, { width: o.width, gutter: o.gutter, cursorColumn });
}

/** Degree numbers under the axis at the window ends, e.g. "0°" … "719°". */
export function crankScale(o: { width: number; gutter: number; from: number; span: number }): string {
  const cols = Math.max(1, o.width - o.gutter);
  const left = `${Math.round(o.from)}°`;
  const right = `${Math.round(mod(o.from + o.span - 1, 720))}°`;
  const mid = cols - left.length - right.length;
  return ' '.repeat(o.gutter) + (mid >= 1 ? left + ' '.repeat(mid) + right : fitRight(left, cols));
}

/** the eighth blocks of a sparkline, lowest first */
export const SPARK = ['▁', '▂', '▃', '▄', '▅', '▆', '▇', '█'] as const;

/**
 * A one-row chart of per-degree samples against crank angle: each column's
 * mean as an eighth block between yMin and yMax (a blank where there is no
 * sample), the top value in the gutter. For the charts the Valve view keeps
 * small while another is large.
 */
export function crankSparkline(values: ArrayLike<number>, o: Omit<CrankChartOptions, 'height' | 'reference'>): string {
  const cols = Math.max(1, o.width - o.gutter);
  const bins = crankBins(o.from, o.span, cols);
  const span = o.yMax - o.yMin;
  let out = '';
  for (const bin of bins) {
    let sum = 0;
    let n = 0;
    for (const i of bin) {
      const v = values[i];
      if (v === undefined || !Number.isFinite(v)) continue;
      sum += v;
      n++;
    }
    if (n === 0 || !(span > 0)) {
      out += ' ';
      continue;
    }
    const f = (sum / n - o.yMin) / span;
    out += SPARK[Math.min(SPARK.length - 1, Math.max(0, Math.floor(f * SPARK.length)))];
  }
  const gutter = o.gutter > 0 ? fitLeft(o.formatY(o.yMax), o.gutter - 1) + '┤' : '';
  return gutter + out;
}
