/** The exact Riemann solver the tests compare with: src/analysis/exact-riemann.ts (Toro 2009, ch. 4). */
export * from '../../src/analysis/exact-riemann.js';
