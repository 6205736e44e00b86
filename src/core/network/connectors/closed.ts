/** Closed pipe end (valve shut, capped side tube): zero velocity, the wave reflects (boundary/closed.ts). */
import { solveClosed } from '../../boundary/closed.js';
import type { Connector, PipeEnd } from '../types.js';

export class ClosedConnector implements Connector {
  readonly ends: readonly PipeEnd[];
  constructor(
    readonly name: string,
    private readonly end: PipeEnd,
  ) {
    this.ends = [end];
  }
  solve(): void {
    solveClosed(this.end.incoming, this.end.state);
  }
}
