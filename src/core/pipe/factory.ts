/** Picks the runner scheme named in the numerics. */
import type { SchemeName } from '../model.js';
import type { Mesh } from './mesh.js';
import type { PipeScheme, PipeWall } from './scheme.js';
import { createCharacteristicsScheme } from './moc.js';
import { createConservativeScheme } from './fv.js';

/**
 * The scheme used when a case does not name one: the conservative
 * finite-volume scheme (fv.ts). The characteristics scheme with its mass
 * correction (moc.ts) keeps the per-cycle mass imbalance far below 0.5 % and
 * shows the same wave timing, but at the default 10 mm mesh its
 * first-order interpolation at the feet of the characteristics leaves a
 * mesh error in ηv (over the demo cases' sweeps 0.8–1.4 % on average, 2.7 %
 * at worst), where the conservative scheme is mesh-converged to about 0.1 %
 * (test/core/schemes-agree.test.ts for the agreement on timing). So
 * the reported figures come from the conservative scheme by default; the
 * characteristics scheme stays selectable (numerics.scheme) for teaching
 * and comparison.
 */
export const DEFAULT_SCHEME: SchemeName = 'conservative';

export function createPipeScheme(name: SchemeName, mesh: Mesh, wall: PipeWall): PipeScheme {
  return name === 'conservative' ? createConservativeScheme(mesh, wall) : createCharacteristicsScheme(mesh, wall);
}
