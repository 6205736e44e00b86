/**
 * A pipe of the network at run time: its mesh (the physical sections plus the
 * virtual end-correction extensions), its scheme, and its two ends.
 */
import { newEndState } from '../boundary/types.js';
import { buildMesh, totalLength, type MeshSection } from '../pipe/mesh.js';
import { createPipeScheme } from '../pipe/factory.js';
import type { PipeScheme } from '../pipe/scheme.js';
import type { SchemeName } from '../model.js';
import type { PipeEnd, PipeRuntime, PipeSpec, Side } from './types.js';

/** sections with straight virtual extensions of `left` and `right` [m] at the two ends */
export function extendedSections(sections: readonly MeshSection[], left: number, right: number): MeshSection[] {
  const out = [...sections];
  const first = sections[0];
  const last = sections[sections.length - 1];
  if (first && left > 0) out.unshift({ length: left, diameterStart: first.diameterStart, diameterEnd: first.diameterStart });
  if (last && right > 0) out.push({ length: right, diameterStart: last.diameterEnd, diameterEnd: last.diameterEnd });
  return out;
}

export class Pipe implements PipeRuntime {
  readonly scheme: PipeScheme;
  readonly left: PipeEnd;
  readonly right: PipeEnd;
  /** physical length, without the extensions [m] */
  readonly length: number;

  constructor(
    readonly spec: PipeSpec,
    meshSize: number,
    scheme: SchemeName,
  ) {
    const mesh = buildMesh(extendedSections(spec.sections, spec.extend.left, spec.extend.right), meshSize);
    this.scheme = createPipeScheme(scheme, mesh, spec.wall);
    this.scheme.fill(spec.initial.pressure, 0, spec.initial.temperature);
    this.length = totalLength(spec.sections);
    this.left = this.end('left');
    this.right = this.end('right');
  }

  private end(side: Side): PipeEnd {
    return { pipe: this, side, incoming: { lambda: 0, entropy: 0, area: 0 }, state: newEndState() };
  }

  /** mesh position [m] of physical position x [m] from the left end */
  meshX(x: number): number {
    return this.spec.extend.left + x;
  }
}
