/**
 * Fixed uniform mesh along a runner made of one or more conical sections,
 * listed from the upstream end (x = 0) to the valve end (x = L).
 *
 * Symbols: n points x_i = i·dx, i = 0..n−1 (both ends included);
 * D_i diameter [m], F_i = πD_i²/4 flow area [m²],
 * dlnF_i = (1/F)·dF/dx [1/m] (the area-change source term of the quasi-1-D
 * equations), computed from the section geometry so a taper is exact.
 */
export interface MeshSection {
  length: number;
  diameterStart: number;
  diameterEnd: number;
}

export interface Mesh {
  n: number;
  dx: number;
  length: number;
  x: Float64Array;
  diameter: Float64Array;
  area: Float64Array;
  dlnF: Float64Array;
}

/** diameter [m] and dD/dx at position x along the sections */
export function diameterAt(sections: readonly MeshSection[], x: number): { d: number; slope: number } {
  let start = 0;
  for (let k = 0; k < sections.length; k++) {
    const s = sections[k]!;
    const end = start + s.length;
    if (x <= end + 1e-12 || k === sections.length - 1) {
      const f = s.length > 0 ? Math.min(1, Math.max(0, (x - start) / s.length)) : 0;
      const slope = s.length > 0 ? (s.diameterEnd - s.diameterStart) / s.length : 0;
      return { d: s.diameterStart + f * (s.diameterEnd - s.diameterStart), slope };
    }
    start = end;
  }
  return { d: 0, slope: 0 };
}

export function totalLength(sections: readonly MeshSection[]): number {
  let L = 0;
  for (const s of sections) L += s.length;
  return L;
}

/** Volume of the sections [m³] (exact for cones). */
export function sectionsVolume(sections: readonly MeshSection[]): number {
  let v = 0;
  for (const s of sections) {
    const a = s.diameterStart / 2;
    const b = s.diameterEnd / 2;
    v += (Math.PI * s.length * (a * a + a * b + b * b)) / 3;
  }
  return v;
}

export function buildMesh(sections: readonly MeshSection[], meshSize: number): Mesh {
  const length = totalLength(sections);
  const n = Math.max(3, Math.round(length / meshSize) + 1);
  const dx = length / (n - 1);
  const x = new Float64Array(n);
  const diameter = new Float64Array(n);
  const area = new Float64Array(n);
  const dlnF = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const xi = i === n - 1 ? length : i * dx;
    x[i] = xi;
    // average the slope just left and right of the point (section joints)
    const l = diameterAt(sections, Math.max(0, xi - 1e-9));
    const r = diameterAt(sections, Math.min(length, xi + 1e-9));
    const d = 0.5 * (l.d + r.d);
    const slope = 0.5 * (l.slope + r.slope);
    diameter[i] = d;
    area[i] = (Math.PI * d * d) / 4;
    dlnF[i] = (2 * slope) / d;
  }
  return { n, dx, length, x, diameter, area, dlnF };
}
