/**
 * `tractwave sweep CASE`: ηv (and estimated torque and power) against speed,
 * the band mean, the best speed, and the hand estimates beside them.
 *
 * Also the pieces `tune` and `compare` share: speed range and band from the
 * options or the case, --jobs, progress on stderr, the curve chart.
 */
import { assemblyLine } from '../../present/network-line.js';
import { METRIC, type Units } from '../../present/units.js';
import { signedFixed } from '../../present/number.js';
import { restateGauge } from '../../present/words.js';
import { MASS_IMBALANCE_LIMIT, massBalanceOk } from '../../analysis/mass-balance.js';
import { curveWarnings } from '../../analysis/plausibility.js';
import type { EngineModel } from '../../core/model.js';
import { engineCost } from '../../analysis/cost.js';
import { resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import * as asciichart from 'asciichart';
import { caseEstimates, DEFAULT_OUTPUT_ASSUMPTIONS, type CaseEstimates, type OutputAssumptions } from '../../analysis/estimates.js';
import { parseBand, parseGrid, RangeInputError, type NumberGrid } from '../../analysis/range.js';
import { summariseSweep, SWEEP_CHUNK_POINTS, type SweepPoint, type SweepSummary } from '../../analysis/sweep.js';
import { defaultJobs, prestartPool, runSweep } from '../../analysis/worker-pool.js';
import { CaseError } from '../../case/errors.js';
import { loadCase, type LoadedCase } from '../../case/load.js';
import { speedProblem, type Case } from '../../case/schema.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec, type ParsedArgs } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, displayUnits, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { fix, table, wrap } from '../format.js';
import type { CliIo } from '../io.js';
import { writeFileAtomic } from '../write-file.js';
import { chartPoints, dynoBlock, dynoJson, outputChart } from '../dyno-output.js';
import { dynoOf, MEASURED_OPTION } from '../measured-options.js';
import { checkTarget } from '../target.js';
import { timeLeft } from '../progress.js';

/** speed range used when neither --rpm nor the case's `sweep` key gives one */
export const DEFAULT_SWEEP = { from: 3000, to: 9000, step: 250 } as const;
/** mass imbalance above which a sweep warns [-] */
const CHART_WIDTH = 60;
const CHART_HEIGHT = 12;

export const RANGE_OPTION: OptionSpec = {
  name: 'rpm',
  type: 'string',
  value: 'FROM:TO:STEP',
  description: `speeds to simulate [rpm], e.g. 3000:9000:250 (default: the case's sweep key, else ${DEFAULT_SWEEP.from}:${DEFAULT_SWEEP.to}:${DEFAULT_SWEEP.step})`,
};
export const BAND_OPTION: OptionSpec = {
  name: 'band',
  type: 'string',
  value: 'LO:HI',
  description: "speed band of the figure of merit [rpm], e.g. 5000:8000 (default: the case's band key, else the whole range)",
};
export const JOBS_OPTION: OptionSpec = {
  name: 'jobs',
  type: 'string',
  value: 'N',
  description: 'worker threads (default: the number of cores); results do not depend on it',
};

/** A RangeInputError from the analysis is bad input: a CaseError naming the option (exit 2). */
export function asInputError(e: unknown): unknown {
  return e instanceof RangeInputError ? new CaseError(e.option, e.detail, 'option') : e;
}

export function parseJobs(args: ParsedArgs): number {
  const t = args.string('jobs');
  if (t === undefined) return defaultJobs();
  if (!/^\d+$/.test(t.trim()) || !(Number(t) >= 1 && Number(t) <= 256)) throw new CaseError('--jobs', `expected a whole number from 1 to 256, got '${t}'`, 'option');
  return Number(t);
}

/** The speeds of a sweep: --rpm, else the case's sweep key, else DEFAULT_SWEEP. */
export function sweepGrid(args: ParsedArgs, c: Case): NumberGrid {
  const text = args.string('rpm');
  let grid: NumberGrid;
  try {
    if (text !== undefined) grid = parseGrid(text, '--rpm', { units: ['rpm'] });
    else {
      const s = c.sweep ?? DEFAULT_SWEEP;
      grid = parseGrid(`${s.from}:${s.to}:${s.step}`, c.sweep ? 'sweep' : '--rpm');
    }
  } catch (e) {
    throw asInputError(e);
  }
  // the same speed limits as the case's rpm and --rpm N (case/schema.ts speedProblem)
  const option = text !== undefined || !c.sweep ? '--rpm' : 'sweep';
  for (const [v, end] of [
    [grid.values[0]!, 'FROM'],
    [grid.values[grid.values.length - 1]!, 'TO'],
  ] as const) {
    const problem = speedProblem(v);
    if (problem) throw new CaseError(option, `${end} ${problem}`, 'option');
  }
  return grid;
}

export interface BandChoice {
  from: number;
  to: number;
  /** where it came from, for the text output */
  source: 'option' | 'case' | 'range';
  /** set when the case's band had to be clipped to the swept speeds */
  note?: string;
}

/**
 * The band: --band (must lie inside the swept speeds: exit 2 otherwise), else
 * the case's band key clipped to the swept speeds, else the whole range.
 */
export function chooseBand(args: ParsedArgs, c: Case, grid: NumberGrid): BandChoice {
  const lo = grid.values[0]!;
  const hi = grid.values[grid.values.length - 1]!;
  const text = args.string('band');
  if (text !== undefined) {
    let b;
    try {
      b = parseBand(text, '--band', { units: ['rpm'] });
    } catch (e) {
      throw asInputError(e);
    }
    if (b.from < lo || b.to > hi)
      throw new CaseError('--band', `${b.from}–${b.to} rpm is outside the swept speeds ${lo}–${hi} rpm (widen --rpm or narrow --band)`, 'option');
    return { from: b.from, to: b.to, source: 'option' };
  }
  if (c.band) {
    const from = Math.max(lo, c.band.from);
    const to = Math.min(hi, c.band.to);
    if (to > from) {
      const clipped = from !== c.band.from || to !== c.band.to;
      return {
        from,
        to,
        source: 'case',
        ...(clipped ? { note: `the case's band ${c.band.from}–${c.band.to} rpm is clipped to the swept speeds` } : {}),
      };
    }
    return { from: lo, to: hi, source: 'range', note: `the case's band ${c.band.from}–${c.band.to} rpm lies outside the swept speeds; using the whole range` };
  }
  return { from: lo, to: hi, source: 'range' };
}

/** Torque/power assumptions: the case's `estimate` key over the defaults. */
export function assumptionsOf(c: Case): OutputAssumptions {
  const e = c.estimate ?? {};
  return {
    airFuelRatio: e.airFuelRatio ?? DEFAULT_OUTPUT_ASSUMPTIONS.airFuelRatio,
    fuelHeatingValue: e.fuelHeatingValue ?? DEFAULT_OUTPUT_ASSUMPTIONS.fuelHeatingValue,
    brakeEfficiency: e.brakeEfficiency ?? DEFAULT_OUTPUT_ASSUMPTIONS.brakeEfficiency,
  };
}

/** A progress line on stderr when it is a terminal, with the time left; `done()` clears it. */
export function progress(io: CliIo, what: string): { tick: (done: number, total: number, rpm: number) => void; done: () => void } {
  if (!io.stderrIsTTY) return { tick: () => {}, done: () => {} };
  let shown = false;
  const t0 = performance.now();
  return {
    tick: (done, total, rpm) => {
      shown = true;
      io.stderr.write(`\r\x1b[K${what}: ${done}/${total} points (last ${fix(rpm, 0)} rpm${timeLeft(t0, done, total)})`);
    },
    done: () => {
      if (shown) io.stderr.write('\r\x1b[K');
    },
  };
}

/** Warnings for points that did not converge or lost mass. */
export function sweepWarnings(
  points: readonly (Pick<SweepPoint, 'rpm' | 'converged' | 'massImbalance' | 'volumetricEfficiency'> & Partial<Pick<SweepPoint, 'residualFraction'>>)[],
  maxCycles: number,
  label = '',
  model?: Pick<EngineModel, 'inlet' | 'ambient'>,
): string[] {
  const out: string[] = [];
  const bad = points.filter((p) => !p.converged);
  const who = label ? `${label}: ` : '';
  if (bad.length > 0)
    out.push(
      `warning: ${who}${bad.length} of ${points.length} points did not converge within ${maxCycles} cycles ` +
        `(${bad.map((p) => fix(p.rpm, 0)).join(', ')} rpm); their numbers are less certain (raise numerics.maxCycles)`,
    );
  const leaky = points.filter((p) => !massBalanceOk(p.massImbalance));
  if (leaky.length > 0)
    out.push(
      `warning: ${who}mass balance off by more than ${MASS_IMBALANCE_LIMIT * 100} % at ${leaky.map((p) => fix(p.rpm, 0)).join(', ')} rpm ` +
        '(a finer numerics.meshSize or the conservative scheme helps)',
    );
  for (const w of curveWarnings(points, label, model)) out.push(`warning: ${w}`);
  return out;
}

function resample(values: readonly number[], width: number): number[] {
  if (values.length === 0) return [];
  if (values.length === 1) return new Array<number>(width).fill(values[0]!);
  const out: number[] = [];
  for (let j = 0; j < width; j++) {
    const x = (j * (values.length - 1)) / (width - 1);
    const k = Math.min(values.length - 2, Math.floor(x));
    const f = x - k;
    out.push(values[k]! * (1 - f) + values[k + 1]! * f);
  }
  return out;
}

/** the second series is drawn in dots so the overlay reads without colour */
const DOT_SYMBOLS: [string, string, string, string, string, string, string, string, string, string] = ['┼', '┤', '╶', '╴', '·', '·', '·', '·', '·', ':'];

export interface ChartSeries {
  /** percent values per speed */
  values: readonly number[];
}

export interface ChartMarks {
  band?: { from: number; to: number };
  /** tuned speeds: label (the order) at a speed */
  tuned?: readonly { label: string; rpm: number }[];
  /** measured points (same unit as the series), drawn as MEASURED_GLYPH at their speeds */
  points?: readonly { rpm: number; value: number }[];
}

/** the glyph of a measured point on a speed chart */
export const MEASURED_GLYPH = '●';

/**
 * ηv against speed as text lines (asciichart). One series: a line. Two: the
 * first as a line, the second in dots, overlaid on one scale. Below the chart:
 * the speed axis, the band, and the quarter-wave tuned speeds.
 */
export function curveChart(rpms: readonly number[], series: readonly ChartSeries[], marks: ChartMarks = {}): string[] {
  const lo = rpms[0]!;
  const hi = rpms[rpms.length - 1]!;
  const width = rpms.length > 1 ? CHART_WIDTH : 1;
  const shownPoints = (marks.points ?? []).filter((p) => Number.isFinite(p.value) && p.rpm >= lo && p.rpm <= hi);
  const all = [...series.flatMap((s) => s.values), ...shownPoints.map((p) => p.value)].filter(Number.isFinite);
  let min = Math.min(...all);
  let max = Math.max(...all);
  if (!(max > min)) {
    min -= 1;
    max += 1;
  }
  const cfg = { height: CHART_HEIGHT, min, max, format: (x: number) => fix(x, 1).padStart(7) };
  const grids = series.map((s, i) =>
    asciichart.plot(resample(s.values, width), i === 0 ? cfg : { ...cfg, symbols: DOT_SYMBOLS }).split('\n'),
  );
  const base = grids[0] ?? [];
  const lines = base.map((line, r) => {
    const chars = [...line];
    for (const g of grids.slice(1)) {
      const other = [...(g[r] ?? '')];
      for (let k = 0; k < other.length; k++) if ((chars[k] ?? ' ') === ' ' && other[k] !== ' ') chars[k] = other[k]!;
    }
    return chars.join('');
  });
  const axisAt = Math.max(0, [...(base[0] ?? '')].findIndex((ch) => ch === '┤' || ch === '┼'));
  const x0 = axisAt + 1;
  const col = (rpm: number): number => x0 + (hi > lo ? Math.round(((rpm - lo) / (hi - lo)) * (width - 1)) : 0);
  // measured points, on asciichart's own rows: rows − (round(v·ratio) − round(min·ratio))
  if (shownPoints.length > 0) {
    const ratio = CHART_HEIGHT / (max - min);
    const min2 = Math.round(min * ratio);
    const rowsN = Math.abs(Math.round(max * ratio) - min2);
    for (const p of shownPoints) {
      const r = rowsN - (Math.round(p.value * ratio) - min2);
      const line = lines[r];
      if (line === undefined) continue;
      const chars = [...line];
      const c = col(p.rpm);
      while (chars.length <= c) chars.push(' ');
      chars[c] = MEASURED_GLYPH;
      lines[r] = chars.join('');
    }
  }
  const blank = (): string[] => new Array<string>(x0 + width + 12).fill(' ');
  const put = (row: string[], at: number, text: string): void => {
    for (let k = 0; k < text.length; k++) row[at + k] = text[k]!;
  };
  const axis = blank();
  put(axis, x0 - 1, `└${'─'.repeat(width)}`);
  const labels = blank();
  const ticks = hi > lo ? [lo, (lo + hi) / 2, hi] : [lo];
  for (const t of ticks) {
    const s = fix(t, 0);
    const at = Math.max(x0, Math.min(col(t) - Math.floor(s.length / 2), x0 + width - s.length));
    put(labels, at, s);
  }
  put(labels, x0 + width + 1, 'rpm');
  const out = [...lines, axis.join('').trimEnd(), labels.join('').trimEnd()];
  if (marks.band && hi > lo) {
    const row = blank();
    put(row, 1, 'band');
    const a = col(Math.max(lo, marks.band.from));
    const b = col(Math.min(hi, marks.band.to));
    put(row, a, `├${'─'.repeat(Math.max(0, b - a - 1))}┤`.slice(0, Math.max(1, b - a + 1)));
    out.push(row.join('').trimEnd());
  }
  const tuned = (marks.tuned ?? []).filter((t) => t.rpm >= lo && t.rpm <= hi);
  if (tuned.length > 0 && hi > lo) {
    const row = blank();
    put(row, 1, 'tuned');
    for (const t of tuned) put(row, col(t.rpm), t.label);
    out.push(row.join('').trimEnd());
  }
  return out;
}

/** Wrap a long line to 78 columns, keeping its indent; continuation lines indented two more. */
export function wrapLine(line: string, width = 78): string {
  if (line.length <= width) return line;
  const lead = /^\s*/.exec(line)?.[0] ?? '';
  return lead + wrap(line.slice(lead.length), width - lead.length, `${lead}  `).replace(/\n$/, '');
}

/** "order 4 at 6890 rpm, order 5 at 5512 rpm" */
export function tunedList(e: CaseEstimates): string {
  if (e.tunedSpeeds.length === 0) return 'no whole order falls in the range';
  return e.tunedSpeeds.map((t) => `order ${t.order} at ${fix(t.rpm, 0)} rpm`).join(', ');
}

/** the hand-estimate lines shown beside a sweep */
export function estimateLines(e: CaseEstimates, bestRpm: number, u: Units = METRIC): string[] {
  const lines = [
    `  quarter-wave: ${fix(e.quarterWaveFrequency, 1)} Hz (a ${u.text('speed', e.soundSpeed)} at the ambient temperature, runner ${u.text('length', e.runnerLength, u.system === 'metric' ? 0 : 1)}` +
      ` + ${e.openEnd} end correction ${u.text('length', e.endCorrection)}); tuned speeds N = 120·f/order: ${tunedList(e)}`,
  ];
  let nearest: { order: number; rpm: number } | undefined;
  for (const t of e.tunedSpeeds) if (!nearest || Math.abs(t.rpm - bestRpm) < Math.abs(nearest.rpm - bestRpm)) nearest = t;
  if (nearest && Number.isFinite(bestRpm)) {
    const off = ((bestRpm - nearest.rpm) / nearest.rpm) * 100;
    lines.push(`  the simulated best speed is ${fix(Math.abs(off), 1)} % ${off >= 0 ? 'above' : 'below'} the order-${nearest.order} quarter-wave speed`);
  }
  lines.push(
    `  Helmholtz estimate (the runner as the neck of a resonator whose volume is the cylinder at mid-stroke): ${fix(e.helmholtz.frequency, 1)} Hz, peak near 30·f = ${fix(e.helmholtz.peakRpm, 0)} rpm`,
  );
  if (e.plenumFrequency !== null) lines.push(`  plenum resonating through its feed: ${fix(e.plenumFrequency, 1)} Hz`);
  return lines;
}

export function assumptionLine(a: OutputAssumptions): string {
  return (
    `torque and power are ESTIMATES from ηv, not simulated: air-fuel ratio ${fix(a.airFuelRatio, 1)}, ` +
    `fuel ${fix(a.fuelHeatingValue / 1e6, 1)} MJ/kg, brake efficiency ${fix(a.brakeEfficiency * 100, 0)} % (case key 'estimate')`
  );
}

const effectWord = { helping: 'helping', neutral: 'neutral', costing: 'costing' } as const;

export function pointRows(points: readonly SweepPoint[], u: Units = METRIC): string[][] {
  return points.map((p) => [
    fix(p.rpm, 0),
    fix(p.volumetricEfficiency * 100, 1),
    u.value('torque', p.torque, 1),
    u.value('power', p.power, 1),
    signed(p.massImbalance * 100, 2),
    p.converged ? 'yes' : 'NO',
    effectWord[p.pulse.effect],
    p.pulse.peakOffsetFromIvc === null ? '—' : signed(p.pulse.peakOffsetFromIvc, 0),
    fix(p.pulse.waveOrder, 2),
  ]);
}

/** One point of a curve in the JSON of compare and tune: the fields a curve is read by (SI). */
export function pointJson(p: SweepPoint) {
  return {
    rpm: p.rpm,
    volumetricEfficiency: p.volumetricEfficiency,
    torque: p.torque,
    power: p.power,
    converged: p.converged,
    massImbalance: p.massImbalance,
  };
}

/** the point table's two header rows: the words, then the units */
export function pointHeader(u: Units = METRIC): string[][] {
  return [
    ['', '', 'torque*', 'power*', 'mass', '', 'wave', 'peak', 'wave'],
    ['rpm', 'ηv %', u.label('torque'), u.label('power'), 'balance %', 'converged', 'at IVC', 'vs IVC °', 'order'],
  ];
}

/** what the columns of the point table mean */
export const POINT_LEGEND =
  "torque*, power*: estimated brake torque and power; mass balance: the solver's mass balance error over the cycle; wave at IVC: the pressure wave's effect " +
  "when the valve closes; peak vs IVC: its compression peak's offset from IVC (− before, + after); wave order: f₁·120/N, quarter-wave periods per cycle";

/** fixed decimals with a sign; never "-0.00" (zero unsigned) */
export function signed(v: number, d: number): string {
  return signedFixed(v, d).replace(/^±/, '');
}

/**
 * CSV of a sweep: one convention with the run CSV (run-output.ts TRACE_COLUMNS):
 * SI values, a header row of snake_case names that end in the unit, one row
 * per speed. The valve pressure at IVC absolute and against the ambient (the
 * "vs ambient" of the screens).
 */
export const SWEEP_CSV_COLUMNS = [
  'speed_rpm',
  'volumetric_efficiency',
  'torque_estimate_N_m',
  'power_estimate_W',
  'mass_imbalance',
  'converged',
  'cycles',
  'trapped_mass_kg',
  'residual_fraction',
  'ivc_cylinder_pressure_Pa',
  'valve_pressure_at_ivc_Pa',
  'valve_pressure_at_ivc_vs_ambient_Pa',
  'peak_offset_from_ivc_deg',
  'wave_order',
  'wave_at_ivc',
] as const;

export function sweepCsv(points: readonly SweepPoint[], ambientPressure: number): string {
  const head = SWEEP_CSV_COLUMNS;
  const num = (v: number): string => (Number.isFinite(v) ? String(v) : '');
  const rows = points.map((p) =>
    [
      num(p.rpm),
      num(p.volumetricEfficiency),
      num(p.torque),
      num(p.power),
      num(p.massImbalance),
      p.converged ? 'yes' : 'no',
      String(p.cycles),
      num(p.trappedMass),
      num(p.residualFraction),
      num(p.ivcPressure),
      num(p.pulse.atIvc.pressure),
      num(p.pulse.atIvc.pressure - ambientPressure),
      p.pulse.peakOffsetFromIvc === null ? '' : num(p.pulse.peakOffsetFromIvc),
      num(p.pulse.waveOrder),
      p.pulse.effect,
    ].join(','),
  );
  return [head.join(','), ...rows].join('\n') + '\n';
}

/**
 * --csv FILE or --json (not both). An existing FILE without --force is refused
 * here, before any simulation runs (the atomic write checks again at the end).
 */
export function csvAndJsonChoice(args: ParsedArgs, io: CliIo, withSvg = false): string | undefined {
  const csv = args.string('csv');
  if (csv !== undefined && args.flag('json')) throw new CaseError('--csv', 'choose one of --json and --csv', 'option');
  if (args.flag('force') && csv === undefined && !(withSvg && args.string('svg') !== undefined))
    throw new CaseError('--force', `only applies with --csv FILE${withSvg ? ' or --svg FILE' : ''}`, 'option');
  // the same checks as every output file (cli/target.ts): not over anything but a regular file, not unasked
  if (csv !== undefined) checkTarget(csv, '--csv', io, args.flag('force'));
  return csv;
}

/** Load a case with --set and --allow-extreme (no --rpm: the speeds are a range here). */
export async function loadForSweep(file: string, args: ParsedArgs, io: CliIo): Promise<LoadedCase> {
  return loadCase(file, { set: args.list('set'), cwd: io.cwd, allowExtreme: args.flag('allow-extreme') });
}

const OPTIONS: OptionSpec[] = [
  RANGE_OPTION,
  BAND_OPTION,
  SET_OPTION,
  JOBS_OPTION,
  MEASURED_OPTION,
  { name: 'json', type: 'boolean', description: 'print the result as JSON (SI units)' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write one row per speed to FILE (header row with units)' },
  { name: 'svg', type: 'string', value: 'FILE', description: 'write the chart of ηv against speed (band, mean, best speed, tuned speeds) to FILE (SVG)' },
  { name: 'force', type: 'boolean', description: 'allow --csv and --svg to overwrite an existing file' },
  UNITS_OPTION,
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
];

export interface SweepJson {
  name: string;
  rpm: { from: number; to: number; step: number };
  points: SweepPoint[];
  band: SweepSummary['band'];
  bestRpm: number;
  bestVolumetricEfficiency: number;
  estimates: CaseEstimates;
  assumptions: OutputAssumptions & { note: string };
  stats: { jobs: number; chunkPoints: number; wallSeconds: number };
  /** with a dyno sheet: each measured point with the model at its speed */
  measured?: ReturnType<typeof dynoJson>;
  measuredFile?: string;
}

export const sweepCommand: Command = {
  name: 'sweep',
  summary: 'ηv, estimated torque and power against speed; band mean and best speed',
  help: `usage: tractwave sweep CASE [--rpm FROM:TO:STEP] [--band LO:HI]
                       [--set path=value ...] [--jobs N]
                       [--json | --csv FILE] [--svg FILE] [--force]

Simulates the case at each speed of the range and shows volumetric efficiency
against speed as a chart and a table, the mean over the speed band (area under
the curve divided by the band width: a band average, not a peak, is the figure
of merit), the speed of the best ηv, and the hand estimates beside them
(quarter-wave tuned speeds, a Helmholtz estimate) so you can see where simple
rules agree with the simulation and where they do not.

Each speed starts from the converged state of the speed before it (in fixed
chunks of ${SWEEP_CHUNK_POINTS} speeds, the first of each started from rest), so sweeps converge in
few cycles and give the same numbers for any --jobs.

Torque and power are estimates from ηv with an assumed air-fuel ratio, fuel
heating value and brake efficiency (case key 'estimate': airFuelRatio,
fuelHeatingValue, brakeEfficiency; defaults 12.8, 44 MJ/kg, 0.28).

The columns 'wave at IVC' and 'peak vs IVC °' say whether the pressure wave
at the valve helps or costs charge when the valve closes, and where the last
compression peak came (− before closing, + after). 'wave order' is f₁·120/N.
'mass balance %' is the solver's own check: runner inlet against valve.

--csv FILE writes SI values (ηv as a fraction, torque in N·m, power in W,
masses in kg, pressures in Pa) under a header whose names end in the unit:
speed_rpm, volumetric_efficiency, torque_estimate_N_m, power_estimate_W,
mass_imbalance, converged, cycles, trapped_mass_kg, residual_fraction,
ivc_cylinder_pressure_Pa, valve_pressure_at_ivc_Pa,
valve_pressure_at_ivc_vs_ambient_Pa, peak_offset_from_ivc_deg, wave_order,
wave_at_ivc. --units changes the text only.

Default range: the case key 'sweep {from, to, step}', else ${DEFAULT_SWEEP.from}:${DEFAULT_SWEEP.to}:${DEFAULT_SWEEP.step};
default band: the case key 'band {from, to}', else the whole range.

options
${optionHelp(OPTIONS)}

--json prints: name, rpm {from, to, step}, points [{rpm, volumetricEfficiency,
torque [N·m], power [W], converged, massImbalance, cycles, deliveredMass,
trappedMass, residualFraction, ivcPressure, peakReverseFlow, pulse {...}}],
band {from, to, meanVolumetricEfficiency}, bestRpm, bestVolumetricEfficiency,
estimates {...}, assumptions {...}, stats {jobs, chunkPoints, wallSeconds};
with a dyno sheet also measured [{rpm, torque?, power?, volumetricEfficiency?,
model {...}, difference {...}}] (model − measured, SI) and measuredFile.

--measured FILE (or the case's measured key) draws a dyno sheet's points (●)
on the charts and lists them against the model at the measured speeds.

examples
  tractwave sweep cases/demo.yaml
  tractwave sweep cases/demo.yaml --rpm 4000:9000:500 --set runner.length=320mm
  tractwave sweep cases/demo.yaml --csv demo-sweep.csv
  tractwave sweep cases/measured-single.yaml --measured cases/measured/dyno.csv
  tractwave sweep cases/demo.yaml --svg demo-sweep.svg
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'sweep');
    const csv = csvAndJsonChoice(args, io, true);
    const svg = args.string('svg');
    if (svg !== undefined) {
      if (!/\.svg$/i.test(svg)) throw new CaseError('--svg', `expected a file name ending in .svg, got '${svg}'`, 'option');
      checkTarget(svg, '--svg', io, args.flag('force'));
    }
    const jobs = parseJobs(args);
    prestartPool(jobs); // the workers load while the case does
    const loaded = await loadForSweep(file!, args, io);
    const u = displayUnits(args, loaded);
    const dyno = await dynoOf(args, loaded, io.cwd);
    const grid = sweepGrid(args, loaded.case);
    const band = chooseBand(args, loaded.case, grid);
    checkCost(engineCost(loaded.model, grid.values, jobs), loaded.model, args, '--rpm');
    const assumptions = assumptionsOf(loaded.case);
    const bar = progress(io, 'sweep');
    const t0 = performance.now();
    let points: SweepPoint[];
    try {
      points = await runSweep(loaded.model, grid.values, { jobs, assumptions, onProgress: bar.tick });
    } finally {
      bar.done();
    }
    const wallSeconds = (performance.now() - t0) / 1000;
    const summary = summariseSweep(points, band);
    const estimates = caseEstimates(loaded.model, grid.values[0]!, grid.values[grid.values.length - 1]!);
    for (const w of sweepWarnings(points, loaded.model.numerics.maxCycles, '', loaded.model)) io.stderr.write(`${w}\n`);
    if (band.note) io.stderr.write(`note: ${band.note}\n`);
    if (svg !== undefined) {
      const { renderSvg, speedVeChart } = await import('../../report/index.js');
      const chart = speedVeChart({ design: { name: loaded.model.name }, rpms: grid.values, band, curve: { points, summary }, estimates });
      await writeFileAtomic(svg, `<?xml version="1.0" encoding="UTF-8"?>\n${await renderSvg(chart.spec)}\n`, { force: args.flag('force'), option: '--svg', cwd: io.cwd });
    }

    if (args.flag('json')) {
      const json: SweepJson = {
        name: loaded.model.name,
        rpm: { from: grid.from, to: grid.to, step: grid.step },
        points,
        band: summary.band,
        bestRpm: summary.bestRpm,
        bestVolumetricEfficiency: summary.bestVolumetricEfficiency,
        estimates,
        assumptions: { ...assumptions, note: 'torque and power are estimates from ηv with these assumptions, not simulated' },
        stats: { jobs: Math.min(jobs, Math.ceil(points.length / SWEEP_CHUNK_POINTS)), chunkPoints: SWEEP_CHUNK_POINTS, wallSeconds },
        ...(dyno ? { measured: dynoJson(points, dyno), measuredFile: dyno.file } : {}),
      };
      io.stdout.write(`${JSON.stringify(json)}\n`);
      return 0;
    }
    if (csv !== undefined) await writeFileAtomic(csv, sweepCsv(points, loaded.model.ambient.pressure), { force: args.flag('force'), option: '--csv', cwd: io.cwd });

    const out: string[] = [];
    out.push(
      `${loaded.model.name}: speed sweep ${fix(grid.values[0]!, 0)}–${fix(grid.values[grid.values.length - 1]!, 0)} rpm every ${fix(grid.step, 0)} rpm` +
        ` (${points.length} points, ${jobs} job${jobs === 1 ? '' : 's'}, ${fix(wallSeconds, 1)} s)`,
      `  ${assemblyLine(loaded.model, u)}`,
      '',
      `volumetric efficiency ηv [%] against speed${dyno?.kinds.includes('volumetricEfficiency') ? ` (● measured, ${dyno.file})` : ''}`,
    );
    out.push(
      ...curveChart(grid.values, [{ values: points.map((p) => p.volumetricEfficiency * 100) }], {
        band,
        tuned: estimates.tunedSpeeds.map((t) => ({ label: String(t.order), rpm: t.rpm })),
        ...(dyno ? { points: chartPoints(dyno, 'volumetricEfficiency', u) } : {}),
      }),
    );
    if (dyno) out.push(...outputChart(grid.values, [points], dyno, { band }, u));
    out.push('');
    out.push(
      `band ${fix(band.from, 0)}–${fix(band.to, 0)} rpm: mean ηv ${fix(summary.band.meanVolumetricEfficiency * 100, 1)} %` +
        ' (area under the curve / band width: the band average, not the peak, is the figure of merit)',
    );
    out.push(`best ηv ${fix(summary.bestVolumetricEfficiency * 100, 1)} % at ${fix(summary.bestRpm, 0)} rpm`);
    const bestPoint = points.find((p) => p.rpm === summary.bestRpm);
    if (bestPoint) out.push(`why, at ${fix(bestPoint.rpm, 0)} rpm: ${restateGauge(bestPoint.pulse.verdict, u)}`);
    out.push('hand estimates beside the simulation:');
    out.push(...estimateLines(estimates, summary.bestRpm, u));
    io.stdout.write(out.map((l) => wrapLine(l)).join('\n') + '\n\n');
    io.stdout.write(table(pointHeader(u), pointRows(points, u)));
    io.stdout.write('\n' + wrapLine(POINT_LEGEND) + '\n');
    io.stdout.write(wrapLine(`* ${assumptionLine(assumptions)}`) + '\n');
    const supply = loaded.model.inlet.kind === 'plenum' ? loaded.model.inlet.supply : undefined;
    if (supply) io.stdout.write(wrapLine(`ηv is on the ambient density; the plenum is fed from a boost supply at ${u.text('pressure', supply.pressure)}, ${u.text('temperature', supply.temperature, 0)} (run gives ηv on the supply density too)`) + '\n');
    if (dyno) io.stdout.write(dynoBlock(points, dyno, u));
    io.stdout.write('results are estimates from a simplified model: verify them on an engine.\n');
    if (csv !== undefined) io.stdout.write(`wrote ${points.length} rows (one per speed) to ${csv}\n`);
    if (svg !== undefined) io.stdout.write(`wrote the chart of ηv against speed to ${svg}\n`);
    return 0;
  },
};
