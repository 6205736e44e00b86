/**
 * Dimensional values of a case file, converted to the model's units.
 *
 * A value is either a plain number, already in the model unit of its kind, or
 * a string "<number> <unit>" (the space is optional: "320mm" works too).
 *
 * Model units by kind (what a bare number means):
 *   length [m], volume [m³], pressure [Pa], temperature [K], angle [deg],
 *   speed [rpm], time [s], velocity [m/s], specific energy [J/kg],
 *   dimensionless [-].
 * Angles and speeds stay in the trade's units (degrees of crank, rpm): the
 * core works in those.
 *
 * Exact factors (NIST SP 811, 2008, Appendix B): 1 in = 0.0254 m;
 * 1 in³ = 16.387064 cm³; 1 psi = 6894.757293168 Pa (lbf/in² with
 * g_n = 9.80665 m/s², 1 lb = 0.45359237 kg); 1 bar = 1e5 Pa; conventional
 * inch of water = 0.0254 m · 1000 kg/m³ · 9.80665 m/s² = 249.08891 Pa;
 * degF → K: (t + 459.67)·5/9; degC → K: t + 273.15.
 */

export type QuantityKind =
  | 'length'
  | 'volume'
  | 'pressure'
  | 'temperature'
  | 'angle'
  | 'speed'
  | 'time'
  | 'velocity'
  | 'specificEnergy'
  | 'dimensionless';

interface UnitDef {
  kind: QuantityKind;
  toModel: (v: number) => number;
}

const scale =
  (kind: QuantityKind, f: number): UnitDef =>
  ({ kind, toModel: (v) => v * f });

/** divide by `d` (keeps decimal inputs like "86 mm" at the nearest double of 0.086) */
const per =
  (kind: QuantityKind, d: number): UnitDef =>
  ({ kind, toModel: (v) => v / d });

const INCH = 0.0254;
const G_N = 9.80665;
const LBF = 0.45359237 * G_N;

/** Unit symbols accepted in case files, by exact spelling. */
export const UNITS: Readonly<Record<string, UnitDef>> = {
  // length
  mm: per('length', 1000),
  cm: per('length', 100),
  m: scale('length', 1),
  in: scale('length', INCH),
  // volume
  cc: per('volume', 1e6),
  cm3: per('volume', 1e6),
  mL: per('volume', 1e6),
  L: per('volume', 1000),
  l: per('volume', 1000),
  ci: scale('volume', INCH ** 3),
  in3: scale('volume', INCH ** 3),
  m3: scale('volume', 1),
  // pressure
  Pa: scale('pressure', 1),
  kPa: scale('pressure', 1e3),
  MPa: scale('pressure', 1e6),
  mbar: scale('pressure', 1e2),
  bar: scale('pressure', 1e5),
  psi: scale('pressure', LBF / INCH ** 2),
  inH2O: scale('pressure', INCH * 1000 * G_N),
  // temperature (absolute scales)
  K: { kind: 'temperature', toModel: (v) => v },
  degC: { kind: 'temperature', toModel: (v) => v + 273.15 },
  degF: { kind: 'temperature', toModel: (v) => ((v + 459.67) * 5) / 9 },
  // angle
  deg: scale('angle', 1),
  // speed
  rpm: scale('speed', 1),
  // time
  s: scale('time', 1),
  ms: per('time', 1000),
  us: per('time', 1e6),
  // velocity
  'm/s': scale('velocity', 1),
  // specific energy (fuel heating value)
  'J/kg': scale('specificEnergy', 1),
  'kJ/kg': scale('specificEnergy', 1e3),
  'MJ/kg': scale('specificEnergy', 1e6),
};

/** The model unit of each kind, for messages. */
export const MODEL_UNIT: Readonly<Record<QuantityKind, string>> = {
  length: 'm',
  volume: 'm³',
  pressure: 'Pa',
  temperature: 'K',
  angle: 'deg',
  speed: 'rpm',
  time: 's',
  velocity: 'm/s',
  specificEnergy: 'J/kg',
  dimensionless: '-',
};

const ARTICLE: Readonly<Record<QuantityKind, string>> = {
  length: 'a length',
  volume: 'a volume',
  pressure: 'a pressure',
  temperature: 'a temperature',
  angle: 'an angle',
  speed: 'a speed',
  time: 'a time',
  velocity: 'a velocity',
  specificEnergy: 'an energy per mass',
  dimensionless: 'a plain number',
};

/** Unit symbols of one kind, for messages. */
export function unitsOfKind(kind: QuantityKind): string[] {
  return Object.keys(UNITS).filter((u) => UNITS[u]!.kind === kind);
}

export type QuantityResult = { ok: true; value: number } | { ok: false; message: string };

const NUMBER_UNIT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(\S*)\s*$/;

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (value instanceof Uint8Array) return 'binary data (a !!binary value)';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a mapping';
  if (typeof value === 'string') return `'${value}'`;
  return `${typeof value} ${String(value)}`;
}

/**
 * Parse a dimensional value of the given kind into the model unit.
 * Returns a message (without the field path) when it is not valid.
 */
export function parseQuantity(value: unknown, kind: QuantityKind): QuantityResult {
  const expected =
    kind === 'dimensionless'
      ? 'a number'
      : `a number in ${MODEL_UNIT[kind]} or a string like "<number> <unit>" (${unitsOfKind(kind).join(', ')})`;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return { ok: false, message: `expected a finite number, got ${value}` };
    return { ok: true, value };
  }
  if (typeof value !== 'string') return { ok: false, message: `expected ${expected}, got ${describe(value)}` };
  const m = NUMBER_UNIT.exec(value);
  if (!m) return { ok: false, message: `expected ${expected}, got '${value}'` };
  const num = Number(m[1]);
  const unit = m[2] ?? '';
  if (!Number.isFinite(num)) return { ok: false, message: `expected a finite number, got '${value}'` };
  if (unit === '') return { ok: true, value: num };
  const def = UNITS[unit];
  if (!def) {
    const known = kind === 'dimensionless' ? 'no unit' : `units: ${unitsOfKind(kind).join(', ')}`;
    return { ok: false, message: `unknown unit '${unit}' (${known})` };
  }
  if (def.kind !== kind) {
    if (kind === 'dimensionless') return { ok: false, message: `unit '${unit}' is ${ARTICLE[def.kind]}, expected a plain number` };
    return { ok: false, message: `unit '${unit}' is ${ARTICLE[def.kind]}, expected ${ARTICLE[kind]}` };
  }
  return { ok: true, value: def.toModel(num) };
}
