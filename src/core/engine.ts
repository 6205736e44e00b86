/**
 * The crank-angle stepper: one operating point of the single-cylinder intake
 * tract, cycle after cycle until periodic.
 *
 * Network (flows positive in the direction named):
 *   ambient ─(feed nozzle)→ plenum ─(open end)→ runner ─(intake valve)→ cylinder ←(exhaust valve)─ exhaust reservoir
 * (without a plenum the runner's upstream end opens to the ambient).
 *
 * Time: θ advances at 6·N deg/s. Each sub-step is the runner's CFL step
 * dt = C·dx/max(|u| + a); the step is shortened only to land on the end of a
 * cycle. Per step: (1) each runner end gets the arriving wave, (2) the
 * boundaries are solved against the reservoirs' present states (valve areas
 * at mid-step), (3) the cylinder and plenum are advanced with exactly the mass
 * and enthalpy flows the boundaries report, (4) the runner is advanced.
 * Samples are taken at every whole crank degree (linear interpolation within
 * the step for scalars).
 *
 * Cycle: starts at exhaust-stroke BDC (θ = 540) with the cylinder set to the
 * exhaust back pressure and gas temperature, all burned gas; runs through
 * exhaust, overlap, intake, compression and expansion back to θ = 540. The
 * runner and plenum states carry over. Converged when the relative change of
 * the delivered mass between cycles is below the tolerance.
 */
import { CP, R_AIR, GAMMA } from './gas.js';
import { reservoirFlow } from './flow.js';
import { Cylinder } from './cylinder.js';
import { Plenum } from './plenum.js';
import { OpenEnd } from './boundary/open.js';
import { RestrictedEnd } from './boundary/restricted.js';
import { newEndState, type Incoming, type Reservoir } from './boundary/types.js';
import { buildMesh, totalLength } from './pipe/mesh.js';
import { createPipeScheme } from './pipe/factory.js';
import { effectiveArea, valveLift } from './valve.js';
import { sweptVolume } from './kinematics.js';
import type { EngineModel, PointResult, RunnerSection, ValveEvents } from './model.js';

/** State to start a point from, e.g. the converged state of a neighbouring speed. Plain data. */
export interface WarmStart {
  pressure: number[];
  velocity: number[];
  temperature: number[];
  plenum?: { pressure: number; temperature: number };
}

export interface SimulateOptions {
  warmStart?: WarmStart;
  /** called after each cycle with its number and delivered mass [kg] */
  onCycle?: (cycle: number, deliveredMass: number) => void;
  /** points along the runner in the space–time map (default 40) */
  mapPoints?: number;
}

export class SimulationError extends Error {
  constructor(
    readonly code: 'diverged' | 'invalid',
    message: string,
  ) {
    super(message);
    this.name = 'SimulationError';
  }
}

const CYCLE_START = 540;

function mod720(x: number): number {
  return ((x % 720) + 720) % 720;
}

/** value of a per-degree (720) array at a fractional crank angle */
function atAngle(arr: Float64Array, theta: number): number {
  const t = mod720(theta);
  const i = Math.floor(t);
  const f = t - i;
  return arr[i % 720]! * (1 - f) + arr[(i + 1) % 720]! * f;
}

export function simulatePoint(model: EngineModel, options: SimulateOptions = {}): { result: PointResult; warmStart: WarmStart } {
  const { engine, ambient, intake, exhaust, runner, numerics, rpm } = model;
  if (!(rpm > 0)) throw new SimulationError('invalid', `rpm must be positive (got ${rpm})`);
  if (!(numerics.courant > 0 && numerics.courant <= 1)) {
    // beyond 1 the feet of the characteristics leave the neighbouring cell (CFL condition)
    throw new SimulationError('invalid', `numerics.courant must be in (0, 1], got ${numerics.courant} (scheme ${numerics.scheme}, ${rpm} rpm)`);
  }
  const delta = openEndCorrection(model);
  const mesh = buildMesh(withEndCorrection(runner.sections, delta), numerics.meshSize);
  const scheme = createPipeScheme(numerics.scheme, mesh, {
    friction: runner.friction,
    heatTransfer: runner.heatTransfer,
    wallTemperature: runner.wallTemperature,
  });
  const n = mesh.n;
  const amb: Reservoir = { pressure: ambient.pressure, temperature: ambient.temperature };
  const exh: Reservoir = { pressure: exhaust.backPressure, temperature: exhaust.gasTemperature };
  const plenum =
    model.inlet.kind === 'plenum'
      ? new Plenum(model.inlet.volume, model.inlet.feedCd * (Math.PI / 4) * model.inlet.feedDiameter ** 2, amb)
      : undefined;
  const inletEnd = new OpenEnd(plenum ?? amb, runner.entryLoss);
  const cyl = new Cylinder(engine, engine.wallTemperature);
  const valveEnd = new RestrictedEnd(cyl);

  const warm = options.warmStart;
  if (warm && warm.pressure.length === n) {
    scheme.setState(warm.pressure, warm.velocity, warm.temperature);
    if (plenum && warm.plenum) plenum.reset(warm.plenum.pressure, warm.plenum.temperature);
  } else scheme.fill(ambient.pressure, 0, ambient.temperature);

  const mapPoints = Math.max(2, Math.min(n, options.mapPoints ?? 40));
  const mapX = new Float64Array(mapPoints);
  const mapIdx = new Float64Array(mapPoints);
  const physical = mesh.length - delta;
  for (let j = 0; j < mapPoints; j++) {
    mapX[j] = (j * physical) / (mapPoints - 1);
    mapIdx[j] = Math.min(n - 1, (delta + mapX[j]!) / mesh.dx);
  }

  // per-degree traces, indexed by θ (0..719)
  const tr = {
    valvePressure: new Float64Array(720),
    valveFlow: new Float64Array(720),
    cylinderPressure: new Float64Array(720),
    cylinderMass: new Float64Array(720),
    lift: new Float64Array(720),
    exhaustLift: new Float64Array(720),
    inletFlow: new Float64Array(720),
    plenumPressure: new Float64Array(720),
  };
  const burnedTrace = new Float64Array(720);
  const mapP = new Float64Array(720 * mapPoints);
  const sp = new Float64Array(n);
  const su = new Float64Array(n);
  const sT = new Float64Array(n);

  const incL: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const incR: Incoming = { lambda: 0, entropy: 0, area: 0 };
  const endL = newEndState();
  const endR = newEndState();

  const degPerSec = 6 * rpm;
  const refMass = (ambient.pressure / (R_AIR * ambient.temperature)) * sweptVolume(engine);
  const history: number[] = [];
  let steps = 0;
  let converged = false;
  let delivered = 0;
  let inletMass = 0;
  let peakReverse = 0;
  let soundSum = 0;
  let cycles = 0;
  let valveP = ambient.pressure;

  for (let cycle = 1; cycle <= numerics.maxCycles; cycle++) {
    cycles = cycle;
    cyl.reset(CYCLE_START, exhaust.backPressure, exhaust.gasTemperature);
    delivered = 0;
    inletMass = 0;
    peakReverse = 0;
    soundSum = 0;
    let revertBurned = 0; // burned gas pushed back into the runner, waiting to return
    let phi = 0; // degrees into the cycle
    let nextMark = 0;
    // sample at φ = 0
    let prevValveP = valveP;
    let prevCylP = cyl.pressure;
    let prevCylM = cyl.mass;
    let prevBurned = cyl.burned;
    let prevPlenum = plenum ? plenum.pressure : amb.pressure;
    while (phi < 720) {
      let dt = scheme.maxStableDt(numerics.courant);
      if (!(dt > 0) || !Number.isFinite(dt)) throw diverged(model, cycle, phi, 'the CFL time step is not finite');
      let dphi = dt * degPerSec;
      if (phi + dphi > 720) {
        dphi = 720 - phi;
        dt = dphi / degPerSec;
      }
      const theta0 = CYCLE_START + phi;
      const thetaMid = mod720(theta0 + 0.5 * dphi);
      const theta1 = theta0 + dphi;

      scheme.incoming('left', dt, incL);
      scheme.incoming('right', dt, incR);
      inletEnd.solve(incL, endL);
      const liftI = valveLift(intake, thetaMid);
      valveEnd.area = effectiveArea(intake, liftI);
      valveEnd.solve(incR, endR);

      // intake valve: flow out of the runner's right end enters the cylinder
      const mIv = endR.massFlow;
      const hIv = endR.enthalpyFlow;
      const liftE = valveLift(exhaust, thetaMid);
      const aEx = effectiveArea(exhaust, liftE);
      const mEx = aEx > 0 ? reservoirFlow(aEx, exh.pressure, exh.temperature, cyl.pressure, cyl.temperature) : 0;
      const hEx = mEx >= 0 ? mEx * CP * exh.temperature : mEx * CP * cyl.temperature;
      const burnedFrac = cyl.mass > 0 ? cyl.burned / cyl.mass : 1;
      let burnedIn = mEx >= 0 ? mEx : mEx * burnedFrac;
      if (mIv < 0) {
        revertBurned += -mIv * dt * burnedFrac;
        burnedIn += mIv * burnedFrac;
        if (-mIv > peakReverse) peakReverse = -mIv;
      } else if (revertBurned > 0) {
        const b = Math.min(revertBurned, mIv * dt);
        revertBurned -= b;
        burnedIn += b / dt;
      }
      cyl.advance(dt, theta1, mIv + mEx, hIv + hEx, burnedIn, rpm);
      scheme.step(dt, endL, endR);
      if (plenum) plenum.advance(dt, endL.massFlow, endL.enthalpyFlow);
      delivered += mIv * dt;
      inletMass -= endL.massFlow * dt;
      valveP = endR.pressure;
      steps++;

      if (!Number.isFinite(cyl.pressure) || !(cyl.pressure > 0) || !Number.isFinite(valveP) || !(valveP > 0)) {
        throw diverged(model, cycle, phi + dphi, 'non-finite or negative pressure');
      }
      if ((steps & 63) === 0 && !scheme.healthy()) throw diverged(model, cycle, phi + dphi, 'runner state went non-finite or negative');

      // whole-degree samples inside (φ, φ + dφ]
      const phiEnd = phi + dphi;
      while (nextMark <= phiEnd && nextMark < 720) {
        const f = dphi > 0 ? Math.min(1, Math.max(0, (nextMark - phi) / dphi)) : 1;
        const j = (CYCLE_START + nextMark) % 720;
        tr.valvePressure[j] = prevValveP + f * (valveP - prevValveP);
        tr.cylinderPressure[j] = prevCylP + f * (cyl.pressure - prevCylP);
        tr.cylinderMass[j] = prevCylM + f * (cyl.mass - prevCylM);
        burnedTrace[j] = prevBurned + f * (cyl.burned - prevBurned);
        const pl = plenum ? plenum.pressure : amb.pressure;
        tr.plenumPressure[j] = prevPlenum + f * (pl - prevPlenum);
        tr.valveFlow[j] = mIv;
        tr.inletFlow[j] = -endL.massFlow;
        tr.lift[j] = valveLift(intake, j);
        tr.exhaustLift[j] = valveLift(exhaust, j);
        scheme.sample(sp, su, sT);
        let asum = 0;
        for (let i = 0; i < n; i++) asum += Math.sqrt(GAMMA * R_AIR * sT[i]!);
        soundSum += asum / n;
        for (let k = 0; k < mapPoints; k++) {
          const pos = mapIdx[k]!;
          const i0 = Math.min(n - 2, Math.floor(pos));
          const w = pos - i0;
          mapP[j * mapPoints + k] = sp[i0]! * (1 - w) + sp[i0 + 1]! * w;
        }
        nextMark++;
      }
      prevValveP = valveP;
      prevCylP = cyl.pressure;
      prevCylM = cyl.mass;
      prevBurned = cyl.burned;
      prevPlenum = plenum ? plenum.pressure : amb.pressure;
      phi = phiEnd;
    }
    history.push(delivered);
    options.onCycle?.(cycle, delivered);
    if (cycle >= 3) {
      const prev = history[history.length - 2]!;
      if (Math.abs(delivered - prev) <= numerics.tolerance * Math.max(Math.abs(delivered), 1e-12)) {
        converged = true;
        break;
      }
    }
  }

  const events: ValveEvents = {
    ivo: mod720(intake.openAngle),
    ivc: mod720(intake.closeAngle),
    evo: mod720(exhaust.openAngle),
    evc: mod720(exhaust.closeAngle),
  };
  const trappedMass = atAngle(tr.cylinderMass, events.ivc);
  const burnedAtIvc = atAngle(burnedTrace, events.ivc);
  const crank = new Float64Array(720);
  for (let j = 0; j < 720; j++) crank[j] = j;

  scheme.sample(sp, su, sT);
  const warmStart: WarmStart = {
    pressure: Array.from(sp),
    velocity: Array.from(su),
    temperature: Array.from(sT),
    ...(plenum ? { plenum: { pressure: plenum.pressure, temperature: plenum.temperature } } : {}),
  };

  const result: PointResult = {
    rpm,
    converged,
    cycles,
    deliveredMass: delivered,
    inletMass,
    massImbalance: delivered !== 0 ? (inletMass - delivered) / delivered : 0,
    referenceMass: refMass,
    volumetricEfficiency: delivered / refMass,
    trappedMass,
    residualFraction: trappedMass > 0 ? burnedAtIvc / trappedMass : 0,
    ivcPressure: atAngle(tr.cylinderPressure, events.ivc),
    valvePressureAtIvo: atAngle(tr.valvePressure, events.ivo),
    valvePressureAtIvc: atAngle(tr.valvePressure, events.ivc),
    peakReverseFlow: peakReverse,
    meanSoundSpeed: soundSum / 720,
    runnerLength: totalLength(runner.sections),
    events,
    history,
    stats: { nodes: n, steps, scheme: scheme.name },
    trace: { crank, ...tr },
    runnerMap: { x: mapX, pressure: mapP },
  };
  return { result, warmStart };
}

/** the open-end correction [m] the runner is extended by (RunnerModel.endCorrection) */
export function openEndCorrection(model: EngineModel): number {
  const first = model.runner.sections[0];
  if (model.runner.endCorrection !== undefined) return Math.max(0, model.runner.endCorrection);
  return first ? 0.6133 * (first.diameterStart / 2) : 0;
}

/** the runner's sections with a straight virtual extension of length δ at the upstream end */
export function withEndCorrection(sections: readonly RunnerSection[], delta: number): RunnerSection[] {
  const first = sections[0];
  if (!first || !(delta > 0)) return [...sections];
  return [{ length: delta, diameterStart: first.diameterStart, diameterEnd: first.diameterStart }, ...sections];
}

function diverged(model: EngineModel, cycle: number, phi: number, what: string): SimulationError {
  const theta = Math.round(mod720(CYCLE_START + phi));
  return new SimulationError(
    'diverged',
    `the solver diverged (${what}) at ${model.rpm} rpm, cycle ${cycle}, crank ${theta}°; ` +
      `runner ${(totalLength(model.runner.sections) * 1000).toFixed(0)} mm, mesh ${(model.numerics.meshSize * 1000).toFixed(1)} mm, ` +
      `courant ${model.numerics.courant}, scheme ${model.numerics.scheme}`,
  );
}
