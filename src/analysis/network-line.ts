/**
 * The assembly in one line of words, for the text commands, the views and
 * the report: what the air passes through, from the outside air to the
 * cylinder and on to the exhaust, e.g.
 *   ambient → snorkel 150×45 → airbox 6 L → runner 300×38 → valve → cylinder → exhaust 700×40 → 103 kPa
 * Lengths × diameters in mm (a tapered or stepped pipe shows its length and
 * end diameters), volumes in litres, unless other formatters are given.
 */
import type { EngineModel, RunnerSection } from '../core/model.js';
import { totalLength } from '../core/pipe/mesh.js';

export interface LineUnits {
  /** a length [m] as text without its unit (mm by default) */
  length: (m: number) => string;
  /** a volume [m³] with its unit (L by default) */
  volume: (m3: number) => string;
  /** a pressure [Pa] with its unit (kPa by default) */
  pressure: (pa: number) => string;
}

const round = (v: number) => String(Math.round(v));

export const METRIC_LINE_UNITS: LineUnits = {
  length: (m) => round(m * 1000),
  volume: (m3) => `${Number((m3 * 1000).toPrecision(3))} L`,
  pressure: (pa) => `${Number((pa / 1000).toPrecision(4))} kPa`,
};

/** "380×40", or "380 (44→28)" for a pipe whose diameter changes */
export function pipeSize(sections: readonly RunnerSection[], u: LineUnits = METRIC_LINE_UNITS): string {
  const d0 = sections[0]?.diameterStart ?? 0;
  const d1 = sections[sections.length - 1]?.diameterEnd ?? 0;
  const straight = sections.every((s) => s.diameterStart === d0 && s.diameterEnd === d0);
  const L = u.length(totalLength(sections));
  return straight ? `${L}×${u.length(d0)}` : `${L} (${u.length(d0)}→${u.length(d1)})`;
}

/** the side resonators in words: "side tube 250×22 at 120 from the valve" */
export function resonatorWords(model: EngineModel, u: LineUnits = METRIC_LINE_UNITS): string[] {
  return (model.runner.resonators ?? []).map((r) =>
    r.kind === 'tube'
      ? `side tube ${u.length(r.length)}×${u.length(r.diameter)} at ${u.length(r.at)} from the valve`
      : `Helmholtz resonator ${u.volume(r.volume)}, neck ${u.length(r.neckLength)}×${u.length(r.neckDiameter)}, at ${u.length(r.at)} from the valve`,
  );
}

export function networkLine(model: EngineModel, u: LineUnits = METRIC_LINE_UNITS): string {
  const parts: string[] = ['ambient'];
  const inlet = model.inlet;
  if (inlet.kind === 'plenum') {
    if (inlet.snorkel) parts.push(`snorkel ${pipeSize(inlet.snorkel.sections, u)}`);
    else parts.push(`feed ${u.length(inlet.feedDiameter ?? 0)}`);
    parts.push(`${inlet.snorkel ? 'airbox' : 'plenum'} ${u.volume(inlet.volume)}`);
  }
  const res = resonatorWords(model, u);
  parts.push(`runner ${pipeSize(model.runner.sections, u)}${res.length > 0 ? ` (${res.join('; ')})` : ''}`);
  parts.push('valve', 'cylinder');
  const ex = model.exhaust;
  if (ex.pipe) parts.push(`exhaust ${pipeSize(ex.pipe.sections, u)}`, u.pressure(ex.backPressure));
  else parts.push(`exhaust at ${u.pressure(ex.backPressure)}`);
  return parts.join(' → ');
}
