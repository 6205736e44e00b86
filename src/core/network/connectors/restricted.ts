/**
 * Pipe end joined to a volume through a restriction: an intake or exhaust
 * valve (area from its lift curve at mid-step) or a fixed orifice. Quasi-steady
 * compressible flow both ways, subsonic or choked, coupled to the arriving
 * wave (boundary/restricted.ts). A zero area is a closed end. The volume
 * receives exactly the end's mass and enthalpy flow.
 */
import { RestrictedEnd } from '../../boundary/restricted.js';
import { AreaSource } from './area.js';
import { ForeignStock } from './composition.js';
import type { AreaSpec, Connector, PipeEnd, StepContext, Volume } from '../types.js';

export class RestrictedConnector implements Connector {
  readonly ends: readonly PipeEnd[];
  readonly area: AreaSource;
  private readonly boundary: RestrictedEnd;
  private readonly composition: ForeignStock;

  constructor(
    readonly name: string,
    private readonly end: PipeEnd,
    readonly volume: Volume,
    area: AreaSpec,
  ) {
    this.ends = [end];
    this.area = new AreaSource(area);
    this.boundary = new RestrictedEnd(volume);
    this.composition = new ForeignStock(end.pipe.spec.nativeBurned);
  }

  /** mass flow into the volume in the last step [kg/s] */
  get flow(): number {
    return this.end.state.massFlow;
  }

  /** static pressure at the pipe end in the last step [Pa] */
  get endPressure(): number {
    return this.end.state.pressure;
  }

  solve(ctx: StepContext): void {
    const s = this.end.state;
    const v = this.volume;
    this.boundary.area = this.area.at(ctx.thetaMid);
    this.boundary.solve(this.end.incoming, s);
    v.addFlow(s.massFlow, s.enthalpyFlow, this.composition.burnedInto(s.massFlow, ctx.dt, v.burnedFraction()));
  }

  startCycle(): void {
    this.composition.stock = 0;
  }
}
