/**
 * The network of parts in one line for the report's header, upstream first:
 * the assembly's own line (analysis/network-line.ts, the same words the text
 * commands and the views use), in the report's units.
 *
 *   ambient → snorkel 150×45 → airbox 6 L → runner 300×38 → valve → cylinder → exhaust at 105 kPa
 *
 * Pipe sizes are length × diameter in the report's length unit.
 */
import { networkLine as assemblyLine, type LineUnits } from '../analysis/network-line.js';
import type { EngineModel } from '../core/model.js';
import type { Units } from './units.js';
import { lineUnits } from '../present/network-line.js';

export { lineUnits };

/** The network in one line, and the unit its pipe sizes are in. */
export function networkLine(model: EngineModel, u: Units): string {
  return `${assemblyLine(model, lineUnits(u))} (pipe sizes length × diameter in ${u.unit('length').label})`;
}
