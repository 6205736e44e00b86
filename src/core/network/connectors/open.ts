/**
 * Open pipe end into a volume (ambient, plenum, airbox, resonator cavity):
 * the open-end boundary of boundary/open.ts with the volume as its reservoir
 * (inflow by isentropic acceleration from the volume's stagnation state with
 * an entry loss K, outflow at the volume's pressure). The volume receives
 * exactly the end's mass and enthalpy flow.
 */
import { OpenEnd } from '../../boundary/open.js';
import { ForeignStock } from './composition.js';
import type { Connector, PipeEnd, StepContext, Volume } from '../types.js';

export class OpenConnector implements Connector {
  readonly ends: readonly PipeEnd[];
  private readonly boundary: OpenEnd;
  private readonly composition: ForeignStock;

  constructor(
    readonly name: string,
    private readonly end: PipeEnd,
    readonly volume: Volume,
    entryLoss: number,
  ) {
    this.ends = [end];
    this.boundary = new OpenEnd(volume, entryLoss);
    this.composition = new ForeignStock(end.pipe.spec.nativeBurned);
  }

  /** mass flow into the volume in the last step [kg/s] */
  get flow(): number {
    return this.end.state.massFlow;
  }

  solve(ctx: StepContext): void {
    const s = this.end.state;
    const v = this.volume;
    this.boundary.solve(this.end.incoming, s);
    v.addFlow(s.massFlow, s.enthalpyFlow, this.composition.burnedInto(s.massFlow, ctx.dt, v.burnedFraction()));
  }

  startCycle(): void {
    this.composition.stock = 0;
  }
}
