/**
 * Test engines in code (invented numbers, for tests only): a 450 cc-class
 * single with a straight runner open to the ambient, and variations.
 */
import type { EngineModel } from '../../src/core/model.js';
import { DEFAULT_CD_TABLE } from '../../src/core/valve.js';
import { DEFAULT_SCHEME } from '../../src/core/pipe/factory.js';

export interface FixtureOptions {
  rpm?: number;
  runnerLength?: number;
  runnerDiameter?: number;
  meshSize?: number;
  scheme?: EngineModel['numerics']['scheme'];
  /** intake closing, deg ABDC */
  ivcAbdc?: number;
  /** intake opening, deg BTDC */
  ivoBtdc?: number;
  /** exhaust closing, deg ATDC */
  evcAtdc?: number;
  plenum?: { volume: number; feedDiameter: number };
  maxCycles?: number;
}

export function testEngine(o: FixtureOptions = {}): EngineModel {
  const L = o.runnerLength ?? 0.35;
  const D = o.runnerDiameter ?? 0.038;
  return {
    name: 'test single',
    engine: { bore: 0.094, stroke: 0.065, rod: 0.115, compressionRatio: 12 },
    ambient: { pressure: 101325, temperature: 293.15 },
    intake: {
      count: 2,
      diameter: 0.036,
      maxLift: 0.0095,
      openAngle: (720 - (o.ivoBtdc ?? 30)) % 720,
      closeAngle: 180 + (o.ivcAbdc ?? 60),
      cdTable: [...DEFAULT_CD_TABLE],
    },
    exhaust: {
      count: 2,
      diameter: 0.03,
      maxLift: 0.0085,
      openAngle: 540 - 60,
      closeAngle: (720 + (o.evcAtdc ?? 30)) % 720,
      cdTable: [...DEFAULT_CD_TABLE],
      backPressure: 105000,
      gasTemperature: 900,
    },
    runner: { sections: [{ length: L, diameterStart: D, diameterEnd: D }], wallTemperature: 310, friction: 0.005, heatTransfer: true, entryLoss: 0.05 },
    inlet: o.plenum ? { kind: 'plenum', volume: o.plenum.volume, feedDiameter: o.plenum.feedDiameter, feedCd: 0.8 } : { kind: 'ambient' },
    rpm: o.rpm ?? 6500,
    numerics: { meshSize: o.meshSize ?? 0.01, courant: 0.9, maxCycles: o.maxCycles ?? 30, tolerance: 1e-4, scheme: o.scheme ?? DEFAULT_SCHEME },
  };
}
