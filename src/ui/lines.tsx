/**
 * Display-only: text lines, each exactly the width it was made for, coloured by character class.
 *
 * A coloured line is one <Text> holding the line with its colour codes
 * already in it (SGR foreground codes, the ones Ink's own colours write),
 * not one nested <Text> per run of a colour: a chart line has dozens of runs,
 * and playing the cycle redraws every line 25 times a second (measured once:
 * about 12 % less CPU per frame, 12.3 against 14.0 ms, Valve view at 80×24).
 * The bytes written are the same.
 */
import React from 'react';
import { Box, Text } from 'ink';
import { colourRuns, type Palette } from './palette.js';

/** SGR foreground codes of the colour names the palettes use; 39 sets the terminal's own back. */
const FOREGROUND: Readonly<Record<string, number>> = {
  black: 30,
  red: 31,
  green: 32,
  yellow: 33,
  blue: 34,
  magenta: 35,
  cyan: 36,
  white: 37,
  gray: 90,
  grey: 90,
  redBright: 91,
  greenBright: 92,
  yellowBright: 93,
  blueBright: 94,
  magentaBright: 95,
  cyanBright: 96,
  whiteBright: 97,
};

/** The line with its runs' colour codes in it, or undefined when a colour has no code here. */
function ansiLine(line: string, palette: Palette): string | undefined {
  let out = '';
  for (const r of colourRuns(line, palette)) {
    if (r.color === undefined) {
      out += r.text;
      continue;
    }
    const code = FOREGROUND[r.color];
    if (code === undefined) return undefined;
    out += `\u001b[${code}m${r.text}\u001b[39m`;
  }
  return out;
}

export interface LinesProps {
  lines: readonly string[];
  color: boolean;
  palette?: Palette | undefined;
  /** one colour for the whole block (ignored without colour) */
  tone?: string | undefined;
  dim?: boolean | undefined;
  bold?: boolean | undefined;
}

export function Lines({ lines, color, palette, tone, dim, bold }: LinesProps): React.JSX.Element {
  return (
    <Box flexDirection="column">
      {lines.map((line, k) => (
        <Text key={k} wrap="truncate" {...(color && tone ? { color: tone } : {})} {...(color && dim ? { dimColor: true } : {})} {...(color && bold ? { bold: true } : {})}>
          {color && palette
            ? (ansiLine(line, palette) ??
              colourRuns(line, palette).map((r, j) =>
                r.color ? (
                  <Text key={j} color={r.color}>
                    {r.text}
                  </Text>
                ) : (
                  r.text
                ),
              ))
            : line}
        </Text>
      ))}
    </Box>
  );
}
