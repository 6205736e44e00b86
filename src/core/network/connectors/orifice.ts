/**
 * Restriction between two volumes (plenum feed from the ambient, an exhaust
 * valve straight into the back-pressure reservoir): quasi-steady isentropic
 * nozzle flow through the effective area (core/flow.ts, NACA 1135), positive
 * from `from` to `to`, carrying cp·T of the volume it leaves (gas at rest in
 * a volume: stagnation = static) and that volume's burned fraction.
 *
 * The flow is solved implicitly at mid-step (one bracketed scalar root per
 * step, see `solve`), so the coupling stays stable and second order where the
 * nozzle's response to a pressure difference has no bound (ṁ ∝ √Δp at Δp → 0).
 */
import { CP } from '../../gas.js';
import { reservoirFlow } from '../../flow.js';
import { AreaSource } from './area.js';
import type { AreaSpec, Connector, PipeEnd, StepContext, Volume } from '../types.js';

export class OrificeConnector implements Connector {
  readonly ends: readonly PipeEnd[] = [];
  readonly area: AreaSource;
  /** mass flow from `from` to `to` in the last step [kg/s] */
  flow = 0;

  constructor(
    readonly name: string,
    readonly from: Volume,
    readonly to: Volume,
    area: AreaSpec,
  ) {
    this.area = new AreaSource(area);
  }

  solve(ctx: StepContext): void {
    const a = this.area.at(ctx.thetaMid);
    const f = this.from;
    const t = this.to;
    let m = 0;
    if (a > 0) {
      // implicit midpoint in the flow: the flow ṁ meets the mid-step pressures
      // the two volumes would have with ṁ instead of last step's flow. A plain
      // explicit flow rings about Δp = 0, where ṁ ∝ √Δp makes the volume's
      // response arbitrarily stiff (an open exhaust valve near BDC). Each
      // volume's mid-step pressure is linear in the enthalpy it receives
      // (Volume.midPressurePerEnthalpy), so a trial flow costs one nozzle
      // evaluation and nothing else.
      const last = this.flow;
      const pf0 = f.pressure;
      const pt0 = t.pressure;
      const Tf = f.temperature;
      const Tt = t.temperature;
      const sf = f.midPressurePerEnthalpy * CP;
      const st = t.midPressurePerEnthalpy * CP;
      // the extra flow d = ṁ − last carries cp·T of the volume it leaves: with ṁ,
      // p_from = pf0 − d·T_up·sf and p_to = pt0 + d·T_up·st
      const m0 = reservoirFlow(a, pf0, Tf, pt0, Tt);
      m = m0;
      const scale = Math.abs(m0) + Math.abs(last);
      if (Math.abs(m0 - last) > 1e-9 * scale) {
        // g(ṁ) = ṁ − flow(ṁ) rises with ṁ; g(last) = last − m0 and the root lies between last and m0
        let lo = last + 0;
        let glo = last - m0;
        let hi = m0 + 0;
        let d = hi - last;
        let Tu = hi >= 0 ? Tf : Tt;
        let ghi = hi - reservoirFlow(a, pf0 - d * Tu * sf, Tf, pt0 + d * Tu * st, Tt);
        if (ghi * glo < 0) {
          let side = 0;
          for (let k = 0; k < 40; k++) {
            m = (lo * ghi - hi * glo) / (ghi - glo);
            d = m - last;
            Tu = m >= 0 ? Tf : Tt;
            const g = m - reservoirFlow(a, pf0 - d * Tu * sf, Tf, pt0 + d * Tu * st, Tt);
            if (g === 0 || Math.abs(hi - lo) < 1e-10 * scale) break;
            if (g > 0 === ghi > 0) {
              hi = m;
              ghi = g;
              if (side === 1) glo *= 0.5;
              side = 1;
            } else {
              lo = m;
              glo = g;
              if (side === -1) ghi *= 0.5;
              side = -1;
            }
          }
        }
      }
    }
    const h = m >= 0 ? m * CP * f.temperature : m * CP * t.temperature;
    const b = m >= 0 ? m * f.burnedFraction() : m * t.burnedFraction();
    this.flow = m;
    t.addFlow(m, h, b);
    f.addFlow(-m, -h, -b);
  }

  startCycle(): void {
    this.flow = 0;
  }
}
