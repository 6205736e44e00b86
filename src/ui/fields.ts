/**
 * The case values the case panel lets you change, in the units people use
 * at the bench. An edit becomes a case-file override (`path` = `value unit`),
 * the same form as `--set` on the command line, so the case loader does every
 * unit conversion; the panel only shows and types numbers.
 */
import { fixed } from '../present/number.js';
import { unitOf, type Quantity, type UnitSystem } from '../present/units.js';
import { UNITS } from '../case/units.js';

export interface FieldDef {
  /** case-file path, as for `--set` */
  path: string;
  label: string;
  /** unit shown beside the value */
  unit: string;
  /** the unit word written into the override ('' = a plain number) */
  unitWord: string;
  /** the step of the larger/smaller keys */
  step: number;
  decimals: number;
  /** short help shown while the field is selected */
  hint: string;
}

export const FIELDS: readonly FieldDef[] = [
  {
    path: 'rpm',
    label: 'Engine speed',
    unit: 'rpm',
    unitWord: '',
    step: 250,
    decimals: 0,
    hint: 'the speed of this point; + and - change it from any view',
  },
  {
    path: 'runner.length',
    label: 'Runner length',
    unit: 'mm',
    unitWord: 'mm',
    step: 10,
    decimals: 0,
    hint: 'longer: the wave takes longer to come back, tuned speed goes down',
  },
  {
    path: 'runner.diameter',
    label: 'Runner diameter',
    unit: 'mm',
    unitWord: 'mm',
    step: 1,
    decimals: 1,
    hint: 'smaller: faster gas and stronger waves, but more restriction at high speed',
  },
  {
    path: 'runner.entryLoss',
    label: 'Entry loss K',
    unit: '',
    unitWord: '',
    step: 0.05,
    decimals: 2,
    hint: 'loss coefficient at the open end: a bellmouth about 0.05, a plain pipe end 0.5',
  },
  {
    path: 'inlet.volume',
    label: 'Plenum volume',
    unit: 'L',
    unitWord: 'L',
    step: 0.25,
    decimals: 2,
    hint: 'the airbox the runner draws from',
  },
  {
    path: 'inlet.feedDiameter',
    label: 'Plenum feed dia.',
    unit: 'mm',
    unitWord: 'mm',
    step: 1,
    decimals: 1,
    hint: 'the hole that feeds the airbox; smaller restricts more and makes the box ring lower',
  },
  {
    path: 'inlet.feedCd',
    label: 'Plenum feed Cd',
    unit: '',
    unitWord: '',
    step: 0.05,
    decimals: 2,
    hint: 'discharge coefficient of the feed hole (0..1): a sharp edge about 0.6, a rounded one up to 0.95',
  },
  {
    path: 'inlet.snorkel.length',
    label: 'Snorkel length',
    unit: 'mm',
    unitWord: 'mm',
    step: 10,
    decimals: 0,
    hint: 'the airbox mouth; longer or narrower: the box rings at a lower speed',
  },
  {
    path: 'inlet.snorkel.diameter',
    label: 'Snorkel diameter',
    unit: 'mm',
    unitWord: 'mm',
    step: 1,
    decimals: 1,
    hint: 'wider: the box rings at a higher speed and restricts less',
  },
  {
    path: 'inlet.snorkel.entryLoss',
    label: 'Snorkel entry loss K',
    unit: '',
    unitWord: '',
    step: 0.05,
    decimals: 2,
    hint: 'loss coefficient at the snorkel mouth: a bellmouth about 0.05, a plain pipe end 0.5',
  },
  {
    path: 'exhaust.pipe.length',
    label: 'Exhaust pipe length',
    unit: 'mm',
    unitWord: 'mm',
    step: 10,
    decimals: 0,
    hint: 'from the exhaust valve to the silencer; sets when its suction wave reaches the overlap',
  },
  {
    path: 'exhaust.pipe.diameter',
    label: 'Exhaust pipe dia.',
    unit: 'mm',
    unitWord: 'mm',
    step: 1,
    decimals: 1,
    hint: 'smaller: stronger pulses, more restriction at high speed',
  },
  {
    path: 'intake.diameter',
    label: 'Intake valve dia.',
    unit: 'mm',
    unitWord: 'mm',
    step: 0.5,
    decimals: 1,
    hint: 'valve head diameter; bigger flows more at the same lift (the curtain area is π·D·lift)',
  },
  {
    path: 'intake.maxLift',
    label: 'Intake max lift',
    unit: 'mm',
    unitWord: 'mm',
    step: 0.25,
    decimals: 2,
    hint: 'peak valve lift; past about a quarter of the diameter more lift adds little flow',
  },
  {
    path: 'intake.opens',
    label: 'Intake opens',
    unit: '° BTDC',
    unitWord: 'deg',
    step: 2,
    decimals: 0,
    hint: 'degrees before top dead centre at the start of the intake stroke',
  },
  {
    path: 'intake.closes',
    label: 'Intake closes',
    unit: '° ABDC',
    unitWord: 'deg',
    step: 2,
    decimals: 0,
    hint: 'degrees after bottom dead centre; later closing suits higher speeds',
  },
  {
    path: 'exhaust.opens',
    label: 'Exhaust opens',
    unit: '° BBDC',
    unitWord: 'deg',
    step: 2,
    decimals: 0,
    hint: 'degrees before bottom dead centre of the power stroke',
  },
  {
    path: 'exhaust.closes',
    label: 'Exhaust closes',
    unit: '° ATDC',
    unitWord: 'deg',
    step: 2,
    decimals: 0,
    hint: 'degrees after top dead centre; with intake opening this sets the overlap',
  },
  {
    path: 'engine.compressionRatio',
    label: 'Compression ratio',
    unit: ': 1',
    unitWord: '',
    step: 0.5,
    decimals: 1,
    hint: 'swept plus clearance volume over clearance; higher leaves less residual gas (re-check detonation margin)',
  },
  {
    path: 'ambient.pressure',
    label: 'Ambient pressure',
    unit: 'kPa',
    unitWord: 'kPa',
    step: 1,
    decimals: 1,
    hint: 'the air the engine breathes; lower at altitude',
  },
  {
    path: 'ambient.temperature',
    label: 'Ambient temperature',
    unit: '°C',
    unitWord: 'degC',
    step: 5,
    decimals: 0,
    hint: 'warmer air is thinner and carries sound faster',
  },
];

/**
 * The fields of a runner given as sections (upstream end first): each
 * section's length and its start and end diameters.
 */
export function sectionFields(count: number): FieldDef[] {
  const out: FieldDef[] = [];
  for (let i = 0; i < count; i++) {
    const n = i + 1;
    const base = `runner.sections.${i}`;
    const where = i === 0 ? ' (open end)' : i === count - 1 ? ' (valve end)' : '';
    out.push(
      {
        path: `${base}.length`,
        label: `Section ${n} length`,
        unit: 'mm',
        unitWord: 'mm',
        step: 10,
        decimals: 0,
        hint: `runner section ${n}${where}; a longer runner tunes to a lower speed`,
      },
      {
        path: `${base}.diameterStart`,
        label: `Section ${n} start dia.`,
        unit: 'mm',
        unitWord: 'mm',
        step: 1,
        decimals: 1,
        hint: `diameter where section ${n} begins (the end nearer the open end)`,
      },
      {
        path: `${base}.diameterEnd`,
        label: `Section ${n} end dia.`,
        unit: 'mm',
        unitWord: 'mm',
        step: 1,
        decimals: 1,
        hint: `diameter where section ${n} ends (the end nearer the valve)`,
      },
    );
  }
  return out;
}

/** The fields of side resonator i (`kind` tube: at, length, diameter; helmholtz: at, neck and volume). */
export function resonatorFields(i: number, kind: 'tube' | 'helmholtz'): FieldDef[] {
  const n = i + 1;
  const base = `runner.resonator.${i}`;
  const mm = (key: string, label: string, step: number, decimals: number, hint: string): FieldDef => ({
    path: `${base}.${key}`,
    label,
    unit: 'mm',
    unitWord: 'mm',
    step,
    decimals,
    hint,
  });
  const at = mm('at', `Resonator ${n} at`, 10, 0, `where resonator ${n} joins the runner, measured from the valve`);
  if (kind === 'tube')
    return [
      at,
      mm('length', `Resonator ${n} length`, 10, 0, 'a closed side tube: longer, it works at a lower frequency (a quarter wave)'),
      mm('diameter', `Resonator ${n} dia.`, 1, 1, 'wider: a stronger and broader effect'),
    ];
  return [
    at,
    mm('neckLength', `Resonator ${n} neck`, 5, 0, 'a longer neck lowers the Helmholtz frequency'),
    mm('neckDiameter', `Resonator ${n} neck dia.`, 1, 1, 'a wider neck raises the Helmholtz frequency'),
    { path: `${base}.volume`, label: `Resonator ${n} volume`, unit: 'L', unitWord: 'L', step: 0.05, decimals: 2, hint: 'a bigger cavity lowers the Helmholtz frequency' },
  ];
}

export function fieldByPath(path: string, fields: readonly FieldDef[] = FIELDS): FieldDef | undefined {
  return fields.find((f) => f.path === path);
}

/** The override text for a value typed in display units, e.g. "320 mm". */
export function overrideText(field: FieldDef, value: number): string {
  const v = roundTo(value, field.decimals + 2);
  return field.unitWord ? `${v} ${field.unitWord}` : `${v}`;
}

export function formatField(field: FieldDef, value: number): string {
  return fixed(value, field.decimals);
}

export function roundTo(v: number, decimals: number): number {
  const f = Math.pow(10, decimals);
  return Math.round(v * f) / f;
}

/** Parse a typed number ("320", "320.5", "-4"); undefined when it is not one. */
export function parseTyped(text: string): number | undefined {
  // the minus sign the screens show (−) is read as a minus too
  const t = text.trim().replace(/^−/, '-');
  if (!/^[-+]?(\d+(\.\d*)?|\.\d+)$/.test(t)) return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

/**
 * A field as the user sees it in a unit system: its unit, decimals and step
 * there, and the conversions between the value kept (the field's own,
 * metric unit, which the override is written in) and the value shown.
 * Imperial: mm → in, L → ci, kPa → psi, °C → °F, through the case loader's
 * unit table (field unit → SI) and the presentation layer's (SI → shown,
 * NIST SP 811 factors); every other field, and every field in metric, as is.
 */
export interface FieldView {
  def: FieldDef;
  toShown: (kept: number) => number;
  fromShown: (shown: number) => number;
}

/** [unitWord] → the quantity whose imperial unit the field is shown in, and the decimals it gains */
const IMPERIAL_OF: Readonly<Record<string, { q: Quantity; decimals: number }>> = {
  mm: { q: 'length', decimals: 2 },
  L: { q: 'volume', decimals: -1 },
  kPa: { q: 'pressure', decimals: 1 },
  degC: { q: 'temperature', decimals: 0 },
};

/** the 1–2–2.5–5 step nearest `x` (by ratio) */
export function niceStep(x: number): number {
  if (!(x > 0)) return x;
  const k = Math.floor(Math.log10(x));
  let best = x;
  let bestRatio = Number.POSITIVE_INFINITY;
  for (const m of [1, 2, 2.5, 5, 10]) {
    const c = m * Math.pow(10, k);
    const ratio = Math.max(c / x, x / c);
    if (ratio < bestRatio) {
      best = c;
      bestRatio = ratio;
    }
  }
  return best;
}

/** a value in SI → the unit `unitWord` of the case loader's table ('' or unknown: as is) */
export function siToUnit(si: number, unitWord: string): number {
  const u = unitWord ? UNITS[unitWord] : undefined;
  if (!u) return si;
  const zero = u.toModel(0);
  return (si - zero) / (u.toModel(1) - zero);
}

export function fieldIn(field: FieldDef, system: UnitSystem): FieldView {
  const imp = system === 'imperial' ? IMPERIAL_OF[field.unitWord] : undefined;
  const kept = UNITS[field.unitWord];
  if (!imp || !kept) return { def: field, toShown: (v) => v, fromShown: (x) => x };
  const shown = unitOf('imperial', imp.q);
  const decimals = Math.max(0, field.decimals + imp.decimals);
  // a step is a difference: no offset (1 °C of step is 1.8 °F)
  const stepShown = shown.toDisplay(kept.toModel(field.step)) - shown.toDisplay(kept.toModel(0));
  return {
    def: { ...field, unit: field.unit.replace(/^(mm|L|kPa|°C)/, shown.label), step: roundTo(niceStep(stepShown), 6), decimals },
    toShown: (v) => shown.toDisplay(kept.toModel(v)),
    fromShown: (x) => siToUnit(shown.toSi(x), field.unitWord),
  };
}
