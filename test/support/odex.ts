/** Typed wrapper for the odex package (Hairer's ODEX), which ships no declarations. */
import { createRequire } from 'node:module';

export interface OdexResult {
  y: number[];
  outcome: number;
  nStep: number;
}
export interface OdexSolver {
  absoluteTolerance: number;
  relativeTolerance: number;
  maxSteps: number;
  solve(f: (x: number, y: number[]) => number[], x0: number, y0: number[], x1: number): OdexResult;
}
const odex = createRequire(import.meta.url)('odex') as { Solver: new (n: number) => OdexSolver };

export function odexSolver(n: number): OdexSolver {
  return new odex.Solver(n);
}
