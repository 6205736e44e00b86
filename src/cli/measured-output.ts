/**
 * Text and JSON of measured data for `run` and `check`: the pressure trace
 * against the model, the ηv basis of a boosted case, the lift logs and flow
 * sheets a case reads.
 */
import { density } from '../core/gas.js';
import { sweptVolume } from '../core/kinematics.js';
import type { EngineModel, PointResult } from '../core/model.js';
import { benchPoints } from '../case/flow-sheet.js';
import { liftCrossings } from '../case/lift-file.js';
import type { CaseFiles, MeasuredTrace, ValveSide } from '../case/measured-files.js';
import { thetaToCard, wrap720 } from '../case/to-model.js';
import type { PressurePeak } from '../analysis/pulse.js';
import type { TraceComparison } from '../analysis/trace-compare.js';
import { card, deg, fix, hz, pct, row, wrap } from './format.js';
import { METRIC, type Units } from '../present/units.js';

/** `measuredTrace` of run --json (SI, crank degrees). */
export function traceJson(c: TraceComparison, t: MeasuredTrace) {
  return {
    file: t.log.file,
    sensorAt: c.sensorAt,
    tdcOffset: t.tdcOffset,
    gauge: t.log.gauge,
    lastPeakBeforeIvc: c.lastPeakBeforeIvc,
    ringingFrequency: c.ringingFrequency,
    atIvo: c.atIvo,
    atIvc: c.atIvc,
    rms: c.rms,
    agrees: c.agrees,
    verdict: c.verdict,
  };
}

function peakText(p: PressurePeak | null, u: Units): string {
  return p ? `θ ${deg(p.crank, 0)}, ${u.signed('gauge', p.pressureAboveReference)} ${u.label('gauge')}` : 'none';
}

/** The text block of run with a measured trace. */
export function traceLines(c: TraceComparison, t: MeasuredTrace, r: PointResult, u: Units = METRIC): string {
  const where = c.sensorAt > 0 ? `sensor ${u.text('length', c.sensorAt, u.system === 'metric' ? 0 : 1)} from the valve (the runner's map there)` : 'sensor at the valve';
  let s = `\nmeasured trace ${t.log.file}\n  ${where}${t.tdcOffset !== 0 ? `, TDC offset ${fix(t.tdcOffset, 1)}°` : ''}${t.log.gauge ? ', gauge + ambient' : ''}\n`;
  s += `  ${''.padEnd(26)}${'model'.padEnd(24)}measured\n`;
  const late = c.lastPeakBeforeIvc.lateBy;
  const two = (label: string, a: string, b: string) => row(label, `${a.padEnd(24)}${b}`);
  s += two('last peak before IVC', peakText(c.lastPeakBeforeIvc.model, u), `${peakText(c.lastPeakBeforeIvc.measured, u)}${late !== null ? `  (${fix(Math.abs(late), 1)}° ${late >= 0 ? 'later' : 'earlier'})` : ''}`);
  const f = (v: number | null) => (v === null ? 'no clear ringing' : hz(v, 0));
  s += two('closed-valve ringing', f(c.ringingFrequency.model), f(c.ringingFrequency.measured));
  s += two(`at IVO (θ ${fix(r.events.ivo, 0)}°)`, u.text('pressure', c.atIvo.model), u.text('pressure', c.atIvo.measured));
  s += two(`at IVC (θ ${fix(r.events.ivc, 0)}°)`, u.text('pressure', c.atIvc.model), u.text('pressure', c.atIvc.measured));
  s += row('RMS difference', u.text('gauge', c.rms, 2));
  s += wrap(`  measured pulse: ${c.verdict}`);
  return s;
}

/**
 * The ηv basis. ηv is always on the ambient density (DESIGN: ρ_a·V_d); with
 * a boost supply it is also given on the supply's density, the basis on
 * which a boosted engine's filling is usually judged.
 */
export function supplyBasis(r: PointResult, m: EngineModel, u: Units = METRIC): { json: Record<string, unknown>; text: string } {
  const supply = m.inlet.kind === 'plenum' ? m.inlet.supply : undefined;
  if (!supply) return { json: { volumetricEfficiencyBasis: 'ambient density' }, text: '' };
  const rho = density(supply.pressure, supply.temperature);
  const eta = r.deliveredMass / (rho * sweptVolume(m.engine));
  const text =
    `\nboost: the plenum's feed draws from a supply at ${u.text('pressure', supply.pressure)}, ${u.text('temperature', supply.temperature, 0)}\n` +
    row('ηv on the supply density', `${pct(eta)} (ρ ${fix(rho, 3)} kg/m³)`) +
    row('ηv on the ambient density', `${pct(r.volumetricEfficiency)} (ρ ${fix(density(m.ambient.pressure, m.ambient.temperature), 3)} kg/m³, the figure above)`);
  return {
    json: {
      volumetricEfficiencyBasis: 'ambient density',
      supplyVolumetricEfficiency: eta,
      supply: { pressure: supply.pressure, temperature: supply.temperature, density: rho },
    },
    text,
  };
}

/** The card events of a valve at angle θ (intake BTDC/ABDC, exhaust BBDC/ATDC). */
function cardText(side: ValveSide, open: number, close: number): string {
  const o = wrap720(open);
  const c = wrap720(close);
  return side === 'intake'
    ? `opens ${card(thetaToCard.intakeOpens(o), 'BTDC', 'ATDC', 1)}, closes ${card(thetaToCard.intakeCloses(c), 'ABDC', 'BBDC', 1)}`
    : `opens ${card(thetaToCard.exhaustOpens(o), 'BBDC', 'ABDC', 1)}, closes ${card(thetaToCard.exhaustCloses(c), 'ATDC', 'BTDC', 1)}`;
}

/** The lines of `check` for the measured files a case reads. */
export function measuredFileLines(files: CaseFiles, m: EngineModel, checkingLift: Partial<Record<ValveSide, number | undefined>>, u: Units = METRIC): string {
  let s = '';
  for (const side of ['intake', 'exhaust'] as const) {
    const lift = files[side].lift;
    if (lift) {
      const { log, profile } = lift;
      s += `\n${side} lift log ${log.file} (${log.crank.length} points, ${log.columns.angle}, ${log.columns.lift}${log.lash > 0 ? `, lash ${u.text('shortLength', log.lash)} subtracted` : ''})\n`;
      s += row('at zero lift', `${cardText(side, profile.open, profile.close)}, duration ${deg(profile.close - profile.open, 1)}`);
      const h = checkingLift[side];
      if (h !== undefined) {
        const x = liftCrossings(log, h);
        if (x) s += row(`at ${u.text('shortLength', h)} checking lift`, `${cardText(side, x.open, x.close)}, duration ${deg(x.close - x.open, 1)}`);
      }
      const at = h !== undefined ? liftCrossings(log, h) : undefined;
      const centre = at ? (at.open + at.close) / 2 : (profile.open + profile.close) / 2;
      const c = wrap720(centre);
      // intake centre line after gas-exchange TDC, exhaust centre line before it (the trade's way)
      const fold = (d: number) => (wrap720(d) > 360 ? wrap720(d) - 720 : wrap720(d));
      const words = side === 'intake' ? `${fix(fold(c), 1)}° ATDC` : `${fix(fold(720 - c), 1)}° BTDC`;
      s += row('lobe centre', `${words} (θ ${fix(c, 1)}°, midway between the events at ${h !== undefined ? 'the checking lift' : 'zero lift'})`);
      s += row('max lift', `${u.text('shortLength', profile.maxLift)} at θ ${fix(wrap720(profile.open + profile.peakAt), 1)}°, L/D ${fix(profile.maxLift / m[side].diameter, 3)}`);
    }
    const flow = files[side].flow;
    if (flow) {
      const pts = benchPoints(flow.sheet, flow.setup);
      const last = pts[pts.length - 1]!;
      s += `\n${side} flow sheet ${flow.sheet.file} (${pts.length} lifts at ${fix(flow.setup.testPressure / 249.08891, 1)} inH2O, ${flow.setup.valves} × ${u.text('shortLength', flow.setup.diameter)})\n`;
      s += row('Cd on the curtain area', pts.map((p) => `${fix(p.ld, 2)}:${fix(p.cd, 2)}`).join(' ').slice(0, 50) + (pts.length > 6 ? ' …' : '') + '  (L/D:Cd)');
      s += row('flow at the highest lift', `${u.text('massFlow', last.flow)} at ${u.text('shortLength', last.lift)}, Cd on the valve area ${fix(last.cdValveArea, 3)}`);
    }
  }
  if (files.dyno) {
    const d = files.dyno;
    s += `\ndyno sheet ${d.file}: ${d.points.length} speeds, ${fix(d.points[0]!.rpm, 0)}–${fix(d.points[d.points.length - 1]!.rpm, 0)} rpm (${d.kinds.join(', ')})\n`;
  }
  if (files.trace) {
    const t = files.trace;
    s += `\npressure trace ${t.log.file}: ${t.log.crank.length} samples, sensor ${u.text('length', t.sensorAt, u.system === 'metric' ? 0 : 1)} from the valve${t.tdcOffset ? `, TDC offset ${fix(t.tdcOffset, 1)}°` : ''}\n`;
  }
  return s;
}
