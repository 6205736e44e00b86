import { describe, expect, it } from 'vitest';
import { CRITICAL_PRESSURE_RATIO, orificeMassFlow, reservoirFlow } from '../../src/core/flow.js';
import { density, soundSpeed, R_AIR } from '../../src/core/gas.js';

describe('isentropic relations (NACA Report 1135, 1953)', () => {
  it('critical pressure ratio p*/p0 = 0.528282 for γ = 1.4', () => {
    expect(CRITICAL_PRESSURE_RATIO).toBeCloseTo(0.528282, 6);
  });
  it('choked flow is ρ*·a*·A with T*/T0 = 0.833333 and ρ*/ρ0 = 0.633938: ṁ·√(R·T0)/(A·p0) = 0.633938·√(1.4 · 0.833333) = 0.684731', () => {
    // the sonic state of NACA 1135; the code's choked flow through 1 m² from 1 Pa, 1 K, scaled by √R
    expect(orificeMassFlow(1, 1, 1, 0.1) * Math.sqrt(R_AIR)).toBeCloseTo(0.684731, 5);
    expect(orificeMassFlow(1, 2e5, 400, 0.3e5) * Math.sqrt(R_AIR * 400) / 2e5).toBeCloseTo(0.684731, 5);
  });
  it('choked flow constant √(γ/R)·(2/(γ+1))^((γ+1)/(2(γ−1))) = 0.0404147 SI for R = 287.05', () => {
    // flow through 1 m² from p0 = 1 Pa, T0 = 1 K
    expect(Math.abs(orificeMassFlow(1, 1, 1, 0.1) / 0.0404147 - 1)).toBeLessThan(1e-5);
  });
});

describe('orifice example (computed from Heywood 1988, App. C; NACA 1135)', () => {
  // A = 1 cm², p0 = 101325 Pa, T0 = 293.15 K, Cd = 1
  it('p/p0 = 0.9 gives 14.760 g/s', () => {
    expect(orificeMassFlow(1e-4, 101325, 293.15, 0.9 * 101325) * 1000).toBeCloseTo(14.76, 2);
  });
  it('choked gives 23.917 g/s at any lower back pressure', () => {
    expect(orificeMassFlow(1e-4, 101325, 293.15, 0.5 * 101325) * 1000).toBeCloseTo(23.917, 2);
    expect(orificeMassFlow(1e-4, 101325, 293.15, 0.1 * 101325) * 1000).toBeCloseTo(23.917, 2);
  });
  it('reverses sign between reservoirs and is zero at equal pressure', () => {
    expect(reservoirFlow(1e-4, 9e4, 300, 1e5, 300)).toBeLessThan(0);
    expect(reservoirFlow(1e-4, 1e5, 300, 1e5, 300)).toBe(0);
  });
});

describe('sea-level air (U.S. Standard Atmosphere 1976)', () => {
  it('density 1.2250 kg/m³ and sound speed 340.294 m/s at 101325 Pa, 288.15 K', () => {
    expect(density(101325, 288.15)).toBeCloseTo(1.225, 3);
    expect(soundSpeed(288.15)).toBeCloseTo(340.294, 1);
  });
  it('uses the dry-air gas constant 287.05 J/(kg·K) (ISO 2533: 287.05287, from memory)', () => {
    expect(Math.abs(R_AIR - 287.053)).toBeLessThan(0.01);
  });
});
