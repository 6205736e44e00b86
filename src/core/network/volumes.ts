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
 */
import { CV, R_AIR } from '../gas.js';
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
  addFlow(): void {}
  advance(): void {}
}

export class Chamber implements Volume {
  pressure: number;
  temperature: number;
  mass: number;
  burned = 0;
  private mIn = 0;
  private hIn = 0;
  private bIn = 0;

  constructor(
    readonly name: string,
    /** [m³] */
    readonly volume: number,
    pressure: number,
    temperature: number,
  ) {
    this.pressure = pressure;
    this.temperature = temperature;
    this.mass = (pressure * volume) / (R_AIR * temperature);
  }

  /** set the state (all fresh gas) */
  reset(pressure: number, temperature: number): void {
    this.pressure = pressure;
    this.temperature = temperature;
    this.mass = (pressure * this.volume) / (R_AIR * temperature);
    this.burned = 0;
  }

  burnedFraction(): number {
    return this.mass > 0 ? this.burned / this.mass : 0;
  }

  addFlow(mass: number, enthalpy: number, burned: number): void {
    this.mIn += mass;
    this.hIn += enthalpy;
    this.bIn += burned;
  }

  advance(ctx: StepContext): void {
    const dt = ctx.dt;
    const U = this.mass * CV * this.temperature + this.hIn * dt;
    this.mass += this.mIn * dt;
    this.burned = Math.min(this.mass, Math.max(0, this.burned + this.bIn * dt));
    this.temperature = U / (this.mass * CV);
    this.pressure = (this.mass * R_AIR * this.temperature) / this.volume;
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

  constructor(
    readonly name: string,
    geometry: { bore: number; stroke: number; rod: number; compressionRatio: number },
    wallTemperature: number | undefined,
  ) {
    this.cylinder = new Cylinder(geometry, wallTemperature);
  }

  get pressure(): number {
    return this.cylinder.pressure;
  }
  get temperature(): number {
    return this.cylinder.temperature;
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

  advance(ctx: StepContext): void {
    this.cylinder.advance(ctx.dt, ctx.theta1, this.mIn, this.hIn, this.bIn, ctx.rpm);
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
