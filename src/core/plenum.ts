/**
 * Plenum / airbox: a 0-D volume with mass and energy balance, fed from the
 * ambient through a restriction (throttle body or airbox mouth) and joined to
 * the runner's upstream end, which sees it as the reservoir of an open end.
 *
 *   dm/dt = ṁ_feed + ṁ_runner,   d(m·cv·T)/dt = H_feed + H_runner   (adiabatic)
 *
 * ṁ_feed: quasi-steady nozzle flow through Cd·π·d²/4, positive into the
 * plenum, carrying cp·T of the upstream side; ṁ_runner, H_runner: what the
 * runner's end pushes out of the pipe into the plenum (outward flow of the
 * runner's left end, positive into the plenum).
 */
import { CP, CV, R_AIR } from './gas.js';
import { reservoirFlow } from './flow.js';
import type { Reservoir } from './boundary/types.js';

export class Plenum implements Reservoir {
  pressure: number;
  temperature: number;
  mass: number;
  /** feed flow of the last step [kg/s], positive into the plenum */
  feedFlow = 0;

  constructor(
    public readonly volume: number,
    public readonly feedArea: number,
    public readonly ambient: Reservoir,
  ) {
    this.pressure = ambient.pressure;
    this.temperature = ambient.temperature;
    this.mass = (this.pressure * volume) / (R_AIR * this.temperature);
  }

  reset(pressure: number, temperature: number): void {
    this.pressure = pressure;
    this.temperature = temperature;
    this.mass = (pressure * this.volume) / (R_AIR * temperature);
  }

  /** advance by dt [s] with the runner's flow into the plenum [kg/s] and its enthalpy flow [W] */
  advance(dt: number, runnerFlow: number, runnerEnthalpy: number): void {
    const amb = this.ambient;
    const mf = reservoirFlow(this.feedArea, amb.pressure, amb.temperature, this.pressure, this.temperature);
    this.feedFlow = mf;
    const hf = mf >= 0 ? mf * CP * amb.temperature : mf * CP * this.temperature;
    const U = this.mass * CV * this.temperature + (hf + runnerEnthalpy) * dt;
    this.mass += (mf + runnerFlow) * dt;
    this.temperature = U / (this.mass * CV);
    this.pressure = (this.mass * R_AIR * this.temperature) / this.volume;
  }
}
