/**
 * The volumes of a network (types.ts): 0-D gas stores with one interface.
 *
 * Fixed reservoir (ambient, exhaust back pressure, boost supply): its state
 * never changes; flows into it are counted and dropped.
 *
 * Rigid chamber of volume V (plenum, airbox, resonator cavity, silencer),
 * adiabatic walls, gas at rest, perfectly mixed:
 *   dm/dt = Σ ṁ_k,   d(m·cv·T)/dt = Σ H_k,   p = m·R·T/V
 * ṁ_k > 0 into the chamber, H_k the stagnation enthalpy flow of the gas that
 * moves (cp·T0 of its source). Integrated over the step with the flows the
 * connectors reported, so mass and energy cross every joint exactly.
 *
 * Cylinder: the single-zone cylinder of core/cylinder.ts (slider-crank
 * volume, p·dV work, optional wall heat transfer), fed the same way.
 *
 * Second order in time (explicit midpoint rule): before the connectors solve,
 * `predict(ctx)` moves the state they read (pressure, temperature) to an
 * estimate at mid-step — the previous step's flows carried over dt/2 (and, in
 * the cylinder, the volume change to θ_mid). The connectors' flows are then
 * mid-step flows, and `advance` integrates them over the whole step from the
 * state at the start of the step. An error of O(dt) in the estimate gives an
 * error of O(dt²) in the flows, so the step stays second order; with the
 * state at the start of the step instead (as before) the coupling was first
 * order and ηv converged at order 1 with the mesh.
 */
import { CV, GAMMA, R_AIR } from '../gas.js';
import { Cylinder } from '../cylinder.js';
import type { StepContext, Volume, VolumeSpec } from './types.js';

export class FixedReservoir implements Volume {
  readonly mass = Infinity;
  constructor(
    readonly name: string,
    public pressure: number,
    public temperature: number,
    private readonly burned: number,
  ) {}
  burnedFraction(): number {
    return this.burned;
  }
  readonly midPressurePerEnthalpy = 0;
  addFlow(): void {}
  predict(): void {}
  advance(): void {}
}

export class Chamber implements Volume {
  /** gas mass at the start of the step (after `advance`: at its end) [kg] */
  mass: number;
  burned = 0;
  // state at the start of the step [Pa, K], and the mid-step estimate the connectors read
  private p0: number;
  private T0: number;
  private pMid = 0;
  private TMid = 0;
  private inStep = false;
  private mIn = 0;
  private hIn = 0;
  private bIn = 0;
  // flows of the previous step [kg/s, W]
  private mLast = 0;
  private hLast = 0;
  /** ∂p_mid/∂H [Pa/W] = (γ−1)/V·dt/2 (p = (γ−1)·U/V for the mixed gas at rest) */
  midPressurePerEnthalpy = 0;

  constructor(
    readonly name: string,
    /** [m³] */
    readonly volume: number,
    pressure: number,
    temperature: number,
  ) {
    this.p0 = pressure;
    this.T0 = temperature;
    this.mass = (pressure * volume) / (R_AIR * temperature);
  }

  /** [Pa]: at mid-step between `predict` and `advance`, else the present state */
  get pressure(): number {
    return this.inStep ? this.pMid : this.p0;
  }

  /** [K]: at mid-step between `predict` and `advance`, else the present state */
  get temperature(): number {
    return this.inStep ? this.TMid : this.T0;
  }

  /** set the state (all fresh gas) */
  reset(pressure: number, temperature: number): void {
    this.p0 = pressure;
    this.T0 = temperature;
    this.mass = (pressure * this.volume) / (R_AIR * temperature);
    this.burned = 0;
    this.inStep = false;
    this.mLast = 0;
    this.hLast = 0;
  }

  burnedFraction(): number {
    return this.mass > 0 ? this.burned / this.mass : 0;
  }

  /** internal energy m·cv·T of the gas [J] */
  get internalEnergy(): number {
    return this.mass * CV * this.T0;
  }

  /** set mass [kg] and internal energy [J], keeping the burned fraction (an extrapolated cycle start) */
  setContent(mass: number, internalEnergy: number): void {
    const b = this.burnedFraction();
    this.mass = mass;
    this.T0 = internalEnergy / (mass * CV);
    this.p0 = (mass * R_AIR * this.T0) / this.volume;
    this.burned = b * mass;
    this.inStep = false;
  }

  addFlow(mass: number, enthalpy: number, burned: number): void {
    this.mIn += mass;
    this.hIn += enthalpy;
    this.bIn += burned;
  }

  predict(ctx: StepContext): void {
    const h = 0.5 * ctx.dt;
    this.midPressurePerEnthalpy = ((GAMMA - 1) * h) / this.volume;
    const m = this.mass + this.mLast * h;
    const U = this.mass * CV * this.T0 + this.hLast * h;
    if (m > 0 && U > 0) {
      this.TMid = U / (m * CV);
      this.pMid = (m * R_AIR * this.TMid) / this.volume;
    } else {
      this.TMid = this.T0;
      this.pMid = this.p0;
    }
    this.inStep = true;
  }

  advance(ctx: StepContext): void {
    const dt = ctx.dt;
    const U = this.mass * CV * this.T0 + this.hIn * dt;
    this.mass += this.mIn * dt;
    this.burned = Math.min(this.mass, Math.max(0, this.burned + this.bIn * dt));
    this.T0 = U / (this.mass * CV);
    this.p0 = (this.mass * R_AIR * this.T0) / this.volume;
    this.mLast = this.mIn;
    this.hLast = this.hIn;
    this.inStep = false;
    this.mIn = 0;
    this.hIn = 0;
    this.bIn = 0;
  }
}

export class CylinderVolume implements Volume {
  readonly cylinder: Cylinder;
  private mIn = 0;
  private hIn = 0;
  private bIn = 0;
  // flows of the previous step [kg/s, W]
  private mLast = 0;
  private hLast = 0;
  /** the mid-step estimate the connectors read, valid between `predict` and `advance` */
  private readonly mid = { pressure: 0, temperature: 0, perEnergy: 0 };
  private inStep = false;
  /** ∂p_mid/∂H [Pa/W] */
  midPressurePerEnthalpy = 0;

  constructor(
    readonly name: string,
    geometry: { bore: number; stroke: number; rod: number; compressionRatio: number },
    wallTemperature: number | undefined,
  ) {
    this.cylinder = new Cylinder(geometry, wallTemperature);
  }

  get pressure(): number {
    return this.inStep ? this.mid.pressure : this.cylinder.pressure;
  }
  get temperature(): number {
    return this.inStep ? this.mid.temperature : this.cylinder.temperature;
  }
  get mass(): number {
    return this.cylinder.mass;
  }

  burnedFraction(): number {
    const c = this.cylinder;
    return c.mass > 0 ? c.burned / c.mass : 1;
  }

  addFlow(mass: number, enthalpy: number, burned: number): void {
    this.mIn += mass;
    this.hIn += enthalpy;
    this.bIn += burned;
  }

  predict(ctx: StepContext): void {
    const c = this.cylinder;
    c.predict(ctx.dt, ctx.thetaMid, this.mLast, this.hLast, this.mid);
    // linear in the internal energy after the half-step's flows (Cylinder.predict)
    this.midPressurePerEnthalpy = 0.5 * ctx.dt * this.mid.perEnergy;
    this.inStep = true;
  }

  advance(ctx: StepContext): void {
    this.cylinder.advance(ctx.dt, ctx.theta1, this.mIn, this.hIn, this.bIn, ctx.rpm, this.inStep ? ctx.thetaMid : undefined);
    this.mLast = this.mIn;
    this.hLast = this.hIn;
    this.inStep = false;
    this.mIn = 0;
    this.hIn = 0;
    this.bIn = 0;
  }
}

export function createVolume(spec: VolumeSpec): Volume {
  switch (spec.kind) {
    case 'reservoir':
      return new FixedReservoir(spec.name, spec.pressure, spec.temperature, spec.burned);
    case 'chamber':
      return new Chamber(spec.name, spec.volume, spec.pressure, spec.temperature);
    case 'cylinder':
      return new CylinderVolume(spec.name, spec.geometry, spec.wallTemperature);
  }
}
