/**
 * Single-zone cylinder: mass and energy balance of an ideal gas in the
 * slider-crank volume V(θ), with the enthalpy of whatever flows in, p·dV
 * work and optional wall heat transfer.
 *
 *   dm/dt = Σ ṁ_k,   d(m·cv·T)/dt = Σ H_k − p·dV/dt + Q̇,   p = m·R·T/V
 *
 * ṁ_k > 0 into the cylinder; H_k = ṁ_k·cp·T0 of the gas that moves (the
 * source's stagnation temperature on inflow, the cylinder's own T on outflow).
 * One step of length dt is split symmetrically (Strang splitting, second
 * order in dt; Strang 1968, SIAM J. Numer. Anal. 5:506): the volume change
 * V₀ → V(θ_mid) as an isentropic compression or expansion (exact for the
 * adiabatic closed part), then the flows (taken at mid-step) and the heat
 * transfer at constant volume, then V(θ_mid) → V₁ isentropically. Without a
 * mid-step angle the older first-order split is used: flows at V₀, then
 * V₀ → V₁, then heat transfer.
 *
 * `predict` gives the state at mid-step that the connectors solve against:
 * the flows of the previous step carried over half a step (a first-order
 * estimate of the mid-step state, enough for a second-order step), and the
 * pressure's sensitivity to the internal energy there.
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
   * the heat transfer's mean piston speed; θ_mid [deg] the crank angle at
   * mid-step (symmetric split; omitted: first-order split).
   */
  advance(dt: number, theta1: number, massIn: number, enthalpyIn: number, burnedIn: number, rpm: number, thetaMid?: number): void {
    const v1 = cylinderVolume(theta1, this.geometry);
    const m = this.mass + massIn * dt;
    this.burned = Math.min(m, Math.max(0, this.burned + burnedIn * dt));
    let T: number;
    if (thetaMid !== undefined) {
      const vm = cylinderVolume(thetaMid, this.geometry);
      // V0 → Vmid isentropic, flows at Vmid, heat at Vmid, Vmid → V1 isentropic
      const T1 = this.temperature * Math.pow(this.volume / vm, GAMMA - 1);
      T = (this.mass * CV * T1 + enthalpyIn * dt) / (m * CV);
      if (this.wallTemperature !== undefined) {
        this.heat(dt, thetaMid, m, T, vm, rpm);
        T += this.dT;
      }
      T *= Math.pow(vm / v1, GAMMA - 1);
    } else {
      const U = this.mass * CV * this.temperature + enthalpyIn * dt;
      T = U / (m * CV);
      T *= Math.pow(this.volume / v1, GAMMA - 1);
      if (this.wallTemperature !== undefined) {
        this.heat(dt, theta1, m, T, v1, rpm);
        T += this.dT;
      }
    }
    this.mass = m;
    this.volume = v1;
    this.temperature = T;
    this.pressure = (m * R_AIR * T) / v1;
  }

  /**
   * Mid-step state [p, T into `out`] after dt/2 of the flows massIn, enthalpyIn
   * (the previous step's) and the volume change to θ_mid; the state itself is
   * not changed.
   */
  predict(dt: number, thetaMid: number, massIn: number, enthalpyIn: number, out: { pressure: number; temperature: number; perEnergy: number }): void {
    const h = 0.5 * dt;
    const vm = cylinderVolume(thetaMid, this.geometry);
    const iso = Math.pow(this.volume / vm, GAMMA - 1);
    let m = this.mass + massIn * h;
    if (!(m > 0)) m = this.mass;
    let T = (this.mass * CV * this.temperature + enthalpyIn * h) / (m * CV);
    if (!(T > 0)) T = this.temperature;
    T *= iso;
    out.temperature = T;
    out.pressure = (m * R_AIR * T) / vm;
    // p = (γ−1)·U′·(V₀/V_mid)^(γ−1)/V_mid whatever the mass: ∂p/∂U′ [1/m³]
    out.perEnergy = ((GAMMA - 1) * iso) / vm;
  }

  /** temperature change of the last `heat` [K] (a field: no number boxed per call) */
  private dT = 0;

  /** temperature change [K] from Woschni heat transfer over dt at crank angle θ, mass m, temperature T, volume v, into dT */
  private heat(dt: number, theta: number, m: number, T: number, v: number, rpm: number): void {
    const g = this.geometry;
    const p = (m * R_AIR * T) / v;
    const sp = (2 * g.stroke * rpm) / 60;
    const h = 3.26 * Math.pow(g.bore, -0.2) * Math.pow(p / 1000, 0.8) * Math.pow(T, -0.55) * Math.pow(6.18 * sp, 0.8);
    const q = h * cylinderSurface(theta, g) * ((this.wallTemperature as number) - T) * dt;
    this.dT = q / (m * CV);
  }
}
