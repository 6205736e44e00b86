/**
 * The report's display units against NIST Special Publication 811 (2008),
 * Appendix B.8 and B.9 (factors for units listed alphabetically / by kind).
 */
import { describe, expect, it } from 'vitest';
import { units } from '../../src/report/units.js';

const imp = units('imperial');
const met = units('metric');

describe('imperial display units (NIST SP 811, Appendix B)', () => {
  it.each([
    // [quantity, SI value, display value, source]
    ['length', 0.0254, 1, 'inch = 0.0254 m exactly (NIST SP 811 B.8)'],
    ['volume', 1.6387064e-5, 1, 'cubic inch = 1.6387064 × 10⁻⁵ m³ exactly (B.8)'],
    ['pressure', 6.894757e3, 1, 'pound-force per square inch = 6.894757 × 10³ Pa (B.8)'],
    ['pressure', 101325, 14.69595, 'standard atmosphere 101325 Pa = 14.69595 psi (B.8 lists both factors)'],
    ['torque', 1.355818, 1, 'pound-force foot = 1.355818 N·m (B.9, torque)'],
    ['power', 7.456999e2, 1, 'horsepower (550 ft·lbf/s) = 7.456999 × 10² W (B.8)'],
    ['mass', 6.479891e-5, 1, 'grain = 6.479891 × 10⁻⁵ kg exactly (B.8)'],
    ['massFlow', 0.45359237 / 60, 1, 'pound per minute = 0.45359237 kg / 60 s (B.8: pound avoirdupois)'],
  ] as const)('%s: %s SI is %s (%s)', (q, si, shown, _source) => {
    expect(imp.num(q, si)).toBeCloseTo(shown, 5);
  });

  it('temperatures: 293.15 K is 68 °F and 20 °C (NIST SP 811 B.9: t/°F = 1.8·T/K − 459.67)', () => {
    expect(imp.num('temperature', 293.15)).toBeCloseTo(68, 9);
    expect(met.num('temperature', 293.15)).toBeCloseTo(20, 9);
    expect(imp.text('temperature', 273.15)).toBe('32.0 °F');
  });

  it('labels carry the unit for titles, and text never shows "-0.0"', () => {
    expect(imp.bracket('pressure')).toBe('[psi]');
    expect(met.bracket('massFlow')).toBe('[g/s]');
    expect(met.text('pressure', -10)).toBe('0.0 kPa');
    expect(met.text('length', 0.38)).toBe('380.0 mm');
  });
});
