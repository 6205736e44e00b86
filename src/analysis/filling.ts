/**
 * Filling through the cycle: the mass delivered through the intake valve
 * since the valve opened, at each crank degree. The classic long/short
 * runner demonstration reads it: which runner is ahead before BDC, which by
 * IVC.
 *
 *   m(θ) = Σ ṁ(θ′) · Δt over θ′ from IVO to θ,  Δt = 1° / (6·N) [s]
 *
 * with ṁ the valve mass flow [kg/s] (positive into the cylinder), one
 * sample per crank degree, and N the engine speed [rpm]. Over the whole
 * cycle the sum is the delivered mass of the result, to the sampling of the
 * trace (once a degree).
 */
import type { PointResult } from '../core/model.js';

/** mass delivered since IVO at each crank angle θ = 0..719 [kg] (θ before IVO: after the previous opening) */
export function deliveredSinceIvo(result: Pick<PointResult, 'rpm' | 'events' | 'trace'>): Float64Array {
  const flow = result.trace.valveFlow;
  const n = flow.length;
  const dt = 1 / (6 * result.rpm);
  const out = new Float64Array(n);
  const start = ((Math.round(result.events.ivo) % n) + n) % n;
  let sum = 0;
  for (let k = 0; k < n; k++) {
    const th = (start + k) % n;
    sum += (flow[th] ?? 0) * dt;
    out[th] = sum;
  }
  return out;
}

/** the delivered mass since IVO at crank angle θ [deg] (rounded to the degree) [kg] */
export function deliveredAt(since: Float64Array, theta: number): number {
  const n = since.length;
  return since[((Math.round(theta) % n) + n) % n] ?? 0;
}
