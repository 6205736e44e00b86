/**
 * Display units of the report: SI values in, text in the chosen system out.
 *
 * A small local table until the one formatting layer of the text commands
 * (issue 12, `--units metric|imperial`) exists; when `cli/format.ts` grows an
 * imperial mode this file should give way to it. Factors are those of NIST
 * Special Publication 811 (2008), Appendix B.8/B.9:
 *   1 in        = 0.0254 m (exact)
 *   1 in³       = 1.6387064 × 10⁻⁵ m³ (exact)
 *   1 psi       = 6.894757 × 10³ Pa
 *   1 lbf·ft    = 1.355818 N·m
 *   1 hp (550 ft·lbf/s) = 7.456999 × 10² W
 *   1 lb (avoirdupois)  = 0.45359237 kg (exact)
 *   1 gr (grain)        = 6.479891 × 10⁻⁵ kg (exact)
 *   t/°F = 1.8·(T/K) − 459.67 (exact)
 *
 * Each quantity has one unit per system; `scale` turns the SI value into the
 * display number, `label` is what goes in brackets in titles ("[kPa]").
 */

export type UnitSystem = 'metric' | 'imperial';
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

export type ReportQuantity =
  | 'length'
  | 'shortLength'
  | 'volume'
  | 'smallVolume'
  | 'pressure'
  | 'temperature'
  | 'torque'
  | 'power'
  | 'massFlow'
  | 'mass'
  | 'heatingValue';

/** NIST SP 811 factors (SI per unit) */
export const NIST = {
  inch: 0.0254,
  cubicInch: 1.6387064e-5,
  psi: 6.894757e3,
  poundForceFoot: 1.355818,
  horsepower: 745.6999,
  pound: 0.45359237,
  grain: 6.479891e-5,
} as const;

export interface DisplayUnit {
  /** the unit's symbol, e.g. "kPa" */
  label: string;
  /** SI value → display number */
  toDisplay: (si: number) => number;
  /** decimals normally shown */
  decimals: number;
}

const linear = (label: string, siPerUnit: number, decimals: number): DisplayUnit => ({
  label,
  toDisplay: (si) => si / siPerUnit,
  decimals,
});

const TABLE: Record<UnitSystem, Record<ReportQuantity, DisplayUnit>> = {
  metric: {
    length: linear('mm', 1e-3, 1),
    shortLength: linear('mm', 1e-3, 2),
    volume: linear('L', 1e-3, 2),
    smallVolume: linear('cc', 1e-6, 1),
    pressure: linear('kPa', 1e3, 1),
    temperature: { label: '°C', toDisplay: (k) => k - 273.15, decimals: 1 },
    torque: linear('N·m', 1, 1),
    power: linear('kW', 1e3, 1),
    massFlow: linear('g/s', 1e-3, 1),
    mass: linear('mg', 1e-6, 1),
    heatingValue: linear('MJ/kg', 1e6, 1),
  },
  imperial: {
    length: linear('in', NIST.inch, 2),
    shortLength: linear('in', NIST.inch, 3),
    volume: linear('in³', NIST.cubicInch, 0),
    smallVolume: linear('in³', NIST.cubicInch, 2),
    pressure: linear('psi', NIST.psi, 2),
    temperature: { label: '°F', toDisplay: (k) => 1.8 * k - 459.67, decimals: 1 },
    torque: linear('lb·ft', NIST.poundForceFoot, 1),
    power: linear('hp', NIST.horsepower, 1),
    massFlow: linear('lb/min', NIST.pound / 60, 2),
    mass: linear('gr', NIST.grain, 2),
    heatingValue: linear('MJ/kg', 1e6, 1),
  },
};

/** The display unit of a quantity in a system. */
export function unitOf(system: UnitSystem, q: ReportQuantity): DisplayUnit {
  return TABLE[system][q];
}

/** fixed decimals, '—' when not finite, never "-0.0" */
export function fixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return '—';
  const s = v.toFixed(decimals);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** A formatter bound to one unit system. */
export interface Units {
  system: UnitSystem;
  unit: (q: ReportQuantity) => DisplayUnit;
  /** the display number of an SI value */
  num: (q: ReportQuantity, si: number) => number;
  /** "380.0 mm" */
  text: (q: ReportQuantity, si: number, decimals?: number) => string;
  /** "[mm]", for axis and column titles */
  bracket: (q: ReportQuantity) => string;
}

export function units(system: UnitSystem): Units {
  const unit = (q: ReportQuantity) => unitOf(system, q);
  return {
    system,
    unit,
    num: (q, si) => unit(q).toDisplay(si),
    text: (q, si, d) => {
      const u = unit(q);
      return `${fixed(u.toDisplay(si), d ?? u.decimals)} ${u.label}`;
    },
    bracket: (q) => `[${unit(q).label}]`,
  };
}
