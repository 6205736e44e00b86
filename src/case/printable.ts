/**
 * Text from a case file or the command line shown on a terminal: control
 * characters (C0, DEL, C1: escape sequences, NUL, bells, carriage returns)
 * and the bidirectional-override marks are shown escaped, so a name or key
 * with an escape sequence in it cannot move the cursor, change colours or
 * hide text. Newlines and tabs are escaped too when `keepNewlines` is off
 * (one-line messages).
 */

const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;
const CONTROL_AND_BREAKS = /[\u0000-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

function escapeOne(ch: string): string {
  const c = ch.codePointAt(0)!;
  if (c === 0x0a) return '\\n';
  if (c === 0x09) return '\\t';
  if (c === 0x0d) return '\\r';
  if (c === 0x00) return '\\0';
  if (c === 0x1b) return '\\e';
  return c <= 0xff ? `\\x${c.toString(16).padStart(2, '0')}` : `\\u${c.toString(16).padStart(4, '0')}`;
}

/** `text` with control characters escaped (\e, \0, \x07, \u202e ...). */
export function printable(text: string, keepNewlines = false): string {
  return text.replace(keepNewlines ? CONTROL : CONTROL_AND_BREAKS, escapeOne);
}

/** true when `text` holds a character `printable` would escape */
export function hasControl(text: string): boolean {
  CONTROL_AND_BREAKS.lastIndex = 0;
  return CONTROL_AND_BREAKS.test(text);
}
