import type { SchemeName } from '../model.js';
import type { Mesh } from './mesh.js';
import type { PipeScheme, PipeWall } from './scheme.js';
import { createCharacteristicsScheme } from './moc.js';
export function createPipeScheme(name: SchemeName, mesh: Mesh, wall: PipeWall): PipeScheme {
  return createCharacteristicsScheme(mesh, wall);
}
export const DEFAULT_SCHEME: SchemeName = 'characteristics';
