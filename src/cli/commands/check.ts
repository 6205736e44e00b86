/** `tractwave check CASE`: validate, print derived geometry and hand estimates. */
import { printable } from '../../case/printable.js';
import { clearanceVolume, sweptVolume } from '../../core/kinematics.js';
import { curtainArea } from '../../core/valve.js';
import { sectionsVolume, totalLength } from '../../core/pipe/mesh.js';
import { caseEstimates, END_CORRECTION, quarterWaveFrequency } from '../../analysis/estimates.js';
import { resonatorWords } from '../../analysis/network-line.js';
import { assemblyLine, pipeSizeText, textLineUnits } from '../../present/network-line.js';
import { METRIC, type Units } from '../../present/units.js';
import { soundSpeed } from '../../core/gas.js';
import { endCorrection as coreEndCorrection } from '../../core/network/end-correction.js';
import { DEFAULT_RELEASE_PRESSURE } from '../../core/network/assemble.js';
import { expectPositionals, optionHelp, parseArgs, type OptionSpec } from '../args.js';
import { ALLOW_EXTREME_OPTION, displayUnits, loadCaseFromArgs, RPM_OPTION, SET_OPTION, UNITS_OPTION, type Command } from '../command.js';
import { card, deg, fix, hz, row, rpm, wrap } from '../format.js';
import type { LoadedCase } from '../../case/load.js';
import { effectiveCard, wrap720 } from '../../case/to-model.js';
import { eventLines } from '../run-output.js';
import { measuredFileLines } from '../measured-output.js';
import { density } from '../../core/gas.js';

const OPTIONS: OptionSpec[] = [RPM_OPTION, SET_OPTION, UNITS_OPTION, ALLOW_EXTREME_OPTION];

export function checkReport(loaded: LoadedCase, u: Units = METRIC): string {
  const m = loaded.model;
  const c = loaded.case;
  const vd = sweptVolume(m.engine);
  const vc = clearanceVolume(m.engine);
  const L = totalLength(m.runner.sections);
  const vr = sectionsVolume(m.runner.sections);
  const lo = c.sweep?.from ?? m.rpm / 2;
  const hi = c.sweep?.to ?? m.rpm * 1.5;
  const est = caseEstimates(m, lo, hi);
  const a = est.soundSpeed;
  let s = `${m.name}${loaded.file ? `  (${printable(loaded.file)})` : ''}: the case is valid\n`;
  s += `  ${wrap(assemblyLine(m, u), 76, '    ')}\ngeometry\n`;
  s += row('displacement', `${u.text('smallVolume', vd)}  (bore ${u.text('length', m.engine.bore)} x stroke ${u.text('length', m.engine.stroke)})`);
  s += row('clearance volume', `${u.text('smallVolume', vc)}  (compression ratio ${fix(m.engine.compressionRatio, 2)})`);
  s += row('rod / crank radius', fix(m.engine.rod / (m.engine.stroke / 2), 2));
  for (const [label, v] of [['intake', m.intake], ['exhaust', m.exhaust]] as const) {
    s += row(
      `${label} curtain area`,
      `${u.text('area', curtainArea(v, v.maxLift))} at ${u.text('shortLength', v.maxLift)} lift  (${v.count} x π·D·L, L/D ${fix(v.maxLift / v.diameter, 3)})`,
    );
  }
  const secs = m.runner.sections;
  const shape =
    secs.length === 1 && secs[0]!.diameterStart === secs[0]!.diameterEnd
      ? `diameter ${u.text('length', secs[0]!.diameterStart)}`
      : `${secs.length} section${secs.length > 1 ? 's' : ''}, ${u.text('length', secs[0]!.diameterStart, u.system === 'metric' ? 0 : 1)} to ${u.text('length', secs[secs.length - 1]!.diameterEnd, u.system === 'metric' ? 0 : 1)} dia.`;
  s += row('runner', `${u.text('length', L)}, ${shape}`);
  s += row('runner volume', `${u.text('smallVolume', vr)}  (${fix(vr / vd, 2)} x displacement)`);
  s += row('entry loss, friction', `K ${fix(m.runner.entryLoss, 2)}, Fanning f ${m.runner.friction}${m.runner.heatTransfer ? ', wall heat transfer on' : ''}`);
  if (m.inlet.kind === 'plenum')
    s += row(
      'plenum',
      `${u.text('volume', m.inlet.volume)} (${fix(m.inlet.volume / vd, 1)} x displacement), ` +
        (m.inlet.snorkel ? `fed by a snorkel ${u.text('length', totalLength(m.inlet.snorkel.sections), u.system === 'metric' ? 0 : 1)} long` : `feed ${u.text('length', m.inlet.feedDiameter ?? 0)}, Cd ${m.inlet.feedCd}`),
    );
  else s += row('inlet', 'open to the ambient air');
  if (c.ambient.altitude !== undefined)
    s += row('ambient', `${u.text('barometric', m.ambient.pressure)}, ${u.text('temperature', m.ambient.temperature)} at ${u.system === 'metric' ? `${fix(c.ambient.altitude, 0)} m` : `${fix(c.ambient.altitude / 0.3048, 0)} ft`} (U.S. Standard Atmosphere 1976 for what the case does not state)`);
  if (m.inlet.kind === 'plenum' && m.inlet.supply)
    s += row('boost supply', `${u.text('pressure', m.inlet.supply.pressure)}, ${u.text('temperature', m.inlet.supply.temperature, 0)} feeds the plenum (density ${fix(density(m.inlet.supply.pressure, m.inlet.supply.temperature), 3)} kg/m³; ηv stays on the ambient density)`);

  s += partsReport(m, u);
  s += measuredFileLines(loaded.files, m, { intake: c.intake.checkingLift, exhaust: c.exhaust.checkingLift }, u);
  s += '\nhand estimates: rules of thumb, not the simulation\n';
  s += row('speed of sound a', `${u.text('speed', a)} at the ambient ${u.text('temperature', m.ambient.temperature)} (as run shows)`);
  s += row('quarter-wave frequency', `${hz(est.quarterWaveFrequency)} = a/(4(L+δ)), δ = ${END_CORRECTION.unflanged}·r = ${u.text('length', est.endCorrection)}`);
  s += row('wave order at case speed', `${fix((est.quarterWaveFrequency * 120) / m.rpm, 2)}  (f₁·120/N at ${rpm(m.rpm)})`);
  s += row(
    'tuned speeds 120·f₁/k',
    est.tunedSpeeds.length > 0
      ? `${est.tunedSpeeds.slice(0, 5).map((t) => `k=${t.order} ${fix(t.rpm, 0)}`).join(', ')} rpm`
      : `no whole order k falls in ${fix(lo, 0)}–${fix(hi, 0)} rpm`,
  );
  s += row('Helmholtz, runner+cylinder', `${hz(est.helmholtz.frequency)}, peak near ${rpm(est.helmholtz.peakRpm)} (30·f)`);
  s += row('', 'f = (a/2π)·√(A/(L·V)), V: the cylinder at mid-stroke');
  if (est.plenumFrequency !== null)
    s += row(m.inlet.kind === 'plenum' && m.inlet.snorkel ? 'airbox through its snorkel' : 'plenum through its feed', `${hz(est.plenumFrequency)} (Helmholtz, Kinsler et al.)`);
  s += row('wave round trip 12·N·L/a', `${deg((12 * m.rpm * L) / a, 1)} of crank at ${rpm(m.rpm)}  (2L/a = ${fix(((2 * L) / a) * 1000, 2)} ms)`);

  s += '\nevents, card as given\n';
  const note = (v: { checkingLift?: number | undefined; liftFile?: string | undefined }) =>
    (v.checkingLift !== undefined ? ` at ${u.text('shortLength', v.checkingLift)}` : ', zero lift') + (v.liftFile !== undefined ? ' (from the lift log)' : '');
  s += row('intake', `opens ${card(c.intake.opens, 'BTDC', 'ATDC', 1)}, closes ${card(c.intake.closes, 'ABDC', 'BBDC', 1)}${note(c.intake)}`);
  s += row('exhaust', `opens ${card(c.exhaust.opens, 'BBDC', 'ABDC', 1)}, closes ${card(c.exhaust.closes, 'ATDC', 'BTDC', 1)}${note(c.exhaust)}`);
  for (const [side, v, o, cl] of [['intake', c.intake, ['BTDC', 'ATDC'], ['ABDC', 'BBDC']], ['exhaust', c.exhaust, ['BBDC', 'ABDC'], ['ATDC', 'BTDC']]] as const) {
    if (v.shift === undefined && v.duration === undefined) continue;
    const e = effectiveCard(v);
    const what = [v.duration !== undefined ? `duration ${fix(v.duration, 1)}°` : '', v.shift !== undefined ? `shift ${v.shift > 0 ? '+' : v.shift < 0 ? '−' : ''}${fix(Math.abs(v.shift), 1)}°` : '']
      .filter((x) => x !== '')
      .join(', ');
    s += row(`${side}, as moved`, `opens ${card(e.opens, o[0], o[1], 1)}, closes ${card(e.closes, cl[0], cl[1], 1)}`);
    s += `  (by ${side}.${what.replace(', ', ` and ${side}.`)})\n`;
  }
  const widened = c.intake.checkingLift !== undefined || c.exhaust.checkingLift !== undefined;
  if (widened) s += '  (measured at a checking lift: widened below to the zero-lift ends)\n';
  s += '\nevents as θ, 0 = TDC at the start of the intake stroke\n';
  const ev = { ivo: m.intake.openAngle, ivc: m.intake.closeAngle, evo: m.exhaust.openAngle, evc: m.exhaust.closeAngle };
  s += eventLines(ev);
  const intakeDur = wrap720(ev.ivc - ev.ivo);
  const exhaustDur = wrap720(ev.evc - ev.evo);
  const ov = wrap720(ev.evc - ev.ivo);
  const overlap = ov < intakeDur && ov < exhaustDur ? ov : 0;
  s += row('durations', `intake ${deg(intakeDur, 1)}, exhaust ${deg(exhaustDur, 1)}, overlap ${deg(overlap, 1)}`);
  return s;
}

/** the snorkel, the exhaust pipe and the resonators: sizes and their own frequencies */
function partsReport(m: LoadedCase['model'], u: Units): string {
  let s = '';
  const a = soundSpeed(m.ambient.temperature);
  if (m.inlet.kind === 'plenum' && m.inlet.snorkel) {
    const sn = m.inlet.snorkel;
    s += row('snorkel', `${pipeSizeText(sn.sections, u)} (length × diameter), entry loss K ${fix(sn.entryLoss, 2)}`);
  }
  const ex = m.exhaust;
  if (ex.pipe) {
    const L = totalLength(ex.pipe.sections);
    const aEx = soundSpeed(ex.gasTemperature);
    s += row('exhaust pipe', `${pipeSizeText(ex.pipe.sections, u)} (length × diameter) to ${u.text('pressure', ex.backPressure)}, wall ${u.text('temperature', ex.pipe.wallTemperature, 0)}`);
    s += row('exhaust round trip', `${deg((12 * m.rpm * L) / aEx, 1)} of crank at ${rpm(m.rpm)} (a ${u.text('speed', aEx, 0)} at ${u.text('temperature', ex.gasTemperature, 0)})`);
    s += row('cycle starts at EVO', `cylinder at ${u.text('pressure', ex.releasePressure ?? DEFAULT_RELEASE_PRESSURE)}${ex.releasePressure === undefined ? ' (exhaust.releasePressure default)' : ''}`);
  }
  for (const [k, r] of (m.runner.resonators ?? []).entries()) {
    const words = resonatorWords(m, textLineUnits(u))[k]!;
    const f =
      r.kind === 'tube'
        ? quarterWaveFrequency(a, r.length, coreEndCorrection('flanged', r.diameter))
        : (a / (2 * Math.PI)) * Math.sqrt(((Math.PI / 4) * r.neckDiameter ** 2) / (r.volume * (r.neckLength + 2 * coreEndCorrection('flanged', r.neckDiameter))));
    s += row(`resonator ${k + 1}`, words);
    s += row('', `${hz(f)}${r.kind === 'tube' ? ' = a/(4(L+δ)), δ = 0.8216·r (flanged)' : ' = (a/2π)·√(S/(V·L′)), L′ = L + 2·0.8216·r'}`);
  }
  return s;
}

export const checkCommand: Command = {
  name: 'check',
  summary: 'validate a case; print derived geometry and hand estimates',
  help: `usage: tractwave check CASE [--set path=value ...] [--rpm N]

Validates the case file and prints what follows from it: displacement,
clearance volume, valve curtain areas at max lift, runner length and volume,
the quarter-wave frequency with the open-end correction 0.6133·r (Levine &
Schwinger), the wave order and tuned speeds, a Helmholtz estimate, the wave
round trip 12·N·L/a in crank degrees at the case speed, and the valve events
in card form and as crank angle θ. Nothing is simulated.

options
${optionHelp(OPTIONS)}
`,
  async run(argv, io) {
    const args = parseArgs(argv, OPTIONS);
    const [file] = expectPositionals(args, ['CASE'], 'check');
    const loaded = await loadCaseFromArgs(file!, args, io);
    io.stdout.write(checkReport(loaded, displayUnits(args, loaded)));
    return 0;
  },
};
