/**
 * Line editing in a typed field (a value in the Case view, a file name to
 * save to): the usual keys of a shell's line editor. Pure: text and cursor
 * in, text and cursor out.
 *
 *   ← →  ctrl+b ctrl+f   one character left / right
 *   home end  ctrl+a ctrl+e   to the start / end
 *   backspace  ctrl+h   delete the character before the cursor
 *   ctrl+d   delete the character under the cursor
 *   ctrl+u   delete from the start to the cursor
 *   ctrl+k   delete from the cursor to the end
 *   ctrl+w   delete the word before the cursor
 */
import type { KeyInfo } from './keys.js';

export interface LineText {
  text: string;
  /** cursor position, 0..text.length (before the character at that index) */
  cursor: number;
}

export type LineOp = 'left' | 'right' | 'home' | 'end' | 'backspace' | 'deleteForward' | 'killStart' | 'killEnd' | 'killWord';

/** Words for the help screen. */
export const LINE_EDIT_HELP = 'ctrl+a/e start/end, ctrl+u/k delete to start/end, ctrl+w word';

function clampCursor(l: LineText): number {
  return Math.max(0, Math.min(l.text.length, l.cursor));
}

/** Insert `s` at the cursor (keeping at most `max` characters). */
export function insertText(l: LineText, s: string, max = Infinity): LineText {
  const c = clampCursor(l);
  const room = Math.max(0, max - l.text.length);
  const add = s.slice(0, room);
  return { text: l.text.slice(0, c) + add + l.text.slice(c), cursor: c + add.length };
}

export function applyLineOp(l: LineText, op: LineOp): LineText {
  const t = l.text;
  const c = clampCursor(l);
  switch (op) {
    case 'left':
      return { text: t, cursor: Math.max(0, c - 1) };
    case 'right':
      return { text: t, cursor: Math.min(t.length, c + 1) };
    case 'home':
      return { text: t, cursor: 0 };
    case 'end':
      return { text: t, cursor: t.length };
    case 'backspace':
      return c === 0 ? { text: t, cursor: 0 } : { text: t.slice(0, c - 1) + t.slice(c), cursor: c - 1 };
    case 'deleteForward':
      return { text: t.slice(0, c) + t.slice(c + 1), cursor: c };
    case 'killStart':
      return { text: t.slice(c), cursor: 0 };
    case 'killEnd':
      return { text: t.slice(0, c), cursor: c };
    case 'killWord': {
      // the spaces before the cursor, then the word (letters, digits, dots) before them; at least one character
      let k = c;
      while (k > 0 && /\s/.test(t[k - 1] ?? '')) k--;
      const word = /[\p{L}\p{N}._-]/u;
      if (k > 0 && word.test(t[k - 1] ?? '')) while (k > 0 && word.test(t[k - 1] ?? '')) k--;
      else if (k > 0) k--;
      return { text: t.slice(0, k) + t.slice(c), cursor: k };
    }
  }
}

/** The line-editing operation of a key, or undefined when the key is not one. */
export function lineOpOfKey(input: string, key: KeyInfo & { end?: boolean }): LineOp | undefined {
  if (key.leftArrow) return 'left';
  if (key.rightArrow) return 'right';
  if (key.home) return 'home';
  if (key.end) return 'end';
  // Ink reports the key labelled Backspace (0x7f) as delete, ctrl+h (0x08) as backspace
  if (key.backspace || key.delete) return 'backspace';
  if (!key.ctrl) return undefined;
  switch (input) {
    case 'a':
      return 'home';
    case 'e':
      return 'end';
    case 'b':
      return 'left';
    case 'f':
      return 'right';
    case 'h':
      return 'backspace';
    case 'd':
      return 'deleteForward';
    case 'u':
      return 'killStart';
    case 'k':
      return 'killEnd';
    case 'w':
      return 'killWord';
  }
  return undefined;
}

/** The text with a cursor mark at the cursor. */
export function withCursor(l: LineText, mark = '▌'): string {
  const c = clampCursor(l);
  return l.text.slice(0, c) + mark + l.text.slice(c);
}
