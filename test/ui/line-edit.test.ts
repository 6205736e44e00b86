/**
 * Line editing in a field (ui/line-edit.ts): the keys of the usual shell
 * line editor (common practice: GNU Readline's emacs mode, from memory).
 */
import { describe, expect, it } from 'vitest';
import { applyLineOp, insertText, lineOpOfKey, withCursor, type LineOp } from '../../src/ui/line-edit.js';

const at = (text: string, cursor: number) => ({ text, cursor });

describe('line editing', () => {
  it.each<[string, number, LineOp, string, number]>([
    ['320 mm', 3, 'left', '320 mm', 2],
    ['320', 0, 'left', '320', 0],
    ['320', 1, 'right', '320', 2],
    ['320', 3, 'right', '320', 3],
    ['320', 2, 'home', '320', 0],
    ['320', 0, 'end', '320', 3],
    ['320', 2, 'backspace', '30', 1],
    ['320', 0, 'backspace', '320', 0],
    ['320', 1, 'deleteForward', '30', 1],
    ['320', 2, 'killStart', '0', 0],
    ['320', 1, 'killEnd', '3', 1],
    ['cases/demo-2.yaml', 17, 'killWord', 'cases/', 6],
    ['cases/demo-2.yaml  ', 19, 'killWord', 'cases/', 6],
    ['cases/', 6, 'killWord', 'cases', 5],
    ['', 0, 'killWord', '', 0],
  ])('%j at %i, %s → %j at %i', (text, cursor, op, outText, outCursor) => {
    expect(applyLineOp(at(text, cursor), op)).toEqual(at(outText, outCursor));
  });

  it('inserts at the cursor and keeps to a length', () => {
    expect(insertText(at('30', 1), '2')).toEqual(at('320', 2));
    expect(insertText(at('1234', 4), '567', 6)).toEqual(at('123456', 6));
    expect(withCursor(at('320', 1))).toBe('3▌20');
  });

  it.each<[string, Record<string, boolean>, LineOp | undefined]>([
    ['a', { ctrl: true }, 'home'],
    ['e', { ctrl: true }, 'end'],
    ['u', { ctrl: true }, 'killStart'],
    ['k', { ctrl: true }, 'killEnd'],
    ['w', { ctrl: true }, 'killWord'],
    ['d', { ctrl: true }, 'deleteForward'],
    ['b', { ctrl: true }, 'left'],
    ['f', { ctrl: true }, 'right'],
    ['', { leftArrow: true }, 'left'],
    ['', { rightArrow: true }, 'right'],
    ['', { home: true }, 'home'],
    ['', { end: true }, 'end'],
    ['', { delete: true }, 'backspace'],
    ['', { backspace: true }, 'backspace'],
    ['u', {}, undefined],
    ['z', { ctrl: true }, undefined],
  ])('key %j %j → %s', (input, key, op) => {
    expect(lineOpOfKey(input, key)).toBe(op);
  });
});
