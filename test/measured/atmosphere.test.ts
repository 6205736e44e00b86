/**
 * Altitude: the U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF, 1976).
 * Check values from its tables: sea level 101325 Pa, 288.15 K; 1500 m
 * 84.56 kPa, 278.4 K (the check); 11 km 22.632 kPa, 216.65 K.
 */
import { describe, expect, it } from 'vitest';
import { standardAtmosphere } from '../../src/core/atmosphere.js';
import { parseCase } from '../../src/case/load.js';
import { baseCase } from '../case/fixture.js';
import YAML from 'yaml';

describe('U.S. Standard Atmosphere 1976', () => {
  it.each([
    // [geometric altitude m, p kPa, T K, p tolerance kPa] — U.S. Standard Atmosphere 1976 tables
    [0, 101.325, 288.15, 0.001],
    [1500, 84.56, 278.4, 0.005],
    [11000, 22.7, 216.77, 0.05], // 11 km geometric is 10 981 m geopotential, just below the tropopause (table: 22.700 kPa, 216.774 K)
  ])('%d m: %f kPa, %f K', (z, p, T, tol) => {
    const a = standardAtmosphere(z);
    expect(Math.abs(a.pressure / 1000 - p)).toBeLessThan(tol);
    expect(a.temperature).toBeCloseTo(T, 1);
  });

  it('is continuous at the tropopause (geopotential 11 km) and isothermal above it', () => {
    const z = (h: number) => (6356766 * h) / (6356766 - h); // geometric altitude of geopotential h
    const below = standardAtmosphere(z(11000) - 1e-6);
    const above = standardAtmosphere(z(11000) + 1e-6);
    expect(above.pressure).toBeCloseTo(below.pressure, 3);
    expect(standardAtmosphere(z(15000)).temperature).toBeCloseTo(216.65, 9);
    // table value at 11 km geopotential: 22 632.06 Pa (U.S. Standard Atmosphere 1976)
    expect(below.pressure).toBeCloseTo(22632.06, 0);
  });
});

describe('ambient.altitude in a case', () => {
  const load = (ambient: Record<string, unknown>) => {
    const d = baseCase();
    d.ambient = ambient;
    return parseCase(YAML.stringify(d));
  };
  it('gives pressure and temperature when neither is stated', () => {
    const c = load({ altitude: '1500 m' });
    expect(c.model.ambient.pressure / 1000).toBeCloseTo(84.56, 2);
    expect(c.model.ambient.temperature).toBeCloseTo(278.4, 1);
  });
  it('a stated temperature (or pressure) wins over the standard one', () => {
    const c = load({ altitude: '1500 m', temperature: '30 degC' });
    expect(c.model.ambient.temperature).toBeCloseTo(303.15, 9);
    expect(c.model.ambient.pressure / 1000).toBeCloseTo(84.56, 2);
    expect(load({ altitude: 1500, pressure: '90 kPa' }).model.ambient.pressure).toBe(90000);
  });
  it('an engine at 1500 m breathes less air than at sea level (common practice: about 15 % less density)', () => {
    const sea = load({ altitude: 0 });
    const high = load({ altitude: 1500 });
    const rho = (m: typeof sea) => m.model.ambient.pressure / m.model.ambient.temperature;
    // table densities 1.0581 and 1.2250 kg/m³ (U.S. Standard Atmosphere 1976; the 1500 m value from memory): ratio 0.8638
    expect(rho(high) / rho(sea)).toBeCloseTo(0.8638, 3);
  });
  it.each([
    [{ temperature: 290 }, 'ambient.pressure', 'altitude'],
    [{ altitude: 40000 }, 'ambient.altitude', 'between'],
    [{ altitude: '5 kPa' }, 'ambient.altitude', 'expected a length'],
  ])('refuses %j', (ambient, path, words) => {
    expect(() => load(ambient)).toThrow(new RegExp(`${path.replace('.', '\\.')}: .*${words}`));
  });
});
