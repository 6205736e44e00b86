/**
 * Pulse timing on synthetic valve-end traces built here: a pure cosine
 * ringing p = p_ref + A·cos(2π(θ − θ_peak)/P), so the peak position, the
 * phase at each event and the period are known exactly from the trace itself.
 */
import { describe, expect, it } from 'vitest';
import { closedValveRingingPeriod, pulseTiming } from '../../src/analysis/pulse.js';
import { fakeModel, fakeResult } from './fake-result.js';

const P_REF = 101325;
const ring = (peak: number, period: number, amp: number) => (theta: number) =>
  P_REF + amp * Math.cos((2 * Math.PI * (theta - peak)) / period);

describe('round trip and wave order', () => {
  // worked by hand: Δθ = 12·N·L/a (kinematics, REFERENCES.md), 2L/a, f₁ = a/(4L) without a model (no end
  // correction; Kinsler et al.), order f₁·120/N
  it.each([
    [6000, 0.3, 340, 63.5294, 1.76471, 283.333, 5.66667],
    [3000, 0.45, 350, 46.2857, 2.57143, 194.444, 7.77778],
    [9000, 0.2, 345, 62.6087, 1.15942, 431.25, 5.75],
  ])('N %d rpm, L %d m, a %d m/s: %f° round trip, %f ms, %f Hz, order %f', (rpm, L, a, deg, ms, f, order) => {
    const r = fakeResult(ring(226, 100, 5000), { rpm, runnerLength: L, soundSpeed: a });
    const p = pulseTiming(r);
    expect(p.roundTripDegrees).toBeCloseTo(deg, 3);
    expect(p.roundTripSeconds * 1000).toBeCloseTo(ms, 4);
    expect(p.quarterWaveFrequency).toBeCloseTo(f, 2);
    expect(p.waveOrder).toBeCloseTo(order, 4);
  });

  it('uses the open-end correction of the model (Levine & Schwinger 1948, δ = 0.6133 r)', () => {
    const r = fakeResult(ring(226, 100, 5000), { soundSpeed: 343.23, runnerLength: 0.3 });
    const p = pulseTiming(r, fakeModel());
    // REFERENCES.md example: 343.23 m/s, L 0.30 m, r 20 mm → 274.79 Hz
    expect(p.quarterWaveFrequency).toBeCloseTo(274.79, 1);
  });
});

describe('compression peak before IVC', () => {
  it.each([
    // peak θ, period, expected offset from IVC (240)
    [226, 100, -14],
    [200, 90, -40],
    [239.4, 120, -0.6],
    [180.25, 200, -59.75],
  ])('peak at %d° (period %d°) → offset %d°', (peak, period, offset) => {
    const p = pulseTiming(fakeResult(ring(peak, period, 5000)));
    expect(p.lastPeakBeforeIvc).not.toBeNull();
    // the parabola refinement of a sampled cosine is good to a small fraction of a degree
    expect(p.lastPeakBeforeIvc!.offsetFromIvc).toBeCloseTo(offset, 0);
    expect(Math.abs(p.lastPeakBeforeIvc!.crank - peak)).toBeLessThan(0.2);
    expect(p.lastPeakBeforeIvc!.pressureAboveReference).toBeCloseTo(5000, -1);
  });

  it('takes the latest of several peaks in the open period', () => {
    // period 60°: peaks at 226, 166, 106 … inside IVO (690) → IVC (240)
    const p = pulseTiming(fakeResult(ring(226, 60, 4000)));
    expect(p.lastPeakBeforeIvc!.crank).toBeCloseTo(226, 0);
  });

  it('ignores peaks that do not rise above the reference pressure', () => {
    // ringing entirely below the reference: no compression peak at all
    const p = pulseTiming(fakeResult((t) => ring(226, 100, 3000)(t) - 6000));
    expect(p.lastPeakBeforeIvc).toBeNull();
    expect(p.effect).toBe('costing');
  });

  it('handles an IVC that wraps past 720° and peaks just after TDC', () => {
    // events placed so the open period crosses θ = 0: IVO 600, IVC 30, peak at 5
    const p = pulseTiming(fakeResult(ring(5, 100, 5000), { ivo: 600, ivc: 30 }));
    expect(p.lastPeakBeforeIvc!.offsetFromIvc).toBeCloseTo(-25, 0);
  });
});

describe('ringing period and phase', () => {
  it.each([[80], [100], [137.5]])('measures a %d° closed-valve ringing from the trace', (period) => {
    const r = fakeResult(ring(226, period, 5000));
    const measured = closedValveRingingPeriod(r.trace.valvePressure, r.trace.crank, 240, 690);
    expect(measured).not.toBeNull();
    expect(measured!).toBeCloseTo(period, 0);
    const p = pulseTiming(r);
    expect(p.ringingSource).toBe('trace');
    expect(p.ringingFrequency).toBeCloseTo((6 * 6000) / period, -1);
  });

  it('falls back to the quarter-wave period when the closed period is flat', () => {
    const p = pulseTiming(fakeResult(() => P_REF));
    expect(p.ringingSource).toBe('quarter-wave estimate');
    expect(p.ringingPeriodDegrees).toBeCloseTo((6 * 6000) / (340 / 1.2), 9);
  });

  it.each([
    // θ_peak, period, phase at IVC (240): 360·(240 − θ_peak)/P
    [226, 100, 50.4],
    [190, 100, 180],
    [250, 100, 324],
    [240, 100, 0],
  ])('peak %d°, period %d° → phase %d° at IVC', (peak, period, phase) => {
    const p = pulseTiming(fakeResult(ring(peak, period, 5000)));
    const d = Math.abs(((p.atIvc.ringingPhase - phase + 540) % 360) - 180);
    expect(d).toBeLessThan(2);
  });

  it('phase at IVO follows the same definition', () => {
    // IVO 690, peak at 690 − 25 with period 100 → 90° (falling through the mean)
    const p = pulseTiming(fakeResult(ring(665, 100, 5000)));
    expect(p.atIvo.ringingPhase).toBeCloseTo(90, -0.5);
    expect(p.atIvo.pressureAboveReference).toBeCloseTo(0, -1);
  });
});

describe('verdict follows from the numbers', () => {
  it('compression peak shortly before closing: helping, with the offset in the words', () => {
    const p = pulseTiming(fakeResult(ring(226, 100, 5000)));
    expect(p.effect).toBe('helping');
    expect(p.verdict).toContain('peaks 14° before the valve closes');
    expect(p.verdict).toContain('helping');
    expect(p.verdict).toMatch(/\+3\.[0-9] kPa at closing/); // 5000·cos(50.4°) = 3.19 kPa
  });

  it('closing on the trough: costing charge', () => {
    const p = pulseTiming(fakeResult(ring(190, 100, 5000)));
    expect(p.effect).toBe('costing');
    expect(p.verdict).toContain('closes on an expansion');
    expect(p.verdict).toContain('costing charge');
    expect(p.verdict).toContain('50° before closing');
    expect(p.peakOffsetFromIvc).toBeCloseTo(-50, 0);
  });

  it('still rising at closing: helping, late, with the peak after IVC', () => {
    const p = pulseTiming(fakeResult(ring(250, 100, 5000)));
    expect(p.effect).toBe('helping');
    expect(p.peakAfterIvc!.offsetFromIvc).toBeCloseTo(10, 0);
    expect(p.verdict).toContain('10° after');
    expect(p.verdict).toContain('a little late');
    expect(p.peakOffsetFromIvc).toBeCloseTo(10, 0);
  });

  it('peak well after closing: helping but late', () => {
    const p = pulseTiming(fakeResult(ring(270, 200, 5000)));
    expect(p.effect).toBe('helping');
    expect(p.verdict).toContain('30° after');
    expect(p.verdict).toContain('arrives late');
  });

  it('small swing: neutral (within 2 % of the reference), a tighter band makes it count', () => {
    const p = pulseTiming(fakeResult(ring(226, 100, 600)));
    expect(p.effect).toBe('neutral');
    expect(p.verdict).toContain('neither helps nor costs');
    // 600·cos(50.4°) = 383 Pa at IVC: above a 0.1 % band (101 Pa), below a 2 % band (2 kPa)
    expect(pulseTiming(fakeResult(ring(226, 100, 600)), undefined, { neutralBand: 0.001, minPeakAmplitude: 0.001 }).effect).toBe('helping');
  });

  it.each([[2000], [6000], [12000]])('the same trace gives the same effect at %d rpm (no fixed speed ranges)', (rpm) => {
    const help = pulseTiming(fakeResult(ring(226, 100, 5000), { rpm }));
    const cost = pulseTiming(fakeResult(ring(190, 100, 5000), { rpm }));
    expect(help.effect).toBe('helping');
    expect(cost.effect).toBe('costing');
  });

  it('the reference is the plenum mean when the runner draws from a plenum', () => {
    // a plenum sitting 4 kPa below ambient: a valve pressure of ambient + 1 kPa
    // at IVC is 5 kPa above the plenum — helping
    const plenum = () => P_REF - 4000;
    const r = fakeResult((t) => ring(226, 100, 1000)(t), { plenum });
    const m = fakeModel({ inlet: { kind: 'plenum', volume: 2e-3, feedDiameter: 0.04, feedCd: 0.8 } });
    const p = pulseTiming(r, m);
    expect(p.referenceKind).toBe('plenum mean');
    expect(p.referencePressure).toBeCloseTo(P_REF - 4000, 6);
    expect(p.effect).toBe('helping');
  });

  it('is JSON-able', () => {
    const p = pulseTiming(fakeResult(ring(226, 100, 5000)));
    expect(JSON.parse(JSON.stringify(p))).toEqual(p);
  });
});
