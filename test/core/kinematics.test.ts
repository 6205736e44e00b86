import { describe, expect, it } from 'vitest';
import { clearanceVolume, cylinderVolume, cylinderVolumeRate, sweptVolume } from '../../src/core/kinematics.js';

// Heywood, Internal Combustion Engine Fundamentals (1988), eqs. 2.4–2.6;
// example values computed from those equations (REFERENCES.md):
// B = S = 86 mm, l = 143.5 mm, rc = 10.
const g = { bore: 0.086, stroke: 0.086, rod: 0.1435, compressionRatio: 10 };

describe('slider-crank volume (Heywood 1988, eqs. 2.4–2.6)', () => {
  it('swept and clearance volume', () => {
    expect(sweptVolume(g) * 1e6).toBeCloseTo(499.557, 2);
    expect(clearanceVolume(g) * 1e6).toBeCloseTo(55.506, 2);
  });
  it.each([
    [0, 55.506],
    [30, 98.379],
    [90, 343.588],
    [180, 555.063],
    [360, 55.506],
  ])('V(%d°) = %f cm³', (theta, v) => {
    expect(cylinderVolume(theta, g) * 1e6).toBeCloseTo(v, 2);
  });
  // Heywood eq. 2.4 differentiated by hand: dV/dθ = (πB²/4)·a·sinθ·(1 + cosθ/√(R² − sin²θ)), R = l/a,
  // per degree (× π/180); worked for the example engine (a 43 mm, R 3.33721)
  it.each([
    [30, 2.75184],
    [90, 4.35946],
    [135, 2.41427],
    [270, -4.35946],
  ])('dV/dθ(%d°) = %f cm³ per degree', (theta, rate) => {
    expect(cylinderVolumeRate(theta, g) * 1e6).toBeCloseTo(rate, 4);
  });
});
