/**
 * Single-zone cylinder: mass and energy balance of an ideal gas in the
 * slider-crank volume V(θ), with the enthalpy of whatever flows in, p·dV
 * work and optional wall heat transfer.
 *
 *   dm/dt = Σ ṁ_k,   d(m·cv·T)/dt = Σ H_k − p·dV/dt + Q̇,   p = m·R·T/V
 *
 * ṁ_k > 0 into the cylinder; H_k = ṁ_k·cp·T0 of the gas that moves (the
 * source's stagnation temperature on inflow, the cylinder's own T on outflow).
 * One step of length dt is split: flows at constant volume, then the volume
 * change V₀ → V₁ as an isentropic compression or expansion (exact for the
 * adiabatic closed part), then heat transfer.
 *
 * Composition: `burned` is the mass of residual (burned) gas; inflow from the
 * exhaust side is burned, inflow from the intake is fresh except gas that was
 * pushed back into the runner earlier (tracked by the stepper), outflow takes
 * the mixture.
 *
 * Heat transfer (optional, when a wall temperature is given): Woschni's
 * correlation for the gas-exchange period, h = 3.26·B^−0.2·p^0.8·T^−0.55·
 * (6.18·S̄p)^0.8 [W/(m²K), p in kPa] (Heywood 1988, §12.4; constants from memory).
 */
import { CV, GAMMA, R_AIR } from './gas.js';
import { cylinderSurface, cylinderVolume, type EngineGeometry } from './kinematics.js';
import type { Reservoir } from './boundary/types.js';

export class Cylinder implements Reservoir {
  pressure = 0;
  temperature = 0;
  mass = 0;
  burned = 0;
  volume = 0;

  constructor(
    public readonly geometry: EngineGeometry,
    /** wall temperature [K], or undefined for an adiabatic cylinder */
    public readonly wallTemperature: number | undefined,
  ) {}

  /** set the state at crank angle θ [deg] to pressure p [Pa] and temperature T [K], all burned gas */
  reset(thetaDeg: number, p: number, T: number): void {
    this.volume = cylinderVolume(thetaDeg, this.geometry);
    this.pressure = p;
    this.temperature = T;
    this.mass = (p * this.volume) / (R_AIR * T);
    this.burned = this.mass;
  }

  /**
   * Advance by dt [s] from θ0 to θ1 [deg] with the net flow in [kg/s], the
   * enthalpy flow in [W], and the burned part of the net flow [kg/s]; rpm for
   * the heat transfer's mean piston speed.
   */
  advance(dt: number, theta1: number, massIn: number, enthalpyIn: number, burnedIn: number, rpm: number): void {
    const U = this.mass * CV * this.temperature + enthalpyIn * dt;
    const m = this.mass + massIn * dt;
    this.burned = Math.min(m, Math.max(0, this.burned + burnedIn * dt));
    let T = U / (m * CV);
    const v1 = cylinderVolume(theta1, this.geometry);
    T *= Math.pow(this.volume / v1, GAMMA - 1);
    if (this.wallTemperature !== undefined) {
      const g = this.geometry;
      const p = (m * R_AIR * T) / v1;
      const sp = (2 * g.stroke * rpm) / 60;
      const h = 3.26 * Math.pow(g.bore, -0.2) * Math.pow(p / 1000, 0.8) * Math.pow(T, -0.55) * Math.pow(6.18 * sp, 0.8);
      const q = h * cylinderSurface(theta1, g) * (this.wallTemperature - T) * dt;
      T += q / (m * CV);
    }
    this.mass = m;
    this.volume = v1;
    this.temperature = T;
    this.pressure = (m * R_AIR * T) / v1;
  }
}
