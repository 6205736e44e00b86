/**
 * The assembly's one line of words (analysis/network-line.ts) in a unit
 * system: pipe sizes length × diameter in the system's length unit.
 */
import { METRIC_LINE_UNITS, networkLine, pipeSize, type LineUnits } from '../analysis/network-line.js';
import type { EngineModel, RunnerSection } from '../core/model.js';
import { fixed } from './number.js';
import type { Units } from './units.js';

/** the assembly line's formatters in a unit system */
export function lineUnits(u: Units): LineUnits {
  const len = u.unit('length');
  return {
    length: (m) => fixed(len.toDisplay(m), u.system === 'metric' ? 0 : 2),
    volume: (m3) => u.text('volume', m3),
    pressure: (pa) => u.text('pressure', pa),
  };
}

/** the formatters the text commands use: the assembly's own in metric */
export function textLineUnits(u: Units): LineUnits {
  return u.system === 'metric' ? METRIC_LINE_UNITS : lineUnits(u);
}

/** The network in one line for the text commands and the views. */
export function assemblyLine(model: EngineModel, u: Units): string {
  return networkLine(model, textLineUnits(u));
}

/** "380×40 mm" / "14.96×1.57 in" */
export function pipeSizeText(sections: readonly RunnerSection[], u: Units): string {
  return `${pipeSize(sections, textLineUnits(u))} ${u.label('length')}`;
}
