/**
 * `tractwave tune CASE --vary path=FROM:TO:STEP [--vary ...]`: a grid over up
 * to four case values, each design swept over the same speeds and ranked by
 * its band-mean ηv, best first, with a text heat map of ηv over speed and
 * design. Also:
 *  - `--shard K/N` | `auto` | `auto/N`: run one deterministic slice of the
 *    grid and print it as a part (JSON with the case, the options and their
 *    fingerprint) for `tractwave merge` (merge.ts), which prints what the
 *    whole tune would have printed, byte for byte;
 *  - `--search`: walk towards the best band mean with the Nelder–Mead
 *    simplex instead of simulating the whole grid (analysis/search.ts).
 *
 * The grid is counted before anything is built (analysis/shard.ts), and a
 * rough cost estimate is printed before a long run (analysis/cost.ts).
 *
 * What tune and merge share lives here: `planTune` turns the case and the
 * options into the plan (axes, speeds, band, grid size), `designOutcome`
 * keeps of a simulated design what the report reads, `writeTuneReport`
 * prints the report from the plan and the outcomes alone.
 */
import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import { performance } from 'node:perf_hooks';
import { combinedCost, engineCost, roughDuration, sweepsSeconds } from '../../analysis/cost.js';
import { parseVary, type NumberGrid, type VarySpec } from '../../analysis/range.js';
import { DesignSearch, RESOLUTION, type SearchAxis } from '../../analysis/search.js';
import { NELDER_MEAD_LIBRARY } from '../../analysis/nelder-mead.js';
import { canonicalJson, gridSize, parseShard, shardDesigns, shardSize, ShardInputError, type Environment, type Shard } from '../../analysis/shard.js';
import { bandMean, type SweepPoint } from '../../analysis/sweep.js';
import { designAt, edgePaths, HEAT_SHADES, rankDesigns, shadeIndex, shadeRanges, type DesignPoint, type RankedDesign, type VaryAxis } from '../../analysis/tune.js';
import { prestartPool, runSweeps } from '../../analysis/worker-pool.js';
import { CaseError, isCaseError } from '../../case/errors.js';
import { buildCase, parseYamlText, readCaseText, type LoadedCase } from '../../case/load.js';
import { MODEL_UNIT, UNITS } from '../../case/units.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, displayUnits, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { fix, table } from '../format.js';
import type { CliIo } from '../io.js';
import { packageVersion } from '../package-root.js';
import { writeFileAtomic } from '../write-file.js';
import {
  asInputError,
  assumptionsOf,
  BAND_OPTION,
  chooseBand,
  csvAndJsonChoice,
  JOBS_OPTION,
  parseJobs,
  pointJson,
  progress,
  RANGE_OPTION,
  sweepGrid,
  sweepWarnings,
  wrapLine,
  type BandChoice,
} from './sweep.js';

/** the most designs one run simulates (a whole tune, one shard, or one search's budget) */
export const MAX_DESIGNS = 2000;
/** the most designs a grid may hold when it is cut into shards */
export const MAX_GRID_DESIGNS = 100000;
/** the most --vary axes */
export const MAX_VARY = 4;
/** default --budget of --search */
export const DEFAULT_BUDGET = 40;
/** a run estimated longer than this [s] says so before it starts */
const LONG_RUN_SECONDS = 30;
/** the ranking table lists every design up to this many, else the best TABLE_ROWS */
const TABLE_ALL = 30;
const TABLE_ROWS = 25;
/** the heat map is drawn up to this many designs */
const HEAT_MAP_ROWS = 40;

/** the part format (`tune --shard`), checked by merge */
export const PART_FORMAT = 'tractwave tune part';
export const PART_VERSION = 1;

const OPTIONS: OptionSpec[] = [
  {
    name: 'vary',
    type: 'list',
    value: 'path=FROM:TO:STEP',
    description: `a case value to vary, e.g. runner.length=250mm:450mm:50mm (up to ${MAX_VARY} times)`,
  },
  RANGE_OPTION,
  BAND_OPTION,
  SET_OPTION,
  JOBS_OPTION,
  { name: 'json', type: 'boolean', description: 'print the ranking as JSON (SI units)' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write one row per design and speed to FILE (header row with units)' },
  { name: 'force', type: 'boolean', description: 'allow --csv to overwrite an existing file' },
  {
    name: 'shard',
    type: 'string',
    value: 'K/N|auto',
    description: 'run only slice K of N of the grid and print it as a part for tractwave merge; auto: K and N from a Slurm array or (auto/N) a Kubernetes indexed job',
  },
  { name: 'search', type: 'boolean', description: 'walk towards the best band mean (Nelder–Mead simplex) instead of simulating the whole grid' },
  { name: 'budget', type: 'string', value: 'N', description: `with --search: the most designs to simulate (default ${DEFAULT_BUDGET})` },
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
  UNITS_OPTION,
];

// ---------------------------------------------------------------- the plan

/** The options that decide a tune's results (what a part's fingerprint covers). */
export interface TuneRequest {
  vary: string[];
  set: string[];
  /** --rpm as typed, or null (the case's sweep key) */
  rpm: string | null;
  /** --band as typed, or null */
  band: string | null;
}

/** An axis of the grid: the typed values, their SI values, and how to show them. */
export interface Axis extends VaryAxis {
  spec: VarySpec;
  /** the values as shown: "250 mm" */
  labels: string[];
  /** typed value → SI */
  toSI: (v: number) => number;
  /** whole numbers only (valve counts): --search keeps it on its grid */
  discrete: boolean;
}

/** case paths that hold whole numbers */
function isWholeNumberPath(path: string): boolean {
  return /(^|\.)valves$/.test(path);
}

function toAxis(spec: VarySpec): Axis {
  const unit = spec.grid.unit;
  let convert = (v: number): number => v;
  if (unit !== '') {
    const def = UNITS[unit];
    if (!def) throw new CaseError(`--vary ${spec.path}`, `unknown unit '${unit}'`, 'option');
    convert = def.toModel;
  }
  return {
    path: spec.path,
    values: spec.grid.values.map(convert),
    setValues: spec.setValues,
    spec,
    labels: spec.grid.values.map((v) => labelOf(v, unit)),
    toSI: convert,
    discrete: isWholeNumberPath(spec.path),
  };
}

function labelOf(v: number, unit: string): string {
  return unit ? `${v} ${unit}` : String(v);
}

/** Parse the --vary texts into axes; bad ones are exit 2 naming the option. */
export function parseAxes(varyTexts: readonly string[]): Axis[] {
  if (varyTexts.length === 0) throw new CaseError('--vary', 'needed: what to vary, e.g. --vary runner.length=250mm:450mm:50mm', 'option');
  if (varyTexts.length > MAX_VARY) throw new CaseError('--vary', `at most ${MAX_VARY} (a grid grows as the product of their sizes), got ${varyTexts.length}`, 'option');
  let axes: Axis[];
  try {
    axes = varyTexts.map((t) => {
      const spec = parseVary(t);
      if (spec.path === 'rpm')
        throw new CaseError('--vary rpm', 'rpm is swept, not a design value: use --rpm FROM:TO:STEP for the speeds and --band LO:HI for the band', 'option');
      return toAxis(spec);
    });
  } catch (e) {
    throw asInputError(e);
  }
  for (let k = 1; k < axes.length; k++)
    if (axes.slice(0, k).some((a) => a.path === axes[k]!.path)) throw new CaseError('--vary', `${axes[k]!.path} is given twice`, 'option');
  return axes;
}

export interface TunePlan {
  /** the case file's name without its directory (the name a part records) */
  caseFile: string;
  /** the case as parsed, before --set */
  raw: Record<string, unknown>;
  request: TuneRequest;
  axes: Axis[];
  /** the case with --set applied (the design values not yet) */
  base: LoadedCase;
  /** speeds */
  grid: NumberGrid;
  band: BandChoice;
  /** designs in the whole grid */
  total: number;
  /** values outside the working ranges accepted (--allow-extreme) */
  allowExtreme: boolean;
}

/** The plan of a tune: the same for tune and merge, from the case and the options alone. */
export function planTune(raw: Record<string, unknown>, caseFile: string, request: TuneRequest, allowExtreme = false): TunePlan {
  const axes = parseAxes(request.vary);
  const total = gridSize(axes.map((a) => a.values.length));
  const base = buildCase(raw, caseFile, { set: request.set, allowExtreme });
  const argv = [...(request.rpm !== null ? ['--rpm', request.rpm] : []), ...(request.band !== null ? ['--band', request.band] : [])];
  const args = parseArgs(argv, [RANGE_OPTION, BAND_OPTION]);
  const grid = sweepGrid(args, base.case);
  const band = chooseBand(args, base.case, grid);
  return { caseFile, raw, request, axes, base, grid, band, total, allowExtreme };
}

function designCase(plan: TunePlan, sets: readonly string[]): LoadedCase {
  try {
    return buildCase(plan.raw, plan.caseFile, { set: [...plan.request.set, ...sets], allowExtreme: plan.allowExtreme });
  } catch (e) {
    if (isCaseError(e)) throw new CaseError(e.path, `${e.detail} (in the design ${sets.join(', ')})`, e.code);
    throw e;
  }
}

// ---------------------------------------------------------------- outcomes

/** One speed of a design, as the report and the JSON read it (SI). */
export type TunePoint = ReturnType<typeof pointJson>;

/** What the report keeps of one simulated design. */
export interface DesignOutcome {
  /** design number in the grid (grid order) */
  number: number;
  points: TunePoint[];
  /** the pulse-timing verdict at the design's own peak speed */
  verdict: string;
}

export function designOutcome(number: number, points: readonly SweepPoint[]): DesignOutcome {
  let best: SweepPoint | undefined;
  for (const p of points) if (best === undefined || p.volumetricEfficiency > best.volumetricEfficiency) best = p;
  return { number, points: points.map(pointJson), verdict: best?.pulse.verdict ?? '' };
}

/** Simulate the designs with these grid numbers; results in the same order. */
async function simulateDesigns(plan: TunePlan, numbers: readonly number[], jobs: number, io: CliIo, what: string, sharded: boolean): Promise<DesignOutcome[]> {
  const designs = numbers.map((i) => designAt(plan.axes, i));
  const loaded = designs.map((d) => designCase(plan, d.sets));
  announceCost(io, plan, designs.length, jobs, what, !sharded);
  const bar = progress(io, what);
  const t0 = performance.now();
  let points: SweepPoint[][];
  try {
    points = await runSweeps(
      loaded.map((l) => ({ model: l.model, rpms: plan.grid.values })),
      { jobs, assumptions: assumptionsOf(plan.base.case), onProgress: bar.tick },
    );
  } finally {
    bar.done();
  }
  const seconds = (performance.now() - t0) / 1000;
  if (io.stderrIsTTY || designs.length * plan.grid.values.length >= 200)
    io.stderr.write(`${what}: ${designs.length * plan.grid.values.length} points on ${jobs} job${jobs === 1 ? '' : 's'} in ${fix(seconds, 1)} s\n`);
  return points.map((p, k) => designOutcome(numbers[k]!, p));
}

/** The line said before a long run (undefined for a short one). */
export function costLine(model: LoadedCase['model'], rpms: readonly number[], designs: number, jobs: number, what: string, shardHint = true): string | undefined {
  const s = sweepsSeconds(model, rpms, designs, jobs);
  if (!(s >= LONG_RUN_SECONDS)) return undefined;
  const points = designs * rpms.length;
  return wrapLine(
    `${what}: ${designs} designs × ${rpms.length} speeds = ${points} points; estimated about ${roughDuration(s)} on ${jobs} job${jobs === 1 ? '' : 's'} ` +
      `(a rough figure from the mesh and the speeds; machines differ)${shardHint ? '. To spread a grid over several machines: --shard K/N and tractwave merge' : ''}`,
  );
}

function announceCost(io: CliIo, plan: TunePlan, designs: number, jobs: number, what: string, shardHint = true): void {
  const line = costLine(plan.base.model, plan.grid.values, designs, jobs, what, shardHint);
  if (line !== undefined) io.stderr.write(`${line}\n`);
}

// ---------------------------------------------------------------- the report

/** "250 mm / 50" — a design's values as typed */
function labelOfDesign(axes: readonly Axis[], index: readonly number[]): string {
  return axes.map((a, k) => a.labels[index[k] ?? 0] ?? '?').join(' / ');
}

/** rows of the ranking, in an order the caller chooses */
interface ReportRow {
  ranked: RankedDesign<TunePoint>;
  /** typed values, one per axis */
  typed: number[];
  label: string;
  verdict: string;
}

/**
 * Text heat map: one row per design (grid order), one column per speed,
 * a shade per ηv. Characters only (readable without colour), legend below.
 */
export function heatMap(
  rpms: readonly number[],
  rows: readonly { label: string; points: readonly Pick<SweepPoint, 'rpm' | 'volumetricEfficiency'>[] }[],
  band?: { from: number; to: number },
): string[] {
  const all = rows.flatMap((r) => r.points.map((p) => p.volumetricEfficiency)).filter(Number.isFinite);
  const scale = { shades: HEAT_SHADES, lo: Math.min(...all), hi: Math.max(...all) };
  const cell = rpms.length <= 30 ? 2 : 1;
  const lw = Math.max(...rows.map((r) => r.label.length), 4);
  const lo = rpms[0]!;
  const hi = rpms[rpms.length - 1]!;
  const width = rpms.length * cell;
  const out: string[] = [];
  // speed labels over the first, middle and last column
  const head = new Array<string>(lw + 3 + width + 14).fill(' ');
  const put = (row: string[], at: number, text: string): void => {
    for (let k = 0; k < text.length; k++) row[at + k] = text[k]!;
  };
  const colOf = (i: number): number => lw + 3 + i * cell;
  const mid = Math.floor((rpms.length - 1) / 2);
  // the first and last speed, then the middle one where it fits between them
  const marks = rpms.length > 2 ? [0, rpms.length - 1, mid] : rpms.map((_, i) => i);
  const taken: [number, number][] = [];
  for (const i of marks) {
    const s = fix(rpms[i]!, 0);
    const centred = Math.max(colOf(i) - Math.floor(s.length / 2) + (cell > 1 ? 1 : 0), lw + 3);
    // inside the map where it fits; the last one may stand out past its right edge
    let at = Math.min(centred, lw + 3 + width - s.length);
    if (i === rpms.length - 1 && taken.some(([, b]) => at <= b + 1)) at = Math.max(at, ...taken.map(([, b]) => b + 2));
    if (taken.some(([a, b]) => at <= b + 1 && at + s.length - 1 >= a - 1)) continue; // keep a space between labels
    put(head, at, s);
    taken.push([at, at + s.length - 1]);
  }
  put(head, Math.max(lw + 3 + width + 1, ...taken.map(([, b]) => b + 2)), 'rpm');
  out.push(head.join('').trimEnd());
  for (const r of rows) {
    const cells = rpms.map((rpm) => {
      const p = r.points.find((q) => q.rpm === rpm);
      const k = p ? shadeIndex(p.volumetricEfficiency, scale) : -1;
      return (k < 0 ? '?' : HEAT_SHADES[k]!).repeat(cell);
    });
    out.push(`${r.label.padStart(lw)} |${cells.join('')}|`);
  }
  if (band && hi > lo) {
    const row = new Array<string>(lw + 3 + width).fill(' ');
    put(row, Math.max(0, lw - 4), 'band');
    const a = rpms.findIndex((x) => x >= band.from);
    let b = rpms.length - 1;
    while (b > 0 && rpms[b]! > band.to) b--;
    if (a >= 0 && b >= a) {
      const start = colOf(a);
      const end = colOf(b) + cell - 1;
      put(row, start, end > start ? `├${'─'.repeat(end - start - 1)}┤` : '│');
    }
    out.push(row.join('').trimEnd());
  }
  const legend = shadeRanges(scale).map((s) => `${s.shade} from ${fix(s.from * 100, 1)}`);
  out.push(wrapLine(`shades, lowest to highest ηv %: ${legend.join(', ')}, up to ${fix(scale.hi * 100, 1)} %`));
  return out;
}

/** the SI unit of a value typed in `unit`, as a CSV header suffix ("m", "m3", "Pa"); '' for a plain number */
function siSuffix(unit: string | undefined): string {
  if (!unit) return '';
  const kind = UNITS[unit]?.kind;
  if (!kind || kind === 'dimensionless') return '';
  return `_${MODEL_UNIT[kind].replace('³', '3').replace('/', '_per_')}`;
}

/**
 * CSV: one row per design and speed, rows in the given order. One convention
 * with run and sweep: SI values, the header names end in the unit (the
 * varied values too: runner.length_m).
 */
function tuneCsv(axes: readonly Axis[], rows: readonly ReportRow[]): string {
  const head = [
    ...axes.map((a) => `${a.path}${siSuffix(a.spec.grid.unit)}`),
    'speed_rpm',
    'volumetric_efficiency',
    'torque_estimate_N_m',
    'power_estimate_W',
    'converged',
    'band_mean_volumetric_efficiency',
    'rank',
  ];
  const num = (v: number, _d?: number): string => (Number.isFinite(v) ? String(v) : '');
  const lines: string[] = [];
  for (const r of rows) {
    const d = r.ranked;
    for (const p of d.points)
      lines.push(
        [
          ...r.typed.map((v, k) => num(axes[k]!.toSI(v))),
          num(p.rpm),
          num(p.volumetricEfficiency),
          num(p.torque),
          num(p.power),
          p.converged ? 'yes' : 'no',
          num(d.meanVolumetricEfficiency),
          String(d.rank),
        ].join(','),
      );
  }
  return [head.join(','), ...lines].join('\n') + '\n';
}

function designJson(d: RankedDesign<TunePoint>) {
  return {
    values: d.values,
    meanVolumetricEfficiency: d.meanVolumetricEfficiency,
    peakRpm: d.peakRpm,
    peakVolumetricEfficiency: d.peakVolumetricEfficiency,
    rank: d.rank,
    converged: d.unconverged === 0,
    points: d.points,
  };
}

const FIGURE_OF_MERIT = 'meanVolumetricEfficiency: the mean ηv over the band (area under the curve / band width); a band average, not a peak';

function rangeText(a: Axis): string {
  return `${a.labels[0]}–${a.labels[a.labels.length - 1]}`;
}

/** Warnings for a best value at the end of its range (stderr). */
function edgeWarnings(axes: readonly Axis[], edges: readonly string[], bestTyped: readonly number[], ends: (a: Axis) => [number, number]): string[] {
  return edges.map((path) => {
    const k = axes.findIndex((a) => a.path === path);
    const a = axes[k]!;
    const v = bestTyped[k]!;
    const [lo, hi] = ends(a);
    const u = a.spec.grid.unit;
    return (
      `warning: the best design has ${path} = ${labelOf(v, u)}, the ${v === lo ? 'low' : 'high'} end of its range ${labelOf(lo, u)}–${labelOf(hi, u)}: ` +
      `the best may lie beyond it; widen the range (--vary ${path}=...)`
    );
  });
}

/** the ends of a grid axis: its first and last value */
const gridEnds = (a: Axis): [number, number] => [a.spec.grid.values[0]!, a.spec.grid.values[a.spec.grid.values.length - 1]!];
/** the ends of a searched axis: FROM and TO */
const searchEnds = (a: Axis): [number, number] => (a.discrete ? gridEnds(a) : [a.spec.grid.from, a.spec.grid.to]);

export interface ReportOptions {
  json: boolean;
  csv: string | undefined;
  force: boolean;
}

/**
 * Print the report of a grid tune from its plan and the outcomes of every
 * design (in grid order). Everything printed depends on these alone, so a
 * merge of parts prints what the whole tune printed.
 */
export async function writeTuneReport(plan: TunePlan, outcomes: readonly DesignOutcome[], io: CliIo, o: ReportOptions): Promise<number> {
  const { axes, grid, band } = plan;
  const designs = outcomes.map((x) => designAt(axes, x.number));
  const ranked = rankDesigns(
    designs,
    outcomes.map((x) => x.points),
    band,
  );
  const rowOf = (d: RankedDesign<TunePoint>): ReportRow => ({
    ranked: d,
    typed: axes.map((a, k) => a.spec.grid.values[d.index[k] ?? 0]!),
    label: labelOfDesign(axes, d.index),
    verdict: outcomes[d.order]!.verdict,
  });
  const rows = ranked.map(rowOf);
  const best = rows[0];
  const edges = best ? edgePaths(axes.map((a) => ({ path: a.path, size: a.values.length })), (k) => best.ranked.index[k] === 0 || best.ranked.index[k] === axes[k]!.values.length - 1) : [];
  const byGrid = [...rows].sort((x, y) => outcomes[x.ranked.order]!.number - outcomes[y.ranked.order]!.number);
  return writeReport(plan, rows, byGrid, edges, io, o, {
    title: `${plan.base.model.name}: tune over ${axes.map((a) => `${a.path} ${rangeText(a)}`).join(' × ')} (${designs.length} designs)`,
    json: {},
    extraText: [],
    ends: gridEnds,
  });
}

interface ReportExtras {
  title: string;
  /** fields added to the JSON after `stats` */
  json: Record<string, unknown>;
  /** lines printed before the ranking */
  extraText: string[];
  /** the ends of an axis's range (grid: first and last value; search: FROM and TO) */
  ends: (a: Axis) => [number, number];
}

async function writeReport(
  plan: TunePlan,
  rows: readonly ReportRow[],
  csvOrder: readonly ReportRow[],
  edges: readonly string[],
  io: CliIo,
  o: ReportOptions,
  extras: ReportExtras,
): Promise<number> {
  const { axes, grid, band } = plan;
  const maxCycles = plan.base.model.numerics.maxCycles;
  for (const r of csvOrder) for (const w of sweepWarnings(r.ranked.points, maxCycles, r.label, plan.base.model)) io.stderr.write(`${w}\n`);
  if (band.note) io.stderr.write(`note: ${band.note}\n`);
  const best = rows[0];
  if (best) for (const w of edgeWarnings(axes, edges, best.typed, extras.ends)) io.stderr.write(`${w}\n`);
  const points = rows.length * grid.values.length;

  if (o.json) {
    const json = {
      name: plan.base.model.name,
      vary: axes.map((a) => ({ path: a.path, values: a.values, unit: a.spec.grid.unit })),
      rpm: { from: grid.from, to: grid.to, step: grid.step },
      band: { from: band.from, to: band.to },
      figureOfMerit: FIGURE_OF_MERIT,
      designs: rows.map((r) => designJson(r.ranked)),
      edges,
      stats: { designs: rows.length, points },
      ...extras.json,
    };
    io.stdout.write(`${JSON.stringify(json)}\n`);
    return 0;
  }
  if (o.csv !== undefined) await writeFileAtomic(o.csv, tuneCsv(axes, csvOrder), { force: o.force, option: '--csv', cwd: io.cwd });

  const lo = grid.values[0]!;
  const hi = grid.values[grid.values.length - 1]!;
  const out: string[] = [
    `${extras.title} × ${fix(lo, 0)}–${fix(hi, 0)} rpm every ${fix(grid.step, 0)} rpm (${points} points)`,
    '',
    `figure of merit: the mean ηv over the band ${fix(band.from, 0)}–${fix(band.to, 0)} rpm (area under the curve / band width).` +
      ' A band average, not a peak, decides: a design that peaks high at one speed often gives it back at the next.',
    '',
    ...extras.extraText,
  ];
  io.stdout.write(out.map((l) => wrapLine(l)).join('\n') + '\n');
  const header = ['rank', ...axes.map((a) => a.path), 'band mean ηv %', 'peak ηv %', 'at rpm', 'converged'];
  const shown = rows.length <= TABLE_ALL ? rows : rows.slice(0, TABLE_ROWS);
  const cells = shown.map((r) => [
    String(r.ranked.rank),
    ...axes.map((a, k) => labelOf(r.typed[k]!, a.spec.grid.unit)),
    fix(r.ranked.meanVolumetricEfficiency * 100, 2),
    fix(r.ranked.peakVolumetricEfficiency * 100, 1),
    fix(r.ranked.peakRpm, 0),
    r.ranked.unconverged === 0 ? 'yes' : `${r.ranked.unconverged} no`,
  ]);
  io.stdout.write(table(header, cells));
  if (shown.length < rows.length) io.stdout.write(`  … and ${rows.length - shown.length} more designs (all of them: --json or --csv FILE)\n`);
  const second = rows[1];
  if (best) {
    const gap = second
      ? `, ${fix((best.ranked.meanVolumetricEfficiency - second.ranked.meanVolumetricEfficiency) * 100, 2)} points above the next (${second.label})`
      : '';
    io.stdout.write(
      '\n' +
        wrapLine(
          `best over the band: ${best.label} — mean ηv ${fix(best.ranked.meanVolumetricEfficiency * 100, 1)} %${gap}; ` +
            `its own peak is at ${fix(best.ranked.peakRpm, 0)} rpm`,
        ) +
        '\n',
    );
    if (best.verdict) io.stdout.write(wrapLine(`why, at its peak: ${best.verdict}`) + '\n');
    let peakiest = best;
    for (const r of rows) if (r.ranked.peakVolumetricEfficiency > peakiest.ranked.peakVolumetricEfficiency) peakiest = r;
    if (peakiest !== best)
      io.stdout.write(
        wrapLine(
          `the highest single peak (${fix(peakiest.ranked.peakVolumetricEfficiency * 100, 1)} % at ${fix(peakiest.ranked.peakRpm, 0)} rpm, ${peakiest.label}) ` +
            `ranks ${peakiest.ranked.rank}: over the band it gives back what it gains at its peak`,
        ) + '\n',
      );
    if (edges.length > 0) io.stdout.write(wrapLine(`at the end of its range: ${edges.join(', ')} — widen the range to see whether the best lies beyond`) + '\n');
  }
  if (csvOrder.length <= HEAT_MAP_ROWS) {
    io.stdout.write(`\nηv over speed (columns) and design (rows: ${axes.map((a) => a.path).join(' / ')})\n`);
    io.stdout.write(heatMap(grid.values, csvOrder.map((r) => ({ label: r.label, points: r.ranked.points })), band).join('\n') + '\n');
  } else io.stdout.write(`\n(no heat map for ${csvOrder.length} designs: it is drawn up to ${HEAT_MAP_ROWS}; --csv FILE has every point)\n`);
  io.stdout.write('\nresults are estimates from a simplified model: verify them on an engine.\n');
  if (o.csv !== undefined) io.stdout.write(`wrote ${csvOrder.reduce((n, r) => n + r.ranked.points.length, 0)} rows (one per design and speed) to ${o.csv}\n`);
  return 0;
}

// ---------------------------------------------------------------- parts (--shard)

/** The fingerprint of a case and the options that decide its results: sha256 of their canonical JSON. */
export function partFingerprint(p: { caseFile: string; case: unknown; request: TuneRequest; tool: string }): string {
  const text = canonicalJson({ format: PART_FORMAT, version: PART_VERSION, tool: p.tool, caseFile: p.caseFile, case: p.case, options: p.request });
  return `sha256:${createHash('sha256').update(text, 'utf8').digest('hex')}`;
}

/** A checksum of a part's simulated designs (so a damaged or edited part is noticed): sha256 of their canonical JSON. */
export function designsChecksum(designs: readonly DesignOutcome[]): string {
  return `sha256:${createHash('sha256').update(canonicalJson(designs), 'utf8').digest('hex')}`;
}

/** JSON text with non-finite numbers kept (as "NaN", "Infinity", "-Infinity"). */
export function partText(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));
}

export interface TunePart {
  format: typeof PART_FORMAT;
  version: number;
  tool: string;
  fingerprint: string;
  shard: Shard;
  /** designs in the whole grid */
  gridDesigns: number;
  caseFile: string;
  case: Record<string, unknown>;
  options: TuneRequest;
  designs: DesignOutcome[];
  /** designsChecksum(designs) */
  checksum: string;
}

function toolName(): string {
  return `tractwave ${packageVersion()}`;
}

// ---------------------------------------------------------------- --search

async function runSearch(plan: TunePlan, budget: number, jobs: number, io: CliIo, o: ReportOptions): Promise<number> {
  const { axes } = plan;
  const searchAxes: SearchAxis[] = axes.map((a) => ({
    path: a.path,
    from: a.spec.grid.from,
    to: a.spec.grid.to,
    step: a.spec.grid.step,
    discrete: a.discrete,
    values: a.spec.grid.values,
  }));
  const search = new DesignSearch(searchAxes, budget);
  if (search.combinationCount > budget)
    throw new CaseError(
      '--budget',
      `${search.combinationCount} combinations of ${axes.filter((a) => a.discrete).map((a) => a.path).join(', ')} need a budget of at least that many designs, got ${budget}`,
      'option',
    );
  announceCost(io, plan, budget, jobs, 'search (at most)', false);
  const live = o.json ? (io.stderrIsTTY ? io.stderr : undefined) : io.stdout;
  live?.write(
    wrapLine(
      `searching over ${axes.filter((a) => !a.discrete).map((a) => `${a.path} ${labelOf(a.spec.grid.from, a.spec.grid.unit)}–${labelOf(a.spec.grid.to, a.spec.grid.unit)}`).join(' × ')}` +
        `${search.combinationCount > 1 ? ` for each of ${search.combinationCount} combinations of ${axes.filter((a) => a.discrete).map((a) => a.path).join(', ')}` : ''}` +
        ` with the Nelder–Mead simplex (${NELDER_MEAD_LIBRARY.replace(/ \(.*\)$/, '')}), at most ${budget} designs:`,
    ) + '\n',
  );
  const outcomes: DesignOutcome[] = [];
  const typedList: number[][] = [];
  const designs: Pick<DesignPoint, 'values' | 'index'>[] = [];
  const assumptions = assumptionsOf(plan.base.case);
  let bestScore = Number.NEGATIVE_INFINITY;
  let reason = '';
  const t0 = performance.now();
  for (;;) {
    const r = search.next();
    if (r.kind === 'done') {
      reason = r.reason;
      break;
    }
    const typed = r.values;
    const sets = axes.map((a, k) => `${a.path}=${labelOf(typed[k]!, a.spec.grid.unit)}`);
    const loaded = designCase(plan, sets);
    const [points] = await runSweeps([{ model: loaded.model, rpms: plan.grid.values }], { jobs, assumptions });
    const n = outcomes.length;
    const outcome = designOutcome(n, points ?? []);
    const values: Record<string, number> = {};
    axes.forEach((a, k) => (values[a.path] = a.toSI(typed[k]!)));
    const score = bandMean(
      outcome.points.map((p) => ({ x: p.rpm, y: p.volumetricEfficiency })),
      plan.band.from,
      plan.band.to,
    );
    search.tell(typed, score);
    outcomes.push(outcome);
    typedList.push(typed);
    designs.push({ values, index: [n] });
    const better = score > bestScore;
    if (better) bestScore = score;
    live?.write(
      `  ${String(n + 1).padStart(3)}  ${axes.map((a, k) => labelOf(typed[k]!, a.spec.grid.unit)).join(' / ')}  → band mean ηv ${fix(score * 100, 2)} %${better ? '  (best so far)' : ''}\n`,
    );
  }
  const seconds = (performance.now() - t0) / 1000;
  if (!o.json || io.stderrIsTTY) io.stderr.write(`search: ${outcomes.length} designs × ${plan.grid.values.length} speeds in ${fix(seconds, 1)} s\n`);

  const ranked = rankDesigns(designs, outcomes.map((x) => x.points), plan.band);
  const label = (k: number): string => axes.map((a, j) => labelOf(typedList[k]![j]!, a.spec.grid.unit)).join(' / ');
  const rows: ReportRow[] = ranked.map((d) => ({ ranked: d, typed: typedList[d.order]!, label: label(d.order), verdict: outcomes[d.order]!.verdict }));
  const inOrder = [...rows].sort((x, y) => x.ranked.order - y.ranked.order);
  const best = rows[0];
  const edges = best
    ? edgePaths(
        axes.map((a) => ({ path: a.path, size: a.discrete ? a.values.length : a.spec.grid.to > a.spec.grid.from ? 2 : 1 })),
        (k) => searchEnds(axes[k]!).includes(best.typed[k]!),
      )
    : [];
  // the walk: each design that beat every one before it
  const path: { evaluation: number; values: Record<string, number>; meanVolumetricEfficiency: number }[] = [];
  let top = Number.NEGATIVE_INFINITY;
  inOrder.forEach((r) => {
    if (r.ranked.meanVolumetricEfficiency > top) {
      top = r.ranked.meanVolumetricEfficiency;
      path.push({ evaluation: r.ranked.order + 1, values: r.ranked.values, meanVolumetricEfficiency: top });
    }
  });
  const pathText = path.map((p) => `${label(p.evaluation - 1)} (${fix(p.meanVolumetricEfficiency * 100, 2)} %)`).join(' → ');
  const gridCount = gridSize(axes.map((a) => a.values.length));
  return writeReport(plan, rows, inOrder, edges, io, o, {
    title: `${plan.base.model.name}: search over ${axes.map((a) => `${a.path} ${labelOf(a.spec.grid.from, a.spec.grid.unit)}–${labelOf(a.spec.grid.to, a.spec.grid.unit)}`).join(' × ')} (${outcomes.length} designs)`,
    json: {
      search: {
        method: 'Nelder–Mead downhill simplex, restarted with half the simplex until it is below half a STEP',
        library: NELDER_MEAD_LIBRARY,
        budget,
        evaluations: outcomes.length,
        gridDesigns: gridCount,
        resolution: `a tenth of each STEP (${RESOLUTION} × STEP); whole-number paths on their grid`,
        stopped: reason,
      },
      evaluations: inOrder.map((r) => ({ evaluation: r.ranked.order + 1, values: r.ranked.values, meanVolumetricEfficiency: r.ranked.meanVolumetricEfficiency })),
      path,
    },
    extraText: [
      `the walk (each design that beat all before it): ${pathText}`,
      `${outcomes.length} designs simulated (${reason}); the grid of these ranges holds ${gridCount}. Nelder–Mead finds a local best: when in doubt, check with the grid.`,
      '',
    ],
    ends: searchEnds,
  });
}

// ---------------------------------------------------------------- the command

function parseBudget(text: string | undefined): number {
  if (text === undefined) return DEFAULT_BUDGET;
  if (!/^\d+$/.test(text.trim()) || !(Number(text) >= 3 && Number(text) <= MAX_DESIGNS))
    throw new CaseError('--budget', `expected a whole number from 3 to ${MAX_DESIGNS}, got '${text}'`, 'option');
  return Number(text);
}

function asShardError(e: unknown): unknown {
  return e instanceof ShardInputError ? new CaseError(e.option, e.detail, 'option') : e;
}

function tooMany(total: number): string {
  const shards = Math.ceil(total / MAX_DESIGNS);
  return total > MAX_GRID_DESIGNS
    ? `${total} designs is too many (at most ${MAX_GRID_DESIGNS}, even cut into shards); use larger steps or fewer axes, or --search`
    : `${total} designs is too many for one run (at most ${MAX_DESIGNS}); use larger steps, --search, or cut the grid with --shard K/N (N ≥ ${shards}) and join the parts with tractwave merge`;
}

export const tuneCommand: Command = {
  name: 'tune',
  summary: 'vary up to four case values and rank the designs by band-mean ηv (grid, shards or a search)',
  help: `usage: tractwave tune CASE --vary path=FROM:TO:STEP [--vary ...] (up to ${MAX_VARY})
                      [--rpm FROM:TO:STEP] [--band LO:HI] [--set path=value ...]
                      [--jobs N] [--json | --csv FILE [--force]]
                      [--shard K/N | --shard auto | --shard auto/N]
                      [--search [--budget N]]

Builds every combination of the varied values (up to ${MAX_VARY} case paths, e.g.
runner.length, runner.diameter, inlet.volume, intake.closes, intake.shift),
sweeps each design over the same speeds and ranks them by the mean ηv over the
band: the area under the curve over the band divided by the band width. A band
average, not a peak, is the figure of merit: wave tuning that gains at one
speed usually costs at a nearby one. Each design's peak speed is shown beside
it, and a heat map shows ηv over speed for each design (up to ${HEAT_MAP_ROWS}).

Values may carry a unit (250mm:450mm:50mm); all three parts use the same one.
A bare number is in SI units: runner.length=0.25:0.45:0.05 is in metres.
They are applied to the case like --set, after the --set options. rpm is not
a design value (it is swept): use --rpm and --band.

Cam timing as a design value, in crank degrees:
  intake.shift=-10:10:5     moves both intake events by the same angle:
                            positive = later (retard), negative = earlier
                            (advance). Shift S makes "opens X BTDC, closes Y
                            ABDC" into opens X − S BTDC, closes Y + S ABDC;
                            for the exhaust, opens X − S BBDC and closes
                            Y + S ATDC.
  intake.duration=260:300:10  the open duration opens + 180 + closes, both
                            events moved alike about the same centre line.
  (exhaust.shift and exhaust.duration alike; duration first, then shift.)

When the best design sits at the end of a range, the JSON lists that path in
'edges' and a warning says to widen the range: the best may lie beyond it.

Size: the grid is counted before anything is built; one run simulates at most
${MAX_DESIGNS} designs, and a run estimated to take long says so before it starts.

Shards (a cluster's job scheduler, or GNU parallel on several machines):
  --shard K/N   simulates only slice K of N (1 ≤ K ≤ N) of the grid, the
                designs whose grid number i has i mod N = K − 1 — the same
                slice on any machine — and prints it as a part (JSON with the
                case, these options and a fingerprint of both) for
                'tractwave merge PART.json ...', which checks the parts belong
                together and prints exactly what the whole tune prints.
  --shard auto  K and N from a Slurm job array (SLURM_ARRAY_TASK_ID, _COUNT,
                _MIN, _MAX, _STEP; indices one evenly spaced range).
  --shard auto/N  K from a Kubernetes Indexed Job (JOB_COMPLETION_INDEX,
                0-based); N = the Job's spec.completions (Kubernetes does not
                pass it on to the pod).
                With a grid of up to ${MAX_GRID_DESIGNS} designs, each part at most ${MAX_DESIGNS}.

--search simulates far fewer designs than the grid: starting in the middle of
the ranges it walks towards the best band mean with the Nelder–Mead simplex
(the fmin package), restarting with a smaller simplex until it is below half
a STEP, or until --budget designs (default ${DEFAULT_BUDGET}) are simulated. The ranges
are continuous (values resolved to a tenth of STEP); valve counts stay on
their grid (a search for each). Each design is printed as it is simulated,
then the walk and the ranking. It finds a local best: check with the grid
when in doubt.

Speeds and band default as for sweep: the case keys 'sweep' and 'band', else
3000:9000:250 and the whole range. A design's figure equals the band mean
that 'tractwave sweep' gives for the same case, speeds and band.

options
${optionHelp(OPTIONS)}

--json prints: name, vary [{path, values (SI), unit}], rpm {from, to, step},
band {from, to}, figureOfMerit, designs [{values {path: SI value},
meanVolumetricEfficiency, peakRpm, peakVolumetricEfficiency, rank, converged,
points [{rpm, volumetricEfficiency, torque, power, converged, massImbalance}]}]
best first, edges [paths], stats {designs, points}; with --search also
search {method, library, budget, evaluations, gridDesigns, resolution,
stopped}, evaluations [{evaluation, values, meanVolumetricEfficiency}] in the
order simulated, and path [the designs that beat all before them].
The time taken is printed on stderr, not in the JSON, so the same tune gives
the same JSON on any machine.

examples
  tractwave tune cases/demo.yaml --vary runner.length=250mm:450mm:50mm \\
      --band 5000:8000
  tractwave tune cases/demo.yaml --vary runner.length=300mm:420mm:40mm \\
      --vary intake.closes=50:70:10
  tractwave tune cases/demo.yaml --vary runner.length=250mm:500mm:10mm \\
      --vary intake.shift=-20:20:2 --search
  tractwave tune cases/demo.yaml --vary runner.length=250mm:500mm:25mm \\
      --shard 2/4 --json > part-2.json    (then: tractwave merge part-*.json)
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    displayUnits(args); // a bad --units is exit 2 before any work
    const [file] = expectPositionals(args, ['CASE'], 'tune');
    const csv = csvAndJsonChoice(args, io);
    const jobs = parseJobs(args);
    prestartPool(jobs); // the workers load while the case does
    const shardText = args.string('shard');
    const searching = args.flag('search');
    if (args.string('budget') !== undefined && !searching) throw new CaseError('--budget', 'only applies with --search', 'option');
    const budget = parseBudget(args.string('budget'));
    if (shardText !== undefined && searching) throw new CaseError('--shard', 'a search walks one design at a time and cannot be cut into shards; use one or the other', 'option');
    if (shardText !== undefined && csv !== undefined) throw new CaseError('--csv', 'a shard prints a part for tractwave merge; ask merge for the CSV (tractwave merge PART.json ... --csv FILE)', 'option');
    const axes = parseAxes(args.list('vary'));
    const total = gridSize(axes.map((a) => a.values.length));
    let shard: (Shard & { source: string }) | undefined;
    if (shardText !== undefined) {
      try {
        shard = parseShard(shardText, (io.env ?? {}) as Environment);
      } catch (e) {
        throw asShardError(e);
      }
    }
    // the design cap, counted before anything is built
    if (!searching) {
      if (total > MAX_GRID_DESIGNS || (shard === undefined && total > MAX_DESIGNS)) throw new CaseError('--vary', tooMany(total), 'option');
      if (shard !== undefined && shardSize(total, shard) > MAX_DESIGNS)
        throw new CaseError('--shard', `shard ${shard.index}/${shard.count} holds ${shardSize(total, shard)} of ${total} designs, more than one run may (${MAX_DESIGNS}); cut the grid into at least ${Math.ceil(total / MAX_DESIGNS)} shards`, 'option');
    }

    const raw = parseYamlText(await readCaseText(file!, io.cwd), file!);
    const request: TuneRequest = { vary: args.list('vary'), set: args.list('set'), rpm: args.string('rpm') ?? null, band: args.string('band') ?? null };
    const plan = planTune(raw, basename(file!), request, args.flag('allow-extreme'));
    // the varied paths exist and the first design is a valid case, before any simulation
    const first = designCase(plan, designAt(axes, 0).sets);
    // and the whole run is not estimated beyond the limit (--allow-long)
    {
      const designs = searching ? budget : shard !== undefined ? shardSize(total, shard) : total;
      const one = engineCost(first.model, plan.grid.values);
      checkCost(combinedCost(new Array<typeof one>(designs).fill(one), jobs), first.model, args, '--vary');
    }
    const report = { json: args.flag('json'), csv, force: args.flag('force') };
    if (searching) return runSearch(plan, budget, jobs, io, report);

    if (shard !== undefined) {
      const numbers = shardDesigns(total, shard);
      io.stderr.write(`tune: shard ${shard.index}/${shard.count} (${shard.source}): ${numbers.length} of ${total} designs\n`);
      const outcomes = await simulateDesigns(plan, numbers, jobs, io, `tune shard ${shard.index}/${shard.count}`, true);
      const tool = toolName();
      const part: TunePart = {
        format: PART_FORMAT,
        version: PART_VERSION,
        tool,
        fingerprint: partFingerprint({ caseFile: plan.caseFile, case: raw, request, tool }),
        shard: { index: shard.index, count: shard.count },
        gridDesigns: total,
        caseFile: plan.caseFile,
        case: raw,
        options: request,
        designs: outcomes,
        checksum: designsChecksum(outcomes),
      };
      io.stdout.write(`${partText(part)}\n`);
      return 0;
    }
    const numbers = shardDesigns(total, { index: 1, count: 1 });
    const outcomes = await simulateDesigns(plan, numbers, jobs, io, `tune (${total} designs)`, false);
    return writeTuneReport(plan, outcomes, io, report);
  },
};
