/**
 * `tractwave report CASE --out FILE.html`: one self-contained HTML file with
 * the design, the speed curves, the operating points and the mass balance
 * (src/report builds it; this file reads the options and writes the files).
 */
import { prestartPool } from '../../analysis/worker-pool.js';
import { existsSync, statSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { basename, dirname, extname, join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { CaseError } from '../../case/errors.js';
import { loadMeasuredSheet, type MeasuredSheet } from '../../case/measured.js';
import type { LoadedCase } from '../../case/load.js';
// the report modules (and vega) are loaded only when a report is made: other commands start faster
import type { ReportDesign } from '../../report/gather.js';
import { UNIT_SYSTEMS, type UnitSystem } from '../../report/units.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec, type ParsedArgs } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, parseRpm, SET_OPTION, type Command } from '../command.js';
import { combinedCost, engineCost } from '../../analysis/cost.js';
import { fix } from '../format.js';
import type { CliIo } from '../io.js';
import { packageVersion } from '../package-root.js';
import { checkTarget } from '../target.js';
import { writeFileAtomic } from '../write-file.js';
import {
  assumptionsOf,
  BAND_OPTION,
  chooseBand,
  JOBS_OPTION,
  loadForSweep,
  parseJobs,
  progress,
  RANGE_OPTION,
  sweepGrid,
  sweepWarnings,
} from './sweep.js';

const OPTIONS: OptionSpec[] = [
  { name: 'out', type: 'string', value: 'FILE.html', description: 'the report file to write (required)' },
  RANGE_OPTION,
  BAND_OPTION,
  { name: 'at', type: 'list', value: 'RPM', description: 'also show this operating point besides the best speed (repeatable, or comma-separated)' },
  { name: 'compare', type: 'string', value: 'OTHER.yaml', description: 'a second design, swept over the same speeds and drawn beside' },
  { name: 'measured', type: 'string', value: 'FILE', description: 'dyno sheet (CSV: rpm and torque_Nm, torque_lbft, power_kW, power_hp or ve_pct) drawn as points' },
  { name: 'units', type: 'string', value: 'metric|imperial', description: "units of the text and charts (default: the case's display.units, else metric)" },
  { name: 'svg', type: 'string', value: 'DIR', description: 'also write each chart as its own SVG file into DIR (for slides)' },
  SET_OPTION,
  JOBS_OPTION,
  { name: 'force', type: 'boolean', description: 'allow replacing existing files' },
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
];

/** The --units value (else the case's display.units, else metric), or exit 2. */
export function parseUnits(args: ParsedArgs, caseUnits?: UnitSystem): UnitSystem {
  const t = args.string('units');
  if (t === undefined) return caseUnits ?? 'metric';
  if (!(UNIT_SYSTEMS as readonly string[]).includes(t)) throw new CaseError('--units', `expected ${UNIT_SYSTEMS.join(' or ')}, got '${t}'`, 'option');
  return t as UnitSystem;
}

/** The --at speeds, each checked like --rpm. */
export function parseAt(args: ParsedArgs): number[] {
  const out: number[] = [];
  for (const item of args.list('at'))
    for (const part of item.split(',')) {
      if (part.trim() === '') throw new CaseError('--at', `expected speeds in rpm, e.g. --at 5000 or --at 5000,6500, got '${item}'`, 'option');
      out.push(parseRpm(part.trim(), '--at'));
    }
  return out;
}

function designOf(loaded: LoadedCase, file: string): ReportDesign {
  return { name: loaded.model.name, file, case: loaded.case, model: loaded.model };
}

/** "2026-12-02 14:05 UTC" */
export function stamp(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export const reportCommand: Command = {
  name: 'report',
  summary: 'one self-contained HTML file with the charts: curves, valve traces, runner map, mass balance',
  help: `usage: tractwave report CASE --out FILE.html
         [--rpm FROM:TO:STEP] [--band LO:HI] [--at RPM ...]
         [--compare OTHER.yaml] [--measured FILE] [--units metric|imperial]
         [--svg DIR] [--set path=value ...] [--jobs N] [--force]

Writes one HTML file that tells the story of the design: the case with units
and the network of parts in one line; ηv, estimated torque and power against
speed with the band, its mean, the best speed and the quarter-wave tuned
speeds (and the compared design and measured dyno points when given); at the
best speed and at each --at speed the pressure at the valve, the valve flow
and the cylinder mass against crank angle with TDC, BDC, IVO, IVC, EVO and EVC
marked, the verdict in words and the runner's pressure along its length as a
heat map; the mass balance and convergence of every point; the safety note.

The file needs nothing else: the charts are inline SVG, the styles inline,
no scripts and no fonts or images are fetched, so it opens from a USB stick
with no network. It prints on A4 or Letter, one section a page.

The numbers are those of \`tractwave sweep\` (same speeds, same warm-start
chunks) and \`tractwave run --rpm N\` (each operating point from rest).
Speeds and band as for sweep: the options, else the case's 'sweep' and
'band' keys, else ${'3000:9000:250'} and the whole range.

options
${optionHelp(OPTIONS)}

--svg DIR writes speed-ve.svg, speed-output.svg, valve-<N>rpm.svg,
runner-<N>rpm.svg and mass-balance.svg (DIR is made if it does not exist;
existing files are kept unless --force).

examples
  tractwave report cases/demo.yaml --out demo.html
  tractwave report cases/demo.yaml --out demo.html --at 5000 \\
      --compare cases/airbox-single.yaml
  tractwave report cases/kart-single.yaml --units imperial --svg slides \\
      --out kart.html
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'report');
    const out = args.string('out');
    if (out === undefined) throw new CaseError('--out', 'required: the HTML file to write, e.g. --out report.html', 'option');
    if (!/\.html?$/i.test(extname(out))) throw new CaseError('--out', `expected a file name ending in .html, got '${out}'`, 'option');
    const force = args.flag('force');
    checkTarget(out, '--out', io, force);
    const units = parseUnits(args);
    const at = parseAt(args);
    const jobs = parseJobs(args);
    prestartPool(jobs); // the workers load while the case does
    const svgDir = args.string('svg');
    if (svgDir !== undefined) {
      const full = resolve(io.cwd, svgDir);
      if (existsSync(full) && !statSync(full).isDirectory()) throw new CaseError('--svg', `'${svgDir}' is a file, not a folder`, 'option');
      if (!existsSync(dirname(full))) throw new CaseError('--svg', `the folder above '${svgDir}' does not exist`, 'option');
      // the charts whose names are known before the sweep (the best speed's come after it)
      if (existsSync(full))
        for (const name of ['speed-ve', 'speed-output', 'mass-balance', ...at.flatMap((r) => [`valve-${fix(r, 0)}rpm`, `runner-${fix(r, 0)}rpm`])])
          checkTarget(join(svgDir, `${name}.svg`), '--svg', io, force);
    }

    const loaded = await loadForSweep(file!, args, io);
    const compareFile = args.string('compare');
    const other = compareFile !== undefined ? await loadForSweep(compareFile, args, io) : undefined;
    let measured: MeasuredSheet | undefined;
    const measuredFile = args.string('measured');
    if (measuredFile !== undefined) measured = await loadMeasuredSheet(measuredFile, io.cwd);
    const grid = sweepGrid(args, loaded.case);
    const band = chooseBand(args, loaded.case, grid);
    checkCost(combinedCost([loaded, ...(other ? [other] : [])].map((l) => engineCost(l.model, grid.values)), 1), loaded.model, args, '--rpm');
    const assumptions = assumptionsOf(loaded.case);

    const { buildReport, gatherReport } = await import('../../report/index.js');
    const bar = progress(io, 'report');
    const t0 = performance.now();
    let data;
    try {
      data = await gatherReport({
        design: designOf(loaded, file!),
        rpms: grid.values,
        band,
        at,
        assumptions,
        ...(other ? { compare: designOf(other, compareFile!) } : {}),
        ...(measured ? { measured } : {}),
        jobs,
        onProgress: bar.tick,
      });
    } finally {
      bar.done();
    }
    for (const w of sweepWarnings(data.curve.points, loaded.model.numerics.maxCycles)) io.stderr.write(`${w}\n`);
    if (data.compare) for (const w of sweepWarnings(data.compare.curve.points, other!.model.numerics.maxCycles, data.compare.design.name)) io.stderr.write(`${w}\n`);
    if (band.note) io.stderr.write(`note: ${band.note}\n`);

    const speedsFrom = args.string('rpm') !== undefined ? 'from --rpm' : loaded.case.sweep ? "from the case's sweep key" : 'the default range';
    const built = await buildReport(data, { generatedAt: stamp(new Date()), version: packageVersion(), units: parseUnits(args, loaded.case.display?.units ?? units), speedsFrom, jobs });
    const seconds = (performance.now() - t0) / 1000;

    const written: string[] = [];
    if (svgDir !== undefined) {
      const dir = resolve(io.cwd, svgDir);
      if (!existsSync(dir)) await mkdir(dir);
      for (const c of built.charts) checkTarget(join(svgDir, `${c.name}.svg`), '--svg', io, force);
      for (const c of built.charts) {
        const name = join(svgDir, `${c.name}.svg`);
        await writeFileAtomic(name, `<?xml version="1.0" encoding="UTF-8"?>\n${c.svg}\n`, { force, option: '--svg', cwd: io.cwd });
        written.push(name);
      }
    }
    await writeFileAtomic(out, built.html, { force, option: '--out', cwd: io.cwd });
    const s = data.curve.summary;
    io.stdout.write(
      `wrote ${out} (${fix(built.html.length / 1024, 0)} KiB, ${built.charts.length} charts, ${data.points.length} operating point${data.points.length === 1 ? '' : 's'}, ${fix(seconds, 1)} s)\n` +
        `  ${loaded.model.name}: band ${fix(band.from, 0)}–${fix(band.to, 0)} rpm mean ηv ${fix(s.band.meanVolumetricEfficiency * 100, 1)} %, best ${fix(s.bestVolumetricEfficiency * 100, 1)} % at ${fix(s.bestRpm, 0)} rpm\n` +
        (written.length > 0 ? `  and ${written.length} SVG files in ${svgDir}: ${written.map((w) => basename(w)).join(', ')}\n` : '') +
        '  results are estimates from a simplified model: verify them on an engine.\n',
    );
    return 0;
  },
};
