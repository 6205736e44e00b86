/**
 * What a pipe remembers of the gas a volume pushed into it.
 *
 * A pipe carries no composition; it holds its native gas (fresh on the intake
 * side, burned on the exhaust side). When a volume pushes gas into the pipe
 * (reverse flow through the intake valve, fresh charge short-circuiting into
 * the exhaust during overlap), the foreign part of that gas — burned gas in an
 * intake pipe, fresh gas in an exhaust pipe — is kept as a stock at the joint,
 * and it is the first to come back when the flow turns. The stock is
 * forgotten at the start of each cycle (gas that has not come back by then is
 * taken as mixed into the pipe).
 *
 *   into the pipe (ṁ < 0, outward from the volume): stock += |ṁ|·dt·f,
 *       f = b_vol (native fresh) or 1 − b_vol (native burned)
 *   out of the pipe (ṁ > 0): foreign back t = min(stock, ṁ·dt), stock −= t;
 *       burned rate into the volume = t/dt (native fresh) or ṁ − t/dt (native burned)
 */
export class ForeignStock {
  /** foreign mass pushed into the pipe and not yet back [kg] */
  stock = 0;

  constructor(
    /** native burned fraction of the pipe: 0 or 1 */
    private readonly native: number,
  ) {}

  /**
   * Burned part [kg/s] of a flow ṁ [kg/s] into the volume (negative: out of
   * it into the pipe), given the volume's burned fraction b.
   */
  burnedInto(massFlow: number, dt: number, b: number): number {
    if (massFlow < 0) {
      this.stock += -massFlow * dt * (this.native > 0 ? 1 - b : b);
      return massFlow * b;
    }
    let back = 0;
    if (this.stock > 0) {
      back = Math.min(this.stock, massFlow * dt);
      this.stock -= back;
    }
    return this.native > 0 ? massFlow - back / dt : back / dt;
  }
}
