/**
 * Flow bench → discharge coefficient, with the compressible orifice equation
 * (core/flow.ts; Heywood 1988, App. C).
 *
 * On a flow bench air is drawn from the room (stagnation state p0, T0)
 * through the port and the valve, held at a lift L, into a box kept at the
 * test depression Δp below the room: the static pressure past the valve is
 * p = p0 − Δp. The ideal mass flow per unit area is
 *
 *   G(p0, T0, p) = p0/√(R·T0) · √(2γ/(γ−1)·(pr^(2/γ) − pr^((γ+1)/γ))),  pr = p/p0
 *
 * (choked below the critical ratio), and the measured mass flow ṁ gives
 *
 *   Cd  = ṁ / (G · n·π·D·L)          on the curtain area (the model's table: x = L/D)
 *   Cdv = ṁ / (G · n·π·D²/4)         on the valve head area
 *
 * for n valves of head diameter D flowed together. A volume flow Q read at
 * the bench's upstream state is the mass flow ṁ = ρ0·Q, ρ0 = p0/(R·T0).
 *
 * Units: [m], [Pa], [K], [kg/s], [m³/s].
 */
import { R_AIR } from './gas.js';
import { orificeMassFlow } from './flow.js';

export interface BenchSetup {
  /** valve head diameter D [m] */
  diameter: number;
  /** valves flowed together n (default 1) */
  valves: number;
  /** room (upstream stagnation) pressure p0 [Pa] */
  pressure: number;
  /** room temperature T0 [K] */
  temperature: number;
  /** test depression Δp below p0 [Pa] */
  testPressure: number;
}

export interface BenchPoint {
  /** valve lift [m] */
  lift: number;
  /** L/D [-] */
  ld: number;
  /** mass flow [kg/s] */
  flow: number;
  /** discharge coefficient on the curtain area n·π·D·L */
  cd: number;
  /** discharge coefficient on the valve head area n·π·D²/4 */
  cdValveArea: number;
}

/** ideal mass flow per unit area G [kg/(s·m²)] at the bench's pressures */
export function benchIdealFlux(s: Pick<BenchSetup, 'pressure' | 'temperature' | 'testPressure'>): number {
  return orificeMassFlow(1, s.pressure, s.temperature, s.pressure - s.testPressure);
}

/** mass flow [kg/s] of a volume flow Q [m³/s] at the bench's upstream state */
export function benchMassFlow(volumeFlow: number, s: Pick<BenchSetup, 'pressure' | 'temperature'>): number {
  return (volumeFlow * s.pressure) / (R_AIR * s.temperature);
}

/** One bench reading (lift [m], mass flow [kg/s]) as discharge coefficients. */
export function benchPoint(lift: number, massFlow: number, s: BenchSetup): BenchPoint {
  const g = benchIdealFlux(s);
  const curtain = s.valves * Math.PI * s.diameter * lift;
  const head = (s.valves * Math.PI * s.diameter * s.diameter) / 4;
  return { lift, ld: lift / s.diameter, flow: massFlow, cd: massFlow / (g * curtain), cdValveArea: massFlow / (g * head) };
}
