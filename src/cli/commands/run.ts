/** `tractwave run CASE`: simulate one operating point. */
import { performance } from 'node:perf_hooks';
import { simulatePoint } from '../../core/engine.js';
import { pulseTiming } from '../../analysis/pulse.js';
import { CaseError } from '../../case/errors.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_EXTREME_OPTION, ALLOW_LONG_OPTION, checkCost, displayUnits, loadCaseFromArgs, RPM_OPTION, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { engineCost } from '../../analysis/cost.js';
import { cycleProgress } from '../progress.js';
import { runJson, runSummary, runWarnings, traceCsv } from '../run-output.js';
import { checkOutputFile, writeFileAtomic } from '../write-file.js';
import { compareTrace } from '../../analysis/trace-compare.js';
import { supplyBasis, traceJson, traceLines } from '../measured-output.js';
import { traceOf } from '../measured-options.js';
import { checkTarget } from '../target.js';

const OPTIONS: OptionSpec[] = [
  RPM_OPTION,
  SET_OPTION,
  { name: 'json', type: 'boolean', description: 'print the result as JSON (SI units, crank degrees)' },
  { name: 'csv', type: 'string', value: 'FILE', description: 'write the per-degree trace of the converged cycle to FILE' },
  { name: 'svg', type: 'string', value: 'FILE', description: 'write the chart of valve pressure, valve flow and cylinder mass against crank angle to FILE (SVG)' },
  { name: 'force', type: 'boolean', description: 'allow --csv and --svg to overwrite an existing file' },
  { name: 'measured-trace', type: 'string', value: 'FILE', description: "a runner pressure trace (CSV: crank_deg, pressure_kPa or pressure_kPa_gauge) to compare with the model (default: the case's measuredTrace)" },
  { name: 'sensor-at', type: 'string', value: 'D', description: "the transducer's distance from the valve along the runner, e.g. 80mm (default: at the valve)" },
  { name: 'tdc-offset', type: 'string', value: 'DEG', description: "added to the trace's crank angles to give θ (default 0)" },
  UNITS_OPTION,
  ALLOW_EXTREME_OPTION,
  ALLOW_LONG_OPTION,
];

export const runCommand: Command = {
  name: 'run',
  summary: 'simulate one operating point: ηv, trapped mass, pulse timing',
  help: `usage: tractwave run CASE [--rpm N] [--set path=value ...]
                     [--json | --csv FILE] [--svg FILE] [--force]

Simulates the case at one speed, cycle after cycle until periodic, and prints
volumetric efficiency, delivered and trapped mass, residual gas, pressures at
the valve events, reverse flow, the mass balance, the pulse timing with a
plain-words verdict, and the valve events.

options
${optionHelp(OPTIONS)}

--json prints: rpm, converged, cycles, volumetricEfficiency, deliveredMass,
inletMass, massImbalance, trappedMass, ivcPressure, residualFraction,
valvePressureAtIvo, valvePressureAtIvc, peakReverseFlow, events {ivo, ivc,
evo, evc}, pulse {...}, stats {nodes, steps, wallSeconds, scheme}, trace
{crank, valvePressure, valveFlow, cylinderPressure, cylinderMass, lift}
(720 samples, one per crank degree), warnings [...] (the stderr warnings as
text). SI units: kg, Pa, kg/s, m; angles θ in degrees with 0 = TDC at the
start of the intake stroke.

A run that does not converge still exits 0, with converged: false and a
warning on stderr. So does a result no engine gives (ηv below 0 or above
200 %, residual gas above 50 %): the warning says what it means.

Values outside the ranges engines meet (ambient, back pressure, gas and
wall temperatures, valve sizes) are refused unless --allow-extreme. A run
estimated to take over 15 minutes is refused unless --allow-long; on a
terminal a run of more than a few seconds shows its progress.

examples
  tractwave run cases/demo.yaml
  tractwave run cases/demo.yaml --rpm 8000 --set runner.length=320mm
  tractwave run cases/demo.yaml --csv demo-trace.csv
  tractwave run cases/measured-single.yaml --sensor-at 80mm \\
      --measured-trace cases/measured/trace.csv
  tractwave run cases/demo.yaml --svg demo-valve.svg

--measured-trace FILE compares a measured runner pressure trace with the
model's pressure at the sensor (the runner's space–time map, --sensor-at from
the valve): the last compression peak before IVC (crank angle and rise), the
closed-valve ringing frequency, the pressure at IVO and IVC and the RMS
difference; --json adds measuredTrace {lastPeakBeforeIvc {model, measured,
lateBy}, ringingFrequency {model, measured}, atIvo, atIvc, rms, agrees,
verdict, ...}. A gauge trace is made absolute with the case's ambient pressure.
With inlet.supply (boost) --json adds supplyVolumetricEfficiency; ηv itself is
always on the ambient density (volumetricEfficiencyBasis).
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'run');
    const csv = args.string('csv');
    if (csv !== undefined && args.flag('json')) throw new CaseError('--csv', 'choose one of --json and --csv', 'option');
    const svg = args.string('svg');
    if (args.flag('force') && csv === undefined && svg === undefined) throw new CaseError('--force', 'only applies with --csv FILE or --svg FILE', 'option');
    if (svg !== undefined) {
      if (!/\.svg$/i.test(svg)) throw new CaseError('--svg', `expected a file name ending in .svg, got '${svg}'`, 'option');
      checkTarget(svg, '--svg', io, args.flag('force'));
    }
    const loaded = await loadCaseFromArgs(file!, args, io);
    const u = displayUnits(args, loaded);
    const measured = await traceOf(args, loaded, io.cwd);
    // a file that may not be written is refused before the run, not after it
    if (csv !== undefined) await checkOutputFile(csv, { force: args.flag('force'), option: '--csv', cwd: io.cwd });
    const cost = engineCost(loaded.model);
    checkCost(cost, loaded.model, args, '--rpm');
    const bar = cycleProgress(io, cost);
    const t0 = performance.now();
    let result;
    try {
      result = simulatePoint(loaded.model, bar ? { onCycle: bar.tick } : {}).result;
    } finally {
      bar?.done();
    }
    const wallSeconds = (performance.now() - t0) / 1000;
    const pulse = pulseTiming(result, loaded.model);
    const warnings = runWarnings(result, loaded.model.numerics.maxCycles, loaded.model);
    for (const w of warnings) io.stderr.write(`${w}\n`);
    const cmp = measured ? compareTrace(result, loaded.model, measured.byDegree, measured.sensorAt) : undefined;
    if (svg !== undefined) {
      const { renderSvg, valveChart } = await import('../../report/index.js');
      const chart = valveChart({ rpm: result.rpm, reason: 'asked', result, pulse }, u, pulse.referencePressure);
      await writeFileAtomic(svg, `<?xml version="1.0" encoding="UTF-8"?>\n${await renderSvg(chart.spec)}\n`, { force: args.flag('force'), option: '--svg', cwd: io.cwd });
    }
    if (args.flag('json')) {
      const json = {
        ...runJson(result, pulse, wallSeconds, loaded.model, warnings),
        ...supplyBasis(result, loaded.model).json,
        ...(cmp && measured ? { measuredTrace: traceJson(cmp, measured) } : {}),
      };
      io.stdout.write(`${JSON.stringify(json)}\n`);
      return 0;
    }
    if (csv !== undefined) {
      await writeFileAtomic(csv, traceCsv(result, loaded.model), { force: args.flag('force'), option: '--csv', cwd: io.cwd });
    }
    io.stdout.write(runSummary(loaded, result, pulse, wallSeconds, u));
    io.stdout.write(supplyBasis(result, loaded.model, u).text);
    if (cmp && measured) io.stdout.write(traceLines(cmp, measured, result, u));
    if (csv !== undefined) io.stdout.write(`\nwrote the trace (${result.trace.crank.length} rows, one per crank degree) to ${csv}\n`);
    if (svg !== undefined) io.stdout.write(`${csv === undefined ? '\n' : ''}wrote the valve chart to ${svg}\n`);
    return 0;
  },
};
