import { describe, expect, it } from 'vitest';
import { validateCase } from '../../src/case/schema.js';
import { cardToTheta, thetaToCard, toEngineModel, profileCrossings, widenToZeroLift } from '../../src/case/to-model.js';
import { valveLift, DEFAULT_CD_TABLE } from '../../src/core/valve.js';
import type { ValveModel } from '../../src/core/model.js';
import { baseCase } from './fixture.js';

function model(mut: (d: Record<string, any>) => void = () => {}) {
  const d = baseCase();
  mut(d);
  const r = validateCase(d);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return toEngineModel(r.value);
}

describe('cam card to crank angle θ (0 = gas-exchange TDC, DESIGN §2)', () => {
  // θ = 0 TDC (intake starts), 180 BDC, 360 TDC (firing), 540 BDC: the card's reference points
  it.each([
    // [opens BTDC, closes ABDC, ivo θ, ivc θ]
    [30, 60, 690, 240],
    [0, 0, 0, 180],
    [-5, 40, 5, 220], // opening 5° after TDC
    [45, -10, 675, 170], // closing 10° before BDC
  ])('intake %d° BTDC / %d° ABDC → θ %d / %d', (o, c, ivo, ivc) => {
    const m = model((d) => {
      d.intake.opens = o;
      d.intake.closes = c;
    });
    expect(m.intake.openAngle).toBeCloseTo(ivo, 12);
    expect(m.intake.closeAngle).toBeCloseTo(ivc, 12);
    expect(thetaToCard.intakeOpens(ivo)).toBeCloseTo(o, 12);
    expect(thetaToCard.intakeCloses(ivc)).toBeCloseTo(c, 12);
  });
  it.each([
    // [opens BBDC, closes ATDC, evo θ, evc θ]
    [60, 30, 480, 30],
    [0, 0, 540, 0],
    [40, -5, 500, 715], // closing 5° before TDC
  ])('exhaust %d° BBDC / %d° ATDC → θ %d / %d', (o, c, evo, evc) => {
    expect(cardToTheta.exhaustOpens(o)).toBeCloseTo(evo, 12);
    expect(cardToTheta.exhaustCloses(c)).toBeCloseTo(evc, 12);
    expect(thetaToCard.exhaustOpens(evo)).toBeCloseTo(o, 12);
    expect(thetaToCard.exhaustCloses(evc)).toBeCloseTo(c, 12);
  });
  it('keeps the duration opens + 180 + closes', () => {
    const m = model();
    expect((m.intake.closeAngle - m.intake.openAngle + 720) % 720).toBe(270);
  });
});

describe('case → EngineModel', () => {
  const m = model();
  it('copies geometry in SI and defaults the runner wall to the ambient temperature', () => {
    expect(m.engine).toEqual({ bore: 0.086, stroke: 0.086, rod: 0.1435, compressionRatio: 10 });
    expect(m.runner.sections).toEqual([{ length: 0.3, diameterStart: 0.04, diameterEnd: 0.04 }]);
    expect(m.runner.wallTemperature).toBeCloseTo(293.15, 10);
    expect(m.exhaust).toMatchObject({ backPressure: 105000, gasTemperature: 950, count: 2 });
  });
  it("uses the core's default Cd table unless the case gives one", () => {
    expect(m.intake.cdTable).toEqual(DEFAULT_CD_TABLE);
    const own = model((d) => (d.intake.cdTable = [[0, 0.6], [0.3, 0.5]]));
    expect(own.intake.cdTable).toEqual([{ x: 0, y: 0.6 }, { x: 0.3, y: 0.5 }]);
  });
  it('uses the file name when the case has no name', () => {
    const d = baseCase();
    delete d.name;
    const r = validateCase(d);
    if (!r.ok) throw new Error('invalid');
    expect(toEngineModel(r.value, 'my-engine').name).toBe('my-engine');
  });
});

describe('checking lift: card events widened to the zero-lift ends', () => {
  it('finds where the sin² profile of valve.ts crosses a lift fraction', () => {
    // inverted by hand: lift/Lmax = sin²(πφ) = 1/9 → φ₁ = asin(1/3)/π = 0.108173, φ₂ = 1 − φ₁ = 0.891827
    const c = profileCrossings(undefined, 1 / 9)!;
    expect(c.rise).toBeCloseTo(0.108173, 6);
    expect(c.fall).toBeCloseTo(0.891827, 6);
  });
  it('puts the checking lift exactly at the card angles (round trip through the core lift curve)', () => {
    const m = model((d) => {
      d.intake.checkingLift = '1 mm';
    });
    const card = { open: 690, close: 240 };
    expect(m.intake.openAngle).toBeLessThan(card.open);
    expect(m.intake.closeAngle).toBeGreaterThan(card.close);
    expect(valveLift(m.intake, card.open)).toBeCloseTo(0.001, 9);
    expect(valveLift(m.intake, card.close)).toBeCloseTo(0.001, 9);
  });
  it('works with a lift table too', () => {
    const table = [{ x: 0, y: 0 }, { x: 0.2, y: 0.5 }, { x: 0.8, y: 0.5 }, { x: 1, y: 0 }];
    const w = widenToZeroLift(700, 200, 0.0025, 0.01, table, 'intake.checkingLift');
    const v: ValveModel = { count: 1, diameter: 0.03, maxLift: 0.01, openAngle: w.open, closeAngle: w.close, cdTable: [], liftTable: table };
    // lift fraction 0.25 is reached at φ = 0.1 and 0.9 of this trapezoid: D = 220/0.8 = 275°
    expect((w.close - w.open + 720) % 720).toBeCloseTo(275, 6);
    expect(valveLift(v, 700)).toBeCloseTo(0.0025, 9);
    expect(valveLift(v, 200)).toBeCloseTo(0.0025, 9);
  });
  it('rejects a widening that would exceed a whole cycle', () => {
    expect(() => widenToZeroLift(0, 700, 0.009, 0.01, undefined, 'intake.checkingLift')).toThrow(/intake\.checkingLift.*whole cycle/);
  });
});
