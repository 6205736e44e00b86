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
  it('dV/dθ matches a central difference of V', () => {
    for (const th of [10, 45, 90, 135, 200, 300]) {
      const fd = (cylinderVolume(th + 1e-4, g) - cylinderVolume(th - 1e-4, g)) / 2e-4;
      expect(cylinderVolumeRate(th, g)).toBeCloseTo(fd, 12);
    }
  });
});
