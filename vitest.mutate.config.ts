/**
 * The tests `npm run mutate` (StrykerJS) runs against each mutant of
 * src/core and src/analysis: the physics, analysis and regression tests,
 * without the command-line, view and worker-thread tests (they test the
 * presentation, not these files, and start threads or processes).
 */
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/core/**/*.test.ts', 'test/analysis/**/*.test.ts', 'test/regression/**/*.test.ts', 'test/support/**/*.test.ts'],
    exclude: ['test/analysis/simulation.test.ts', 'test/analysis/commands.test.ts', '**/node_modules/**'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
