/**
 * Pure chart functions of the terminal view: bins, rows, lines, markers.
 * No physics is checked here (rendering only).
 */
import { describe, expect, it } from 'vitest';
import {
  GLYPH,
  LINE_GLYPHS,
  axisLines,
  columnOfCrank,
  crankAxis,
  crankBins,
  crankChart,
  cycleMarks,
  plotBins,
  rowOf,
  valueRange,
  windowStart,
} from '../../src/ui/chart.js';

describe('crank bins and columns', () => {
  it.each([
    // from, span, cols, column, expected first and last degree of that column
    [0, 720, 72, 0, 0, 9],
    [0, 720, 72, 71, 710, 719],
    [700, 40, 4, 0, 700, 709],
    [700, 40, 4, 2, 0, 9], // wraps past the cycle end
    [0, 90, 90, 45, 45, 45],
  ])('window from %i span %i in %i cols: column %i covers %i..%i', (from, span, cols, col, first, last) => {
    const bin = crankBins(from, span, cols)[col] ?? [];
    expect(bin[0]).toBe(first);
    expect(bin[bin.length - 1]).toBe(last);
  });

  it('gives every degree of the window to exactly one column', () => {
    for (const [from, span, cols] of [
      [0, 720, 73],
      [650, 180, 61],
      [10, 90, 200],
    ] as const) {
      const bins = crankBins(from, span, cols);
      const all = bins.flat();
      if (cols <= span) {
        expect(new Set(all).size).toBe(all.length);
        expect(all.length).toBe(span);
      }
      expect(bins.every((b) => b.length >= 1)).toBe(true);
    }
  });

  it.each([
    [0, 0, 720, 72, 0],
    [719, 0, 720, 72, 71],
    [365, 0, 720, 72, 36],
    [5, 700, 40, 4, 2],
    [100, 700, 40, 4, -1], // outside the window
  ])('crank %i in window from %i span %i (%i cols) is column %i', (theta, from, span, cols, col) => {
    expect(columnOfCrank(theta, from, span, cols)).toBe(col);
  });

  it.each([
    [100, 720, 0],
    [100, 180, 10],
    [30, 180, 660],
    [300, 90, 255],
  ])('the window around cursor %i of span %i starts at %i', (cursor, span, start) => {
    expect(windowStart(cursor, span)).toBe(start);
  });
});

describe('rows and ranges', () => {
  it.each([
    [10, 0, 10, 5, 0],
    [0, 0, 10, 5, 4],
    [5, 0, 10, 5, 2],
    [-3, 0, 10, 5, 4], // clamped
    [99, 0, 10, 5, 0],
  ])('value %d over [%d, %d] in %i rows is row %i', (v, lo, hi, h, row) => {
    expect(rowOf(v, lo, hi, h)).toBe(row);
  });

  it('widens a flat series so it can still be drawn', () => {
    const r = valueRange([[5, 5, 5]], { minSpan: 2 });
    expect(r.max - r.min).toBeCloseTo(2);
    expect((r.max + r.min) / 2).toBeCloseTo(5);
  });

  it('includes a reference value outside the data', () => {
    const r = valueRange([[1, 2]], { include: [10] });
    expect(r.max).toBe(10);
    expect(r.min).toBe(1);
  });
});

describe('plotBins', () => {
  const frame = { width: 12, height: 5, gutter: 2, yMin: 0, yMax: 4, formatY: (v: number) => String(v) };
  const bins = Array.from({ length: 10 }, (_, c) => [c]);

  it('draws a constant line as one flat row, every line exactly the width', () => {
    const lines = plotBins([{ values: new Array(10).fill(2), style: 'line' }], bins, frame);
    expect(lines).toHaveLength(5);
    for (const l of lines) expect([...l]).toHaveLength(12);
    expect(lines[2]?.slice(2)).toBe(GLYPH.flat.repeat(10));
    expect(lines[0]?.slice(2)).toBe(' '.repeat(10));
  });

  it.each([
    // a step up: the line turns up (╯) at the low row and out (╭) at the high row
    [[0, 0, 0, 4, 4, 4, 4, 4, 4, 4], 3, 4, 0, GLYPH.upIn, GLYPH.upOut],
    // a step down: in at the high row (╮), out at the low row (╰)
    [[4, 4, 4, 0, 0, 0, 0, 0, 0, 0], 3, 0, 4, GLYPH.downIn, GLYPH.downOut],
  ])('a step %j turns in column %i from row %i to row %i', (values, col, fromRow, toRow, inGlyph, outGlyph) => {
    const lines = plotBins([{ values, style: 'line' }], bins, frame);
    const cell = (r: number): string => [...(lines[r] ?? '')][2 + col] ?? '';
    expect(cell(fromRow)).toBe(inGlyph);
    expect(cell(toRow)).toBe(outGlyph);
    for (let r = Math.min(fromRow, toRow) + 1; r < Math.max(fromRow, toRow); r++) expect(cell(r)).toBe(GLYPH.steep);
  });

  it('keeps the line continuous: every column has at least one line glyph', () => {
    const values = Array.from({ length: 10 }, (_, i) => 2 + 2 * Math.sin(i));
    const lines = plotBins([{ values, style: 'line' }], bins, frame);
    for (let c = 0; c < 10; c++) {
      const col = lines.map((l) => [...l][2 + c] ?? ' ');
      expect(col.some((ch) => LINE_GLYPHS.has(ch))).toBe(true);
    }
  });

  it('draws the baseline as dots under the current line, and the cursor and reference in empty cells', () => {
    const lines = plotBins(
      [
        { values: new Array(10).fill(3), style: 'dots' },
        { values: new Array(10).fill(1), style: 'line' },
      ],
      bins,
      { ...frame, reference: 2 },
      { cursorColumn: 4 },
    );
    expect(lines[1]?.slice(2)).toContain(GLYPH.baseline);
    expect(lines[3]?.slice(2)).toBe(GLYPH.flat.repeat(10));
    expect([...(lines[0] ?? '')][2 + 4]).toBe(GLYPH.cursor);
    expect(lines[2]).toContain(GLYPH.reference);
    // the current line wins over the cursor
    expect([...(lines[3] ?? '')][2 + 4]).toBe(GLYPH.flat);
  });

  it('labels the top and bottom rows in the gutter', () => {
    const lines = plotBins([{ values: new Array(10).fill(2), style: 'line' }], bins, { ...frame, gutter: 3 });
    expect(lines[0]?.startsWith(' 4┤')).toBe(true);
    expect(lines[4]?.startsWith(' 0┤')).toBe(true);
    expect(lines[2]?.startsWith('  │')).toBe(true);
  });

  it('marks the band edges', () => {
    const shade = Array.from({ length: 10 }, (_, c) => c >= 3 && c <= 6);
    const lines = plotBins([{ values: new Array(10).fill(0), style: 'line' }], bins, frame, { shadeColumns: shade });
    expect([...(lines[0] ?? '')][2 + 3]).toBe(GLYPH.band);
    expect([...(lines[0] ?? '')][2 + 6]).toBe(GLYPH.band);
    expect([...(lines[0] ?? '')][2 + 4]).toBe(' ');
  });
});

describe('crank chart and axis', () => {
  const events = { ivo: 700, ivc: 230, evo: 490, evc: 20 };

  it('places IVO and IVC (and TDC/BDC) under their crank angles at 80 columns', () => {
    const [ticks, labels] = crankAxis(cycleMarks(events), { width: 80, gutter: 8, from: 0, span: 720, cursor: 100 });
    expect([...ticks]).toHaveLength(80);
    expect([...labels]).toHaveLength(80);
    for (const name of ['IVO', 'IVC', 'TDC', 'BDC']) expect(labels).toContain(name);
    const cols = 72;
    const near = (label: string, theta: number): void => {
      const at = labels.indexOf(label) - 8;
      const col = Math.floor((theta * cols) / 720);
      expect(Math.abs(at + 1 - col)).toBeLessThanOrEqual(3);
    };
    near('IVC', 230);
    near('IVO', 700);
    expect([...ticks][8 + Math.floor((100 * cols) / 720)]).toBe('▲');
  });

  it('drops the lowest-priority label when two collide, keeping its tick', () => {
    const [ticks, labels] = axisLines(
      [
        { col: 4, label: 'IVC', priority: 0 },
        { col: 5, label: 'BDC', priority: 1 },
      ],
      { width: 9, gutter: 0 },
    );
    expect(labels).toContain('IVC');
    expect(labels).not.toContain('BDC');
    expect(ticks[5]).toBe('┬');
  });

  it('the row the zero line is drawn on is labelled 0.0, even when it is the bottom row (not the range minimum)', () => {
    // flow −17.8 … 173.9 g/s over 9 rows: 21.3 g/s a row, zero falls in the bottom row
    const values = new Float64Array(720).map((_, k) => (k < 200 ? 173.9 * Math.sin((Math.PI * k) / 200) : -17.8 * Math.sin((Math.PI * (k - 200)) / 520)));
    const lines = crankChart([{ values, style: 'line' }], { width: 80, height: 9, gutter: 7, from: 0, span: 720, yMin: -17.8, yMax: 173.9, formatY: (v) => v.toFixed(1), reference: 0 });
    const zeroRow = lines.findIndex((l) => l.includes(GLYPH.reference));
    expect(zeroRow).toBe(8);
    expect(lines[zeroRow]?.slice(0, 7)).toBe('   0.0┤');
    expect(lines.join('\n')).not.toContain('-17.8');
    expect(lines[0]?.slice(0, 7)).toBe(' 173.9┤');
  });

  it('labels rows between the ends when asked (the Sweep chart: more than min and max over many rows)', () => {
    const bins = Array.from({ length: 10 }, (_, c) => [c]);
    const lines = plotBins([{ values: new Float64Array(10).fill(0.5), style: 'line' }], bins, { width: 17, height: 12, gutter: 7, yMin: 0, yMax: 1.2, formatY: (v) => v.toFixed(2), labelEvery: 4 });
    const labelled = lines.map((l) => l.slice(0, 6).trim()).filter((t) => t !== '');
    // rows 0, 4, 8 and the bottom: 1.20, the middles of rows 4 and 8 (0.75, 0.35), 0.00
    expect(labelled).toEqual(['1.20', '0.75', '0.35', '0.00']);
  });

  it('a one-line strip: the eighth block of each column\'s mean between the range ends, the top value in the gutter', async () => {
    const { crankSparkline, SPARK } = await import('../../src/ui/chart.js');
    // 8 columns over 720°: column c holds degrees 90c … 90c+89, all of value c
    const values = new Float64Array(720).map((_, k) => Math.floor(k / 90));
    const line = crankSparkline(values, { width: 12, gutter: 4, from: 0, span: 720, yMin: 0, yMax: 8, formatY: (v) => v.toFixed(0) });
    expect(line).toBe(`  8┤${SPARK.join('')}`);
  });

  it('moves a crowded label further out rather than dropping it: EVC 20° ATDC beside TDC at 80 columns', () => {
    // 72 columns for 720°: TDC at column 0, EVC at column 2, IVO at column 70
    const [ticks, labels] = crankAxis(cycleMarks(events), { width: 80, gutter: 8, from: 0, span: 720 });
    for (const name of ['IVO', 'IVC', 'EVO', 'EVC', 'TDC', 'BDC']) expect(labels).toContain(name);
    expect([...ticks][8 + 2]).toBe('┬');
    // within one label's width of its tick
    expect(labels.indexOf('EVC') - 8 - 2).toBeLessThanOrEqual(4);
  });

  it('shows only the marks inside a zoomed window', () => {
    const [, labels] = crankAxis(cycleMarks(events), { width: 80, gutter: 8, from: 180, span: 90 });
    expect(labels).toContain('IVC');
    expect(labels).not.toContain('IVO');
  });

  it('draws the cursor column through a crank chart', () => {
    const values = new Float64Array(720).fill(1);
    const lines = crankChart([{ values, style: 'line' }], {
      width: 80,
      height: 4,
      gutter: 8,
      from: 0,
      span: 720,
      yMin: 0,
      yMax: 4,
      formatY: (v) => v.toFixed(0),
      cursor: 360,
    });
    const col = 8 + 36;
    expect(lines.filter((l) => [...l][col] === GLYPH.cursor)).toHaveLength(3);
    for (const l of lines) expect([...l]).toHaveLength(80);
  });
});
