/**
 * Builds a core PointResult around a synthetic valve-end pressure trace, so
 * the pure analysis functions can be tested without running the simulation.
 * Only the fields the analysis reads carry meaning; the rest are neutral.
 */
import type { EngineModel, PointResult } from '../../src/core/model.js';

export interface FakeOptions {
  rpm?: number;
  runnerLength?: number;
  soundSpeed?: number;
  ivo?: number;
  ivc?: number;
  /** upstream (plenum) pressure trace; default constant 101325 */
  plenum?: (theta: number) => number;
}

export function fakeResult(pressure: (theta: number) => number, o: FakeOptions = {}): PointResult {
  const n = 720;
  const crank = new Float64Array(n);
  const valvePressure = new Float64Array(n);
  const plenumPressure = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    crank[i] = i;
    valvePressure[i] = pressure(i);
    plenumPressure[i] = o.plenum ? o.plenum(i) : 101325;
  }
  const ivo = o.ivo ?? 690;
  const ivc = o.ivc ?? 240;
  const zeros = (): Float64Array => new Float64Array(n);
  return {
    rpm: o.rpm ?? 6000,
    converged: true,
    cycles: 5,
    deliveredMass: 4e-4,
    inletMass: 4e-4,
    massImbalance: 0,
    referenceMass: 5e-4,
    volumetricEfficiency: 0.8,
    trappedMass: 4.2e-4,
    residualFraction: 0.05,
    ivcPressure: 100000,
    valvePressureAtIvo: pressure(ivo),
    valvePressureAtIvc: pressure(ivc),
    peakReverseFlow: 0,
    meanSoundSpeed: o.soundSpeed ?? 340,
    runnerLength: o.runnerLength ?? 0.3,
    events: { ivo, ivc, evo: 500, evc: 10 },
    history: [4e-4],
    stats: { nodes: 20, steps: 1000, scheme: 'characteristics' },
    trace: {
      crank,
      valvePressure,
      valveFlow: zeros(),
      cylinderPressure: zeros(),
      cylinderMass: zeros(),
      lift: zeros(),
      exhaustLift: zeros(),
      inletFlow: zeros(),
      plenumPressure,
      exhaustPortPressure: zeros(),
    },
    runnerMap: { x: new Float64Array(2), pressure: new Float64Array(1440) },
    pipes: [],
  };
}

/** an invented single-cylinder model for the pure tests (not a demo case) */
export function fakeModel(overrides: Partial<EngineModel> = {}): EngineModel {
  const cd = [
    { x: 0, y: 0.6 },
    { x: 0.3, y: 0.6 },
  ];
  return {
    name: 'test single',
    engine: { bore: 0.086, stroke: 0.086, rod: 0.1435, compressionRatio: 10 },
    ambient: { pressure: 101325, temperature: 293.15 },
    intake: { count: 2, diameter: 0.033, maxLift: 0.0095, openAngle: 690, closeAngle: 240, cdTable: cd },
    exhaust: {
      count: 2,
      diameter: 0.028,
      maxLift: 0.009,
      openAngle: 490,
      closeAngle: 10,
      cdTable: cd,
      backPressure: 105000,
      gasTemperature: 1000,
    },
    runner: {
      sections: [{ length: 0.3, diameterStart: 0.04, diameterEnd: 0.04 }],
      wallTemperature: 293.15,
      friction: 0.005,
      heatTransfer: true,
      entryLoss: 0,
    },
    inlet: { kind: 'ambient' },
    rpm: 6000,
    numerics: { meshSize: 0.02, courant: 0.9, maxCycles: 20, tolerance: 1e-4, scheme: 'characteristics' },
    ...overrides,
  };
}
