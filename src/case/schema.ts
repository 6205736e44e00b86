/**
 * The case-file schemas (zod v4): the engine case and the bare-pipe case.
 *
 * These are the ONE definition of what a case file may contain. Every
 * dimensional value goes through `parseQuantity` here, so the validated case
 * (`Case`, `PipeCase`) is already in model units: SI, with crank angles in
 * degrees and speeds in rpm. Unknown keys are errors (strict objects).
 *
 * `validateCase` / `validatePipeCase` never throw: they return the value or
 * a list of issues, each with a dotted field path and a message.
 */
import { z } from 'zod';
import type { ResonatorModel, SchemeName } from '../core/model.js';
import { DEFAULT_SCHEME as CORE_DEFAULT_SCHEME, characteristicsRangeIssue } from '../core/index.js';
import { parseQuantity, MODEL_UNIT, type QuantityKind } from './units.js';
import { ALTITUDE_LIMITS, standardAtmosphere } from '../core/atmosphere.js';
import { BENCH_DEFAULTS } from './flow-sheet.js';
import { didYouMean } from './suggest.js';

/** Default runner scheme when the case does not choose one: the core's. */
export const DEFAULT_SCHEME: SchemeName = CORE_DEFAULT_SCHEME;

/** plausibility limits of a runner [m]: past them a bare number meant as mm was read as m */
export const RUNNER_LIMITS = { length: 3, diameter: 0.3 } as const;
/** largest bore or stroke [m] */
export const ENGINE_SIZE_LIMIT = 0.5;

/** engine speeds a case may ask for [rpm]: below 100 a cycle takes seconds to simulate, above 100000 nothing is an engine */
export const RPM_LIMITS = { min: 100, max: 100000 } as const;

/**
 * The one check of an engine speed against RPM_LIMITS, used by the case's
 * rpm, sweep and band keys, --rpm of every command (a speed or a range) and
 * the terminal view's speed keys. Returns what is wrong, or undefined.
 */
export function speedProblem(rpm: number): string | undefined {
  if (rpm >= RPM_LIMITS.min && rpm <= RPM_LIMITS.max) return undefined;
  return `must be between ${RPM_LIMITS.min} and ${RPM_LIMITS.max} rpm, got ${shown(rpm)} rpm`;
}

/** A value as a message shows it: numbers as written (Infinity, NaN), strings quoted, else its kind. */
export function shown(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (typeof v === 'number') return Number.isInteger(v) || !Number.isFinite(v) ? String(v) : String(Number(v.toPrecision(6)));
  if (typeof v === 'string') return JSON.stringify(v);
  if (typeof v === 'boolean') return String(v);
  if (v instanceof Uint8Array) return 'binary data (a !!binary value)';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'a mapping';
  return typeof v;
}

export const SCHEMES: readonly SchemeName[] = ['characteristics', 'conservative'];

/** Named entry-loss coefficients accepted for runner.entryLoss. */
export const ENTRY_LOSS: Readonly<Record<string, number>> = {
  /** well-rounded bellmouth (common practice) */
  bellmouth: 0.05,
  /** plain sharp-edged pipe end (common practice) */
  plain: 0.5,
};

// ---------------------------------------------------------------- building blocks

interface QOpts {
  /** > 0 */
  positive?: boolean;
  /** ≥ 0 */
  nonNegative?: boolean;
}

/** the value as the case wrote it ("-380 mm"), else in the model unit */
function asWritten(raw: unknown, v: number, kind: QuantityKind): string {
  return typeof raw === 'string' && raw.trim() !== '' ? raw.trim() : fmt(v, kind);
}

function fmt(v: number, kind: QuantityKind): string {
  const u = MODEL_UNIT[kind];
  const s = Number.isInteger(v) ? String(v) : Number(v.toPrecision(6)).toString();
  return u === '-' ? s : `${s} ${u}`;
}

/** A dimensional value of one kind, converted to the model unit. */
function q(kind: QuantityKind, opts: QOpts = {}) {
  return z.unknown().transform((v, ctx): number => {
    if (v === undefined) {
      ctx.addIssue({ code: 'custom', message: 'required' });
      return z.NEVER;
    }
    const r = parseQuantity(v, kind);
    if (!r.ok) {
      ctx.addIssue({ code: 'custom', message: r.message });
      return z.NEVER;
    }
    if (opts.positive && !(r.value > 0)) {
      ctx.addIssue({ code: 'custom', message: `must be positive, got ${asWritten(v, r.value, kind)}` });
      return z.NEVER;
    }
    if (opts.nonNegative && !(r.value >= 0)) {
      ctx.addIssue({ code: 'custom', message: `must not be negative, got ${asWritten(v, r.value, kind)}` });
      return z.NEVER;
    }
    return r.value;
  });
}

const length = () => q('length', { positive: true });
const temperature = () => q('temperature', { positive: true });
const pressure = () => q('pressure', { positive: true });

/** A whole number ≥ min. */
function count(min: number) {
  return z.unknown().transform((v, ctx): number => {
    if (v === undefined) {
      ctx.addIssue({ code: 'custom', message: 'required' });
      return z.NEVER;
    }
    if (typeof v !== 'number' || !Number.isInteger(v) || v < min) {
      ctx.addIssue({ code: 'custom', message: `expected a whole number ≥ ${min}, got ${shown(v)}` });
      return z.NEVER;
    }
    return v;
  });
}

function bool() {
  return z.unknown().transform((v, ctx): boolean => {
    if (typeof v !== 'boolean') {
      ctx.addIssue({ code: 'custom', message: `expected true or false, got ${shown(v)}` });
      return z.NEVER;
    }
    return v;
  });
}

function oneOf<T extends string>(values: readonly T[]) {
  return z.unknown().transform((v, ctx): T => {
    if (typeof v !== 'string' || !values.includes(v as T)) {
      const got = shown(v);
      const hint = typeof v === 'string' ? didYouMean(v, values) : '';
      ctx.addIssue({ code: 'custom', message: `expected one of ${values.map((s) => `'${s}'`).join(', ')}, got ${got}${hint}` });
      return z.NEVER;
    }
    return v as T;
  });
}

/** A table of [x, y] pairs, x strictly increasing. */
function table(xName: string, yName: string, yMax: number) {
  return z.unknown().transform((v, ctx): { x: number; y: number }[] => {
    const bad = (message: string, path: (string | number)[] = []) => {
      ctx.addIssue({ code: 'custom', message, path });
      return z.NEVER;
    };
    if (!Array.isArray(v) || v.length < 2) return bad(`expected a list of at least two [${xName}, ${yName}] pairs`);
    const out: { x: number; y: number }[] = [];
    for (let i = 0; i < v.length; i++) {
      const p: unknown = v[i];
      if (!Array.isArray(p) || p.length !== 2 || typeof p[0] !== 'number' || typeof p[1] !== 'number' || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
        return bad(`expected a pair [${xName}, ${yName}] of numbers`, [i]);
      const [x, y] = p as [number, number];
      if (x < 0) return bad(`${xName} must not be negative, got ${x}`, [i]);
      if (y < 0 || y > yMax) return bad(`${yName} must be between 0 and ${yMax}, got ${y}`, [i]);
      const last = out[out.length - 1];
      if (last && !(x > last.x)) return bad(`${xName} must increase down the table (${x} after ${last.x})`, [i]);
      out.push({ x, y });
    }
    return out;
  });
}

// ---------------------------------------------------------------- the engine case

const valveKeys = {
  /** number of valves of this kind */
  valves: count(1),
  /** head (seat) diameter */
  diameter: length(),
  maxLift: length(),
  /** card events, degrees; meaning per side (see intake/exhaust) */
  opens: q('angle'),
  closes: q('angle'),
  /** [fraction of open duration, fraction of max lift] pairs */
  liftTable: table('duration fraction', 'lift fraction', 1).optional(),
  /** [L/D, Cd] pairs */
  cdTable: table('L/D', 'Cd', 1).optional(),
  /** lift at which the card events were measured (information; see to-model.ts) */
  checkingLift: q('length', { positive: true }).optional(),
  /**
   * cam timing moved by this many crank degrees, both events of the valve
   * alike: positive = later (retard), negative = earlier (advance); see
   * to-model.ts effectiveCard
   */
  shift: q('angle').optional(),
  /**
   * open duration in crank degrees between the card events (opens + 180 +
   * closes), both ends moved alike about the same centre line
   */
  duration: q('angle', { positive: true }).optional(),
};

/** A file named in a case: a path relative to the case file's folder (read in measured-files.ts). */
function fileName() {
  return z.unknown().transform((v, ctx): string => {
    if (typeof v !== 'string' || v.trim() === '') {
      ctx.addIssue({ code: 'custom', message: `expected a file name (a CSV file, relative to the case file), got ${v === undefined ? 'nothing' : JSON.stringify(v)}` });
      return z.NEVER;
    }
    return v;
  });
}

/** Measured data of a valve (measured-files.ts reads the files; see README "Using your own measurements"). */
const measuredValveKeys = {
  /** a logged lift curve (CSV: crank_deg | cam_deg, lift_mm | lift_in); then opens, closes and maxLift come from it */
  liftFile: fileName().optional(),
  /** running clearance subtracted from the logged lift */
  lash: q('length', { nonNegative: true }).optional(),
  /** a flow-bench sheet (CSV: lift_mm | lift_in, flow_cfm | flow_L_per_s | flow_kg_per_s): the Cd table */
  flowFile: fileName().optional(),
  /** the test depression the sheet was flowed at, below the room */
  flowTestPressure: pressure().optional(),
  /** valve head diameter on the bench; default: the valve's own */
  flowDiameter: length().optional(),
  /** multiplies the Cd table (calibration); default 1 */
  cdScale: q('dimensionless', { positive: true }).optional(),
};

/** largest cdScale a case may give [-] */
export const CD_SCALE_MAX = 2;

function measuredValveChecks(v: { liftFile?: string | undefined; lash?: number | undefined; liftTable?: unknown; flowFile?: string | undefined; flowTestPressure?: number | undefined; flowDiameter?: number | undefined; cdTable?: unknown; cdScale?: number | undefined }, ctx: IssueSink): void {
  const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
  if (v.liftFile === undefined && v.lash !== undefined) issue('lash', 'applies to a liftFile (the lash is subtracted from the logged lift): add liftFile or remove lash');
  if (v.liftFile !== undefined && v.liftTable !== undefined) issue('liftTable', 'give either liftTable or liftFile (the logged curve), not both');
  if (v.flowFile !== undefined) {
    if (v.cdTable !== undefined) issue('cdTable', 'give either cdTable or flowFile (the bench sheet gives the Cd table), not both');
    if (v.flowTestPressure === undefined) issue('flowTestPressure', 'required with flowFile: the test depression the sheet was flowed at, e.g. "28 inH2O"');
    else if (!(v.flowTestPressure < BENCH_DEFAULTS.pressure))
      issue('flowTestPressure', `must be below the bench's room pressure (${BENCH_DEFAULTS.pressure} Pa): it is the depression below it, got ${Number(v.flowTestPressure.toPrecision(6))} Pa`);
  } else {
    if (v.flowTestPressure !== undefined) issue('flowTestPressure', 'applies to a flowFile: add flowFile or remove flowTestPressure');
    if (v.flowDiameter !== undefined) issue('flowDiameter', 'applies to a flowFile: add flowFile or remove flowDiameter');
  }
  if (v.cdScale !== undefined && v.cdScale > CD_SCALE_MAX) issue('cdScale', `must be at most ${CD_SCALE_MAX}, got ${v.cdScale}`);
}

/** largest cam shift a case may ask for [deg crank] */
export const SHIFT_LIMIT = 180;

const intakeSchema = z.strictObject({ ...valveKeys, ...measuredValveKeys }).superRefine(measuredValveChecks);


const sectionSchema = z.strictObject({
  length: length(),
  diameterStart: length(),
  diameterEnd: length(),
});

const entryLoss = z.unknown().transform((v, ctx): number => {
  if (typeof v === 'string' && Object.hasOwn(ENTRY_LOSS, v)) return ENTRY_LOSS[v]!;
  if (typeof v === 'number' && Number.isFinite(v) && v >= 0) return v;
  ctx.addIssue({
    code: 'custom',
    message: `expected a loss coefficient ≥ 0 or one of ${Object.keys(ENTRY_LOSS).map((s) => `'${s}'`).join(', ')}, got ${shown(v)}`,
  });
  return z.NEVER;
});

/** The keys every pipe has: `length` + `diameter`, or a list of conical `sections`, plus its wall. */
const pipeKeys = {
  length: length().optional(),
  diameter: length().optional(),
  sections: z.array(sectionSchema).optional(),
  wallTemperature: temperature().optional(),
  /** Fanning friction factor */
  friction: q('dimensionless', { nonNegative: true }).default(0.005),
  heatTransfer: bool().default(true),
};

interface PipeKeysOut {
  length?: number | undefined;
  diameter?: number | undefined;
  sections?: { length: number; diameterStart: number; diameterEnd: number }[] | undefined;
}

interface IssueSink {
  addIssue(issue: { code: 'custom'; message: string; path?: (string | number)[] }): void;
}

/**
 * The pipe keys to a list of sections, checking that a plain number was not
 * meant as millimetres. `what` names the pipe in messages ("an intake runner").
 */
function pipeShape(what: string) {
  return <T extends PipeKeysOut>(r: T, ctx: IssueSink): Omit<T, 'length' | 'diameter' | 'sections'> & { sections: { length: number; diameterStart: number; diameterEnd: number }[] } => {
    const plain = r.length !== undefined || r.diameter !== undefined;
    if (r.sections !== undefined) {
      if (plain) {
        ctx.addIssue({ code: 'custom', message: 'give either length and diameter, or sections, not both', path: [r.length !== undefined ? 'length' : 'diameter'] });
        return z.NEVER;
      }
      if (r.sections.length === 0) {
        ctx.addIssue({ code: 'custom', message: 'needs at least one section', path: ['sections'] });
        return z.NEVER;
      }
    } else if (r.length === undefined || r.diameter === undefined) {
      ctx.addIssue({
        code: 'custom',
        message: `required (${what} needs length and diameter, or a list of sections)`,
        path: [r.length === undefined ? 'length' : 'diameter'],
      });
      return z.NEVER;
    }
    // plausibility: a bare number is in metres, so "300" meant as millimetres is 300 m
    const big = (path: (string | number)[], v: number, limit: number, words: string): boolean => {
      if (v <= limit) return false;
      ctx.addIssue({ code: 'custom', path, message: `${words} ${limit} m is not ${what}, got ${Number(v.toPrecision(6))} m (a plain number is in metres: write "${Number(v.toPrecision(6))} mm" if you meant millimetres)` });
      return true;
    };
    let bad = false;
    if (r.sections === undefined) {
      bad = big(['length'], r.length!, RUNNER_LIMITS.length, 'longer than') || bad;
      bad = big(['diameter'], r.diameter!, RUNNER_LIMITS.diameter, 'a diameter over') || bad;
    } else {
      r.sections.forEach((x, k) => {
        bad = big(['sections', k, 'length'], x.length, RUNNER_LIMITS.length, 'a section longer than') || bad;
        bad = big(['sections', k, 'diameterStart'], x.diameterStart, RUNNER_LIMITS.diameter, 'a diameter over') || bad;
        bad = big(['sections', k, 'diameterEnd'], x.diameterEnd, RUNNER_LIMITS.diameter, 'a diameter over') || bad;
      });
      const total = r.sections.reduce((t, x) => t + x.length, 0);
      if (!bad) bad = big(['sections'], total, RUNNER_LIMITS.length, 'longer than');
    }
    if (bad) return z.NEVER;
    const { length: _l, diameter: _d, sections, ...rest } = r;
    return { ...rest, sections: sections ?? [{ length: r.length!, diameterStart: r.diameter!, diameterEnd: r.diameter! }] };
  };
}

/**
 * A side resonator on the runner, `at` measured from the valve: a closed side
 * tube (`length`, `diameter`: a quarter-wave resonator) or a Helmholtz
 * resonator (`neckLength`, `neckDiameter`, `volume`).
 */
const resonatorSchema = z
  .strictObject({
    at: length(),
    length: length().optional(),
    diameter: length().optional(),
    neckLength: length().optional(),
    neckDiameter: length().optional(),
    volume: q('volume', { positive: true }).optional(),
  })
  .transform((r, ctx): ResonatorModel => {
    const tube = r.length !== undefined || r.diameter !== undefined;
    const helm = r.neckLength !== undefined || r.neckDiameter !== undefined || r.volume !== undefined;
    const fail = (path: string, message: string) => {
      ctx.addIssue({ code: 'custom', path: [path], message });
      return z.NEVER;
    };
    if (tube && helm)
      return fail(r.length !== undefined ? 'length' : 'diameter', 'give either length and diameter (a closed side tube) or neckLength, neckDiameter and volume (a Helmholtz resonator), not both');
    if (helm) {
      for (const k of ['neckLength', 'neckDiameter', 'volume'] as const)
        if (r[k] === undefined) return fail(k, 'required (a Helmholtz resonator needs neckLength, neckDiameter and volume)');
      return { kind: 'helmholtz', at: r.at, neckLength: r.neckLength!, neckDiameter: r.neckDiameter!, volume: r.volume! };
    }
    for (const k of ['length', 'diameter'] as const)
      if (r[k] === undefined) return fail(k, 'required (a side tube needs length and diameter; a Helmholtz resonator neckLength, neckDiameter and volume)');
    for (const k of ['length', 'diameter'] as const)
      if (r[k]! > RUNNER_LIMITS[k]) return fail(k, `over ${RUNNER_LIMITS[k]} m is not a side tube, got ${Number(r[k]!.toPrecision(6))} m (a plain number is in metres: write "${Number(r[k]!.toPrecision(6))} mm" if you meant millimetres)`);
    return { kind: 'tube', at: r.at, length: r.length!, diameter: r.diameter! };
  });

const runnerSchema = z
  .strictObject({ ...pipeKeys, entryLoss: entryLoss.default(ENTRY_LOSS.bellmouth!), resonator: z.array(resonatorSchema).optional() })
  .transform(pipeShape('an intake runner'));

const snorkelSchema = z.strictObject({ ...pipeKeys, entryLoss: entryLoss.default(ENTRY_LOSS.bellmouth!) }).transform(pipeShape('a snorkel'));

const exhaustPipeSchema = z.strictObject(pipeKeys).transform(pipeShape('an exhaust pipe'));

const exhaustSchema = z.strictObject({
  ...valveKeys,
  ...measuredValveKeys,
  backPressure: pressure(),
  gasTemperature: temperature(),
  /** cylinder pressure at exhaust valve opening (the blowdown); default with an exhaust pipe */
  releasePressure: pressure().optional(),
  /** the exhaust primary from the valve to the back-pressure reservoir */
  pipe: exhaustPipeSchema.optional(),
}).superRefine(measuredValveChecks);

const inletSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({ kind: z.literal('ambient') }),
    z.strictObject({
      kind: z.literal('plenum'),
      volume: q('volume', { positive: true }),
      /** the orifice form of the feed (throttle or airbox mouth) */
      feedDiameter: length().optional(),
      feedCd: q('dimensionless', { positive: true }).default(0.8),
      /** the airbox mouth as a 1-D pipe from the ambient into the box */
      snorkel: snorkelSchema.optional(),
      /** boost: the feed draws from this supply (a charger's outlet) instead of the ambient */
      supply: z.strictObject({ pressure: pressure(), temperature: temperature() }).optional(),
    }),
  ])
  .default({ kind: 'ambient' });

const numericsSchema = z
  .strictObject({
    meshSize: length().default(0.01),
    courant: q('dimensionless').default(0.9),
    maxCycles: count(1).default(30),
    tolerance: q('dimensionless', { positive: true }).default(1e-4),
    scheme: oneOf(SCHEMES).default(DEFAULT_SCHEME),
  })
  .prefault({});

/**
 * The ambient: pressure and temperature, or an altitude, from which the U.S.
 * Standard Atmosphere 1976 gives whichever of the two is not stated.
 */
const ambientSchema = z
  .strictObject({ pressure: pressure().optional(), temperature: temperature().optional(), altitude: q('length').optional() })
  .transform((a, ctx): { pressure: number; temperature: number; altitude?: number } => {
    const z0 = a.altitude;
    if (z0 !== undefined && !(z0 >= ALTITUDE_LIMITS.min && z0 <= ALTITUDE_LIMITS.max)) {
      ctx.addIssue({ code: 'custom', path: ['altitude'], message: `must be between ${ALTITUDE_LIMITS.min} m and ${ALTITUDE_LIMITS.max} m (the standard atmosphere's layers used here), got ${Number(z0.toPrecision(6))} m` });
      return z.NEVER;
    }
    const std = z0 !== undefined ? standardAtmosphere(z0) : undefined;
    const pressureValue = a.pressure ?? std?.pressure;
    const temperatureValue = a.temperature ?? std?.temperature;
    for (const [k, v] of [['pressure', pressureValue], ['temperature', temperatureValue]] as const)
      if (v === undefined) {
        ctx.addIssue({ code: 'custom', path: [k], message: 'required (or give ambient.altitude: the U.S. Standard Atmosphere 1976 then gives it)' });
        return z.NEVER;
      }
    return { pressure: pressureValue!, temperature: temperatureValue!, ...(z0 !== undefined ? { altitude: z0 } : {}) };
  });

/** measured data the case names for the views and as the commands' defaults */
const measuredTraceSchema = z.strictObject({
  /** CSV: crank_deg, pressure_kPa | pressure_kPa_gauge */
  file: fileName(),
  /** the transducer's distance from the valve along the runner; default 0 (at the valve) */
  sensorAt: q('length', { nonNegative: true }).default(0),
  /** added to the logged crank angles to give θ */
  tdcOffset: q('angle').default(0),
});

const speedRange = z.strictObject({ from: q('speed', { positive: true }), to: q('speed', { positive: true }), step: q('speed', { positive: true }) });
const speedBand = z.strictObject({ from: q('speed', { positive: true }), to: q('speed', { positive: true }) });

/** display keys: units of the text and the view only (JSON and CSV stay SI) */
export const DISPLAY_UNITS = ['metric', 'imperial'] as const;
const displaySchema = z.strictObject({ units: oneOf(DISPLAY_UNITS).default('metric') });

export const caseSchema = z
  .strictObject({
    name: z.string().optional(),
    engine: z.strictObject({
      bore: length(),
      stroke: length(),
      /** connecting rod, centre to centre */
      rod: length(),
      compressionRatio: q('dimensionless'),
      wallTemperature: temperature().optional(),
    }),
    ambient: ambientSchema,
    /** opens ° BTDC, closes ° ABDC */
    intake: intakeSchema,
    /** opens ° BBDC, closes ° ATDC */
    exhaust: exhaustSchema,
    runner: runnerSchema,
    inlet: inletSchema,
    rpm: q('speed', { positive: true }),
    numerics: numericsSchema,
    // analysis keys (used by sweep / tune / estimates)
    sweep: speedRange.optional(),
    band: speedBand.optional(),
    estimate: z
      .strictObject({
        airFuelRatio: q('dimensionless', { positive: true }).optional(),
        /** lower heating value of the fuel [J/kg] */
        fuelHeatingValue: q('specificEnergy', { positive: true }).optional(),
        brakeEfficiency: q('dimensionless', { positive: true }).optional(),
      })
      .optional(),
    /** a dyno sheet (CSV: rpm + torque_Nm | torque_lbft | power_kW | power_hp | ve_pct): the Sweep view's points, the default of --measured */
    measured: fileName().optional(),
    /** a runner pressure trace: the Valve view's overlay, the default of run --measured-trace */
    measuredTrace: measuredTraceSchema.optional(),
    /** how results are shown (text commands, the view, the report); loading stays SI */
    display: displaySchema.optional(),
  })
  .superRefine((c, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message });
    const mm = (v: number) => `${Number((v * 1000).toPrecision(6))} mm`;
    const e = c.engine;
    for (const k of ['bore', 'stroke'] as const) {
      if (e[k] > ENGINE_SIZE_LIMIT)
        issue(['engine', k], `larger than ${ENGINE_SIZE_LIMIT} m is not a single-cylinder engine we model, got ${Number(e[k].toPrecision(6))} m (a plain number is in metres: write "${Number(e[k].toPrecision(6))} mm" if you meant millimetres)`);
    }
    if (!(e.rod > e.stroke / 2)) issue(['engine', 'rod'], `must be longer than half the stroke (${mm(e.stroke / 2)}), got ${mm(e.rod)}`);
    if (!(e.compressionRatio > 1)) issue(['engine', 'compressionRatio'], `must be greater than 1, got ${e.compressionRatio}`);
    for (const side of ['intake', 'exhaust'] as const) {
      const v = c[side];
      if (!(v.diameter < e.bore)) issue([side, 'diameter'], `valve must be smaller than the bore (${mm(e.bore)}), got ${mm(v.diameter)}`);
      const duration = v.duration ?? v.opens + 180 + v.closes;
      if (v.duration !== undefined && !(v.duration < 720)) issue([side, 'duration'], `must be below 720 deg (a whole cycle), got ${Number(v.duration.toPrecision(6))} deg`);
      else if (!(duration > 0 && duration < 720))
        issue([side, 'closes'], `duration opens + 180 + closes = ${Number(duration.toPrecision(6))} deg must be between 0 and 720 deg (exclusive)`);
      if (v.shift !== undefined && !(Math.abs(v.shift) <= SHIFT_LIMIT))
        issue([side, 'shift'], `must be between -${SHIFT_LIMIT} and ${SHIFT_LIMIT} deg, got ${Number(v.shift.toPrecision(6))} deg`);
      if (v.checkingLift !== undefined && !(v.checkingLift < v.maxLift))
        issue([side, 'checkingLift'], `must be below maxLift (${mm(v.maxLift)}), got ${mm(v.checkingLift)}`);
    }
    // the heads cannot cover more than the bore under any roof shape (the --allow-extreme rule of about 60 % is in plausibility.ts)
    const heads = c.intake.valves * c.intake.diameter ** 2 + c.exhaust.valves * c.exhaust.diameter ** 2;
    if (c.intake.diameter < e.bore && c.exhaust.diameter < e.bore && !(heads < e.bore ** 2)) {
      const side = c.intake.valves * c.intake.diameter ** 2 >= c.exhaust.valves * c.exhaust.diameter ** 2 ? 'intake' : 'exhaust';
      issue([side, c[side].valves > 1 ? 'valves' : 'diameter'],
        `the valve heads (${c.intake.valves} × ${mm(c.intake.diameter)} intake, ${c.exhaust.valves} × ${mm(c.exhaust.diameter)} exhaust) ` +
          `cover ${Number(((100 * heads) / e.bore ** 2).toPrecision(3))} % of the bore area: they cannot fit in a ${mm(e.bore)} bore`);
    }
    const rpmIssue = speedProblem(c.rpm);
    if (rpmIssue) issue(['rpm'], rpmIssue);
    for (const key of ['sweep', 'band'] as const)
      for (const end of ['from', 'to'] as const) {
        const v = c[key]?.[end];
        const p = v === undefined ? undefined : speedProblem(v);
        if (p) issue([key, end], p);
      }
    const n = c.numerics;
    if (!(n.courant > 0 && n.courant <= 1)) issue(['numerics', 'courant'], `must be in (0, 1], got ${n.courant}`);
    const L = c.runner.sections.reduce((s, x) => s + x.length, 0);
    if (n.meshSize > L / 2) issue(['numerics', 'meshSize'], `must be at most half the runner length (${mm(L / 2)}), got ${mm(n.meshSize)}`);
    if (c.inlet.kind === 'plenum') {
      if (c.inlet.feedCd > 1) issue(['inlet', 'feedCd'], `must be at most 1, got ${c.inlet.feedCd}`);
      if (c.inlet.feedDiameter === undefined && c.inlet.snorkel === undefined)
        issue(['inlet', 'feedDiameter'], 'required (a plenum is fed through feedDiameter, an orifice, or through a snorkel pipe)');
      if (c.inlet.feedDiameter !== undefined && c.inlet.snorkel !== undefined)
        issue(['inlet', 'snorkel'], 'give either feedDiameter (an orifice) or a snorkel (a pipe) as the feed of the plenum, not both');
    }
    // every pipe at least two mesh cells long, every resonator inside the runner
    const twoCells = (path: (string | number)[], sections: readonly { length: number }[]) => {
      const len = sections.reduce((t, x) => t + x.length, 0);
      if (len < 2 * n.meshSize) issue(path, `must be at least twice numerics.meshSize (${mm(2 * n.meshSize)}), got ${mm(len)}`);
    };
    if (c.inlet.kind === 'plenum' && c.inlet.snorkel) twoCells(['inlet', 'snorkel', 'length'], c.inlet.snorkel.sections);
    if (c.exhaust.pipe) twoCells(['exhaust', 'pipe', 'length'], c.exhaust.pipe.sections);
    const res = c.runner.resonator ?? [];
    res.forEach((r, k) => {
      if (!(r.at >= n.meshSize && r.at <= L - n.meshSize))
        issue(['runner', 'resonator', k, 'at'], `must lie on the runner, at least numerics.meshSize (${mm(n.meshSize)}) from either end: between ${mm(n.meshSize)} and ${mm(L - n.meshSize)} from the valve, got ${mm(r.at)}`);
      const own = r.kind === 'tube' ? (['length', r.length] as const) : (['neckLength', r.neckLength] as const);
      if (own[1] < n.meshSize) issue(['runner', 'resonator', k, own[0]], `must be at least numerics.meshSize (${mm(n.meshSize)}), got ${mm(own[1])}: use a finer mesh for a shorter one`);
      for (let j = 0; j < k; j++)
        if (Math.abs(res[j]!.at - r.at) < n.meshSize)
          issue(['runner', 'resonator', k, 'at'], `is within numerics.meshSize (${mm(n.meshSize)}) of resonator ${j} at ${mm(res[j]!.at)}: put them apart or join them as one`);
    });
    if (c.sweep && !(c.sweep.to > c.sweep.from)) issue(['sweep', 'to'], `must be above sweep.from (${c.sweep.from} rpm), got ${c.sweep.to} rpm`);
    if (c.band && !(c.band.to > c.band.from)) issue(['band', 'to'], `must be above band.from (${c.band.from} rpm), got ${c.band.to} rpm`);
    const be = c.estimate?.brakeEfficiency;
    if (be !== undefined && be > 1) issue(['estimate', 'brakeEfficiency'], `must be at most 1, got ${be}`);
  });

export type CaseInput = z.input<typeof caseSchema>;
/** A validated engine case, in model units (SI, degrees, rpm). */
export type Case = z.output<typeof caseSchema>;

// ---------------------------------------------------------------- the pipe case

const sideState = z.strictObject({
  pressure: pressure(),
  temperature: temperature(),
  velocity: q('velocity').default(0),
});

/**
 * A pipe-case end: `closed`, `open` (to a reservoir at that side's initial
 * state), or a closed 0-D volume the pipe opens into: `{ volume, pressure?,
 * temperature? }` (its initial state; default: that side's initial state).
 */
const volumeEnd = z.strictObject({ volume: q('volume', { positive: true }), pressure: pressure().optional(), temperature: temperature().optional() });
const pipeEnd = z.unknown().transform((v, ctx): 'closed' | 'open' | z.output<typeof volumeEnd> => {
  if (v === 'closed' || v === 'open') return v;
  if (v !== null && typeof v === 'object' && !Array.isArray(v)) {
    const r = volumeEnd.safeParse(v);
    if (r.success) return r.data;
    for (const iss of r.error.issues) {
      const path = iss.path as (string | number)[];
      if (iss.code === 'unrecognized_keys') for (const k of iss.keys) ctx.addIssue({ code: 'custom', path: [...path, k], message: `unknown key${didYouMean(k, ['volume', 'pressure', 'temperature'])}` });
      else ctx.addIssue({ code: 'custom', path, message: iss.message });
    }
    return z.NEVER;
  }
  const hint = typeof v === 'string' ? didYouMean(v, ['closed', 'open']) : '';
  ctx.addIssue({ code: 'custom', message: `expected 'closed', 'open' or a volume { volume, pressure?, temperature? }, got ${v === undefined ? 'nothing' : JSON.stringify(v)}${hint}` });
  return z.NEVER;
});

export const pipeCaseSchema = z
  .strictObject({
    name: z.string().optional(),
    pipe: z.strictObject({
      length: length(),
      diameter: length(),
      meshSize: length().default(0.01),
      wallFriction: bool().default(true),
      wallHeatTransfer: bool().default(true),
      /** Fanning friction factor used when wallFriction is on */
      friction: q('dimensionless', { nonNegative: true }).default(0.005),
      /** default: the left initial temperature */
      wallTemperature: temperature().optional(),
    }),
    ends: z.strictObject({ left: pipeEnd, right: pipeEnd }),
    initial: z.strictObject({
      split: q('dimensionless').default(0.5),
      left: sideState,
      right: sideState,
    }),
    times: z.array(q('time', { nonNegative: true })).min(1),
    display: displaySchema.optional(),
    numerics: z
      .strictObject({
        courant: q('dimensionless').default(0.9),
        scheme: oneOf(SCHEMES).default(DEFAULT_SCHEME),
      })
      .prefault({}),
  })
  .superRefine((c, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message });
    const s = c.initial.split;
    if (!(s >= 0 && s <= 1)) issue(['initial', 'split'], `must be between 0 and 1 (fraction of the length from the left end), got ${s}`);
    for (let i = 1; i < c.times.length; i++)
      if (!(c.times[i]! > c.times[i - 1]!)) issue(['times', i], `times must increase (${c.times[i]} s after ${c.times[i - 1]} s)`);
    const cn = c.numerics.courant;
    if (!(cn > 0 && cn <= 1)) issue(['numerics', 'courant'], `must be in (0, 1], got ${cn}`);
    if (c.pipe.meshSize > c.pipe.length / 2) issue(['pipe', 'meshSize'], `must be at most half the pipe length, got ${c.pipe.meshSize} m`);
    if (c.numerics.scheme === 'characteristics') {
      const beyond = characteristicsRangeIssue(c.initial.left, c.initial.right);
      if (beyond) issue(['numerics', 'scheme'], beyond);
    }
  });

export type PipeCaseInput = z.input<typeof pipeCaseSchema>;
export type PipeCase = z.output<typeof pipeCaseSchema>;

// ---------------------------------------------------------------- issues

export interface CaseIssue {
  /** dotted field path, e.g. "runner.length" ("" for the whole file) */
  path: string;
  message: string;
}

export type Validation<T> = { ok: true; value: T } | { ok: false; issues: CaseIssue[] };

export function formatPath(path: readonly PropertyKey[]): string {
  return path.map((p) => String(p)).join('.');
}

function valueAt(data: unknown, path: readonly PropertyKey[]): unknown {
  let cur: unknown = data;
  for (const k of path) {
    if (cur === null || typeof cur !== 'object' || !Object.hasOwn(cur, k)) return undefined;
    cur = (cur as Record<PropertyKey, unknown>)[k as string];
  }
  return cur;
}

function typeName(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (v instanceof Uint8Array) return 'binary data';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'a mapping';
  if (typeof v === 'string') return `'${v}'`;
  return String(v);
}

/** Turn zod issues into our issues with plain messages. */
function toIssues(schema: z.ZodType, data: unknown, zIssues: readonly z.core.$ZodIssue[]): CaseIssue[] {
  const out: CaseIssue[] = [];
  for (const iss of zIssues) {
    const path = formatPath(iss.path);
    switch (iss.code) {
      case 'unrecognized_keys': {
        const known = keysAt(schema, iss.path, data);
        for (const k of iss.keys) out.push({ path: path ? `${path}.${k}` : k, message: `unknown key${didYouMean(k, known)}` });
        break;
      }
      case 'invalid_type': {
        const v = valueAt(data, iss.path);
        const expected = iss.expected === 'object' ? 'a mapping of keys' : iss.expected === 'array' ? 'a list' : `a ${iss.expected}`;
        out.push({ path, message: v === undefined ? `required (${expected})` : `expected ${expected}, got ${typeName(v)}` });
        break;
      }
      case 'invalid_union': {
        if (iss.discriminator !== undefined) {
          const v = valueAt(data, iss.path);
          const options = ((iss as { options?: unknown[] }).options ?? []).map(String);
          const list = options.map((o) => `'${o}'`).join(', ');
          const hint = typeof v === 'string' ? didYouMean(v, options) : '';
          out.push({ path, message: v === undefined ? `required (one of ${list})` : `expected one of ${list}, got ${typeName(v)}${hint}` });
        } else out.push({ path, message: iss.message });
        break;
      }
      case 'too_small':
        out.push({ path, message: iss.origin === 'array' ? `needs at least ${String(iss.minimum)} entr${iss.minimum === 1 ? 'y' : 'ies'}` : iss.message });
        break;
      default:
        out.push({ path, message: iss.message });
    }
  }
  return out;
}

function run<T>(schema: z.ZodType<T>, data: unknown): Validation<T> {
  const r = schema.safeParse(data);
  if (r.success) return { ok: true, value: r.data };
  return { ok: false, issues: toIssues(schema, data, r.error.issues) };
}

export function validateCase(data: unknown): Validation<Case> {
  return run(caseSchema, data);
}

export function validatePipeCase(data: unknown): Validation<PipeCase> {
  return run(pipeCaseSchema, data);
}

// ---------------------------------------------------------------- walking the schema (keys, --set paths)

type AnySchema = z.core.$ZodType;

interface Def {
  type: string;
  innerType?: AnySchema;
  in?: AnySchema;
  shape?: Record<string, AnySchema>;
  options?: AnySchema[];
  element?: AnySchema;
}

function defOf(s: AnySchema): Def {
  return s._zod.def as unknown as Def;
}

/** Strip optional/default/prefault/nullable and transforms (input side). */
function unwrap(s: AnySchema): AnySchema {
  for (;;) {
    const d = defOf(s);
    if ((d.type === 'optional' || d.type === 'default' || d.type === 'prefault' || d.type === 'nullable' || d.type === 'readonly') && d.innerType) s = d.innerType;
    else if (d.type === 'pipe' && d.in) s = d.in;
    else return s;
  }
}

/** The object alternatives a schema stands for (one for an object, several for a union). */
function objectOptions(s: AnySchema, data: unknown): Record<string, AnySchema>[] {
  const u = unwrap(s);
  const d = defOf(u);
  if (d.type === 'object' && d.shape) return [d.shape];
  if (d.type === 'union' && d.options) {
    const all = d.options.flatMap((o) => objectOptions(o, undefined));
    // a discriminated union: prefer the option matching the data's kind
    const kind = data !== null && typeof data === 'object' && Object.hasOwn(data, 'kind') ? (data as Record<string, unknown>).kind : undefined;
    if (kind !== undefined) {
      const match = all.filter((shape) => {
        const k = shape.kind;
        if (!k) return false;
        const kd = defOf(unwrap(k)) as Def & { values?: unknown[] };
        return kd.type === 'literal' && (kd.values ?? []).includes(kind);
      });
      if (match.length > 0) return match;
    }
    return all;
  }
  return [];
}

export type SchemaNode = { kind: 'object'; keys: string[] } | { kind: 'list' } | { kind: 'value' };

/**
 * Follow a path through a schema. Returns what is there, or the index of the
 * first path segment that does not exist (with the keys that would).
 */
export function resolvePath(
  schema: AnySchema,
  path: readonly string[],
  data: unknown,
): { ok: true; node: SchemaNode } | { ok: false; at: number; known: string[] } {
  let s: AnySchema = schema;
  let d: unknown = data;
  for (let i = 0; i < path.length; i++) {
    const key = path[i]!;
    const u = unwrap(s);
    const ud = defOf(u);
    if (ud.type === 'array' && ud.element) {
      if (!/^\d+$/.test(key)) return { ok: false, at: i, known: [] };
      s = ud.element;
      d = Array.isArray(d) ? d[Number(key)] : undefined;
      continue;
    }
    const options = objectOptions(s, d);
    // own keys only: 'constructor', 'toString', '__proto__' ... are not keys of a case
    const next = options.map((o) => (Object.hasOwn(o, key) ? o[key] : undefined)).find((x) => x !== undefined);
    if (!next) return { ok: false, at: i, known: [...new Set(options.flatMap((o) => Object.keys(o)))] };
    s = next;
    d = d !== null && typeof d === 'object' && Object.hasOwn(d, key) ? (d as Record<string, unknown>)[key] : undefined;
  }
  const u = unwrap(s);
  const t = defOf(u).type;
  if (t === 'array') return { ok: true, node: { kind: 'list' } };
  const opts = objectOptions(s, d);
  if (opts.length > 0) return { ok: true, node: { kind: 'object', keys: [...new Set(opts.flatMap((o) => Object.keys(o)))] } };
  return { ok: true, node: { kind: 'value' } };
}

function keysAt(schema: AnySchema, path: readonly PropertyKey[], data: unknown): string[] {
  const r = resolvePath(schema, path.map(String), data);
  return r.ok && r.node.kind === 'object' ? r.node.keys : [];
}
