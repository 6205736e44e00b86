/**
 * Mutant killed: the discharge coefficient table scaled (Cd × 0.8: ηv −5 to
 * −11 %, which no other check saw).
 *
 * Steady flow through the intake valve at a fixed lift and pressure ratio is
 * Cd(L/D) × curtain area (count·π·D·L, Heywood 1988 §6.3) × the compressible
 * orifice flow per unit area (Heywood 1988, App. C; NACA Report 1135). The
 * orifice example of REFERENCES.md gives that flow per unit area:
 * 14.760 g/s per cm² at p/p0 = 0.9 and 23.917 g/s per cm² choked, from
 * p0 = 101325 Pa, T0 = 293.15 K. The expected flows below are those numbers
 * times the effective area worked out by hand (written beside each).
 */
import { describe, expect, it } from 'vitest';
import { orificeMassFlow } from '../../src/core/flow.js';
import { curtainArea, DEFAULT_CD_TABLE, dischargeCoefficient, effectiveArea } from '../../src/core/valve.js';
import { RestrictedEnd } from '../../src/core/boundary/restricted.js';
import { OpenEnd } from '../../src/core/boundary/open.js';
import { createPipeScheme } from '../../src/core/pipe/factory.js';
import { buildMesh } from '../../src/core/pipe/mesh.js';
import type { ValveModel } from '../../src/core/model.js';
import { drive } from '../support/pipe-driver.js';

/** the demo's intake: two 35 mm heads (invented engine) */
const valve: ValveModel = { count: 2, diameter: 0.035, maxLift: 0.01, openAngle: 690, closeAngle: 240, cdTable: [...DEFAULT_CD_TABLE] };
const P0 = 101325;
const T0 = 293.15;

describe('the default discharge-coefficient table', () => {
  it('is the table the results are pinned with (own regression, no external source; its shape from Heywood 1988 §6.3, numbers from memory)', () => {
    expect(DEFAULT_CD_TABLE.map((p) => [p.x, p.y])).toEqual([
      [0, 0.7],
      [0.05, 0.7],
      [0.1, 0.68],
      [0.15, 0.65],
      [0.2, 0.61],
      [0.25, 0.56],
      [0.3, 0.48],
      [0.35, 0.41],
      [0.4, 0.36],
    ]);
  });
  it('about 0.6–0.7 at low lift, and little effective-area gain past L/D 0.25 (Heywood 1988 §6.3, numbers from memory)', () => {
    for (const ld of [0.02, 0.05, 0.1, 0.15]) {
      expect(dischargeCoefficient(DEFAULT_CD_TABLE, ld)).toBeGreaterThanOrEqual(0.6);
      expect(dischargeCoefficient(DEFAULT_CD_TABLE, ld)).toBeLessThanOrEqual(0.7);
    }
    const at = (ld: number) => dischargeCoefficient(DEFAULT_CD_TABLE, ld) * ld;
    expect(at(0.4) / at(0.25)).toBeLessThan(1.05);
  });
  it('past the table the effective area stops growing: the port throat limits (Heywood 1988 §6.3, from memory): Cd(0.5) = 0.36 · 0.4/0.5 = 0.288', () => {
    expect(dischargeCoefficient(DEFAULT_CD_TABLE, 0.5)).toBeCloseTo(0.288, 9);
    expect(dischargeCoefficient(DEFAULT_CD_TABLE, 0.8)).toBeCloseTo(0.18, 9);
    // and the table is read between its points: half way from L/D 0.2 (0.61) to 0.25 (0.56)
    expect(dischargeCoefficient(DEFAULT_CD_TABLE, 0.225)).toBeCloseTo(0.585, 9);
  });
});

describe('steady flow at a fixed lift and pressure ratio (Heywood 1988 App. C orifice example × Cd × curtain area)', () => {
  it.each([
    // lift 7 mm: L/D 0.2, Cd 0.61; curtain 2·π·35·7 mm² = 15.3938 cm²; Cd·curtain 9.39022 cm²
    ['L/D 0.2, p/p0 0.9', 0.007, 15.3938, 0.9, 9.39022 * 14.76],
    // lift 1.75 mm: L/D 0.05, Cd 0.70; curtain 3.84845 cm²; Cd·curtain 2.69392 cm²
    ['L/D 0.05, p/p0 0.9', 0.00175, 3.84845, 0.9, 2.69392 * 14.76],
    // lift 7 mm choked (p/p0 0.5 < 0.528)
    ['L/D 0.2, choked', 0.007, 15.3938, 0.5, 9.39022 * 23.917],
  ])('%s: %f m lift → the hand value', (_n, lift, curtainCm2, pr, grams) => {
    expect(curtainArea(valve, lift) * 1e4).toBeCloseTo(curtainCm2, 4);
    const flow = orificeMassFlow(effectiveArea(valve, lift), P0, T0, pr * P0) * 1000;
    expect(Math.abs(flow / grams - 1)).toBeLessThan(1e-3);
  });

  it.each(['conservative', 'characteristics'] as const)(
    'through the valve-end boundary of a %s runner fed from the ambient: the same 138.6 g/s within 1 per cent',
    (scheme) => {
      // a short frictionless runner from a reservoir at p0, T0 (bellmouth, no loss) to the valve, behind it 0.9·p0
      const mesh = buildMesh([{ length: 0.2, diameterStart: 0.05, diameterEnd: 0.05 }], 0.005);
      const s = createPipeScheme(scheme, mesh, { friction: 0, heatTransfer: false, wallTemperature: T0 });
      s.fill(P0, 0, T0);
      const inlet = new OpenEnd({ pressure: P0, temperature: T0 }, 0);
      const end = new RestrictedEnd({ pressure: 0.9 * P0, temperature: T0 });
      end.area = effectiveArea(valve, 0.007);
      // settle for 60 ms, then average the flow out of the valve end over the next 20 ms
      let m = 0;
      let time = 0;
      drive(s, inlet, end, 0.08, (t, dt, _l, r) => {
        if (t > 0.06) {
          m += r.massFlow * dt;
          time += dt;
        }
      });
      expect(Math.abs((m / time) * 1000 / (9.39022 * 14.76) - 1)).toBeLessThan(0.01);
    },
  );
});
