/**
 * Closed end (valve shut, capped pipe): zero velocity, the incoming wave
 * reflects with its own sign. With w = 0 the end sound speed is the incoming
 * invariant itself, a_e = J = λ·Ap, and the entropy level is the pipe gas's.
 */
import { P_REF, powP } from '../gas.js';
import type { Boundary, EndState, Incoming } from './types.js';

export function solveClosed(inc: Incoming, out: EndState): void {
  out.velocity = 0;
  out.entropy = inc.entropy;
  out.pressure = P_REF * powP(inc.lambda);
  out.massFlow = 0;
  out.enthalpyFlow = 0;
  out.choked = false;
}

export const closedEnd: Boundary = { solve: solveClosed };
