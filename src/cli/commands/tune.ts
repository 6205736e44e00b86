/**
 * `tractwave tune CASE --vary path=FROM:TO:STEP [--vary ...]`: a grid over one
 * or two case values, each design swept over the same speeds and ranked by
 * its band-mean ηv, best first, with a text heat map of ηv over speed and
 * design.
 */
import { performance } from 'node:perf_hooks';
import { parseVary, type VarySpec } from '../../analysis/range.js';
import { SWEEP_CHUNK_POINTS, type SweepPoint } from '../../analysis/sweep.js';
import { designGrid, HEAT_SHADES, rankDesigns, shadeIndex, shadeRanges, type RankedDesign, type VaryAxis } from '../../analysis/tune.js';
import { runSweeps } from '../../analysis/worker-pool.js';
import { CaseError, isCaseError } from '../../case/errors.js';
import { buildCase, parseYamlText, readCaseText, type LoadedCase } from '../../case/load.js';
import { UNITS } from '../../case/units.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, SET_OPTION, type Command } from '../command.js';
import { combinedCost, engineCost } from '../../analysis/cost.js';
import { fix, table } from '../format.js';
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
} from './sweep.js';

/** the most designs one tune may hold */
export const MAX_DESIGNS = 400;

const OPTIONS: OptionSpec[] = [
  {
    name: 'vary',
    type: 'list',
    value: 'path=FROM:TO:STEP',
    description: 'a case value to vary, e.g. runner.length=250mm:450mm:50mm (once or twice)',
  },
  RANGE_OPTION,
  BAND_OPTION,
  SET_OPTION,
  JOBS_OPTION,
  { name: 'json', type: 'boolean', description: 'print the ranking as JSON (SI units)' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write one row per design and speed to FILE (header row with units)' },
  { name: 'force', type: 'boolean', description: 'allow --csv to overwrite an existing file' },
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
];

/** An axis of the grid: the typed values, their SI values, and how to show them. */
interface Axis extends VaryAxis {
  spec: VarySpec;
  /** the values as shown: "250 mm" */
  labels: string[];
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
    labels: spec.grid.values.map((v) => (unit ? `${v} ${unit}` : String(v))),
  };
}

function label(axes: readonly Axis[], index: readonly number[]): string {
  return axes.map((a, k) => a.labels[index[k] ?? 0] ?? '?').join(' / ');
}

/**
 * Text heat map: one row per design (grid order), one column per speed,
 * a shade per ηv. Characters only (readable without colour), legend below.
 */
export function heatMap(rpms: readonly number[], rows: readonly { label: string; points: readonly SweepPoint[] }[], band?: { from: number; to: number }): string[] {
  const all = rows.flatMap((r) => r.points.map((p) => p.volumetricEfficiency)).filter(Number.isFinite);
  const scale = { shades: HEAT_SHADES, lo: Math.min(...all), hi: Math.max(...all) };
  const cell = rpms.length <= 30 ? 2 : 1;
  const lw = Math.max(...rows.map((r) => r.label.length), 4);
  const lo = rpms[0]!;
  const hi = rpms[rpms.length - 1]!;
  const width = rpms.length * cell;
  const out: string[] = [];
  // speed labels over the first, middle and last column
  const head = new Array<string>(lw + 3 + width + 6).fill(' ');
  const put = (row: string[], at: number, text: string): void => {
    for (let k = 0; k < text.length; k++) row[at + k] = text[k]!;
  };
  const colOf = (i: number): number => lw + 3 + i * cell;
  const mid = Math.floor((rpms.length - 1) / 2);
  const marks = rpms.length > 2 ? [0, mid, rpms.length - 1] : rpms.map((_, i) => i);
  for (const i of marks) {
    const s = fix(rpms[i]!, 0);
    put(head, Math.min(Math.max(colOf(i) - Math.floor(s.length / 2) + (cell > 1 ? 1 : 0), lw + 3), lw + 3 + width - s.length), s);
  }
  put(head, lw + 3 + width + 1, 'rpm');
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

function tuneCsv(axes: readonly Axis[], ranked: readonly RankedDesign[]): string {
  const head = [
    ...axes.map((a) => (a.spec.grid.unit ? `${a.path} [${a.spec.grid.unit}]` : a.path)),
    'speed [rpm]',
    'volumetric efficiency [%]',
    'torque estimate [N m]',
    'power estimate [kW]',
    'converged',
    'band mean volumetric efficiency [%]',
    'rank',
  ];
  const num = (v: number, d: number): string => (Number.isFinite(v) ? v.toFixed(d) : '');
  const rows: string[] = [];
  const byGrid = [...ranked].sort((x, y) => {
    for (let k = 0; k < x.index.length; k++) if (x.index[k] !== y.index[k]) return x.index[k]! - y.index[k]!;
    return 0;
  });
  for (const d of byGrid) {
    const typed = axes.map((a, k) => String(a.spec.grid.values[d.index[k] ?? 0]));
    for (const p of d.points)
      rows.push(
        [
          ...typed,
          num(p.rpm, 0),
          num(p.volumetricEfficiency * 100, 4),
          num(p.torque, 3),
          num(p.power / 1000, 4),
          p.converged ? 'yes' : 'no',
          num(d.meanVolumetricEfficiency * 100, 4),
          String(d.rank),
        ].join(','),
      );
  }
  return [head.join(','), ...rows].join('\n') + '\n';
}

export const tuneCommand: Command = {
  name: 'tune',
  summary: 'vary one or two case values and rank the designs by band-mean ηv',
  help: `usage: tractwave tune CASE --vary path=FROM:TO:STEP [--vary path=FROM:TO:STEP]
                      [--rpm FROM:TO:STEP] [--band LO:HI] [--set path=value ...]
                      [--jobs N] [--json | --csv FILE [--force]]

Builds every combination of the varied values (one or two case paths, e.g.
runner.length, runner.diameter, inlet.volume, intake.closes), sweeps each
design over the same speeds and ranks them by the mean ηv over the band: the
area under the curve over the band divided by the band width. A band average,
not a peak, is the figure of merit: wave tuning that gains at one speed
usually costs at a nearby one. Each design's peak speed is shown beside it,
and a heat map shows ηv over speed for every design.

Values may carry a unit (250mm:450mm:50mm); all three parts use the same one.
A bare number is in SI units: runner.length=0.25:0.45:0.05 is in metres.
They are applied to the case like --set, after the --set options.

Speeds and band default as for sweep: the case keys 'sweep' and 'band', else
3000:9000:250 and the whole range. A design's figure equals the band mean
that 'tractwave sweep' gives for the same case, speeds and band.

options
${optionHelp(OPTIONS)}

--json prints: name, vary [{path, values (SI), unit}], rpm {from, to, step},
band {from, to}, figureOfMerit, designs [{values {path: SI value},
meanVolumetricEfficiency, peakRpm, peakVolumetricEfficiency, rank, converged,
points [{rpm, volumetricEfficiency, torque, power, converged, massImbalance}]}]
best first, stats {designs, points, jobs, wallSeconds}.

examples
  tractwave tune cases/demo.yaml --vary runner.length=250mm:450mm:50mm \\
      --band 5000:8000
  tractwave tune cases/demo.yaml --vary runner.length=300mm:420mm:40mm \\
      --vary intake.closes=50:70:10
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'tune');
    const csv = csvAndJsonChoice(args, io);
    const jobs = parseJobs(args);
    const varyTexts = args.list('vary');
    if (varyTexts.length === 0) throw new CaseError('--vary', 'needed: what to vary, e.g. --vary runner.length=250mm:450mm:50mm', 'option');
    if (varyTexts.length > 2) throw new CaseError('--vary', `at most two (a grid over ${varyTexts.length} values grows too fast), got ${varyTexts.length}`, 'option');
    let axes: Axis[];
    try {
      axes = varyTexts.map((t) => toAxis(parseVary(t)));
    } catch (e) {
      throw asInputError(e);
    }
    if (axes.length === 2 && axes[0]!.path === axes[1]!.path) throw new CaseError('--vary', `${axes[0]!.path} is given twice`, 'option');

    const raw = parseYamlText(await readCaseText(file!, io.cwd), file!);
    const sets = args.list('set');
    const allowExtreme = args.flag('allow-extreme');
    const base = buildCase(raw, file!, { set: sets, allowExtreme });
    const grid = sweepGrid(args, base.case);
    const band = chooseBand(args, base.case, grid);
    const designs = designGrid(axes);
    if (designs.length > MAX_DESIGNS) throw new CaseError('--vary', `${designs.length} designs is too many (at most ${MAX_DESIGNS}); use larger steps`, 'option');
    const loaded: LoadedCase[] = designs.map((d) => {
      try {
        return buildCase(raw, file!, { set: [...sets, ...d.sets], allowExtreme });
      } catch (e) {
        if (isCaseError(e)) throw new CaseError(e.path, `${e.detail} (in the design ${d.sets.join(', ')})`, e.code);
        throw e;
      }
    });
    {
      // every design over the same speeds, sharing the workers
      const costs = loaded.map((l) => engineCost(l.model, grid.values));
      const worst = costs.reduce((x, y) => (y.seconds > x.seconds ? y : x));
      checkCost(combinedCost(costs, jobs), loaded[costs.indexOf(worst)]!.model, args, '--vary');
    }
    const assumptions = assumptionsOf(base.case);
    const bar = progress(io, `tune (${designs.length} designs)`);
    const t0 = performance.now();
    let points: SweepPoint[][];
    try {
      points = await runSweeps(
        loaded.map((l) => ({ model: l.model, rpms: grid.values })),
        { jobs, assumptions, onProgress: bar.tick },
      );
    } finally {
      bar.done();
    }
    const wallSeconds = (performance.now() - t0) / 1000;
    const ranked = rankDesigns(designs, points, band);
    for (const d of ranked)
      for (const w of sweepWarnings(d.points, base.model.numerics.maxCycles, label(axes, d.index))) io.stderr.write(`${w}\n`);
    if (band.note) io.stderr.write(`note: ${band.note}\n`);

    if (args.flag('json')) {
      const json = {
        name: base.model.name,
        vary: axes.map((a) => ({ path: a.path, values: a.values, unit: a.spec.grid.unit })),
        rpm: { from: grid.from, to: grid.to, step: grid.step },
        band: { from: band.from, to: band.to },
        figureOfMerit: 'meanVolumetricEfficiency: the mean ηv over the band (area under the curve / band width); a band average, not a peak',
        designs: ranked.map((d) => ({
          values: d.values,
          meanVolumetricEfficiency: d.meanVolumetricEfficiency,
          peakRpm: d.peakRpm,
          peakVolumetricEfficiency: d.peakVolumetricEfficiency,
          rank: d.rank,
          converged: d.unconverged === 0,
          points: d.points.map(pointJson),
        })),
        stats: {
          designs: designs.length,
          points: designs.length * grid.values.length,
          jobs: Math.min(jobs, designs.length * Math.ceil(grid.values.length / SWEEP_CHUNK_POINTS)),
          wallSeconds,
        },
      };
      io.stdout.write(`${JSON.stringify(json)}\n`);
      return 0;
    }
    if (csv !== undefined) await writeFileAtomic(csv, tuneCsv(axes, ranked), { force: args.flag('force'), option: '--csv', cwd: io.cwd });

    const lo = grid.values[0]!;
    const hi = grid.values[grid.values.length - 1]!;
    const what = axes.map((a) => `${a.path} ${a.labels[0]}–${a.labels[a.labels.length - 1]}`).join(' × ');
    const out: string[] = [
      `${base.model.name}: tune over ${what} (${designs.length} designs)` +
        ` × ${fix(lo, 0)}–${fix(hi, 0)} rpm every ${fix(grid.step, 0)} rpm (${designs.length * grid.values.length} points, ${jobs} job${jobs === 1 ? '' : 's'}, ${fix(wallSeconds, 1)} s)`,
      '',
      `figure of merit: the mean ηv over the band ${fix(band.from, 0)}–${fix(band.to, 0)} rpm (area under the curve / band width).` +
        ' A band average, not a peak, decides: a design that peaks high at one speed often gives it back at the next.',
      '',
    ];
    io.stdout.write(out.map((l) => wrapLine(l)).join('\n') + '\n');
    const header = ['rank', ...axes.map((a) => a.path), 'band mean ηv %', 'peak ηv %', 'at rpm', 'conv'];
    const rows = ranked.map((d) => [
      String(d.rank),
      ...axes.map((a, k) => a.labels[d.index[k] ?? 0] ?? ''),
      fix(d.meanVolumetricEfficiency * 100, 2),
      fix(d.peakVolumetricEfficiency * 100, 1),
      fix(d.peakRpm, 0),
      d.unconverged === 0 ? 'yes' : `${d.unconverged} no`,
    ]);
    io.stdout.write(table(header, rows));
    const best = ranked[0];
    const second = ranked[1];
    if (best) {
      const gap = second ? `, ${fix((best.meanVolumetricEfficiency - second.meanVolumetricEfficiency) * 100, 2)} points above the next (${label(axes, second.index)})` : '';
      io.stdout.write(
        '\n' +
          wrapLine(
            `best over the band: ${label(axes, best.index)} — mean ηv ${fix(best.meanVolumetricEfficiency * 100, 1)} %${gap}; ` +
              `its own peak is at ${fix(best.peakRpm, 0)} rpm`,
          ) +
          '\n',
      );
      const atPeak = best.points.find((p) => p.rpm === best.peakRpm);
      if (atPeak) io.stdout.write(wrapLine(`why, at its peak: ${atPeak.pulse.verdict}`) + '\n');
      const peakiest = [...ranked].sort((x, y) => y.peakVolumetricEfficiency - x.peakVolumetricEfficiency)[0];
      if (peakiest && peakiest !== best)
        io.stdout.write(
          wrapLine(
            `the highest single peak (${fix(peakiest.peakVolumetricEfficiency * 100, 1)} % at ${fix(peakiest.peakRpm, 0)} rpm, ${label(axes, peakiest.index)}) ` +
              `ranks ${peakiest.rank}: over the band it gives back what it gains at its peak`,
          ) + '\n',
        );
    }
    const byGrid = [...ranked].sort((x, y) => {
      for (let k = 0; k < x.index.length; k++) if (x.index[k] !== y.index[k]) return x.index[k]! - y.index[k]!;
      return 0;
    });
    io.stdout.write(`\nηv over speed (columns) and design (rows${axes.length === 2 ? `: ${axes[0]!.path} / ${axes[1]!.path}` : `: ${axes[0]!.path}`})\n`);
    io.stdout.write(heatMap(grid.values, byGrid.map((d) => ({ label: label(axes, d.index), points: d.points })), band).join('\n') + '\n');
    io.stdout.write('\nresults are estimates from a simplified model: verify them on an engine.\n');
    if (csv !== undefined) io.stdout.write(`wrote ${designs.length * grid.values.length} rows (one per design and speed) to ${csv}\n`);
    return 0;
  },
};
