/**
 * Bracketed scalar root finding (Illinois variant of regula falsi) over an
 * object's residual method, so boundary solves allocate nothing.
 */
export interface Residual {
  residual(x: number): number;
}

/**
 * Root of f in [lo, hi] given f(lo) = flo and f(hi) = fhi of opposite signs.
 * Converges superlinearly; stops at |hi − lo| < tol·|x| or 60 iterations.
 */
export function bracketedRoot(f: Residual, lo: number, hi: number, flo: number, fhi: number, tol: number): number {
  if (flo === 0) return lo;
  if (fhi === 0) return hi;
  let side = 0;
  let x = lo;
  for (let k = 0; k < 60; k++) {
    x = (lo * fhi - hi * flo) / (fhi - flo);
    const fx = f.residual(x);
    if (fx === 0 || Math.abs(hi - lo) < tol * Math.abs(x)) return x;
    if ((fx > 0) === (fhi > 0)) {
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
  return x;
}
