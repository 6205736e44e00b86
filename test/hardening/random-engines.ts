/**
 * Random physically valid engine cases for property tests (fast-check).
 *
 * Each case is raw case-file data, the way a user writes it (unit strings
 * like "86.4 mm", cam-card angles), so a property run also exercises the
 * schema and the unit conversion before the core. Ranges are our own choice
 * of plausible road and race singles (common practice, no source):
 *   bore 50–100 mm; stroke/bore 0.7–1.3; rod/stroke 1.6–2.2; rc 8–14;
 *   intake opens 0–60° BTDC, closes 20–80° ABDC; exhaust opens 30–80° BBDC,
 *   closes 0–50° ATDC; one or two valves per side, head diameters scaled to
 *   the bore so they fit (two intake heads ≈ 0.36–0.42·B, one ≈ 0.45–0.52·B);
 *   lift 0.22–0.32·D; runner 100–600 mm long, 25–50 mm across, possibly
 *   tapered ±15 %; an optional plenum of 1–8 L; 1500–14000 rpm.
 * The mesh is coarse (20 mm) and the cycle cap low (8), to keep runs fast.
 */
import fc from 'fast-check';
import type { SchemeName } from '../../src/core/model.js';

export interface RandomEngine {
  /** raw case data (YAML-shaped, with unit strings) */
  raw: Record<string, unknown>;
  /** a short description for failure messages */
  label: string;
}

const mm = (v: number) => `${v.toFixed(2)} mm`;

/** a double in [min, max], never NaN */
const real = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

export function randomEngine(opts: { meshSize?: number; maxCycles?: number } = {}): fc.Arbitrary<RandomEngine> {
  const meshSize = opts.meshSize ?? 0.02;
  const maxCycles = opts.maxCycles ?? 8;
  return fc
    .record({
      bore: real(50, 100),
      strokeRatio: real(0.7, 1.3),
      rodRatio: real(1.6, 2.2),
      rc: real(8, 14),
      intakeValves: fc.constantFrom(1, 2),
      intakeScale: real(0, 1),
      exhaustScale: real(0.78, 0.9),
      liftRatio: real(0.22, 0.32),
      ivo: real(0, 60),
      ivc: real(20, 80),
      evo: real(30, 80),
      evc: real(0, 50),
      backPressure: real(100, 115),
      gasTemperature: real(700, 1100),
      runnerLength: real(100, 600),
      runnerDiameter: real(25, 50),
      taper: real(-0.15, 0.15),
      tapered: fc.boolean(),
      plenum: fc.option(fc.record({ litres: real(1, 8), feed: real(30, 60) }), { nil: undefined }),
      rpm: fc.integer({ min: 1500, max: 14000 }),
      scheme: fc.constantFrom<SchemeName>('characteristics', 'conservative'),
    })
    .map((r): RandomEngine => {
      const stroke = r.bore * r.strokeRatio;
      const rod = stroke * r.rodRatio;
      // head diameters that fit the bore: two heads side by side, or one big one
      const dIn = r.bore * (r.intakeValves === 2 ? 0.36 + 0.06 * r.intakeScale : 0.45 + 0.07 * r.intakeScale);
      const dEx = dIn * r.exhaustScale;
      const runner: Record<string, unknown> = r.tapered
        ? {
            sections: [
              { length: mm(r.runnerLength * 0.7), diameterStart: mm(r.runnerDiameter * (1 + r.taper)), diameterEnd: mm(r.runnerDiameter) },
              { length: mm(r.runnerLength * 0.3), diameterStart: mm(r.runnerDiameter), diameterEnd: mm(r.runnerDiameter * (1 - r.taper / 2)) },
            ],
          }
        : { length: mm(r.runnerLength), diameter: mm(r.runnerDiameter) };
      const raw: Record<string, unknown> = {
        name: 'random single',
        engine: { bore: mm(r.bore), stroke: mm(stroke), rod: mm(rod), compressionRatio: Number(r.rc.toFixed(2)) },
        ambient: { pressure: '101.325 kPa', temperature: '20 degC' },
        intake: { valves: r.intakeValves, diameter: mm(dIn), maxLift: mm(dIn * r.liftRatio), opens: Number(r.ivo.toFixed(1)), closes: Number(r.ivc.toFixed(1)) },
        exhaust: {
          valves: r.intakeValves,
          diameter: mm(dEx),
          maxLift: mm(dEx * r.liftRatio),
          opens: Number(r.evo.toFixed(1)),
          closes: Number(r.evc.toFixed(1)),
          backPressure: `${r.backPressure.toFixed(2)} kPa`,
          gasTemperature: `${r.gasTemperature.toFixed(0)} K`,
        },
        runner,
        inlet: r.plenum ? { kind: 'plenum', volume: `${r.plenum.litres.toFixed(2)} L`, feedDiameter: mm(r.plenum.feed) } : { kind: 'ambient' },
        rpm: r.rpm,
        numerics: { meshSize: meshSize, maxCycles, scheme: r.scheme },
      };
      const label =
        `B ${r.bore.toFixed(1)} S ${stroke.toFixed(1)} rod ${rod.toFixed(1)} rc ${r.rc.toFixed(1)}, ` +
        `${r.intakeValves}×${dIn.toFixed(1)} mm, IVO ${r.ivo.toFixed(0)} IVC ${r.ivc.toFixed(0)}, ` +
        `runner ${r.runnerLength.toFixed(0)}×${r.runnerDiameter.toFixed(0)}${r.tapered ? ' tapered' : ''}, ` +
        `${r.plenum ? `plenum ${r.plenum.litres.toFixed(1)} L, ` : ''}${r.rpm} rpm, ${r.scheme}`;
      return { raw, label };
    });
}
