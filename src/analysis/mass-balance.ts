/**
 * The per-cycle mass balance every run is held to: the mass through the
 * runner's inlet end and through the intake valve over one converged cycle
 * differ by at most this fraction. Above it the figures are suspect and the
 * text output, the sweep and the terminal view warn.
 */
export const MASS_IMBALANCE_LIMIT = 0.005;

/** true when a point's mass balance is within the limit */
export function massBalanceOk(massImbalance: number): boolean {
  return Math.abs(massImbalance) <= MASS_IMBALANCE_LIMIT;
}
