/** Picks the runner scheme named in the numerics. */
import type { SchemeName } from '../model.js';
import type { Mesh } from './mesh.js';
import type { PipeScheme, PipeWall } from './scheme.js';
import { createCharacteristicsScheme } from './moc.js';
import { createConservativeScheme } from './fv.js';

/**
 * The scheme used when a case does not name one: the conservative
 * finite-volume scheme (fv.ts), the reference. The characteristics scheme
 * (moc.ts, in conservation form) agrees with it on ηv within 0.04–0.15 % on
 * average over the bundled cases' sweeps (1.4 % at the worst point) and on
 * wave timing (test/core/schemes-agree.test.ts), but it is
 * checked over a narrower range of strong waves (moc.ts header), so it
 * stays selectable (numerics.scheme) for teaching and comparison.
 */
export const DEFAULT_SCHEME: SchemeName = 'conservative';

export function createPipeScheme(name: SchemeName, mesh: Mesh, wall: PipeWall): PipeScheme {
  return name === 'conservative' ? createConservativeScheme(mesh, wall) : createCharacteristicsScheme(mesh, wall);
}
