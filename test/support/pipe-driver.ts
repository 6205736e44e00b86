/** Drives a pipe scheme between two boundaries (test support). */
import type { Boundary, EndState } from '../../src/core/boundary/types.js';
import type { PipeScheme } from '../../src/core/pipe/scheme.js';
import { PipeBetween } from '../../src/core/pipe/between.js';

export function drive(
  scheme: PipeScheme,
  left: Boundary,
  right: Boundary,
  tEnd: number,
  onStep?: (t: number, dt: number, l: EndState, r: EndState) => void,
  courant = 0.9,
): number {
  const pipe = new PipeBetween(scheme, left, right);
  let t = 0;
  let steps = 0;
  while (t < tEnd - 1e-15) {
    let dt = scheme.maxStableDt(courant);
    if (t + dt > tEnd) dt = tEnd - t;
    pipe.step(dt);
    t += dt;
    steps++;
    onStep?.(t, dt, pipe.endL, pipe.endR);
  }
  return steps;
}

/** frequency [Hz] from the mean spacing of upward zero crossings of (y − mean) */
export function ringingFrequency(t: number[], y: number[], skip = 1): number {
  const mean = y.reduce((s, v) => s + v, 0) / y.length;
  const ups: number[] = [];
  for (let i = 1; i < y.length; i++) {
    const a = y[i - 1]! - mean;
    const b = y[i]! - mean;
    if (a < 0 && b >= 0) ups.push(t[i - 1]! + ((t[i]! - t[i - 1]!) * -a) / (b - a));
  }
  const use = ups.slice(skip);
  if (use.length < 2) return NaN;
  return (use.length - 1) / (use[use.length - 1]! - use[0]!);
}
