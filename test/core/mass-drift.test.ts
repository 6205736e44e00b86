/**
 * The mesh method of characteristics is not conservative: interpolating the
 * sound speed at the feet of the characteristics (density goes as a⁵ along
 * an isentrope) makes a steep front gain or lose mass, and refining the mesh
 * does not cure it (the front stays a few cells wide at any mesh). A closed
 * pipe with a two-state split must keep its mass exactly.
 *
 * Reference figures for the defect, from an earlier homentropic model of
 * ours (−0.08 % at pressure ratio 1.1, −3.8 % at 1.65, −15 % at 3.0 after
 * about 11 transits) are not reproduced number for number: our uncorrected
 * update is non-homentropic (entropy levels along path lines), and there the
 * drift has the other sign and a smaller size — but it shows the same
 * defect: growing with the pressure ratio and not shrinking with the mesh.
 * "uncorrected" is that plain mesh method (moc-plain.ts); "corrected" is the
 * characteristics scheme in conservation form (moc.ts), which keeps the mass
 * to round-off.
 */
import { describe, expect, it } from 'vitest';
import { buildMesh } from '../../src/core/pipe/mesh.js';
import { createCharacteristicsScheme } from '../../src/core/pipe/moc.js';
import { closedEnd } from '../../src/core/boundary/closed.js';
import { soundSpeed } from '../../src/core/gas.js';
import { drive } from '../support/pipe-driver.js';

function drift(ratio: number, corrected: boolean, meshSize: number): number {
  const m = buildMesh([{ length: 1, diameterStart: 0.04, diameterEnd: 0.04 }], meshSize);
  const s = createCharacteristicsScheme(m, { friction: 0, heatTransfer: false, wallTemperature: 300 }, corrected);
  const p = new Float64Array(m.n);
  const u = new Float64Array(m.n);
  const T = new Float64Array(m.n);
  for (let i = 0; i < m.n; i++) {
    const left = m.x[i]! < 0.5;
    p[i] = left ? 1e5 * ratio : 1e5;
    T[i] = left ? 300 * Math.pow(ratio, 0.4 / 1.4) : 300; // one entropy level: a homentropic start
  }
  s.setState(p, u, T);
  const m0 = s.mass();
  drive(s, closedEnd, closedEnd, 11 / soundSpeed(300)); // about 11 end-to-end transits
  return s.mass() / m0 - 1;
}

describe('closed-pipe mass drift of the characteristics update', () => {
  const ratios = [1.1, 1.65, 3.0];
  it('uncorrected: the drift grows with the pressure ratio and exceeds 1 % for strong waves', () => {
    const d = ratios.map((r) => Math.abs(drift(r, false, 0.01)));
    expect(d[0]!).toBeLessThan(0.002);
    expect(d[1]!).toBeGreaterThan(0.01);
    expect(d[2]!).toBeGreaterThan(d[1]!);
  });
  it('uncorrected: refining the mesh does not remove it', () => {
    const coarse = Math.abs(drift(3.0, false, 0.01));
    const fine = Math.abs(drift(3.0, false, 0.005));
    expect(fine).toBeGreaterThan(0.5 * coarse);
  });
  it.each(ratios)('corrected: mass kept to round-off at pressure ratio %f', (r) => {
    expect(Math.abs(drift(r, true, 0.01))).toBeLessThan(1e-10);
  });
});
