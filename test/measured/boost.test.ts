/**
 * Boost: `inlet.supply` feeds the plenum from a supply reservoir instead of
 * the ambient. Checks: a supply at the ambient state changes nothing (the
 * same assembly with another name for the source); and dimensional
 * analysis — the 1-D Euler equations with a constant Fanning factor, the
 * Reynolds-analogy wall heat transfer and an adiabatic cylinder are
 * unchanged when every pressure is scaled by k at the same temperatures, so
 * a supply and a back pressure k times the unboosted ones fill the cylinder
 * with k times the mass: the same ηv on the supply density (common
 * knowledge of similarity; the solver's own convergence sets the tolerance).
 */
import { describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { parseCase } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { engineAssembly } from '../../src/core/engine.js';
import { density } from '../../src/core/gas.js';
import { sweptVolume } from '../../src/core/kinematics.js';
import { baseCase } from '../case/fixture.js';
import { cli } from '../cli/helpers.js';

const plenum = (extra: Record<string, unknown> = {}, back = '105 kPa') => {
  const d = baseCase();
  d.inlet = { kind: 'plenum', volume: '3 L', feedDiameter: '40 mm', ...extra };
  d.exhaust.backPressure = back;
  d.numerics = { tolerance: 1e-6, maxCycles: 60 };
  return parseCase(YAML.stringify(d));
};

describe('inlet.supply', () => {
  it('becomes a reservoir named supply that the feed draws from', () => {
    const asm = engineAssembly(plenum({ supply: { pressure: '150 kPa', temperature: '320 K' } }).model);
    const supply = asm.network.volumes.find((v) => v.name === 'supply');
    expect(supply).toMatchObject({ kind: 'reservoir', pressure: 150000, temperature: 320 });
    expect(asm.network.connectors.find((c) => c.name === 'plenum feed')).toMatchObject({ from: 'supply', to: 'plenum' });
  });

  it('at the ambient state changes nothing', () => {
    const a = simulatePoint(plenum().model).result;
    const b = simulatePoint(plenum({ supply: { pressure: '101.325 kPa', temperature: '20 degC' } }).model).result;
    expect(b.volumetricEfficiency).toBe(a.volumetricEfficiency);
    expect(b.trappedMass).toBe(a.trappedMass);
  });

  it('supply and back pressure × 1.5 at the same temperatures: the same ηv on the supply density (similarity)', () => {
    const k = 1.5;
    const a = simulatePoint(plenum().model).result;
    const boosted = plenum({ supply: { pressure: `${101.325 * k} kPa`, temperature: '20 degC' } }, `${105 * k} kPa`).model;
    const b = simulatePoint(boosted).result;
    const supplyEta = b.deliveredMass / (density(101325 * k, 293.15) * sweptVolume(boosted.engine));
    expect(Math.abs(supplyEta / a.volumetricEfficiency - 1)).toBeLessThan(2e-3);
    // on the ambient density the same engine reads k times higher
    expect(b.volumetricEfficiency / a.volumetricEfficiency).toBeCloseTo(k, 2);
  });

  it('run states the basis: JSON supplyVolumetricEfficiency, text both figures', async () => {
    const d = baseCase();
    d.inlet = { kind: 'plenum', volume: '3 L', feedDiameter: '40 mm', supply: { pressure: '140 kPa', temperature: '310 K' } };
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const f = join(mkdtempSync(join(tmpdir(), 'tractwave-boost-')), 'boost.yaml');
    writeFileSync(f, YAML.stringify(d));
    const j = JSON.parse((await cli(['run', f, '--json'])).out);
    expect(j.volumetricEfficiencyBasis).toBe('ambient density');
    expect(j.supplyVolumetricEfficiency).toBeCloseTo(j.deliveredMass / (density(140000, 310) * sweptVolume({ bore: 0.086, stroke: 0.086, rod: 0.1435, compressionRatio: 10 })), 9);
    const t = await cli(['run', f]);
    expect(t.out).toMatch(/ηv on the supply density/);
    expect((await cli(['check', f])).out).toMatch(/boost supply\s+140\.0 kPa, 37 °C/);
  });

  it('is refused on an ambient inlet', async () => {
    const r = await cli(['run', 'cases/demo.yaml', '--set', 'inlet.supply.pressure=150kPa']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: inlet\.supply\.pressure: does not apply while inlet\.kind is 'ambient'/);
  });
});
