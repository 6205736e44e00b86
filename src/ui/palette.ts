/**
 * Colours of the terminal view, by character class, so the text alone reads
 * the same without colour. NO_COLOR (any non-empty value) turns colour off.
 */
import { GLYPH, SPARK } from './chart.js';
import { ABOVE, BELOW } from './space-time.js';

export type Palette = Readonly<Record<string, string>>;

export function colorWanted(env: NodeJS.ProcessEnv = process.env): boolean {
  const v = env['NO_COLOR'];
  return v === undefined || v === '';
}

/** Charts: the current line, the baseline, references, the cursor, the band. */
export const CHART_PALETTE: Palette = {
  [GLYPH.flat]: 'cyan',
  [GLYPH.steep]: 'cyan',
  [GLYPH.downIn]: 'cyan',
  [GLYPH.downOut]: 'cyan',
  [GLYPH.upIn]: 'cyan',
  [GLYPH.upOut]: 'cyan',
  [GLYPH.baseline]: 'magenta',
  [GLYPH.second]: 'green',
  [GLYPH.measured]: 'redBright',
  '●': 'redBright',
  [GLYPH.reference]: 'gray',
  [GLYPH.cursor]: 'yellow',
  [GLYPH.band]: 'blue',
  '▲': 'yellow',
  '▼': 'yellow',
  '×': 'red',
  // the one-line strips of the present result
  ...Object.fromEntries(SPARK.map((c) => [c, 'cyan'])),
};

/** The space–time map: warm for compression, cool for expansion. */
export const MAP_PALETTE: Palette = {
  [ABOVE[0]]: 'yellow',
  [ABOVE[1]]: 'yellowBright',
  [ABOVE[2]]: 'red',
  [ABOVE[3]]: 'redBright',
  [BELOW[0]]: 'cyan',
  [BELOW[1]]: 'cyanBright',
  [BELOW[2]]: 'blue',
  [BELOW[3]]: 'blueBright',
  '▲': 'yellow',
  '▼': 'yellow',
};

/** Split a line into runs of one colour (undefined = the terminal's own). */
export function colourRuns(line: string, palette: Palette): { text: string; color: string | undefined }[] {
  const runs: { text: string; color: string | undefined }[] = [];
  for (const ch of line) {
    const color = palette[ch];
    const last = runs[runs.length - 1];
    if (last && last.color === color) last.text += ch;
    else runs.push({ text: ch, color });
  }
  return runs;
}
