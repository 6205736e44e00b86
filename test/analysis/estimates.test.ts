import { describe, expect, it } from 'vitest';
import {
  caseEstimates,
  endCorrection,
  engelmanVolume,
  helmholtzIntake,
  helmholtzResonator,
  outputEstimate,
  quarterWaveFrequency,
  tunedSpeeds,
  tunedSpeedsInRange,
  waveOrder,
} from '../../src/analysis/estimates.js';
import { fakeModel } from './fake-result.js';

describe('quarter-wave runner', () => {
  it('matches the closed–open example with the unflanged end correction', () => {
    // Kinsler et al., Fundamentals of Acoustics: f = a/(4(L+δ)); Levine & Schwinger,
    // Phys. Rev. 73 (1948): δ = 0.6133 r. Example of REFERENCES.md: a 343.23 m/s,
    // L 0.30 m, r 20 mm → 274.79 Hz.
    const f = quarterWaveFrequency(343.23, 0.3, endCorrection(0.02, 'unflanged'));
    expect(f).toBeCloseTo(274.79, 1);
  });

  it('uses 0.8216 r for a flanged end (Norris & Sheng 1989, value from memory)', () => {
    expect(endCorrection(0.02, 'flanged')).toBeCloseTo(0.016432, 6);
    // a longer effective length gives a lower frequency than unflanged
    expect(quarterWaveFrequency(343.23, 0.3, endCorrection(0.02, 'flanged'))).toBeLessThan(274.79);
  });

  it('without end correction is a/(4L) (Kinsler et al.)', () => {
    expect(quarterWaveFrequency(340, 0.25)).toBeCloseTo(340, 9);
  });
});

describe('tuned speeds: N_k = 120·f/k, wave order k = f·120/N (our stated convention)', () => {
  it.each([
    [275, 1, 33000],
    [275, 4, 8250],
    [275, 5, 6600],
    [200, 3, 8000],
  ])('f %d Hz, order %d → %d rpm', (f, k, rpm) => {
    const [t] = tunedSpeeds(f, [k]);
    expect(t?.rpm).toBeCloseTo(rpm, 6);
    // the two forms are inverse to each other
    expect(waveOrder(f, rpm)).toBeCloseTo(k, 9);
  });

  it('lists only the whole orders inside the range', () => {
    const list = tunedSpeedsInRange(275, 5000, 9000);
    expect(list.map((t) => t.order)).toEqual([4, 5, 6]);
    for (const t of list) {
      expect(t.rpm).toBeGreaterThanOrEqual(5000);
      expect(t.rpm).toBeLessThanOrEqual(9000);
    }
  });
});

describe('Helmholtz', () => {
  it('resonator matches the example of REFERENCES.md', () => {
    // Kinsler et al., Fundamentals of Acoustics (section from memory): f = (a/2π)√(S/(V·L′)).
    // V 1 L, neck 50 mm long, r 10 mm, L′ = L + 1.7 r, a 343.23 m/s → 118.29 Hz.
    const r = 0.01;
    const f = helmholtzResonator(343.23, Math.PI * r * r, 1e-3, 0.05 + 1.7 * r);
    expect(f).toBeCloseTo(118.29, 1);
  });

  it('Engelman intake estimate uses V_eff = (Vd/2)(rc+1)/(rc−1) and a peak near 60·f/2', () => {
    // Engelman, ASME 73-WA/DGP-2 (1973) — form and constants from memory.
    // worked by hand: Vd 499.557 cm³ (Heywood 1988 eqs. 2.4–2.6 example, B = S = 86 mm), rc 10 →
    // Veff = 249.779 · 11/9 = 305.285 cm³; a 343.23 m/s, A = π · 20² mm², L 0.3 m → f = 202.347 Hz, N = 30 f = 6070.4 rpm
    const vd = 499.557e-6;
    expect(engelmanVolume(vd, 10) * 1e6).toBeCloseTo(305.285, 3);
    const h = helmholtzIntake(343.23, 1.256637e-3, 0.3, vd, 10);
    expect(h.frequency).toBeCloseTo(202.347, 2);
    expect(h.peakRpm).toBeCloseTo(6070.4, 0);
  });
});

describe('torque and power estimate', () => {
  it('follows T = ηv·ρ·Vd/AFR·Q·ηb/(4π) and P = T·2πN/60', () => {
    // Heywood 1988, eq. 2.27 (ηv) with the four-stroke work per cycle; sea-level
    // density 1.2250 kg/m³ from the U.S. Standard Atmosphere 1976.
    // worked by hand: air 1.225 · 499.557 cm³ = 611.957 mg a cycle, fuel /12.8, 44 MJ/kg, 28 % → 589.0 J a
    // cycle of two turns: T = 589.0/(4π) = 46.872 N·m; P = T · 2π · 6000/60 = 29.450 kW
    const vd = 499.557e-6;
    const refMass = 1.225 * vd;
    const e = outputEstimate(1, refMass, 6000);
    expect(e.torque).toBeCloseTo(46.872, 2);
    expect(e.power / 1000).toBeCloseTo(29.450, 2);
    // units sanity, common practice (no source): brake mean effective pressure
    // 4πT/Vd of a naturally aspirated petrol engine near ηv 1 is about 10–14 bar
    const bmep = (4 * Math.PI * e.torque) / vd;
    expect(bmep).toBeGreaterThan(10e5);
    expect(bmep).toBeLessThan(14e5);
  });

  it('scales with ηv and the assumptions', () => {
    const a = outputEstimate(0.8, 6e-4, 6000);
    const b = outputEstimate(0.8, 6e-4, 6000, { brakeEfficiency: 0.56 });
    expect(b.torque / a.torque).toBeCloseTo(2, 12);
    const c = outputEstimate(0.4, 6e-4, 6000);
    expect(a.torque / c.torque).toBeCloseTo(2, 12);
  });
});

describe('case estimates', () => {
  it('uses √(γRT) at ambient and the open-end radius of the first section', () => {
    const m = fakeModel();
    const e = caseEstimates(m, 3000, 9000);
    // U.S. Standard Atmosphere 1976: a = 340.294 m/s at 288.15 K
    const sea = caseEstimates(fakeModel({ ambient: { pressure: 101325, temperature: 288.15 } }), 3000, 9000);
    expect(sea.soundSpeed).toBeCloseTo(340.294, 1);
    // the fake model: 20 °C, runner 0.3 m × 40 mm: the REFERENCES.md example, δ 12.266 mm → 274.79 Hz
    expect(e.endCorrection * 1000).toBeCloseTo(12.266, 3);
    expect(e.quarterWaveFrequency).toBeCloseTo(274.79, 1);
    expect(e.plenumFrequency).toBeNull();
    const p = caseEstimates(fakeModel({ inlet: { kind: 'plenum', volume: 2e-3, feedDiameter: 0.04, feedCd: 0.8 } }), 3000, 9000);
    expect(p.plenumFrequency).toBeGreaterThan(0);
  });

  it('a tapered runner: the Helmholtz neck uses ∫dx/A', () => {
    const straight = caseEstimates(fakeModel(), 3000, 9000);
    const m = fakeModel();
    m.runner.sections = [
      { length: 0.15, diameterStart: 0.04, diameterEnd: 0.04 },
      { length: 0.15, diameterStart: 0.04, diameterEnd: 0.04 },
    ];
    // two halves of the same pipe are the same neck
    expect(caseEstimates(m, 3000, 9000).helmholtz.frequency).toBeCloseTo(straight.helmholtz.frequency, 9);
    m.runner.sections = [{ length: 0.3, diameterStart: 0.05, diameterEnd: 0.03 }];
    // ∫dx/A of a cone = L/(π r1 r2)
    const expected = caseEstimates(fakeModel({ runner: { ...m.runner, sections: [{ length: 0.3, diameterStart: Math.sqrt(0.05 * 0.03), diameterEnd: Math.sqrt(0.05 * 0.03) }] } }), 3000, 9000);
    expect(caseEstimates(m, 3000, 9000).helmholtz.frequency).toBeCloseTo(expected.helmholtz.frequency, 9);
  });
});
