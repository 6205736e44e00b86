/**
 * Display units: SI values in, text in the chosen system out. The one table
 * of units for the text commands (src/cli), the terminal view (src/ui) and
 * the report (src/report). Loading (src/case) stays SI; this is display only.
 *
 * Factors are those of NIST Special Publication 811 (2008), Appendix B.8/B.9:
 *   1 in        = 0.0254 m (exact)
 *   1 ft        = 0.3048 m (exact)
 *   1 in³       = 1.6387064 × 10⁻⁵ m³ (exact)
 *   1 psi       = 6.894757 × 10³ Pa
 *   1 inHg (conventional, 0 °C) = 3.386389 × 10³ Pa
 *   1 lbf·ft    = 1.355818 N·m
 *   1 hp (550 ft·lbf/s) = 7.456999 × 10² W (745.699872 W)
 *   1 lb (avoirdupois)  = 0.45359237 kg (exact)
 *   1 gr (grain)        = 6.479891 × 10⁻⁵ kg (exact)
 *   t/°F = 1.8·(T/K) − 459.67 (exact)
 *
 * Each quantity has one unit per system. Pressures: absolute pressures in kPa
 * or psi; a pressure against ambient ("vs ambient", a gauge reading) and the
 * barometer in kPa or inHg, as a shop's vacuum gauge and weather report read.
 */
import { fixed, signedFixed } from './number.js';

export type UnitSystem = 'metric' | 'imperial';
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

export type Quantity =
  /** runner and pipe lengths */
  | 'length'
  /** lift, valve and pipe diameters */
  | 'shortLength'
  /** plenum and airbox volumes */
  | 'volume'
  /** displacement, chamber, cavity volumes */
  | 'smallVolume'
  /** absolute pressure */
  | 'pressure'
  /** a pressure against ambient (gauge) */
  | 'gauge'
  /** the ambient (barometric) pressure */
  | 'barometric'
  | 'temperature'
  | 'torque'
  | 'power'
  | 'massFlow'
  /** the charge of one cycle */
  | 'mass'
  | 'heatingValue'
  /** valve curtain area */
  | 'area'
  /** speed of sound and gas speed */
  | 'speed';

/** @deprecated the report's old name of Quantity */
export type ReportQuantity = Quantity;

/** NIST SP 811 factors (SI per unit) */
export const NIST = {
  inch: 0.0254,
  foot: 0.3048,
  cubicInch: 1.6387064e-5,
  psi: 6.894757e3,
  inchOfMercury: 3.386389e3,
  poundForceFoot: 1.355818,
  horsepower: 745.699872,
  pound: 0.45359237,
  grain: 6.479891e-5,
} as const;

export interface DisplayUnit {
  /** the unit's symbol, e.g. "kPa" */
  label: string;
  /** SI value → display number */
  toDisplay: (si: number) => number;
  /** display number → SI value */
  toSi: (shown: number) => number;
  /** decimals normally shown */
  decimals: number;
  /** true when a difference converts with the same factor but no offset (°C, °F) */
  offset?: boolean;
}

const linear = (label: string, siPerUnit: number, decimals: number): DisplayUnit => ({
  label,
  toDisplay: (si) => si / siPerUnit,
  toSi: (shown) => shown * siPerUnit,
  decimals,
});

const TABLE: Record<UnitSystem, Record<Quantity, DisplayUnit>> = {
  metric: {
    length: linear('mm', 1e-3, 1),
    shortLength: linear('mm', 1e-3, 2),
    volume: linear('L', 1e-3, 2),
    smallVolume: linear('cc', 1e-6, 1),
    pressure: linear('kPa', 1e3, 1),
    gauge: linear('kPa', 1e3, 1),
    barometric: linear('kPa', 1e3, 1),
    temperature: { label: '°C', toDisplay: (k) => k - 273.15, toSi: (c) => c + 273.15, decimals: 1, offset: true },
    torque: linear('N·m', 1, 1),
    power: linear('kW', 1e3, 1),
    massFlow: linear('g/s', 1e-3, 1),
    mass: linear('mg', 1e-6, 1),
    heatingValue: linear('MJ/kg', 1e6, 1),
    area: linear('cm²', 1e-4, 2),
    speed: linear('m/s', 1, 1),
  },
  imperial: {
    length: linear('in', NIST.inch, 2),
    shortLength: linear('in', NIST.inch, 3),
    volume: linear('ci', NIST.cubicInch, 0),
    smallVolume: linear('ci', NIST.cubicInch, 2),
    pressure: linear('psi', NIST.psi, 2),
    gauge: linear('inHg', NIST.inchOfMercury, 2),
    barometric: linear('inHg', NIST.inchOfMercury, 2),
    temperature: { label: '°F', toDisplay: (k) => 1.8 * k - 459.67, toSi: (f) => (f + 459.67) / 1.8, decimals: 1, offset: true },
    torque: linear('lb·ft', NIST.poundForceFoot, 1),
    power: linear('hp', NIST.horsepower, 1),
    massFlow: linear('lb/min', NIST.pound / 60, 2),
    mass: linear('gr', NIST.grain, 2),
    heatingValue: linear('MJ/kg', 1e6, 1),
    area: linear('in²', NIST.inch * NIST.inch, 3),
    speed: linear('ft/s', NIST.foot, 0),
  },
};

/** The display unit of a quantity in a system. */
export function unitOf(system: UnitSystem, q: Quantity): DisplayUnit {
  return TABLE[system][q];
}

/** A unit system from text (an option or a case value); undefined when it is neither. */
export function unitSystemOf(text: string): UnitSystem | undefined {
  return (UNIT_SYSTEMS as readonly string[]).includes(text) ? (text as UnitSystem) : undefined;
}

/** A formatter bound to one unit system. */
export interface Units {
  system: UnitSystem;
  unit: (q: Quantity) => DisplayUnit;
  /** the unit's symbol, "kPa" */
  label: (q: Quantity) => string;
  /** the display number of an SI value */
  num: (q: Quantity, si: number) => number;
  /** the display number alone, "380.0" */
  value: (q: Quantity, si: number, decimals?: number) => string;
  /** "380.0 mm" */
  text: (q: Quantity, si: number, decimals?: number) => string;
  /** a difference with its sign, no unit: "+3.2", "−1.5" (temperatures: no offset) */
  signed: (q: Quantity, siDifference: number, decimals?: number) => string;
  /** "[mm]", for axis and column titles */
  bracket: (q: Quantity) => string;
}

export function units(system: UnitSystem): Units {
  const unit = (q: Quantity) => unitOf(system, q);
  const diff = (q: Quantity, d: number) => {
    const u = unit(q);
    return u.offset ? u.toDisplay(d) - u.toDisplay(0) : u.toDisplay(d);
  };
  return {
    system,
    unit,
    label: (q) => unit(q).label,
    num: (q, si) => unit(q).toDisplay(si),
    value: (q, si, d) => fixed(unit(q).toDisplay(si), d ?? unit(q).decimals),
    text: (q, si, d) => {
      const u = unit(q);
      return `${fixed(u.toDisplay(si), d ?? u.decimals)} ${u.label}`;
    },
    signed: (q, si, d) => signedFixed(diff(q, si), d ?? unit(q).decimals),
    bracket: (q) => `[${unit(q).label}]`,
  };
}

export const METRIC = units('metric');
export const IMPERIAL = units('imperial');
