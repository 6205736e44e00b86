/**
 * One threshold for the mass balance everywhere (analysis/mass-balance.ts):
 * the run summary, the sweep warnings and the terminal view all warn above
 * 0.5 % per cycle — the limit the solver is held to. Points here are built
 * by hand (only their mass balance and speed matter); no physics is checked.
 */
import { describe, expect, it } from 'vitest';
import { MASS_IMBALANCE_LIMIT, massBalanceOk } from '../../src/analysis/mass-balance.js';
import type { SweepPoint } from '../../src/analysis/sweep.js';
import { sweepWarnings } from '../../src/cli/commands/sweep.js';
import { MASS_IMBALANCE_WARNING } from '../../src/cli/run-output.js';
import { MASS_WARNING } from '../../src/ui/app.js';

function point(rpm: number, massImbalance: number): SweepPoint {
  return { rpm, massImbalance, converged: true } as SweepPoint;
}

describe('mass balance warning threshold', () => {
  it('is the same 0.5 % in the run summary and the terminal view', () => {
    expect(MASS_IMBALANCE_LIMIT).toBe(0.005);
    expect(MASS_IMBALANCE_WARNING).toBe(MASS_IMBALANCE_LIMIT);
    expect(MASS_WARNING).toBe(MASS_IMBALANCE_LIMIT);
  });
  it.each([
    [0.004, true],
    [-0.005, true],
    [0.0051, false],
    [-0.02, false],
  ])('imbalance %f within the limit: %s', (imb, ok) => {
    expect(massBalanceOk(imb)).toBe(ok);
  });
  it('the sweep warns for a point at 0.6 % and names its speed, not for one at 0.4 %', () => {
    const w = sweepWarnings([point(5000, 0.004), point(6000, 0.006)], 30).join('\n');
    expect(w).toContain('mass balance off by more than 0.5 %');
    expect(w).toContain('6000 rpm');
    expect(w).not.toContain('5000');
  });
});
