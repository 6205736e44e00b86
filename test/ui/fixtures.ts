/**
 * SYNTHETIC fixtures for the terminal-view tests. The traces below are made
 * from simple sine and bump functions so the rendering can be tested without
 * running the solver; they are not physics and no test reads physics from
 * them. A fake case session and a fake engine service wrap them for the Ink
 * tests.
 */
import type { EngineModel, PointResult } from '../../src/core/model.js';
import type { WarmStart } from '../../src/core/engine.js';
import type { CaseSession } from '../../src/ui/case-session.js';
import type { EngineService, PointOutcome, SweepCallbacks, SweepHandle } from '../../src/ui/engine-service.js';
import type { Edit } from '../../src/ui/state.js';
import { FIELDS } from '../../src/ui/fields.js';

export const AMBIENT = 101325;
export const EVENTS = { ivo: 700, ivc: 230, evo: 490, evc: 20 };

export interface SyntheticOptions {
  rpm?: number;
  /** pressure swing at the valve [Pa] */
  amplitude?: number;
  /** period of the synthetic ringing [deg] */
  period?: number;
  /** shift of the synthetic ringing [deg] */
  shift?: number;
  nodes?: number;
  runnerLength?: number;
  volumetricEfficiency?: number;
}

/** A smooth bump 0 → 1 → 0 over `duration` degrees from `open`, zero elsewhere (wrapping). */
export function bump(theta: number, open: number, duration: number): number {
  const phi = (((theta - open) % 720) + 720) % 720;
  if (phi >= duration) return 0;
  return Math.sin((Math.PI * phi) / duration) ** 2;
}

export function syntheticResult(o: SyntheticOptions = {}): PointResult {
  const n = 720;
  const rpm = o.rpm ?? 6000;
  const A = o.amplitude ?? 20000;
  const period = o.period ?? 90;
  const shift = o.shift ?? 0;
  const nodes = o.nodes ?? 20;
  const L = o.runnerLength ?? 0.3;
  const maxLift = 0.009;
  const crank = new Float64Array(n);
  const valvePressure = new Float64Array(n);
  const valveFlow = new Float64Array(n);
  const cylinderPressure = new Float64Array(n);
  const cylinderMass = new Float64Array(n);
  const lift = new Float64Array(n);
  const exhaustLift = new Float64Array(n);
  const inletFlow = new Float64Array(n);
  const plenumPressure = new Float64Array(n).fill(AMBIENT);
  const ring = (theta: number): number => A * Math.sin((2 * Math.PI * (theta - shift)) / period);
  let mass = 5e-5;
  for (let t = 0; t < n; t++) {
    crank[t] = t;
    lift[t] = maxLift * bump(t, EVENTS.ivo, 250);
    exhaustLift[t] = maxLift * bump(t, EVENTS.evo, 250);
    valvePressure[t] = AMBIENT + ring(t);
    // into the cylinder while the intake valve is open, a little back-flow in the overlap
    const l = lift[t] as number;
    valveFlow[t] = l > 0 ? (t >= EVENTS.ivo ? -0.004 : 0.08 * (l / maxLift)) : 0;
    mass = t === 0 ? 5e-5 : Math.max(1e-5, mass + (valveFlow[t] as number) / (6 * rpm));
    cylinderMass[t] = mass;
    cylinderPressure[t] = AMBIENT;
    inletFlow[t] = valveFlow[t] as number;
  }
  // the runner map: the same ringing, arriving later the farther from the valve
  const x = new Float64Array(nodes);
  for (let k = 0; k < nodes; k++) x[k] = (L * k) / (nodes - 1);
  const pressure = new Float64Array(n * nodes);
  for (let t = 0; t < n; t++) {
    for (let k = 0; k < nodes; k++) {
      const delay = 30 * (1 - k / (nodes - 1)); // 30° from valve end to open end
      pressure[t * nodes + k] = AMBIENT + ring(t - delay) * (0.3 + 0.7 * (k / (nodes - 1)));
    }
  }
  const eta = o.volumetricEfficiency ?? 0.95;
  return {
    rpm,
    converged: true,
    cycles: 6,
    deliveredMass: 5e-4 * eta,
    inletMass: 5e-4 * eta,
    massImbalance: 0.001,
    referenceMass: 5e-4,
    volumetricEfficiency: eta,
    trappedMass: 4.8e-4,
    residualFraction: 0.05,
    ivcPressure: 105000,
    valvePressureAtIvo: valvePressure[EVENTS.ivo] as number,
    valvePressureAtIvc: valvePressure[EVENTS.ivc] as number,
    peakReverseFlow: 0.004,
    meanSoundSpeed: 343,
    runnerLength: L,
    events: { ...EVENTS },
    history: [1, 2, 3],
    stats: { nodes, steps: 1000, scheme: 'characteristics' },
    trace: { crank, valvePressure, valveFlow, cylinderPressure, cylinderMass, lift, exhaustLift, inletFlow, plenumPressure, exhaustPortPressure: new Float64Array(n).fill(AMBIENT) },
    runnerMap: { x, pressure },
    pipes: [{ name: 'runner', role: 'runner', label: 'runner: upstream end to valve', length: L, start: 'upstream end', end: 'valve', x, pressure }],
  };
}

/** A plain model for the fake session (values only; nothing simulates it). */
export function syntheticModel(values: Record<string, number>): EngineModel {
  const mm = (v: number | undefined, d: number): number => (v ?? d) / 1000;
  return {
    name: 'Synthetic single',
    engine: { bore: 0.09, stroke: 0.07, rod: 0.12, compressionRatio: 11 },
    ambient: { pressure: (values['ambient.pressure'] ?? 101.325) * 1000, temperature: (values['ambient.temperature'] ?? 20) + 273.15 },
    intake: { count: 2, diameter: 0.034, maxLift: 0.009, openAngle: 700, closeAngle: 230, cdTable: [] },
    exhaust: { count: 2, diameter: 0.028, maxLift: 0.008, openAngle: 490, closeAngle: 20, cdTable: [], backPressure: 105000, gasTemperature: 1000 },
    runner: {
      sections: [{ length: mm(values['runner.length'], 300), diameterStart: mm(values['runner.diameter'], 38), diameterEnd: mm(values['runner.diameter'], 38) }],
      wallTemperature: 320,
      friction: 0.005,
      heatTransfer: true,
      entryLoss: 0.05,
    },
    inlet: { kind: 'ambient' },
    rpm: values['rpm'] ?? 6000,
    numerics: { meshSize: 0.01, courant: 0.9, maxCycles: 20, tolerance: 1e-4, scheme: 'characteristics' },
  };
}

export const START_VALUES: Record<string, number> = {
  rpm: 6000,
  'runner.length': 300,
  'runner.diameter': 38,
  'intake.opens': 20,
  'intake.closes': 50,
  'exhaust.opens': 50,
  'exhaust.closes': 20,
  'ambient.pressure': 101.325,
  'ambient.temperature': 20,
};

/** Parse fake override text ("320 mm", "6250") back to a number. */
function num(text: string): number {
  return Number(text.split(' ')[0]);
}

export interface FakeSession extends CaseSession {
  saved: { edits: readonly Edit[]; path: string; overwrite: boolean }[];
  /** the reports asked for (the fake writes none) */
  reports: { edits: readonly Edit[]; path: string; overwrite: boolean }[];
  existing: Set<string>;
}

export function fakeSession(): FakeSession {
  const saved: FakeSession['saved'] = [];
  const reports: FakeSession['reports'] = [];
  const existing = new Set<string>(['/cases/synthetic-2.yaml']);
  return {
    file: '/cases/synthetic.yaml',
    name: 'Synthetic single',
    fields: FIELDS.filter((f) => START_VALUES[f.path] !== undefined),
    values: { ...START_VALUES },
    sweepPlan: { rpms: [3000, 4000, 5000, 6000, 7000, 8000, 9000], band: { from: 5000, to: 8000 } },
    build(edits) {
      const values = { ...START_VALUES };
      for (const e of edits) {
        const v = num(e.value);
        if (e.path === 'runner.length' && !(v > 0)) {
          const err = new Error(`runner.length: must be positive, got ${e.value}`);
          err.name = 'CaseError';
          throw err;
        }
        values[e.path] = v;
      }
      return syntheticModel(values);
    },
    async suggestSavePath() {
      for (let k = 2; ; k++) {
        const p = `/cases/synthetic-${k}.yaml`;
        if (!existing.has(p)) return p;
      }
    },
    async exists(path) {
      return existing.has(path);
    },
    async save(edits, path, overwrite) {
      saved.push({ edits, path, overwrite });
      existing.add(path);
      return path;
    },
    async suggestReportPath() {
      for (let k = 1; ; k++) {
        const p = `/cases/synthetic-report${k === 1 ? '' : `-${k}`}.html`;
        if (!existing.has(p)) return p;
      }
    },
    async report(edits, path, overwrite) {
      reports.push({ edits, path, overwrite });
      existing.add(path);
      return path;
    },
    saved,
    reports,
    existing,
  };
}

/**
 * A fake engine: answers at once with a synthetic result whose ringing
 * period follows the runner length (a longer runner rings slower) and whose
 * ηv follows the speed, so an edit visibly changes the result.
 */
export function fakeEngine(): EngineService & { runs: EngineModel[] } {
  const runs: EngineModel[] = [];
  const resultFor = (model: EngineModel): PointResult => {
    const L = model.runner.sections[0]?.length ?? 0.3;
    return syntheticResult({
      rpm: model.rpm,
      runnerLength: L,
      period: 90 * (L / 0.3),
      volumetricEfficiency: 0.9 + 0.1 * Math.sin(model.rpm / 2000) + (L - 0.3),
    });
  };
  return {
    runs,
    async runPoint(model: EngineModel, _warm?: WarmStart): Promise<PointOutcome> {
      runs.push(model);
      const result = resultFor(model);
      return {
        result,
        warmStart: { pipes: [], chambers: [] },
        pulse: { verdict: 'synthetic verdict: compression peaks 10° before the valve closes', roundTripDeg: 42, openingNote: 'synthetic opening note' },
      };
    },
    runSweep(model: EngineModel, rpms: readonly number[], cb: SweepCallbacks): SweepHandle {
      let cancelled = false;
      void (async () => {
        for (let k = 0; k < rpms.length; k++) {
          await new Promise((r) => setImmediate(r));
          if (cancelled) return;
          const r = resultFor({ ...model, rpm: rpms[k] as number });
          cb.onPoint(k, r.volumetricEfficiency, true);
        }
        if (!cancelled) cb.onDone();
      })();
      return {
        cancel() {
          cancelled = true;
        },
      };
    },
    async close() {},
  };
}
