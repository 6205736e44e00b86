/**
 * The Nelder–Mead downhill simplex (Nelder & Mead, Computer Journal 7, 1965)
 * from the fmin package (0.0.4, pinned), behind one typed function.
 *
 * Two things about that release, found when it was chosen (2026-12):
 * - Its `main` is a UMD file inside a package marked `"type": "module"`.
 *   Node therefore loads it as an ES module with no exports, and the UMD
 *   wrapper puts the library on `globalThis.fmin` instead; a bundler (esbuild)
 *   treats the same file as CommonJS and gives real exports. `nelderMeadOf`
 *   takes whichever is there.
 * - Its shrink step assigns an undeclared loop variable, which throws in strict
 *   mode (fmin issue #23, 0.0.4 only). The shrink step is only reached with
 *   sigma < 1, so `nelderMead` here always passes sigma = 1: where the method
 *   would shrink, it stops and returns its best vertex. The caller restarts
 *   from there with a smaller simplex (search.ts), which is the usual way to
 *   make the method robust anyway.
 * Its `minTolerance` reads `minErrorDelta` (fmin issue #14): one tolerance
 * serves both the spread of the values and the spread of the vertices.
 */
import * as fminModule from 'fmin';

type NelderMeadFn = typeof fminModule.nelderMead;

function nelderMeadOf(): NelderMeadFn {
  const ns = fminModule as { nelderMead?: unknown; default?: { nelderMead?: unknown } };
  if (typeof ns.nelderMead === 'function') return ns.nelderMead as NelderMeadFn;
  if (typeof ns.default?.nelderMead === 'function') return ns.default.nelderMead as NelderMeadFn;
  const g = (globalThis as { fmin?: { nelderMead?: unknown } }).fmin;
  if (typeof g?.nelderMead === 'function') return g.nelderMead as NelderMeadFn;
  throw new Error('the fmin package loaded without its nelderMead function');
}

const fminNelderMead = nelderMeadOf();

/** the library the search uses, for the JSON and the text output */
export const NELDER_MEAD_LIBRARY = 'fmin 0.0.4 (Nelder–Mead downhill simplex)';

export interface NelderMeadOptions {
  /** the most simplex iterations */
  maxIterations: number;
  /** stop when both the value spread and the vertex spread fall below this */
  tolerance: number;
  /**
   * The first simplex: x0 and x0 + e_i·(nonZeroDelta − 1)·x0_i. With x0 = (1, …, 1)
   * and nonZeroDelta = 2 it is x0 + e_i: scale the variables so one unit is the
   * first step wanted.
   */
  nonZeroDelta: number;
}

/** Minimise f from x0 (not modified). Exceptions thrown by f pass through. */
export function nelderMead(f: (x: readonly number[]) => number, x0: readonly number[], o: NelderMeadOptions): { x: number[]; fx: number } {
  const r = fminNelderMead((x) => f(x), [...x0], {
    maxIterations: o.maxIterations,
    minErrorDelta: o.tolerance,
    nonZeroDelta: o.nonZeroDelta,
    sigma: 1,
  });
  return { x: [...r.x], fx: r.fx };
}
