/** Display-only: text lines, each exactly the width it was made for, coloured by character class. */
import React from 'react';
import { Box, Text } from 'ink';
import { colourRuns, type Palette } from './palette.js';

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
            ? colourRuns(line, palette).map((r, j) =>
                r.color ? (
                  <Text key={j} color={r.color}>
                    {r.text}
                  </Text>
                ) : (
                  r.text
                ),
              )
            : line}
        </Text>
      ))}
    </Box>
  );
}
