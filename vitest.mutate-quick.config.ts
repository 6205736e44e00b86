/**
 * The tests `npm run mutate:quick` runs against each mutant of the five core
 * files it mutates (stryker.quick.json): the fast checks of the valve, the
 * orifice flow, the cylinder, the kinematics and the plenum, each against its
 * published or hand-worked value.
 */
import { defineConfig } from 'vitest/config';
export default defineConfig({
  test: {
    include: ['test/core/flow.test.ts', 'test/core/kinematics.test.ts', 'test/core/valve-flow.test.ts', 'test/core/cylinder-heat.test.ts', 'test/core/cylinder-odex.test.ts', 'test/core/plenum-charging.test.ts', 'test/core/open-end-ringing.test.ts'],
    testTimeout: 60_000,
  },
});
