/** Effective area of a restriction at a crank angle: fixed, or a valve's lift curve (core/valve.ts). */
import { effectiveArea, valveLift } from '../../valve.js';
import type { ValveModel } from '../../model.js';
import type { AreaSpec } from '../types.js';

export class AreaSource {
  /** lift at the last evaluation [m] (0 for a fixed area) */
  lift = 0;
  private readonly fixed: number;
  private readonly valve: ValveModel | undefined;

  constructor(spec: AreaSpec) {
    this.fixed = spec.kind === 'fixed' ? spec.area : 0;
    this.valve = spec.kind === 'valve' ? spec.valve : undefined;
  }

  /** effective area [m²] at crank angle θ [deg] */
  at(thetaDeg: number): number {
    const v = this.valve;
    if (!v) return this.fixed;
    this.lift = valveLift(v, thetaDeg);
    return effectiveArea(v, this.lift);
  }
}
