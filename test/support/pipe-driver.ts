/** Drives a pipe scheme between two boundaries (test support). */
import type { Boundary, Incoming } from '../../src/core/boundary/types.js';
import { newEndState } from '../../src/core/boundary/types.js';
import type { PipeScheme } from '../../src/core/pipe/scheme.js';

export function drive(
  scheme: PipeScheme,
  left: Boundary,
  right: Boundary,
  tEnd: number,
  onStep?: (t: number, dt: number, l: ReturnType<typeof newEndState>, r: ReturnType<typeof newEndState>) => void,
  courant = 0.9,
): number {
  const incL: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const incR: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const l = newEndState();
  const r = newEndState();
  let t = 0;
  let steps = 0;
  while (t < tEnd - 1e-15) {
    let dt = scheme.maxStableDt(courant);
    if (t + dt > tEnd) dt = tEnd - t;
    scheme.incoming('left', dt, incL);
    scheme.incoming('right', dt, incR);
    left.solve(incL, l);
    right.solve(incR, r);
    scheme.step(dt, l, r);
    t += dt;
    steps++;
    onStep?.(t, dt, l, r);
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
