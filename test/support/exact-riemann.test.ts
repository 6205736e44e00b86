import { describe, expect, it } from 'vitest';
import { sampleRiemann, shockSpeeds, solveRiemann, starRegionSpeeds, type GasState } from './exact-riemann.js';

const G = 1.4;

function relErr(value: number, ref: number): number {
  return Math.abs(value - ref) / Math.abs(ref);
}

describe('exact Riemann solver (Toro 2009, ch. 4)', () => {
  // Toro 2009, Table 4.1 (data) and Table 4.3 (exact p*, u*), γ = 1.4.
  it.each([
    { name: 'test 1 (Sod)', l: { rho: 1, u: 0, p: 1 }, r: { rho: 0.125, u: 0, p: 0.1 }, pStar: 0.30313, uStar: 0.92745 },
    { name: 'test 3', l: { rho: 1, u: 0, p: 1000 }, r: { rho: 1, u: 0, p: 0.01 }, pStar: 460.894, uStar: 19.5975 },
    { name: 'test 4', l: { rho: 1, u: 0, p: 0.01 }, r: { rho: 1, u: 0, p: 100 }, pStar: 46.095, uStar: -6.19633 },
  ])('$name: p* and u* as Toro 2009 Table 4.3', ({ l, r, pStar, uStar }) => {
    const sol = solveRiemann(l, r, G);
    // Table 4.3 prints 5–6 significant figures: agree to the last printed digit.
    expect(relErr(sol.pStar, pStar)).toBeLessThan(2e-5);
    expect(relErr(sol.uStar, uStar)).toBeLessThan(2e-5);
  });

  it('Sod: star densities and shock speed (Sod 1978; Toro 2009 Table 4.3)', () => {
    const sol = solveRiemann({ rho: 1, u: 0, p: 1 }, { rho: 0.125, u: 0, p: 0.1 }, G);
    // Sod, J. Comput. Phys. 27 (1978); Toro 2009: ρ*L 0.42632, ρ*R 0.26557, shock speed 1.75216
    expect(relErr(sol.rhoStarL, 0.42632)).toBeLessThan(2e-5);
    expect(relErr(sol.rhoStarR, 0.26557)).toBeLessThan(2e-5);
    expect(relErr(shockSpeeds(sol).right, 1.75216)).toBeLessThan(2e-5);
    expect(sol.leftShock).toBe(false);
    expect(sol.rightShock).toBe(true);
  });

  it('Sod shock reflected from a wall: mirror-image Riemann problem (Anderson, Modern Compressible Flow)', () => {
    const sod = solveRiemann({ rho: 1, u: 0, p: 1 }, { rho: 0.125, u: 0, p: 0.1 }, G);
    const behind: GasState = { rho: sod.rhoStarR, u: sod.uStar, p: sod.pStar };
    // a wall is the symmetry plane of the gas and its mirror image moving the other way
    const refl = solveRiemann(behind, { ...behind, u: -behind.u }, G);
    expect(Math.abs(refl.uStar)).toBeLessThan(1e-12);
    // REFERENCES.md: reflected p 0.780386, ρ 0.509395 (Anderson, reflected-shock relation)
    expect(relErr(refl.pStar, 0.780386)).toBeLessThan(2e-6);
    expect(relErr(refl.rhoStarR, 0.509395)).toBeLessThan(2e-6);
  });

  it('sampled shock satisfies the Rankine–Hugoniot conditions (Toro 2009 §3.1.3)', () => {
    const l: GasState = { rho: 1, u: 0, p: 0.01 };
    const r: GasState = { rho: 1, u: 0, p: 100 };
    const sol = solveRiemann(l, r, G); // test 4: the left wave is a shock
    const S = shockSpeeds(sol).left;
    const a = sampleRiemann(sol, S - 1e-9);
    const b = sampleRiemann(sol, S + 1e-9);
    const E = (w: GasState): number => w.p / (G - 1) + 0.5 * w.rho * w.u * w.u;
    // F(U_b) − F(U_a) = S·(U_b − U_a) for mass, momentum and energy
    const mass = b.rho * b.u - a.rho * a.u - S * (b.rho - a.rho);
    const mom = b.rho * b.u * b.u + b.p - (a.rho * a.u * a.u + a.p) - S * (b.rho * b.u - a.rho * a.u);
    const en = (E(b) + b.p) * b.u - (E(a) + a.p) * a.u - S * (E(b) - E(a));
    expect(Math.abs(mass)).toBeLessThan(1e-9 * Math.abs(S * b.rho));
    expect(Math.abs(mom)).toBeLessThan(1e-9 * b.p);
    expect(Math.abs(en)).toBeLessThan(1e-9 * Math.abs(E(b) * S));
  });

  it('rarefaction fan is isentropic and joins the star state (Toro 2009 eqs. 4.56, 4.63)', () => {
    const sol = solveRiemann({ rho: 1, u: 0, p: 1 }, { rho: 0.125, u: 0, p: 0.1 }, G);
    const edges = starRegionSpeeds(sol);
    const K = 1 / Math.pow(1, G); // p/ρ^γ of the left state
    for (let s = -Math.sqrt(G) + 1e-6; s < edges.from; s += 0.05) {
      const w = sampleRiemann(sol, s);
      expect(Math.abs(w.p / Math.pow(w.rho, G) - K)).toBeLessThan(1e-12);
      // the fan is a C-: s = u − a inside it
      expect(Math.abs(w.u - Math.sqrt((G * w.p) / w.rho) - s)).toBeLessThan(1e-12);
    }
    const tail = sampleRiemann(sol, edges.from - 1e-12);
    expect(relErr(tail.p, sol.pStar)).toBeLessThan(1e-9);
    expect(relErr(tail.u, sol.uStar)).toBeLessThan(1e-9);
  });

  it('mirror symmetry: swapping and reflecting the data reflects the solution (Toro 2009 §4.2)', () => {
    const l = { rho: 1, u: 0, p: 1000 };
    const r = { rho: 1, u: 0, p: 0.01 };
    const a = solveRiemann(l, r, G);
    const b = solveRiemann({ ...r, u: -r.u }, { ...l, u: -l.u }, G);
    expect(relErr(b.pStar, a.pStar)).toBeLessThan(1e-12);
    expect(relErr(-b.uStar, a.uStar)).toBeLessThan(1e-12);
  });

  it('rejects data that generate vacuum (Toro 2009 eq. 4.40)', () => {
    expect(() => solveRiemann({ rho: 1, u: -10, p: 0.4 }, { rho: 1, u: 10, p: 0.4 }, G)).toThrow(/vacuum/);
  });
});
