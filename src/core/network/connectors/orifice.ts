/**
 * Restriction between two volumes (plenum feed from the ambient, an exhaust
 * valve straight into the back-pressure reservoir): quasi-steady isentropic
 * nozzle flow through the effective area (core/flow.ts, NACA 1135), positive
 * from `from` to `to`, carrying cp·T of the volume it leaves (gas at rest in
 * a volume: stagnation = static) and that volume's burned fraction.
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
    const m = a > 0 ? reservoirFlow(a, f.pressure, f.temperature, t.pressure, t.temperature) : 0;
    const h = m >= 0 ? m * CP * f.temperature : m * CP * t.temperature;
    const b = m >= 0 ? m * f.burnedFraction() : m * t.burnedFraction();
    this.flow = m;
    t.addFlow(m, h, b);
    f.addFlow(-m, -h, -b);
  }
}
