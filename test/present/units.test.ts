/**
 * The shared display units against NIST Special Publication 811 (2008),
 * Appendix B.8 and B.9, and one run shown in both systems: the same
 * quantities, read back from the text, within the display's rounding.
 */
import { describe, expect, it } from 'vitest';
import { IMPERIAL, METRIC, NIST, parseShown, units, fixed, signedFixed, type Quantity } from '../../src/present/index.js';
import { loadCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { pulseTiming } from '../../src/analysis/pulse.js';
import { runSummary } from '../../src/cli/run-output.js';
import { checkReport } from '../../src/cli/commands/check.js';

describe('imperial units: NIST SP 811 (2008) Appendix B factors', () => {
  it.each([
    // [quantity, SI value, shown value, source]
    ['length', 0.0254, 1, 'inch = 2.54 × 10⁻² m exactly (B.8)'],
    ['pressure', 6894.757, 1, 'pound-force per square inch = 6.894757 × 10³ Pa (B.8)'],
    ['gauge', 3386.389, 1, 'inch of mercury, conventional (0 °C) = 3.386389 × 10³ Pa (B.8)'],
    ['torque', 1.355818, 1, 'pound-force foot = 1.355818 N·m (B.9, torque)'],
    ['power', 745.699872, 1, 'horsepower (550 ft·lbf/s) = 7.456999 × 10² W (B.8)'],
    ['massFlow', 0.45359237 / 60, 1, 'pound (avoirdupois) = 0.45359237 kg exactly (B.8), per minute'],
    ['smallVolume', 16.387064e-6, 1, 'cubic inch = 1.6387064 × 10⁻⁵ m³ exactly (B.8): ci'],
    ['mass', 6.479891e-5, 1, 'grain = 6.479891 × 10⁻⁵ kg exactly (B.8)'],
  ] as const)('%s: %s SI shows as %s (%s)', (q, si, shown, _source) => {
    expect(IMPERIAL.num(q, si)).toBeCloseTo(shown, 5);
  });

  it('the standard atmosphere 101 325 Pa reads 29.92 inHg (from memory, the weather-report figure)', () => {
    expect(IMPERIAL.num('barometric', 101325)).toBeCloseTo(29.92, 2);
  });

  it('the factors as printed in NIST SP 811 (B.8, B.9)', () => {
    expect(NIST.inch).toBe(0.0254);
    expect(NIST.psi).toBe(6894.757);
    expect(NIST.inchOfMercury).toBe(3386.389);
    expect(NIST.poundForceFoot).toBe(1.355818);
    expect(NIST.horsepower).toBe(745.699872);
    expect(NIST.pound).toBe(0.45359237);
    expect(NIST.cubicInch * 1e6).toBeCloseTo(16.387064, 9);
  });

  it('°F: t/°F = 1.8·T/K − 459.67 exactly (B.9): 273.15 K is 32 °F, 373.15 K is 212 °F; a difference has no offset', () => {
    expect(IMPERIAL.num('temperature', 273.15)).toBeCloseTo(32, 9);
    expect(IMPERIAL.num('temperature', 373.15)).toBeCloseTo(212, 9);
    expect(IMPERIAL.text('temperature', 293.15)).toBe('68.0 °F');
    expect(METRIC.text('temperature', 293.15)).toBe('20.0 °C');
    expect(IMPERIAL.signed('temperature', 10)).toBe('+18.0');
    expect(IMPERIAL.unit('temperature').toSi(212)).toBeCloseTo(373.15, 9);
  });

  it('one minus sign, never "-0.0", "—" for no number (our own display convention)', () => {
    expect(fixed(-2.5, 1)).toBe('−2.5');
    expect(fixed(-0.004, 2)).toBe('0.00');
    expect(fixed(Number.NaN, 1)).toBe('—');
    expect(signedFixed(0.01, 1)).toBe('±0.0');
    expect(signedFixed(-3.21, 1)).toBe('−3.2');
    expect(METRIC.text('gauge', -29400)).toBe('−29.4 kPa');
    expect(parseShown('−29.4')).toBe(-29.4);
    for (const q of ['length', 'pressure', 'gauge', 'massFlow', 'mass'] as Quantity[]) {
      expect(units('imperial').text(q, -1e-12)).not.toMatch(/-/);
    }
  });
});

/** the rows "label   number unit" of a text report, by label */
function rowsOf(text: string): Map<string, string> {
  const m = new Map<string, string>();
  for (const line of text.split('\n')) {
    const r = /^ {2}(\S.*?\S) {2,}(.*)$/.exec(line);
    if (r) m.set(r[1]!, r[2]!);
  }
  return m;
}

/** the first number with the given unit in a text */
function numberWith(text: string, unit: string): number {
  const esc = unit.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const r = new RegExp(`([+−-]?\\d+(?:\\.\\d+)?) ${esc}(?![\\w/])`).exec(text);
  if (!r) throw new Error(`no number in ${unit} in '${text}'`);
  return parseShown(r[1]!);
}

describe('the same run in both unit systems shows the same quantities (read back, within display rounding)', async () => {
  const loaded = await loadCase('cases/demo.yaml', { set: ['numerics.meshSize=20mm'] });
  const { result } = simulatePoint(loaded.model);
  const pulse = pulseTiming(result, loaded.model);
  const metric = rowsOf(runSummary(loaded, result, pulse, 0, METRIC));
  const imperial = rowsOf(runSummary(loaded, result, pulse, 0, IMPERIAL));

  it.each([
    // [row, metric unit, imperial unit, quantity]
    ['trapped mass at IVC', 'mg', 'gr', 'mass'],
    ['cylinder pressure at IVC', 'kPa', 'psi', 'pressure'],
    ['valve pressure at IVO', 'kPa', 'psi', 'pressure'],
    ['valve pressure at IVC', 'kPa', 'psi', 'pressure'],
    ['peak reverse flow', 'g/s', 'lb/min', 'massFlow'],
    ['at IVC', 'kPa', 'inHg', 'gauge'],
  ] as const)('%s: %s and %s give the same SI value', (row, mu, iu, q) => {
    const a = METRIC.unit(q).toSi(numberWith(metric.get(row)!, mu));
    const b = IMPERIAL.unit(q).toSi(numberWith(imperial.get(row)!, iu));
    // each is rounded to half its last decimal: the two agree within the sum of both
    const half = (u: typeof METRIC) => u.unit(q).toSi(0.5 * 10 ** -u.unit(q).decimals) - u.unit(q).toSi(0);
    expect(Math.abs(a - b)).toBeLessThanOrEqual(half(METRIC) + half(IMPERIAL) + 1e-9);
  });

  it('check: displacement in cc and ci, runner length in mm and in, the same engine', () => {
    const m = rowsOf(checkReport(loaded, METRIC));
    const i = rowsOf(checkReport(loaded, IMPERIAL));
    const ccM = numberWith(m.get('displacement')!, 'cc') * 1e-6;
    const ciI = numberWith(i.get('displacement')!, 'ci') * NIST.cubicInch;
    expect(Math.abs(ccM - ciI)).toBeLessThanOrEqual(0.05e-6 + 0.005 * NIST.cubicInch);
    const lenM = numberWith(m.get('runner')!, 'mm') * 1e-3;
    const lenI = numberWith(i.get('runner')!, 'in') * NIST.inch;
    expect(Math.abs(lenM - lenI)).toBeLessThanOrEqual(0.05e-3 + 0.005 * NIST.inch);
    // JSON and the loaded case stay SI whatever is shown
    expect(loaded.model.runner.sections[0]!.length).toBeGreaterThan(0.1);
  });
});
