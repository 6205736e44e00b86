/**
 * What the parts around the runner did over one converged cycle, from the
 * traces (pure functions over a PointResult).
 *
 * The airbox or plenum: its pressure swing, and how strongly it answers each
 * multiple k of the engine's breathing rate (one intake event per cycle,
 * f_cycle = N/120): the k with the largest Fourier amplitude of the plenum
 * trace, |P_k| = (2/720)·|Σ p_j·e^(−2πi·k·j/720)|, is where the box rings
 * most; beside it the Helmholtz estimate of the box through its feed.
 *
 * The exhaust port during overlap: the mean pressure at the exhaust valve end
 * of the exhaust pipe from IVO to EVC, against the pressure at the intake
 * valve over the same crank angles. A port below the intake side during
 * overlap pulls gas through the cylinder (scavenging); above it, burned gas is
 * pushed back into the intake (reversion).
 */
import type { EngineModel, PointResult } from '../core/model.js';

export interface PlenumRinging {
  /** lowest and highest plenum pressure over the cycle [Pa] */
  min: number;
  max: number;
  /** the harmonic of the cycle the box answers most, k ≥ 1 */
  order: number;
  /** its frequency k·N/120 [Hz] */
  frequency: number;
  /** its amplitude [Pa] */
  amplitude: number;
}

/** harmonic amplitude |P_k| [Pa] of a 720-sample cycle trace */
export function harmonicAmplitude(trace: ArrayLike<number>, k: number): number {
  const n = trace.length;
  let re = 0;
  let im = 0;
  for (let j = 0; j < n; j++) {
    const w = (2 * Math.PI * k * j) / n;
    re += trace[j]! * Math.cos(w);
    im -= trace[j]! * Math.sin(w);
  }
  return (2 / n) * Math.hypot(re, im);
}

/** the plenum's ringing over the cycle; null without a plenum */
export function plenumRinging(result: PointResult, model: EngineModel, maxOrder = 20): PlenumRinging | null {
  if (model.inlet.kind !== 'plenum') return null;
  const p = result.trace.plenumPressure;
  let min = Infinity;
  let max = -Infinity;
  for (let j = 0; j < p.length; j++) {
    if (p[j]! < min) min = p[j]!;
    if (p[j]! > max) max = p[j]!;
  }
  let order = 1;
  let amplitude = 0;
  for (let k = 1; k <= maxOrder; k++) {
    const a = harmonicAmplitude(p, k);
    if (a > amplitude) {
      amplitude = a;
      order = k;
    }
  }
  return { min, max, order, frequency: (order * result.rpm) / 120, amplitude };
}

export interface OverlapPressures {
  /** crank angles of the overlap, IVO → EVC [deg] */
  from: number;
  to: number;
  /** mean pressure at the exhaust port over the overlap [Pa] */
  port: number;
  /** mean pressure at the intake valve over the overlap [Pa] */
  intake: number;
  /** port − intake [Pa]: negative pulls through, positive pushes back */
  difference: number;
}

/** mean exhaust-port and intake-valve pressures over the overlap; null without an exhaust pipe or without overlap */
export function overlapPressures(result: PointResult, model: EngineModel): OverlapPressures | null {
  if (!model.exhaust.pipe) return null;
  const { ivo, evc } = result.events;
  const span = (((evc - ivo) % 720) + 720) % 720;
  if (!(span > 0 && span < 360)) return null;
  let port = 0;
  let intake = 0;
  let n = 0;
  for (let d = 0; d <= span; d++) {
    const j = Math.round(ivo + d) % 720;
    port += result.trace.exhaustPortPressure[j]!;
    intake += result.trace.valvePressure[j]!;
    n++;
  }
  port /= n;
  intake /= n;
  return { from: ivo, to: evc, port, intake, difference: port - intake };
}
