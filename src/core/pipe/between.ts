/**
 * A pipe between two boundaries, advanced one step at a time with the step
 * protocol of scheme.ts. The bare-pipe experiment and the test drivers use
 * it; the engine stepper does the same steps with its reservoirs in between.
 */
import { newEndState, type Boundary, type EndState, type Incoming } from '../boundary/types.js';
import type { PipeScheme } from './scheme.js';

export class PipeBetween {
  readonly incL: Incoming = { lambda: 0, entropy: 0, area: 0 };
  readonly incR: Incoming = { lambda: 0, entropy: 0, area: 0 };
  /** the end states of the last step (outward velocity) */
  readonly endL: EndState = newEndState();
  readonly endR: EndState = newEndState();

  constructor(
    readonly scheme: PipeScheme,
    readonly left: Boundary,
    readonly right: Boundary,
  ) {}

  /** advance by dt [s] */
  step(dt: number): void {
    const s = this.scheme;
    s.incoming('left', dt, this.incL);
    s.incoming('right', dt, this.incR);
    this.left.solve(this.incL, this.endL);
    this.right.solve(this.incR, this.endR);
    s.step(dt, this.endL, this.endR);
  }
}
