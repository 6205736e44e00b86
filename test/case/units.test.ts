import { describe, expect, it } from 'vitest';
import { parseQuantity, type QuantityKind } from '../../src/case/units.js';

function value(v: unknown, kind: QuantityKind): number {
  const r = parseQuantity(v, kind);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

describe('parseQuantity: conversions to model units', () => {
  // [input, kind, expected model value, source]
  it.each([
    ['1 in', 'length', 0.0254, 'NIST SP 811 (2008) B.8: 1 in = 2.54 E-02 m, exact'],
    ['12 in', 'length', 0.3048, 'NIST SP 811: 1 ft = 0.3048 m, exact'],
    ['320 mm', 'length', 0.32, 'SI prefix milli'],
    ['320mm', 'length', 0.32, 'SI prefix milli; no space'],
    ['3.2 cm', 'length', 0.032, 'SI prefix centi'],
    [0.32, 'length', 0.32, 'a bare number is already SI'],
    ['1 ci', 'volume', 16.387064e-6, 'NIST SP 811: 1 in³ = 1.638 706 4 E-05 m³, exact'],
    ['450 cc', 'volume', 450e-6, '1 cc = 1 cm³'],
    ['6 L', 'volume', 6e-3, 'NIST SP 811: 1 L = 1 E-03 m³'],
    ['1 psi', 'pressure', 6894.757, 'NIST SP 811: 1 psi = 6.894 757 E+03 Pa'],
    ['14.69595 psi', 'pressure', 101325, 'standard atmosphere 101325 Pa ≈ 14.69595 psi (NIST SP 811 factor)'],
    ['1 bar', 'pressure', 1e5, 'NIST SP 811: 1 bar = 1 E+05 Pa, exact'],
    ['101.325 kPa', 'pressure', 101325, 'U.S. Standard Atmosphere 1976 sea-level pressure'],
    ['1 inH2O', 'pressure', 249.0889, 'NIST SP 811, inch of water, conventional: 2.490 889 E+02 Pa (from memory); = 0.0254 m × 1000 kg/m³ × 9.80665 m/s²'],
    ['0 degC', 'temperature', 273.15, 'SI: T/K = t/°C + 273.15'],
    ['20 degC', 'temperature', 293.15, 'SI: T/K = t/°C + 273.15'],
    ['68 degF', 'temperature', 293.15, 'NIST SP 811: T/K = (t/°F + 459.67)/1.8'],
    ['-40 degF', 'temperature', 233.15, 'NIST SP 811: −40 °F = −40 °C'],
    ['288.15 K', 'temperature', 288.15, 'kelvin is the model unit'],
    ['-5 deg', 'angle', -5, 'crank degrees are the model unit'],
    ['6500 rpm', 'speed', 6500, 'rpm is the model unit'],
    ['6500rpm', 'speed', 6500, 'rpm, no space'],
    ['0.632 ms', 'time', 0.000632, 'SI prefix milli'],
    ['43 MJ/kg', 'specificEnergy', 43e6, 'SI prefix mega'],
    ['1e5 Pa', 'pressure', 1e5, 'exponent notation'],
    ['12.5', 'dimensionless', 12.5, 'a number in a string'],
  ] as const)('%s (%s) = %d — %s', (input, kind, expected, _source) => {
    // relative agreement to 2e-7, whatever the magnitude (the sources give 7 significant figures)
    expect(Math.abs(value(input, kind) - expected)).toBeLessThanOrEqual(Math.abs(expected) * 2e-7);
  });
});

describe('parseQuantity: bad values', () => {
  it.each([
    ['5 kPa', 'length', "unit 'kPa' is a pressure, expected a length"],
    ['5 mm', 'pressure', "unit 'mm' is a length, expected a pressure"],
    ['5 degC', 'volume', "unit 'degC' is a temperature, expected a volume"],
    ['30 rpm', 'angle', "unit 'rpm' is a speed, expected an angle"],
    ['5 furlong', 'length', "unknown unit 'furlong'"],
    ['5 mm', 'dimensionless', 'expected a plain number'],
    ['long', 'length', "got 'long'"],
    [true, 'length', 'got boolean true'],
    [[1, 2], 'length', 'got a list'],
    [Number.POSITIVE_INFINITY, 'length', 'finite'],
  ] as const)('%j as %s: %s', (input, kind, message) => {
    const r = parseQuantity(input, kind);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain(message);
  });

  it('lists the units of the expected kind when the unit is unknown', () => {
    const r = parseQuantity('3 gallon', 'volume');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/cc.*L.*ci/);
  });
});
