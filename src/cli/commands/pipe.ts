/** `tractwave pipe CASE`: the bare pipe experiment (teaching and verification). */
import { printable } from '../../case/printable.js';
import { performance } from 'node:perf_hooks';
import { runPipeExperiment } from '../../core/pipe-experiment.js';
import type { PipeEndModel, PipeExperimentResult } from '../../core/pipe-experiment-model.js';
import { GAMMA, R_AIR, soundSpeed } from '../../core/gas.js';
import { sampleRiemann, solveRiemann, waveFrontSpeeds, type GasState } from '../../analysis/exact-riemann.js';
import { helmholtzResonator } from '../../analysis/estimates.js';
import { zeroCrossingFrequency } from '../../analysis/ringing.js';
import { loadPipeCase, type LoadedPipeCase } from '../../case/load.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_LONG_OPTION, displayUnits, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { METRIC, type Units } from '../../present/units.js';
import { costProblem, pipeCost } from '../../analysis/cost.js';
import { CaseError } from '../../case/errors.js';
import { fix, table } from '../format.js';

/** rows shown per snapshot in the text table when the window size is not known (and the fewest otherwise) */
export const TABLE_ROWS = 11;

const OPTIONS: OptionSpec[] = [
  { ...SET_OPTION, description: 'override a case value, e.g. --set pipe.length=2m (repeatable)' },
  { name: 'json', type: 'boolean', description: 'print x and the snapshots as JSON (SI units)' },
  UNITS_OPTION,
  {
    name: 'rows',
    type: 'string',
    value: 'N',
    description: `rows of each snapshot's table (default: as many as the terminal has room for, at least ${TABLE_ROWS}; ${TABLE_ROWS} when not writing to a terminal)`,
  },
  ALLOW_LONG_OPTION,
];

/** lines a snapshot takes besides its table rows (blank, title, header) */
const SNAPSHOT_LINES = 3;

/** Rows per snapshot: --rows, else what one screen holds (a snapshot a screen), else TABLE_ROWS. */
export function tableRows(text: string | undefined, terminalRows: number | undefined): number {
  if (text !== undefined) {
    if (!/^\d+$/.test(text.trim()) || !(Number(text) >= 2 && Number(text) <= 10000))
      throw new CaseError('--rows', `expected a whole number from 2 to 10000, got '${text}'`, 'option');
    return Number(text);
  }
  if (terminalRows === undefined) return TABLE_ROWS;
  return Math.max(TABLE_ROWS, terminalRows - SNAPSHOT_LINES - 2);
}

/**
 * The exact solution of the initial split as a Riemann problem at time t
 * (Toro 2009, ch. 4), while it applies: no wall friction or heat transfer,
 * and no wave has yet reached an end (so the ends play no part). Undefined
 * otherwise, and at t = 0.
 */
export function exactSolution(m: LoadedPipeCase['model'], t: number): ((x: number) => GasState & { T: number }) | undefined {
  if (m.pipe.wallFriction || m.pipe.wallHeatTransfer || !(t > 0)) return undefined;
  const state = (s: { pressure: number; temperature: number; velocity: number }): GasState => ({ rho: s.pressure / (R_AIR * s.temperature), u: s.velocity, p: s.pressure });
  const sol = solveRiemann(state(m.initial.left), state(m.initial.right), GAMMA);
  const x0 = m.initial.split * m.pipe.length;
  const front = waveFrontSpeeds(sol);
  if (x0 + front.left * t < 0 || x0 + front.right * t > m.pipe.length) return undefined;
  return (x) => {
    const w = sampleRiemann(sol, (x - x0) / t);
    return { ...w, T: w.p / (R_AIR * w.rho) };
  };
}

export function pipeJson(r: PipeExperimentResult, wallSeconds: number) {
  return { x: r.x, snapshots: r.snapshots, mass: r.mass, ...(r.volumes.length > 0 ? { volumes: r.volumes } : {}), stats: { ...r.stats, wallSeconds } };
}

/** an end in words: "closed", "open", "a 3 L volume" */
function endWords(end: PipeEndModel, u: Units): string {
  return typeof end === 'string' ? end : `into a ${u.text('volume', end.volume)} volume`;
}

/** What a volume end did: its pressure range, its ringing against the bare-pipe Helmholtz formula. */
export function volumeLines(m: LoadedPipeCase['model'], r: PipeExperimentResult, u: Units = METRIC): string {
  let s = '';
  for (const v of r.volumes) {
    const end = m.ends[v.side];
    if (typeof end !== 'object') continue;
    const lo = Math.min(...v.pressure);
    const hi = Math.max(...v.pressure);
    const f = zeroCrossingFrequency(v.time, v.pressure);
    const area = (Math.PI / 4) * m.pipe.diameter ** 2;
    const estimate = helmholtzResonator(soundSpeed(end.temperature), area, end.volume, m.pipe.length);
    s += `
  ${v.side} volume: ${u.value('pressure', lo, 2)}–${u.text('pressure', hi, 2)} over the run`;
    s += Number.isFinite(f)
      ? `, ringing at ${fix(f, 1)} Hz (Helmholtz (a/2π)·√(S/(V·L)) with the bare pipe: ${fix(estimate, 1)} Hz)\n`
      : ` (run longer to see it ring: Helmholtz estimate ${fix(estimate, 1)} Hz, a period of ${fix(1000 / estimate, 1)} ms)\n`;
  }
  return s;
}

export function pipeReport(loaded: LoadedPipeCase, r: PipeExperimentResult, wallSeconds: number, u: Units = METRIC, rows: number = TABLE_ROWS): string {
  const m = loaded.model;
  // positions along the pipe: metres, or inches
  const xUnit = u.system === 'metric' ? 'm' : 'in';
  const xText = (x: number) => (u.system === 'metric' ? fix(x, 3) : u.value('length', x, 1));
  let s = `${m.name}${loaded.file ? `  (${printable(loaded.file)})` : ''}\n`;
  s += `  pipe ${xText(m.pipe.length)} ${xUnit} x ${u.text('length', m.pipe.diameter)}, ends: left ${endWords(m.ends.left, u)}, right ${endWords(m.ends.right, u)}; `;
  s += `friction ${m.pipe.wallFriction ? 'on' : 'off'}, wall heat transfer ${m.pipe.wallHeatTransfer ? 'on' : 'off'}\n`;
  s += `  initial split at ${xText(m.initial.split * m.pipe.length)} ${xUnit}: left ${u.text('pressure', m.initial.left.pressure, 2)} ${u.text('temperature', m.initial.left.temperature)}, `;
  s += `right ${u.text('pressure', m.initial.right.pressure, 2)} ${u.text('temperature', m.initial.right.temperature)}\n`;
  const n = r.x.length;
  const shown = Math.min(rows, n);
  const idx = Array.from({ length: shown }, (_, k) => Math.round((k * (n - 1)) / Math.max(1, shown - 1)));
  const exactNote = m.pipe.wallFriction || m.pipe.wallHeatTransfer ? '' : 'exact: the Riemann problem of the split (Toro 2009, ch. 4) while no wave has reached an end';
  let exactShown = false;
  r.snapshots.forEach((snap, j) => {
    const p = snap.pressure;
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of p) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    const exact = exactSolution(m, snap.time);
    const reached = !exact && exactNote !== '' && snap.time > 0 ? '; a wave has reached an end: no exact column' : '';
    s += `\nt = ${fix(snap.time * 1000, 3)} ms   (pressure ${u.value('pressure', lo, 2)}–${u.text('pressure', hi, 2)}; gas mass ${u.text('mass', r.mass[j] ?? NaN, 3)}${reached})\n`;
    if (exact) {
      exactShown = true;
      s += table(
        [`x [${xUnit}]`, `p ${u.bracket('pressure')}`, 'exact', `u ${u.bracket('speed')}`, 'exact', `T ${u.bracket('temperature')}`, 'exact'],
        idx.map((i) => {
          const e = exact(r.x[i]!);
          return [
            xText(r.x[i]!),
            u.value('pressure', p[i]!, 2),
            u.value('pressure', e.p, 2),
            u.value('speed', snap.velocity[i]!, 1),
            u.value('speed', e.u, 1),
            u.value('temperature', snap.temperature[i]!, 1),
            u.value('temperature', e.T, 1),
          ];
        }),
      );
    } else {
      s += table(
        [`x [${xUnit}]`, `p ${u.bracket('pressure')}`, `u ${u.bracket('speed')}`, `T ${u.bracket('temperature')}`],
        idx.map((i) => [xText(r.x[i]!), u.value('pressure', p[i]!, 2), u.value('speed', snap.velocity[i]!, 1), u.value('temperature', snap.temperature[i]!, 1)]),
      );
    }
  });
  if (exactShown) s += `\n  ${exactNote}\n`;
  s += volumeLines(m, r, u);
  s += `\n  ${r.stats.nodes} points, ${r.stats.steps} time steps, ${r.stats.scheme} scheme, ${fix(wallSeconds, 2)} s\n`;
  return s;
}

export const pipeCommand: Command = {
  name: 'pipe',
  summary: 'bare pipe experiment: shock tube, pulse reflections',
  help: `usage: tractwave pipe CASE [--set path=value ...] [--json]

Runs a straight pipe with chosen ends (closed, or open to the initial state of
that side) from a two-state initial split, and prints pressure, velocity and
temperature along the pipe at the requested times. For teaching (how a pulse
reflects) and for checking the solver (Sod's shock tube).

A pipe case:
  pipe:    { length, diameter, meshSize, wallFriction: true,
             wallHeatTransfer: true }
  ends:    { left: closed | open | { volume, pressure?, temperature? },
             right: ... }   (a volume end: a closed 0-D volume the
             pipe opens into, e.g. a Helmholtz resonator's cavity)
  initial: { split: 0..1, left: { pressure, temperature, velocity },
             right: { ... } }
  times:   [ 0 s, 1 ms, ... ]
  numerics: { courant, scheme }

options
${optionHelp(OPTIONS)}

--json prints x [m] and snapshots [{time [s], pressure [Pa], velocity [m/s],
temperature [K]}], plus mass [kg] per snapshot (pipe and volumes), volumes
[{side, time [s], pressure [Pa]}] for volume ends, and stats. The lab's pipe is
exactly its length: no acoustic end correction is added at its ends.

examples
  tractwave pipe cases/pipe-sod.yaml
  tractwave pipe cases/pipe-pulse.yaml --set ends.right=closed
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'pipe');
    const loaded = await loadPipeCase(file!, { set: args.list('set'), cwd: io.cwd });
    const problem = args.flag('allow-long') ? undefined : costProblem(pipeCost(loaded.model), 'pipe');
    if (problem) throw new CaseError(loaded.model.pipe.meshSize < 0.002 ? 'pipe.meshSize' : 'times', problem, 'option');
    const t0 = performance.now();
    const r = runPipeExperiment(loaded.model);
    const wallSeconds = (performance.now() - t0) / 1000;
    if (args.flag('json')) io.stdout.write(`${JSON.stringify(pipeJson(r, wallSeconds))}\n`);
    else io.stdout.write(pipeReport(loaded, r, wallSeconds, displayUnits(args, loaded), tableRows(args.string('rows'), io.stdoutIsTTY ? io.stdoutRows : undefined)));
    return 0;
  },
};
