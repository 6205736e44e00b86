/**
 * Number formatting for text output: the shared presentation layer
 * (src/present), plus the few unit-free forms the text commands use.
 * Quantities with a unit go through a `Units` formatter (`u.text('pressure', pa)`)
 * so that --units metric|imperial applies everywhere.
 */
import { fixed, percent } from '../present/number.js';

export { fixed as fix, signedFixed as signed } from '../present/number.js';
export { card, row, wrap, table } from '../present/text.js';

export const pct = (fraction: number, d = 1) => percent(fraction, d);
export const deg = (v: number, d = 0) => `${fixed(v, d)}°`;
export const hz = (v: number, d = 1) => `${fixed(v, d)} Hz`;
export const rpm = (v: number) => `${fixed(v, 0)} rpm`;
