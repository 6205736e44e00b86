/** Picks the runner scheme named in the numerics. */
import type { SchemeName } from '../model.js';
import type { Mesh } from './mesh.js';
import type { PipeScheme, PipeWall } from './scheme.js';
import { createCharacteristicsScheme } from './moc.js';
import { createConservativeScheme } from './fv.js';

/**
 * The scheme used when a case does not name one. The characteristics scheme
 * with its conservative mass correction (moc.ts) keeps the per-cycle mass
 * imbalance far below 0.5 % and agrees with the conservative reference
 * (test/core/schemes-agree.test.ts), so it is the default.
 */
export const DEFAULT_SCHEME: SchemeName = 'characteristics';

export function createPipeScheme(name: SchemeName, mesh: Mesh, wall: PipeWall): PipeScheme {
  return name === 'conservative' ? createConservativeScheme(mesh, wall) : createCharacteristicsScheme(mesh, wall);
}
