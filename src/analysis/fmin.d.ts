/** Declarations for the parts of the fmin package (0.0.4) that nelder-mead.ts uses; it ships none. */
declare module 'fmin' {
  export interface NelderMeadParameters {
    maxIterations?: number;
    nonZeroDelta?: number;
    zeroDelta?: number;
    minErrorDelta?: number;
    rho?: number;
    chi?: number;
    psi?: number;
    sigma?: number;
  }
  export function nelderMead(f: (x: number[]) => number, x0: number[], parameters?: NelderMeadParameters): { fx: number; x: number[] };
}
