/**
 * Bracketed scalar root finding (Illinois variant of regula falsi).
 *
 * The function is an object that reads its argument from `rx` and writes its
 * value to `rf` in `evaluate()`: no double crosses a call boundary, so a call
 * that V8 does not inline boxes nothing and a boundary solve allocates
 * nothing.
 */
import { G1 } from '../gas.js';

export interface Residual {
  /** argument of the next evaluation */
  rx: number;
  /** value at rx after evaluate() */
  rf: number;
  evaluate(): void;
}

/**
 * Root of f in [lo, hi] given f(lo) = flo and f(hi) = fhi of opposite signs,
 * left in f.rx. Converges superlinearly; stops at |hi − lo| < tol·|x| or 60
 * iterations.
 */
export function bracketedRoot(f: Residual, lo0: number, hi0: number, flo0: number, fhi0: number, tol: number): void {
  // '+ 0' makes float64 locals: loop variables that start as (boxed) arguments
  // would otherwise stay boxed and allocate a number per iteration
  let lo = lo0 + 0;
  let hi = hi0 + 0;
  let flo = flo0 + 0;
  let fhi = fhi0 + 0;
  if (flo === 0) {
    f.rx = lo;
    return;
  }
  if (fhi === 0) {
    f.rx = hi;
    return;
  }
  let side = 0;
  for (let k = 0; k < 60; k++) {
    const x = (lo * fhi - hi * flo) / (fhi - flo);
    f.rx = x;
    f.evaluate();
    const fx = f.rf;
    if (fx === 0 || Math.abs(hi - lo) < tol * Math.abs(x)) return;
    if (fx > 0 === fhi > 0) {
      hi = x;
      fhi = fx;
      if (side === 1) flo *= 0.5;
      side = 1;
    } else {
      lo = x;
      flo = fx;
      if (side === -1) fhi *= 0.5;
      side = -1;
    }
  }
  // f.rx holds the last iterate
}

/**
 * Base of a boundary solved by one bracketed root: subclasses give the
 * residual; `at(x)` evaluates it through the field protocol above.
 */
export abstract class ScalarRoot implements Residual {
  rx = 0;
  rf = 0;

  evaluate(): void {
    this.rf = this.residualAt(this.rx);
  }

  protected at(x: number): number {
    this.rx = x;
    this.evaluate();
    return this.rf;
  }

  protected abstract residualAt(x: number): number;

  /**
   * Inflow into the pipe end (open or restricted): the root of the residual
   * in X ∈ [Λ, min(xRes, Λ/(1 − G1))] — from the incoming wave's rest state
   * to the reservoir pressure or the pipe end's sonic limit |w| = a_e. The
   * residual is negative at Λ; when it is still ≤ 0 at the sonic limit the
   * pipe end is choked there. Leaves X in rx; returns true when choked.
   */
  protected inflowRoot(lam: number, xRes: number, tol: number): boolean {
    const xSonic = lam / (1 - G1);
    if (xSonic < xRes) {
      const fhi = this.at(xSonic);
      if (fhi <= 0) {
        this.rx = xSonic;
        return true;
      }
      bracketedRoot(this, lam, xSonic, this.at(lam), fhi, tol);
      return false;
    }
    bracketedRoot(this, lam, xRes, this.at(lam), this.at(xRes), tol);
    return false;
  }
}
