/**
 * `tractwave compare A.yaml B.yaml`: two designs swept over the same speeds,
 * their curves overlaid, the difference per speed, the band means side by
 * side and where each one wins.
 */
import { printable } from '../../case/printable.js';
import { assemblyLine } from '../../present/network-line.js';
import { performance } from 'node:perf_hooks';
import { winnerAt, winningSpans, type WinSpan } from '../../analysis/compare.js';
import { summariseSweep, type SweepPoint } from '../../analysis/sweep.js';
import { prestartPool, runSweeps } from '../../analysis/worker-pool.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, displayUnits, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { combinedCost, engineCost } from '../../analysis/cost.js';
import { fix, table } from '../format.js';
import { writeFileAtomic } from '../write-file.js';
import { chartPoints, dynoBlockTwo, dynoJsonTwo, outputChart } from '../dyno-output.js';
import { dynoOf, MEASURED_OPTION } from '../measured-options.js';
import {
  assumptionsOf,
  BAND_OPTION,
  chooseBand,
  csvAndJsonChoice,
  curveChart,
  JOBS_OPTION,
  loadForSweep,
  parseJobs,
  pointJson,
  progress,
  RANGE_OPTION,
  signed,
  sweepGrid,
  sweepWarnings,
  wrapLine,
} from './sweep.js';

const OPTIONS: OptionSpec[] = [
  RANGE_OPTION,
  BAND_OPTION,
  { ...SET_OPTION, description: 'override a value in both cases, e.g. --set numerics.meshSize=5mm (repeatable)' },
  JOBS_OPTION,
  { ...MEASURED_OPTION, description: "a dyno sheet (CSV: rpm and torque_Nm, torque_lbft, power_kW, power_hp or ve_pct) shown beside both (default: A's measured key)" },
  { name: 'json', type: 'boolean', description: 'print both curves and the differences as JSON (SI units)' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write one row per speed with both curves to FILE' },
  { name: 'force', type: 'boolean', description: 'allow --csv to overwrite an existing file' },
  UNITS_OPTION,
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
];

function spanText(s: WinSpan): string {
  const where = s.from === s.to ? `${fix(s.from, 0)} rpm` : `${fix(s.from, 0)}–${fix(s.to, 0)} rpm`;
  if (s.winner === 'even') return `even at ${where}`;
  return `${s.winner} wins ${where} (by up to ${fix(s.largestDifference * 100, 1)} points)`;
}

function slim(points: readonly SweepPoint[]) {
  return points.map((p) => ({ ...pointJson(p), effect: p.pulse.effect }));
}

export const compareCommand: Command = {
  name: 'compare',
  summary: 'two designs over the same speeds: curves, differences, band means, who wins where',
  help: `usage: tractwave compare A.yaml B.yaml [--rpm FROM:TO:STEP] [--band LO:HI]
                         [--set path=value ...] [--jobs N]
                         [--json | --csv FILE [--force]]

Sweeps both cases over the same speeds and shows their ηv curves on one chart
(A as a line, B in dots), the difference B − A at each speed in percentage
points, the band means side by side (area under the curve / band width: the
figure of merit), and the speed spans where each design wins. A difference
within 0.1 point counts as even.

Speeds and band come from the options, else from A's 'sweep' and 'band' keys,
else 3000:9000:250 and the whole range. --set applies to both cases.

options
${optionHelp(OPTIONS)}

--json prints: a {name, file, points [...], band {...}, bestRpm}, b {...},
band {from, to}, difference [{rpm, difference}] (B − A, fraction),
wins [{winner, from, to, largestDifference}], stats {jobs, wallSeconds}; with a
dyno sheet also measured [{rpm, torque?, power?, volumetricEfficiency?,
a {model, difference}, b {model, difference}}] and measuredFile.

examples
  tractwave compare cases/demo.yaml cases/airbox-single.yaml
  tractwave compare a.yaml b.yaml --rpm 4000:9000:250 --band 5000:8000
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [fileA, fileB] = expectPositionals(args, ['A.yaml', 'B.yaml'], 'compare');
    const csv = csvAndJsonChoice(args, io);
    const jobs = parseJobs(args);
    prestartPool(jobs); // the workers load while the case does
    const a = await loadForSweep(fileA!, args, io);
    const b = await loadForSweep(fileB!, args, io);
    const u = displayUnits(args, a);
    const dyno = await dynoOf(args, a, io.cwd);
    const grid = sweepGrid(args, a.case);
    const band = chooseBand(args, a.case, grid);
    {
      // both designs share the workers
      const ca = engineCost(a.model, grid.values);
      const cb = engineCost(b.model, grid.values);
      checkCost(combinedCost([ca, cb], jobs), ca.seconds >= cb.seconds ? a.model : b.model, args, '--rpm');
    }
    const bar = progress(io, 'compare');
    const t0 = performance.now();
    let pa: SweepPoint[];
    let pb: SweepPoint[];
    try {
      const both = await runSweeps(
        [
          { model: a.model, rpms: grid.values },
          { model: b.model, rpms: grid.values },
        ],
        { jobs, onProgress: bar.tick, assumptions: assumptionsOf(a.case) },
      );
      pa = both[0]!;
      pb = both[1]!;
    } finally {
      bar.done();
    }
    // B's torque and power with B's own assumptions
    const ab = assumptionsOf(a.case);
    const bb = assumptionsOf(b.case);
    if (ab.airFuelRatio !== bb.airFuelRatio || ab.fuelHeatingValue !== bb.fuelHeatingValue || ab.brakeEfficiency !== bb.brakeEfficiency) {
      const k = (bb.fuelHeatingValue * bb.brakeEfficiency * ab.airFuelRatio) / (ab.fuelHeatingValue * ab.brakeEfficiency * bb.airFuelRatio);
      pb = pb.map((p) => ({ ...p, torque: p.torque * k, power: p.power * k }));
    }
    const wallSeconds = (performance.now() - t0) / 1000;
    const sa = summariseSweep(pa, band);
    const sb = summariseSweep(pb, band);
    const rpms = grid.values;
    const ea = pa.map((p) => p.volumetricEfficiency);
    const eb = pb.map((p) => p.volumetricEfficiency);
    const spans = winningSpans(rpms, ea, eb);
    for (const w of sweepWarnings(pa, a.model.numerics.maxCycles, 'A', a.model)) io.stderr.write(`${w}\n`);
    for (const w of sweepWarnings(pb, b.model.numerics.maxCycles, 'B', b.model)) io.stderr.write(`${w}\n`);
    if (band.note) io.stderr.write(`note: ${band.note}\n`);
    if (b.case.band && (b.case.band.from !== band.from || b.case.band.to !== band.to) && band.source !== 'option')
      io.stderr.write(`note: B's own band ${b.case.band.from}–${b.case.band.to} rpm is not used; both are judged over A's band (set --band to choose)\n`);

    if (args.flag('json')) {
      const side = (file: string, name: string, points: SweepPoint[], s: typeof sa) => ({
        name,
        file,
        points: slim(points),
        band: s.band,
        bestRpm: s.bestRpm,
        bestVolumetricEfficiency: s.bestVolumetricEfficiency,
      });
      const json = {
        a: side(fileA!, a.model.name, pa, sa),
        b: side(fileB!, b.model.name, pb, sb),
        band: { from: band.from, to: band.to },
        difference: rpms.map((rpm, i) => ({ rpm, difference: (eb[i] ?? Number.NaN) - (ea[i] ?? Number.NaN) })),
        wins: spans,
        stats: { jobs, wallSeconds },
        ...(dyno ? { measured: dynoJsonTwo(pa, pb, dyno), measuredFile: dyno.file } : {}),
      };
      io.stdout.write(`${JSON.stringify(json)}\n`);
      return 0;
    }
    if (csv !== undefined) {
      // one convention with run and sweep: SI values (ηv as a fraction), the header names end in the unit
      const head = ['speed_rpm', 'a_volumetric_efficiency', 'b_volumetric_efficiency', 'b_minus_a_volumetric_efficiency', 'better'];
      const num = (v: number): string => (Number.isFinite(v) ? String(v) : '');
      const rows = rpms.map((rpm, i) => {
        const x = ea[i] ?? Number.NaN;
        const y = eb[i] ?? Number.NaN;
        return [num(rpm), num(x), num(y), num(y - x), winnerAt(x, y)].join(',');
      });
      await writeFileAtomic(csv, [head.join(','), ...rows].join('\n') + '\n', { force: args.flag('force'), option: '--csv', cwd: io.cwd });
    }

    const out: string[] = [
      `compare over ${fix(rpms[0]!, 0)}–${fix(rpms[rpms.length - 1]!, 0)} rpm every ${fix(grid.step, 0)} rpm (${rpms.length * 2} points, ${fix(wallSeconds, 1)} s)`,
      `  A (line ─): ${a.model.name} [${printable(fileA!)}]`,
      `    ${assemblyLine(a.model, u)}`,
      `  B (dots ·): ${b.model.name} [${printable(fileB!)}]`,
      `    ${assemblyLine(b.model, u)}`,
      '',
      `volumetric efficiency ηv [%] against speed${dyno?.kinds.includes('volumetricEfficiency') ? ` (● measured, ${dyno.file})` : ''}`,
    ];
    out.push(
      ...curveChart(rpms, [{ values: ea.map((v) => v * 100) }, { values: eb.map((v) => v * 100) }], {
        band,
        ...(dyno ? { points: chartPoints(dyno, 'volumetricEfficiency', u) } : {}),
      }),
    );
    if (dyno) out.push(...outputChart(rpms, [pa, pb], dyno, { band }, u));
    out.push('');
    io.stdout.write(out.map((l) => wrapLine(l)).join('\n') + '\n');
    const rows = rpms.map((rpm, i) => {
      const x = ea[i] ?? Number.NaN;
      const y = eb[i] ?? Number.NaN;
      const w = winnerAt(x, y);
      return [fix(rpm, 0), fix(x * 100, 1), fix(y * 100, 1), signed((y - x) * 100, 1), w === 'even' ? '=' : w];
    });
    io.stdout.write(table([['', 'A', 'B', 'B − A', ''], ['rpm', 'ηv %', 'ηv %', 'points', 'better']], rows));
    if (dyno) io.stdout.write(dynoBlockTwo(pa, pb, dyno, u));
    const ma = sa.band.meanVolumetricEfficiency;
    const mb = sb.band.meanVolumetricEfficiency;
    const lead = winnerAt(ma, mb);
    const verdict =
      lead === 'even'
        ? 'the two are even over the band'
        : `${lead} is better over the band by ${fix(Math.abs(mb - ma) * 100, 2)} points`;
    const summary = [
      '',
      `band ${fix(band.from, 0)}–${fix(band.to, 0)} rpm, mean ηv (area under the curve / band width): A ${fix(ma * 100, 2)} %, B ${fix(mb * 100, 2)} % — ${verdict}`,
      `best speed: A ${fix(sa.bestVolumetricEfficiency * 100, 1)} % at ${fix(sa.bestRpm, 0)} rpm, B ${fix(sb.bestVolumetricEfficiency * 100, 1)} % at ${fix(sb.bestRpm, 0)} rpm`,
      `where each wins: ${spans.map(spanText).join('; ')}`,
      'results are estimates from a simplified model: verify them on an engine.',
    ];
    io.stdout.write(summary.map((l) => wrapLine(l)).join('\n') + '\n');
    if (csv !== undefined) io.stdout.write(`wrote ${rpms.length} rows (one per speed) to ${csv}\n`);
    return 0;
  },
};

