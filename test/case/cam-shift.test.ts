/**
 * Cam timing as design values: `shift` moves both events of a valve by the
 * same crank angle (positive later = retard, negative earlier = advance) and
 * `duration` sets the open duration opens + 180 + closes about the same
 * centre line. Checked against the cam card's own convention (DESIGN §2, the
 * trade's card: intake opens ° BTDC, closes ° ABDC; exhaust opens ° BBDC,
 * closes ° ATDC; duration = opens + 180 + closes, common practice) and the
 * card-to-θ table of the README (θ 0 = TDC at the start of the intake stroke).
 */
import { describe, expect, it } from 'vitest';
import { validateCase } from '../../src/case/schema.js';
import { effectiveCard, toEngineModel } from '../../src/case/to-model.js';
import { baseCase } from './fixture.js';

function model(mut: (d: Record<string, any>) => void) {
  const d = baseCase();
  mut(d);
  const r = validateCase(d);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return toEngineModel(r.value);
}

describe('intake.shift and exhaust.shift', () => {
  it.each([
    // opens BTDC, closes ABDC, shift → IVO θ, IVC θ
    [30, 60, 0, 690, 240],
    [30, 60, -10, 680, 230], // 10° advance: opens 40 BTDC, closes 50 ABDC
    [30, 60, 10, 700, 250], // 10° retard: opens 20 BTDC, closes 70 ABDC
    [5, 40, 10, 5, 230], // retarded past TDC: opens 5° ATDC
  ])('intake %d° BTDC / %d° ABDC shifted %d° → θ %d / %d', (o, c, s, ivo, ivc) => {
    const m = model((d) => {
      d.intake.opens = o;
      d.intake.closes = c;
      d.intake.shift = s;
    });
    expect(m.intake.openAngle).toBeCloseTo(ivo, 12);
    expect(m.intake.closeAngle).toBeCloseTo(ivc, 12);
    // the duration is unchanged by a shift
    expect((m.intake.closeAngle - m.intake.openAngle + 720) % 720).toBeCloseTo(o + 180 + c, 12);
  });

  it('moves the exhaust events the same way, and only the valve it is set on', () => {
    // exhaust 60 BBDC / 30 ATDC is θ 480 / 30; shifted −5 (advance): 65 BBDC / 25 ATDC, θ 475 / 25
    const m = model((d) => {
      d.exhaust.opens = 60;
      d.exhaust.closes = 30;
      d.exhaust.shift = '-5 deg';
    });
    expect(m.exhaust.openAngle).toBeCloseTo(475, 12);
    expect(m.exhaust.closeAngle).toBeCloseTo(25, 12);
    const plain = model(() => {});
    expect(m.intake.openAngle).toBe(plain.intake.openAngle);
    expect(m.intake.closeAngle).toBe(plain.intake.closeAngle);
  });

  it('refuses a shift beyond half a turn of the crank', () => {
    const d = baseCase();
    d.intake.shift = 200;
    const r = validateCase(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ path: 'intake.shift' });
  });
});

describe('intake.duration and exhaust.duration', () => {
  it('widens both ends alike about the same centre line', () => {
    // 30 BTDC / 60 ABDC is 270°, centre line 105° ATDC (θ 105); 290°: 40 BTDC / 70 ABDC
    expect(effectiveCard({ opens: 30, closes: 60, duration: 290 })).toEqual({ opens: 40, closes: 70 });
    const m = model((d) => {
      d.intake.opens = 30;
      d.intake.closes = 60;
      d.intake.duration = 290;
    });
    expect(m.intake.openAngle).toBeCloseTo(680, 12);
    expect(m.intake.closeAngle).toBeCloseTo(250, 12);
    const centre = (m.intake.openAngle - 720 + m.intake.closeAngle) / 2;
    expect(centre).toBeCloseTo(105, 12);
  });

  it('applies the duration first, then the shift', () => {
    // 270° → 250°: 20 BTDC / 50 ABDC; then 4° advance: 24 BTDC / 46 ABDC
    expect(effectiveCard({ opens: 30, closes: 60, duration: 250, shift: -4 })).toEqual({ opens: 24, closes: 46 });
  });

  it('refuses a duration of a whole cycle or more, naming the key', () => {
    const d = baseCase();
    d.exhaust.duration = 720;
    const r = validateCase(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ path: 'exhaust.duration' });
  });
});
