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
import { bracketedRoot, type Residual } from '../../boundary/solve.js';
import type { AreaSpec, Connector, PipeEnd, StepContext, Volume } from '../types.js';

/**
 * g(ṁ) = ṁ − (the nozzle flow at the mid-step pressures ṁ would give): the
 * trial flow's extra part d = ṁ − last carries cp·T of the volume it leaves,
 * so p_from = pf0 − d·T_up·sf and p_to = pt0 + d·T_up·st (see `solve`).
 */
class MidStepFlow implements Residual {
  a = 0;
  pf0 = 0;
  Tf = 0;
  pt0 = 0;
  Tt = 0;
  sf = 0;
  st = 0;
  last = 0;
  rx = 0;
  rf = 0;
  evaluate(): void {
    const d = this.rx - this.last;
    const Tu = this.rx >= 0 ? this.Tf : this.Tt;
    this.rf = this.rx - reservoirFlow(this.a, this.pf0 - d * Tu * this.sf, this.Tf, this.pt0 + d * Tu * this.st, this.Tt);
  }
}

export class OrificeConnector implements Connector {
  readonly ends: readonly PipeEnd[] = [];
  readonly area: AreaSource;
  /** mass flow from `from` to `to` in the last step [kg/s] */
  flow = 0;
  private readonly residual = new MidStepFlow();

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
        const g = this.residual;
        g.a = a;
        g.pf0 = pf0;
        g.Tf = Tf;
        g.pt0 = pt0;
        g.Tt = Tt;
        g.sf = sf;
        g.st = st;
        g.last = last;
        g.rx = m0;
        g.evaluate();
        const ghi = g.rf;
        if (ghi * (last - m0) < 0) {
          bracketedRoot(g, last, m0, last - m0, ghi, 1e-10);
          m = g.rx;
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
