/** `tractwave flow FILE --diameter D --test-pressure P`: a flow-bench sheet as discharge coefficients. */
import { resolve } from 'node:path';
import type { BenchPoint, BenchSetup } from '../../core/flow-bench.js';
import { CaseError } from '../../case/errors.js';
import { readDataFile } from '../../case/csv.js';
import { BENCH_DEFAULTS, benchPoints, parseFlowSheet, type FlowSheet } from '../../case/flow-sheet.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { displayUnits, UNITS_OPTION, type Command } from '../command.js';
import { fix, table } from '../format.js';
import { quantityOption } from '../measured-options.js';
import { writeFileAtomic } from '../write-file.js';
import { csvAndJsonChoice } from './sweep.js';

const OPTIONS: OptionSpec[] = [
  { name: 'diameter', type: 'string', value: 'D', description: 'valve head diameter on the bench, e.g. 35mm (required)' },
  { name: 'test-pressure', type: 'string', value: 'P', description: 'the test depression below the room, e.g. 28inH2O (required)' },
  { name: 'valves', type: 'string', value: 'N', description: 'valves flowed together (default 1)' },
  { name: 'pressure', type: 'string', value: 'P0', description: `room pressure (default ${BENCH_DEFAULTS.pressure / 1000} kPa)` },
  { name: 'temperature', type: 'string', value: 'T0', description: `room temperature (default ${fix(BENCH_DEFAULTS.temperature - 273.15, 0)} degC)` },
  { name: 'json', type: 'boolean', description: 'print the points as JSON (SI units)' },
  { name: 'csv', type: 'string', value: 'OUT', description: 'write the points to OUT (header row with units)' },
  { name: 'force', type: 'boolean', description: 'allow --csv to overwrite an existing file' },
  UNITS_OPTION,
];

export function benchSetupOf(args: ReturnType<typeof parseArgs>): BenchSetup {
  const diameter = quantityOption(args, 'diameter', 'length', { positive: true });
  if (diameter === undefined) throw new CaseError('--diameter', 'required: the valve head diameter on the bench, e.g. --diameter 35mm', 'option');
  const testPressure = quantityOption(args, 'test-pressure', 'pressure', { positive: true });
  if (testPressure === undefined) throw new CaseError('--test-pressure', 'required: the depression the sheet was flowed at, e.g. --test-pressure 28inH2O', 'option');
  const pressure = quantityOption(args, 'pressure', 'pressure', { positive: true }) ?? BENCH_DEFAULTS.pressure;
  const temperature = quantityOption(args, 'temperature', 'temperature', { positive: true }) ?? BENCH_DEFAULTS.temperature;
  const vt = args.string('valves');
  if (vt !== undefined && !/^\d+$/.test(vt.trim())) throw new CaseError('--valves', `expected a whole number ≥ 1, got '${vt}'`, 'option');
  const valves = vt === undefined ? 1 : Number(vt);
  if (!(valves >= 1)) throw new CaseError('--valves', `expected a whole number ≥ 1, got '${vt}'`, 'option');
  if (!(testPressure < pressure))
    throw new CaseError('--test-pressure', `must be below the room pressure (${fix(pressure / 1000, 3)} kPa): it is the depression below it`, 'option');
  return { diameter, valves, pressure, temperature, testPressure };
}

const INH2O = 249.08891;

function flowText(sheet: FlowSheet, i: number): string {
  const v = sheet.flow[i]!;
  switch (sheet.columns.flow) {
    case 'flow_cfm':
      return fix(v / ((0.3048 ** 3) / 60), 1);
    case 'flow_L_per_s':
      return fix(v * 1000, 2);
    default:
      return fix(v * 1000, 2);
  }
}

const FLOW_UNIT: Record<string, string> = { flow_cfm: 'cfm', flow_L_per_s: 'L/s', flow_kg_per_s: 'g/s' };

export function flowCsv(points: readonly BenchPoint[]): string {
  const head = 'lift_m,ld,flow_kg_per_s,cd,cd_valve_area';
  const rows = points.map((p) => [p.lift, p.ld, p.flow, p.cd, p.cdValveArea].map((v) => String(v)).join(','));
  return [head, ...rows].join('\n') + '\n';
}

export const flowCommand: Command = {
  name: 'flow',
  summary: 'a flow-bench sheet as discharge coefficients (Cd on the curtain and on the valve area)',
  help: `usage: tractwave flow FILE --diameter D --test-pressure P [--valves N]
                      [--pressure P0] [--temperature T0]
                      [--json | --csv OUT [--force]]

Reads a flow-bench sheet (CSV with a header row: lift_mm or lift_in, and
flow_cfm, flow_L_per_s or flow_kg_per_s; volume flows are of air at the room
state) and prints, for each lift, L/D, the flow and the discharge coefficient
on the curtain area n·π·D·L (what a case's Cd table holds) and on the valve
head area n·π·D²/4, from the compressible orifice equation (Heywood 1988,
App. C):
  Cd = ṁ / (A·p0/√(R·T0)·√(2γ/(γ−1)·(pr^(2/γ) − pr^((γ+1)/γ)))),
  pr = (p0 − P)/p0.
In a case, intake.flowFile (with flowTestPressure and flowDiameter) uses
these Cd values as the valve's Cd table.

options
${optionHelp(OPTIONS)}

--json prints: file, diameter, valves, testPressure, pressure, temperature,
points [{lift, ld, flow, cd, cdValveArea}] (SI: m, kg/s).

examples
  tractwave flow cases/measured/intake-flow.csv --diameter 34mm \\
      --valves 2 --test-pressure 28inH2O
  tractwave flow bench.csv --diameter 1.5in --test-pressure 10inH2O --json
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const u = displayUnits(args);
    const [file] = expectPositionals(args, ['FILE'], 'flow');
    const csv = csvAndJsonChoice(args, io);
    const setup = benchSetupOf(args);
    const sheet = parseFlowSheet(await readDataFile(resolve(io.cwd, file!), file!), file!);
    const points = benchPoints(sheet, setup);
    if (args.flag('json')) {
      io.stdout.write(`${JSON.stringify({ file, ...setup, points })}\n`);
      return 0;
    }
    if (csv !== undefined) await writeFileAtomic(csv, flowCsv(points), { force: args.flag('force'), option: '--csv', cwd: io.cwd });
    const unit = FLOW_UNIT[sheet.columns.flow] ?? '';
    let s = `${file}: ${points.length} lifts, ${setup.valves} valve${setup.valves > 1 ? 's' : ''} of ${u.text('shortLength', setup.diameter)}\n`;
    s += `  bench: room ${u.text('barometric', setup.pressure, u.system === 'metric' ? 3 : 2)}, ${u.text('temperature', setup.temperature)}; test depression ${u.text('gauge', setup.testPressure, u.system === 'metric' ? 3 : 2)} (${fix(setup.testPressure / INH2O, 1)} inH2O)\n\n`;
    const rows = points.map((p, i) => [u.value('shortLength', p.lift), fix(p.ld, 3), flowText(sheet, i), u.value('massFlow', p.flow, 2), fix(p.cd, 3), fix(p.cdValveArea, 3)]);
    s += table([`lift ${u.label('shortLength')}`, 'L/D', `flow ${unit}`, u.label('massFlow'), 'Cd curtain', 'Cd valve'], rows);
    s += '\nCd curtain: on n·π·D·L, what a case\'s Cd table holds (x = L/D);\nCd valve: on n·π·D²/4.\n';
    s += `In a case (the file name then relative to the case file):\n  intake: { flowFile: ${file}, flowTestPressure: ${fix(setup.testPressure / INH2O, 1)} inH2O,\n            flowDiameter: ${fix(setup.diameter * 1000, 2)} mm }\n`;
    io.stdout.write(s);
    if (csv !== undefined) io.stdout.write(`wrote ${points.length} rows to ${csv}\n`);
    return 0;
  },
};
