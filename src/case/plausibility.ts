/**
 * Physical plausibility of a validated engine case: values the schema
 * accepts as numbers of the right kind but that no engine meets, so a result
 * computed from them would be printed as an answer while meaning nothing
 * (an exhaust back pressure of 10 MPa gives ηv −325 %; an ambient of 1 Pa
 * gives −5463 %). These are refused unless the user asks for them with
 * `--allow-extreme` (research, a deliberately absurd lesson).
 *
 * The ranges are the trade's working ranges (common practice unless a
 * source is named), wide on purpose: they catch a slip (a missing unit, a
 * misplaced decimal point), not an unusual engine.
 *
 * Pure: no I/O. Each issue names the field path and says what is wrong.
 */
import type { Case, CaseIssue } from './schema.js';

export interface Range {
  min: number;
  max: number;
}

/** working ranges, model units (Pa, K, -) */
export const PLAUSIBLE = {
  /**
   * air an engine breathes: 30 kPa is the standard atmosphere near 9 km
   * (U.S. Standard Atmosphere 1976, value from memory), 150 kPa is above any
   * natural sea-level pressure (a boosted supply belongs in its own key)
   */
  ambientPressure: { min: 30e3, max: 150e3 },
  /** −60 °C to +60 °C: beyond the coldest and hottest air engines are run in (common practice) */
  ambientTemperature: { min: 213.15, max: 333.15 },
  /** behind an exhaust valve: from a strong scavenging pulse to a turbocharger's turbine inlet (common practice) */
  backPressure: { min: 30e3, max: 400e3 },
  /** exhaust gas at the valve: from a cold engine motored to the hottest spark-ignition exhaust (common practice) */
  exhaustGasTemperature: { min: 300, max: 1500 },
  /** a runner's or cylinder's wall: from a cold start in frost to a glowing port (common practice) */
  wallTemperature: { min: 213.15, max: 800 },
  /** compression ratio: below 3 nothing runs, above 25 is past every diesel (common practice) */
  compressionRatio: { min: 3, max: 25 },
  /** valves of one kind per cylinder (common practice: up to three intake and two exhaust) */
  valves: { min: 1, max: 4 },
  /** peak lift over head diameter (common practice: about 0.25–0.35; past 0.5 the curtain is no longer what limits) */
  liftOverDiameter: { min: 0, max: 0.5 },
} as const satisfies Record<string, Range>;

/**
 * the part of the bore area all valve heads together may cover. The largest
 * four-valve racing heads reach about 60 % (common practice; two equal heads
 * side by side in a flat roof fit at most 50 %, inclined valves in a pent
 * roof allow more); the limit is set a little above, so no real head is
 * refused.
 */
export const VALVE_AREA_FRACTION = 0.65;

function kPa(v: number): string {
  return `${Number((v / 1000).toPrecision(4))} kPa`;
}
function K(v: number): string {
  return `${Number(v.toPrecision(5))} K (${Number((v - 273.15).toPrecision(4))} °C)`;
}
function plain(v: number): string {
  return String(Number(v.toPrecision(4)));
}

/** total area of the valve heads over the bore area [-] */
export function valveAreaFraction(c: Pick<Case, 'engine' | 'intake' | 'exhaust'>): number {
  const b2 = c.engine.bore ** 2;
  return (c.intake.valves * c.intake.diameter ** 2 + c.exhaust.valves * c.exhaust.diameter ** 2) / b2;
}

/** The values of a case outside the working ranges above (empty: plausible). */
export function plausibilityIssues(c: Case): CaseIssue[] {
  const out: CaseIssue[] = [];
  const check = (path: string, v: number, r: Range, show: (x: number) => string, what: string): void => {
    if (v >= r.min && v <= r.max) return;
    out.push({ path, message: `${show(v)} is outside the range ${what} (${show(r.min)} to ${show(r.max)})` });
  };
  check('ambient.pressure', c.ambient.pressure, PLAUSIBLE.ambientPressure, kPa, 'of the air engines breathe');
  check('ambient.temperature', c.ambient.temperature, PLAUSIBLE.ambientTemperature, K, 'of the air engines breathe');
  check('exhaust.backPressure', c.exhaust.backPressure, PLAUSIBLE.backPressure, kPa, 'an exhaust valve sees');
  check('exhaust.gasTemperature', c.exhaust.gasTemperature, PLAUSIBLE.exhaustGasTemperature, K, 'of exhaust gas at the valve');
  if (c.engine.wallTemperature !== undefined)
    check('engine.wallTemperature', c.engine.wallTemperature, PLAUSIBLE.wallTemperature, K, 'of a cylinder wall');
  if (c.runner.wallTemperature !== undefined)
    check('runner.wallTemperature', c.runner.wallTemperature, PLAUSIBLE.wallTemperature, K, 'of a runner wall');
  check('engine.compressionRatio', c.engine.compressionRatio, PLAUSIBLE.compressionRatio, plain, 'of engines');
  for (const side of ['intake', 'exhaust'] as const) {
    const v = c[side];
    check(`${side}.valves`, v.valves, PLAUSIBLE.valves, plain, 'of valves of one kind per cylinder');
    check(`${side}.maxLift`, v.maxLift / v.diameter, PLAUSIBLE.liftOverDiameter, (x) => `lift/diameter ${plain(x)}`, 'of poppet valves');
  }
  const f = valveAreaFraction(c);
  if (f > VALVE_AREA_FRACTION) {
    const mm = (x: number) => `${Number((x * 1000).toPrecision(4))} mm`;
    out.push({
      path: 'intake.diameter',
      message:
        `the valve heads (${c.intake.valves} × ${mm(c.intake.diameter)} intake, ${c.exhaust.valves} × ${mm(c.exhaust.diameter)} exhaust) ` +
        `cover ${Math.round(f * 100)} % of the bore area; at most about ${VALVE_AREA_FRACTION * 100} % fits in a ${mm(c.engine.bore)} bore (common practice)`,
    });
  }
  return out;
}
