/**
 * Output of one simulated operating point: the JSON of `run` (DESIGN §3),
 * the per-degree CSV trace, and the text summary for a tuner.
 */
import { printable } from '../case/printable.js';
import { MASS_IMBALANCE_LIMIT, massBalanceOk } from '../analysis/mass-balance.js';
import { maxVolumetricEfficiency, resultProblems, resultWarnings } from '../analysis/plausibility.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { soundSpeed } from '../core/gas.js';
import { feedInertance } from '../analysis/estimates.js';
import { networkLine } from '../analysis/network-line.js';
import { overlapPressures, plenumRinging } from '../analysis/parts.js';
import type { PulseTiming } from '../analysis/pulse.js';
import type { LoadedCase } from '../case/load.js';
import { thetaToCard } from '../case/to-model.js';
import { card, deg, fix, hz, pct, row, wrap } from './format.js';
import { METRIC, type Units } from '../present/units.js';
import { restateGauge } from '../present/words.js';
import { assemblyLine } from '../present/network-line.js';

/** mass imbalance above which a warning is printed [-] */
/** the warning threshold of the mass balance (analysis/mass-balance.ts) */
export const MASS_IMBALANCE_WARNING = MASS_IMBALANCE_LIMIT;

export interface RunJson {
  rpm: number;
  converged: boolean;
  cycles: number;
  volumetricEfficiency: number;
  deliveredMass: number;
  inletMass: number;
  massImbalance: number;
  trappedMass: number;
  ivcPressure: number;
  residualFraction: number;
  valvePressureAtIvo: number;
  valvePressureAtIvc: number;
  peakReverseFlow: number;
  events: { ivo: number; ivc: number; evo: number; evc: number };
  pulse: PulseTiming;
  stats: { nodes: number; steps: number; wallSeconds: number; scheme: string };
  trace: {
    crank: number[];
    valvePressure: number[];
    valveFlow: number[];
    cylinderPressure: number[];
    cylinderMass: number[];
    lift: number[];
    /** with a plenum or airbox */
    plenumPressure?: number[];
    /** with an exhaust pipe: pressure at its valve end */
    exhaustPortPressure?: number[];
  };
  /** the warnings printed on stderr, without the "warning: " prefix */
  warnings: string[];
}

export function runJson(r: PointResult, pulse: PulseTiming, wallSeconds: number, model: EngineModel, warnings: readonly string[] = []): RunJson {
  const t = r.trace;
  return {
    rpm: r.rpm,
    converged: r.converged,
    cycles: r.cycles,
    volumetricEfficiency: r.volumetricEfficiency,
    deliveredMass: r.deliveredMass,
    inletMass: r.inletMass,
    massImbalance: r.massImbalance,
    trappedMass: r.trappedMass,
    ivcPressure: r.ivcPressure,
    residualFraction: r.residualFraction,
    valvePressureAtIvo: r.valvePressureAtIvo,
    valvePressureAtIvc: r.valvePressureAtIvc,
    peakReverseFlow: r.peakReverseFlow,
    events: { ivo: r.events.ivo, ivc: r.events.ivc, evo: r.events.evo, evc: r.events.evc },
    pulse,
    stats: { nodes: r.stats.nodes, steps: r.stats.steps, wallSeconds, scheme: r.stats.scheme },
    trace: {
      crank: Array.from(t.crank),
      valvePressure: Array.from(t.valvePressure),
      valveFlow: Array.from(t.valveFlow),
      cylinderPressure: Array.from(t.cylinderPressure),
      cylinderMass: Array.from(t.cylinderMass),
      lift: Array.from(t.lift),
      ...(model.inlet.kind === 'plenum' ? { plenumPressure: Array.from(t.plenumPressure) } : {}),
      ...(model.exhaust.pipe ? { exhaustPortPressure: Array.from(t.exhaustPortPressure) } : {}),
    },
    warnings: warnings.map((w) => w.replace(/^warning: /, '')),
  };
}

/** CSV columns: name with unit, and the trace array it comes from. */
export const TRACE_COLUMNS = [
  ['crank_deg', 'crank'],
  ['valve_pressure_Pa', 'valvePressure'],
  ['valve_flow_kg_per_s', 'valveFlow'],
  ['cylinder_pressure_Pa', 'cylinderPressure'],
  ['cylinder_mass_kg', 'cylinderMass'],
  ['intake_lift_m', 'lift'],
  ['exhaust_lift_m', 'exhaustLift'],
  ['inlet_flow_kg_per_s', 'inletFlow'],
  ['plenum_pressure_Pa', 'plenumPressure'],
] as const;

/** columns added when the case has the part */
const EXHAUST_PORT_COLUMN = ['exhaust_port_pressure_Pa', 'exhaustPortPressure'] as const;

export function traceCsv(r: PointResult, model: EngineModel): string {
  const t = r.trace;
  const cols = [...TRACE_COLUMNS, ...(model.exhaust.pipe ? [EXHAUST_PORT_COLUMN] : [])];
  const lines = [cols.map(([h]) => h).join(',')];
  const n = t.crank.length;
  for (let i = 0; i < n; i++) lines.push(cols.map(([, k]) => String(t[k][i] ?? '')).join(','));
  return lines.join('\n') + '\n';
}

/** Warnings for stderr: non-convergence and a poor mass balance. */
export function runWarnings(r: PointResult, maxCycles: number, model?: Pick<EngineModel, 'inlet' | 'ambient'>): string[] {
  const w: string[] = [];
  if (!r.converged) {
    const h = r.history;
    const last = h.length >= 2 ? Math.abs(h[h.length - 1]! - h[h.length - 2]!) / Math.abs(h[h.length - 1]!) : NaN;
    w.push(
      `warning: not converged after ${r.cycles} cycles (cap numerics.maxCycles = ${maxCycles}; last change ${Number.isFinite(last) ? last.toExponential(1) : '?'}): the numbers are not yet periodic`,
    );
  }
  if (!massBalanceOk(r.massImbalance))
    w.push(
      `warning: mass imbalance ${pct(r.massImbalance, 2)} (runner inlet vs intake valve) is above ${pct(MASS_IMBALANCE_WARNING)}: try a smaller numerics.meshSize`,
    );
  for (const x of resultWarnings(r, model)) w.push(`warning: ${x}`);
  return w;
}

/** What the airbox and the exhaust pipe did, when the case has them. */
export function partLines(m: EngineModel, r: PointResult, u: Units = METRIC): string {
  let s = '';
  const box = plenumRinging(r, m);
  if (box && m.inlet.kind === 'plenum') {
    const est = (soundSpeed(m.ambient.temperature) / (2 * Math.PI)) * Math.sqrt(1 / (m.inlet.volume * feedInertance(m.inlet)));
    s += row(m.inlet.snorkel ? 'airbox pressure' : 'plenum pressure', `${u.text('pressure', box.min)} to ${u.text('pressure', box.max)} over the cycle`);
    s += row(m.inlet.snorkel ? 'airbox swings most at' : 'plenum swings most at', `${hz(box.frequency, 0)} = ${box.order} × N/120, ±${u.text('gauge', box.amplitude)} (Helmholtz estimate of the box on its feed ${hz(est, 0)})`);
  }
  const ov = overlapPressures(r, m);
  if (ov) {
    const words = ov.difference < 0 ? 'below the intake side: it pulls gas through' : 'above the intake side: it pushes burned gas back';
    s += row('exhaust port at overlap', `${u.text('pressure', ov.port)}, ${u.text('gauge', Math.abs(ov.difference))} ${words}`);
  }
  return s;
}

/** The events block: θ and card form. */
export function eventLines(events: PointResult['events']): string {
  return (
    row('intake opens (IVO)', `θ ${deg(events.ivo, 1).padStart(6)}   ${card(thetaToCard.intakeOpens(events.ivo), 'BTDC', 'ATDC', 1)}`) +
    row('intake closes (IVC)', `θ ${deg(events.ivc, 1).padStart(6)}   ${card(thetaToCard.intakeCloses(events.ivc), 'ABDC', 'BBDC', 1)}`) +
    row('exhaust opens (EVO)', `θ ${deg(events.evo, 1).padStart(6)}   ${card(thetaToCard.exhaustOpens(events.evo), 'BBDC', 'ABDC', 1)}`) +
    row('exhaust closes (EVC)', `θ ${deg(events.evc, 1).padStart(6)}   ${card(thetaToCard.exhaustCloses(events.evc), 'ATDC', 'BTDC', 1)}`)
  );
}

export function runSummary(loaded: LoadedCase, r: PointResult, pulse: PulseTiming, wallSeconds: number, u: Units = METRIC): string {
  const m = loaded.model;
  let s = '';
  s += `${m.name} at ${fix(r.rpm, 0)} rpm${loaded.file ? `  (${printable(loaded.file)})` : ''}\n`;
  s += `  ${wrap(assemblyLine(m, u), 76, '    ')}`;
  s += r.converged
    ? `  periodic after ${r.cycles} cycles (tolerance ${m.numerics.tolerance})\n\n`
    : `  NOT converged after ${r.cycles} cycles: figures are from the last cycle run\n\n`;
  const implausible = resultProblems({ volumetricEfficiency: r.volumetricEfficiency, residualFraction: r.residualFraction }, maxVolumetricEfficiency(m)).length > 0;
  s += row('volumetric efficiency', `${pct(r.volumetricEfficiency)}${implausible ? '  (NOT a breathing figure: see the warning)' : ''}`);
  s += row('delivered mass', `${u.text('mass', r.deliveredMass)} per cycle (through the intake valve)`);
  s += row('trapped mass at IVC', u.text('mass', r.trappedMass));
  s += row('residual gas', pct(r.residualFraction));
  s += row('cylinder pressure at IVC', u.text('pressure', r.ivcPressure));
  s += row('valve pressure at IVO', u.text('pressure', r.valvePressureAtIvo));
  s += row('valve pressure at IVC', u.text('pressure', r.valvePressureAtIvc));
  s += row('peak reverse flow', u.text('massFlow', r.peakReverseFlow));
  const warn = !massBalanceOk(r.massImbalance) ? '  (above 0.5 %: see warning)' : '';
  s += row('mass balance', `inlet ${u.text('mass', r.inletMass)} vs valve ${u.text('mass', r.deliveredMass)}: ${pct(r.massImbalance, 2)}${warn}`);
  s += partLines(m, r, u);
  s += '\npulse timing\n';
  // a: the simulated mean sound speed in the runner (check uses the ambient's)
  s += row('wave round trip 2L/a', `${deg(pulse.roundTripDegrees, 1)} of crank (L ${u.text('length', pulse.runnerLength, u.system === 'metric' ? 0 : 1)}, a ${u.text('speed', pulse.soundSpeed, 0)}, the mean in the runner)`);
  s += row('quarter-wave, wave order', `${fix(pulse.quarterWaveFrequency, 1)} Hz, order ${fix(pulse.waveOrder, 2)} at this speed`);
  s += row('', `a/(4(L+δ)) with a ${u.text('speed', pulse.quarterWaveSoundSpeed)} at the ambient ${u.text('temperature', m.ambient.temperature)}`);
  // the compression peak the verdict speaks of: still rising at IVC → the one just after
  const after = pulse.effect === 'helping' ? pulse.peakAfterIvc : null;
  const pk = after ?? pulse.lastPeakBeforeIvc;
  s += row(
    after ? 'peak just after IVC' : 'last peak before IVC',
    pk ? `θ ${deg(pk.crank, 1)}, ${deg(Math.abs(pk.offsetFromIvc), 1)} ${pk.offsetFromIvc <= 0 ? 'before' : 'after'} IVC, ${u.signed('gauge', pk.pressureAboveReference)} ${u.label('gauge')}` : 'none in the open period',
  );
  s += row('at IVC', `${u.signed('gauge', pulse.atIvc.pressureAboveReference)} ${u.label('gauge')} vs ${pulse.referenceKind} (ringing phase ${fix(pulse.atIvc.ringingPhase, 0)}°)`);
  s += wrap(`  verdict: ${restateGauge(pulse.verdict, u)}`);
  s += wrap(`  opening: ${restateGauge(pulse.openingNote, u)}`);
  s += '\nevents (θ: 0 = TDC at the start of the intake stroke; card form beside)\n';
  s += eventLines(r.events);
  s += `\n  ${r.stats.nodes} ${r.pipes.length > 1 ? 'pipe' : 'runner'} points, ${r.stats.steps} time steps, ${r.stats.scheme} scheme, ${fix(wallSeconds, 2)} s\n`;
  s += '  results are estimates: verify on an engine.\n';
  return s;
}
