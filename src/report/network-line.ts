/**
 * The network of parts in one line, upstream first, for the report's header:
 *
 *   ambient 101.3 kPa, 20.0 °C → bellmouth (K 0.05) → runner 380.0 mm, Ø 40.0 mm
 *     → 2 intake valves Ø 35.0 mm → cylinder 449.3 cc → 2 exhaust valves Ø 29.0 mm
 *     → exhaust 105.0 kPa
 *
 * One small function over the engine model, so it can give way to the
 * network description of the parts model (analysis/network-line.ts) once the
 * runner becomes a network of pipes.
 */
import type { EngineModel } from '../core/model.js';
import type { Units } from './units.js';

function entryWord(k: number): string {
  if (Math.abs(k - 0.05) < 1e-9) return 'bellmouth';
  if (Math.abs(k - 0.5) < 1e-9) return 'plain edge';
  return 'entry';
}

/** The parts of the model from the air outside to the exhaust, as a list of short phrases. */
export function networkParts(model: EngineModel, u: Units): string[] {
  const parts: string[] = [];
  parts.push(`ambient ${u.text('pressure', model.ambient.pressure)}, ${u.text('temperature', model.ambient.temperature)}`);
  if (model.inlet.kind === 'plenum') {
    parts.push(`feed Ø ${u.text('length', model.inlet.feedDiameter)} (Cd ${model.inlet.feedCd})`);
    parts.push(`plenum ${u.text('volume', model.inlet.volume)}`);
  }
  parts.push(`${entryWord(model.runner.entryLoss)} (K ${model.runner.entryLoss})`);
  const secs = model.runner.sections;
  const total = secs.reduce((s, x) => s + x.length, 0);
  if (secs.length === 1 && secs[0]!.diameterStart === secs[0]!.diameterEnd) {
    parts.push(`runner ${u.text('length', total)}, Ø ${u.text('length', secs[0]!.diameterStart)}`);
  } else {
    const f = (m: number) => u.num('length', m).toFixed(u.unit('length').decimals);
    const ds = secs.map((s) => (s.diameterStart === s.diameterEnd ? f(s.diameterStart) : `${f(s.diameterStart)}–${f(s.diameterEnd)}`)).join(' / ');
    parts.push(`runner ${u.text('length', total)} in ${secs.length} sections, Ø ${ds} ${u.unit('length').label}`);
  }
  const swept = (Math.PI / 4) * model.engine.bore ** 2 * model.engine.stroke;
  const plural = (n: number) => (n === 1 ? '' : 's');
  parts.push(`${model.intake.count} intake valve${plural(model.intake.count)} Ø ${u.text('length', model.intake.diameter)}`);
  parts.push(`cylinder ${u.text('smallVolume', swept)}`);
  parts.push(`${model.exhaust.count} exhaust valve${plural(model.exhaust.count)} Ø ${u.text('length', model.exhaust.diameter)}`);
  parts.push(`exhaust ${u.text('pressure', model.exhaust.backPressure)}`);
  return parts;
}

/** The network in one line, parts joined by arrows. */
export function networkLine(model: EngineModel, u: Units): string {
  return networkParts(model, u).join(' → ');
}
