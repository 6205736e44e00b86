/**
 * Sentences the analysis writes (the pulse verdict, the opening note) carry
 * pressures against the reference as "+57.9 kPa" / "-22.5 kPa". Shown, they
 * take the display's gauge unit and its minus sign.
 */
import type { Units } from './units.js';

const KPA = /([+\-−]?)(\d+(?:\.\d+)?) kPa\b/g;

/** A sentence of the analysis with its "±N kPa" differences in the display units. */
export function restateGauge(text: string, u: Units): string {
  return text.replace(KPA, (_all, sign: string, num: string) => {
    const pa = (sign === '-' || sign === '−' ? -1 : 1) * Number(num) * 1000;
    const shown = sign === '' && pa > 0 ? u.value('gauge', pa) : u.signed('gauge', pa);
    return `${shown} ${u.label('gauge')}`;
  });
}
