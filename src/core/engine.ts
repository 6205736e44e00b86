/**
 * The crank-angle stepper: one operating point of the single-cylinder engine,
 * cycle after cycle until periodic.
 *
 * The engine is an assembly of parts (network/assemble.ts): pipes (the
 * runner, and when the case has them a snorkel, an exhaust pipe, side
 * resonators), volumes (ambient, plenum, cylinder, exhaust reservoir,
 * resonator cavities) and connectors (open ends, valves, orifices, junctions).
 * This file builds nothing of its own: it keeps the crank, the cycle, the
 * samples and the convergence, and lets network/network.ts advance the
 * assembly one CFL step at a time.
 *
 * Time: θ advances at 6·N deg/s. Each step is the smallest CFL step over all
 * pipes, dt = C·dx/max(|u| + a); it is shortened only to land on the end of a
 * cycle. Samples are taken at every whole crank degree (linear interpolation
 * within the step for scalars).
 *
 * Cycle: with a constant exhaust reservoir it starts at exhaust-stroke BDC
 * (θ = 540) with the cylinder at the exhaust back pressure and gas
 * temperature, all burned gas; with an exhaust pipe (or a release pressure)
 * it starts at exhaust valve opening with the cylinder at the release
 * pressure, so the blowdown runs down the pipe. Either way it runs through
 * exhaust, overlap, intake, compression and expansion back to its start.
 * Pipe and chamber states carry over between cycles. Converged when the
 * relative change of the delivered mass between cycles is below the tolerance.
 */
import { GAMMA, R_AIR } from './gas.js';
import { SimulationError } from './errors.js';
import { totalLength } from './pipe/mesh.js';
import { valveLift } from './valve.js';
import { sweptVolume } from './kinematics.js';
import { Network } from './network/network.js';
import { assembleEngine, runnerEndCorrection, type EngineAssembly } from './network/assemble.js';
import { extendedSections, type Pipe } from './network/pipe.js';
import { Chamber, CylinderVolume } from './network/volumes.js';
import { OpenConnector } from './network/connectors/open.js';
import { RestrictedConnector } from './network/connectors/restricted.js';
import type { CycleTrace, EngineModel, PipeMap, PipeRole, PointResult, RunnerSection, ValveEvents } from './model.js';
import type { StepContext } from './network/types.js';

export { SimulationError };

/** State to start a point from, e.g. the converged state of a neighbouring speed. Plain data. */
export interface WarmStart {
  /** per pipe of the assembly, in its order: per-point pressure [Pa], velocity [m/s], temperature [K] */
  pipes: { pressure: number[]; velocity: number[]; temperature: number[] }[];
  /** per chamber of the assembly, in its order */
  chambers: { pressure: number; temperature: number }[];
}

export interface SimulateOptions {
  warmStart?: WarmStart;
  /** called after each cycle with its number and delivered mass [kg] */
  onCycle?: (cycle: number, deliveredMass: number) => void;
  /** points along each pipe in the space–time maps (default 40) */
  mapPoints?: number;
  /**
   * accelerate the cycle-to-cycle convergence (default true): Aitken's Δ²
   * extrapolation of the chambers' slow filling mode, and a stopping rule that
   * also asks the estimated remaining error to be within the tolerance
   * (see `CycleAccelerator`). false: plain cycling with the plain rule.
   */
  accelerate?: boolean;
}

/**
 * Aitken's Δ² extrapolation of the chambers' content at the cycle start
 * (Aitken 1926, Proc. R. Soc. Edinburgh 46:289; for a linearly converging
 * fixed-point map x_{n+1} = g(x_n) the error shrinks by a factor ρ a cycle and
 * x* ≈ x_n + Δ_n·ρ/(1 − ρ), Δ_n = x_n − x_{n−1}, ρ = Δ_n/Δ_{n−1}).
 *
 * A plenum or airbox fills and warms over tens of cycles (a slow, real mode
 * of the cycle map); the waves in the pipes settle in a few. So the
 * extrapolation acts on each chamber's mass and internal energy, and only
 * when the mode is plainly geometric: two successive ratios of the mass
 * steps agree within 0.1 and lie in (0, 0.97); the jump is capped at 20 % of
 * the content. After a jump a chamber waits three cycles before the next.
 * A chamber that still drifts (remaining drift above half the tolerance)
 * keeps the point from stopping.
 *
 * Stopping rule (safe): with ρ the larger of the last two ratios of
 * successive steps of the delivered mass, the remaining error of a linearly
 * converging sequence is about |Δ|·ρ/(1 − ρ); a point is converged when |Δ|
 * is within the tolerance and that estimate within half of it — in two
 * cycles in a row when ρ is above 0.3 (a fast mode dying out can hide a slow
 * one for a cycle: the gas shut in a closed side tube settles over tens of
 * cycles) — and not within two cycles after a jump. Extrapolating a pipe's whole state the
 * same way was tried and dropped: it disturbed the runner's waves more than
 * it saved. (The plain rule, |Δ| within the
 * tolerance, stops a slowly converging point early: the airbox case at
 * 9000 rpm stopped after 4 cycles 1.5 % off its periodic ηv.)
 */
export class CycleAccelerator {
  private readonly hist: { m: number[]; u: number[]; ratio: number; slow: number }[];
  /** cycles since the last extrapolation */
  sinceJump = 99;

  /** cycles in a row that met the stopping rule */
  private met = 0;

  constructor(private readonly chambers: readonly Chamber[]) {
    this.hist = chambers.map(() => ({ m: [], u: [], ratio: Number.NaN, slow: Number.NaN }));
  }

  /** at the start of a cycle: record each chamber's content and extrapolate where the mode is geometric; true when any chamber jumped */
  atCycleStart(): boolean {
    let jumped = false;
    this.sinceJump++;
    this.chambers.forEach((c, k) => {
      const h = this.hist[k]!;
      h.m.push(c.mass);
      h.u.push(c.internalEnergy);
      if (h.m.length > 3) {
        h.m.shift();
        h.u.shift();
      }
      if (h.m.length < 3) return;
      const [m0, m1, m2] = h.m as [number, number, number];
      const [u0, u1, u2] = h.u as [number, number, number];
      const d1 = m1 - m0;
      const d2 = m2 - m1;
      const ratio = d1 !== 0 ? d2 / d1 : Number.NaN;
      const prev = h.ratio;
      h.ratio = ratio;
      if (!geometric(ratio, prev)) return;
      const e1 = u1 - u0;
      const e2 = u2 - u1;
      const ru = e1 !== 0 ? e2 / e1 : Number.NaN;
      if (!geometric(ru, ratio)) return;
      h.slow = ratio;
      let dm = (d2 * ratio) / (1 - ratio);
      let du = (e2 * ru) / (1 - ru);
      if (Math.abs(dm) > CAP * m2) dm = Math.sign(dm) * CAP * m2;
      if (Math.abs(du) > CAP * u2) du = Math.sign(du) * CAP * u2;
      c.setContent(m2 + dm, u2 + du);
      h.m.length = 0;
      h.u.length = 0;
      h.ratio = Number.NaN;
      jumped = true;
    });
    if (jumped) this.sinceJump = 0;
    return jumped;
  }

  /**
   * the safe stopping rule over the delivered mass per cycle (history, newest
   * last), and over each chamber's content: its remaining drift
   * |Δm|·ρ/(1 − ρ), with ρ the ratio of its last extrapolation (0.9 before
   * one), within half the tolerance of its mass; met in two cycles in a row
   * where the step ratio is above 0.3 (a slow mode may hide behind it)
   */
  converged(history: readonly number[], tolerance: number): boolean {
    const ok = this.meets(history, tolerance);
    this.met = ok ? this.met + 1 : 0;
    return this.met >= (this.rho > 0.3 ? 2 : 1);
  }

  /** the step ratio the last `meets` used */
  private rho = 0;

  private meets(history: readonly number[], tolerance: number): boolean {
    const n = history.length;
    if (n < 3 || this.sinceJump < 2) return false;
    for (let k = 0; k < this.chambers.length; k++) {
      const h = this.hist[k]!;
      const c = this.chambers[k]!;
      const last = h.m[h.m.length - 1];
      if (last === undefined) return false;
      const rho = h.slow > 0 && h.slow < 1 ? h.slow : 0.9;
      if ((Math.abs(c.mass - last) * rho) / (1 - rho) > 0.5 * tolerance * c.mass) return false;
    }
    const d = history[n - 1]!;
    const a = history[n - 1]! - history[n - 2]!;
    const b = history[n - 2]! - history[n - 3]!;
    const lim = tolerance * Math.max(Math.abs(d), 1e-12);
    if (Math.abs(a) > lim) return false;
    // the larger of the last two step ratios (a ratio that creeps up towards 1 is not missed)
    let rho = b !== 0 ? Math.abs(a / b) : 0;
    if (n >= 4) {
      const c = history[n - 3]! - history[n - 4]!;
      if (c !== 0) rho = Math.max(rho, Math.abs(b / c));
    }
    this.rho = rho;
    if (rho >= 1) return false;
    return (Math.abs(a) * rho) / (1 - rho) <= 0.5 * lim;
  }
}

/** largest jump of an extrapolation, as a fraction of the content */
const CAP = 0.2;

/** a plainly geometric mode: a ratio in (0, 0.97) that agrees with the one before within 0.1 */
function geometric(ratio: number, prev: number): boolean {
  return ratio > 0 && ratio < 0.97 && Math.abs(ratio - prev) < 0.1;
}

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

/** Sampling positions of a map along a chain of pipes (one pipe, or the pieces of the runner). */
class MapProbe {
  readonly x: Float64Array;
  readonly pressure: Float64Array;
  private readonly pipeOf: Int32Array;
  private readonly pos: Float64Array;

  constructor(
    readonly chain: Pipe[],
    points: number,
  ) {
    const nodes = chain.reduce((s, p) => s + p.scheme.mesh.n, 0);
    const m = Math.max(2, Math.min(nodes, points));
    const length = chain.reduce((s, p) => s + p.length, 0);
    this.x = new Float64Array(m);
    this.pos = new Float64Array(m);
    this.pipeOf = new Int32Array(m);
    this.pressure = new Float64Array(720 * m);
    for (let j = 0; j < m; j++) {
      const x = (j * length) / (m - 1);
      this.x[j] = x;
      let start = 0;
      let k = 0;
      while (k < chain.length - 1 && x > start + chain[k]!.length) start += chain[k++]!.length;
      const p = chain[k]!;
      this.pipeOf[j] = k;
      this.pos[j] = Math.min(p.scheme.mesh.n - 1, p.meshX(x - start) / p.scheme.mesh.dx);
    }
  }

  /** record row j (θ) from the pipes' sampled pressures */
  record(j: number, sampled: readonly Float64Array[]): void {
    const m = this.x.length;
    for (let k = 0; k < m; k++) {
      const sp = sampled[this.pipeOf[k]!]!;
      const pos = this.pos[k]!;
      const i0 = Math.min(sp.length - 2, Math.floor(pos));
      const w = pos - i0;
      this.pressure[j * m + k] = sp[i0]! * (1 - w) + sp[i0 + 1]! * w;
    }
  }
}

export function simulatePoint(model: EngineModel, options: SimulateOptions = {}): { result: PointResult; warmStart: WarmStart } {
  const { ambient, intake, exhaust, runner, numerics, rpm } = model;
  if (!(rpm > 0)) throw new SimulationError('invalid', `rpm must be positive (got ${rpm})`);
  if (!(numerics.courant > 0 && numerics.courant <= 1)) {
    // beyond 1 the feet of the characteristics leave the neighbouring cell (CFL condition)
    throw new SimulationError('invalid', `numerics.courant must be in (0, 1], got ${numerics.courant} (scheme ${numerics.scheme}, ${rpm} rpm)`);
  }
  const asm = assembleEngine(model);
  const net = new Network(asm.network);
  const cyl = net.volume(asm.cylinder) as CylinderVolume;
  const cylinder = cyl.cylinder;
  const valve = net.connector(asm.intakeValve) as RestrictedConnector;
  const inlet = net.connector(asm.runnerInlet) as OpenConnector;
  const exhaustValve = net.connector(asm.exhaustValve);
  const exhaustPort = exhaustValve instanceof RestrictedConnector ? exhaustValve : undefined;
  const plenum = asm.plenum !== undefined ? net.volume(asm.plenum) : undefined;
  const chambers = net.volumes.filter((v): v is Chamber => v instanceof Chamber);

  const warm = options.warmStart;
  if (warm && warm.pipes.length === net.pipes.length && warm.pipes.every((w, i) => w.pressure.length === net.pipes[i]!.scheme.mesh.n)) {
    net.pipes.forEach((p, i) => {
      const w = warm.pipes[i]!;
      p.scheme.setState(w.pressure, w.velocity, w.temperature);
    });
    if (warm.chambers.length === chambers.length) chambers.forEach((c, i) => c.reset(warm.chambers[i]!.pressure, warm.chambers[i]!.temperature));
  }

  // sampling buffers per pipe, and the maps
  const sp = net.pipes.map((p) => new Float64Array(p.scheme.mesh.n));
  const su = net.pipes.map((p) => new Float64Array(p.scheme.mesh.n));
  const sT = net.pipes.map((p) => new Float64Array(p.scheme.mesh.n));
  const mapPoints = options.mapPoints ?? 40;
  const runnerPipes = asm.runner.map((n) => net.pipe(n));
  const runnerIdx = runnerPipes.map((p) => net.pipes.indexOf(p));
  const maps: MapOf[] = [{ probe: new MapProbe(runnerPipes, mapPoints), idx: runnerIdx, name: 'runner', role: 'runner', start: 'upstream end', end: 'valve' }];
  for (const s of asm.side) {
    const p = net.pipe(s.name);
    maps.push({ probe: new MapProbe([p], mapPoints), idx: [net.pipes.indexOf(p)], name: s.name, role: s.role, start: s.start, end: s.end });
  }
  if (asm.exhaustPipe !== undefined) {
    const p = net.pipe(asm.exhaustPipe);
    maps.push({ probe: new MapProbe([p], mapPoints), idx: [net.pipes.indexOf(p)], name: asm.exhaustPipe, role: 'exhaust', start: 'valve', end: 'outlet' });
  }
  const chainSampled = maps.map((m) => m.idx.map((i) => sp[i]!));
  const runnerNodes = runnerPipes.reduce((s, p) => s + p.scheme.mesh.n, 0);

  // per-degree traces, indexed by θ (0..719)
  const tr: Traces = {
    valvePressure: new Float64Array(720),
    valveFlow: new Float64Array(720),
    cylinderPressure: new Float64Array(720),
    cylinderMass: new Float64Array(720),
    lift: new Float64Array(720),
    exhaustLift: new Float64Array(720),
    inletFlow: new Float64Array(720),
    plenumPressure: new Float64Array(720),
    exhaustPortPressure: new Float64Array(720),
  };
  const burnedTrace = new Float64Array(720);

  const degPerSec = 6 * rpm;
  const refMass = (ambient.pressure / (R_AIR * ambient.temperature)) * sweptVolume(model.engine);
  const start = asm.cycleStart;
  const firstWhole = Math.ceil(start - 1e-9); // θ of the first sample
  const history: number[] = [];
  let converged = false;
  let cycles = 0;
  const run = new CycleRun({
    model,
    net,
    cylinder,
    valve,
    inlet,
    exhaustPort,
    plenum,
    tr,
    burnedTrace,
    sp,
    su,
    sT,
    runnerIdx,
    runnerNodes,
    probes: maps.map((m) => m.probe),
    chainSampled,
    start,
    firstWhole,
    phi0: Math.max(0, firstWhole - start),
    degPerSec,
    release: asm.release,
  });

  const accel = options.accelerate === false ? undefined : new CycleAccelerator(chambers);
  // Samples (traces, maps, the mean sound speed) are only of use from the
  // cycle the result is taken from, and cost about a third of a point at a
  // 10 mm mesh: a cycle is sampled when the cycle before changed the
  // delivered mass by at most 300 × the tolerance (the last cycles), or it
  // is the last allowed. A point that converges in a cycle that was not
  // sampled runs one more, sampled, and takes its result from that one.
  let sampleNext = false;
  let pending = false;
  for (let cycle = 1; cycle <= numerics.maxCycles; cycle++) {
    cycles = cycle;
    const nh = history.length;
    const sampling =
      sampleNext || cycle === numerics.maxCycles || (nh >= 2 && Math.abs(history[nh - 1]! - history[nh - 2]!) <= 300 * numerics.tolerance * Math.abs(history[nh - 1]!));
    accel?.atCycleStart();
    run.cycle(cycle, sampling);
    const delivered = run.delivered;
    history.push(delivered);
    options.onCycle?.(cycle, delivered);
    if (pending) {
      // the sampled cycle after convergence
      converged = true;
      break;
    }
    let done = false;
    if (accel) done = accel.converged(history, numerics.tolerance);
    else if (cycle >= 3) {
      const prev = history[history.length - 2]!;
      done = Math.abs(delivered - prev) <= numerics.tolerance * Math.max(Math.abs(delivered), 1e-12);
    }
    if (done) {
      if (sampling) {
        converged = true;
        break;
      }
      pending = true;
      sampleNext = true;
    }
  }
  return pointResult(run, chambers, maps, { refMass, converged, cycles, history });
}

/**
 * One cycle's time stepping and sampling (simulatePoint's inner loop), kept
 * in a class of its own so that the compiler sees the same shapes on every
 * call: the hot loop is optimised once as a method, not recompiled inside
 * the whole of simulatePoint each time the result building there sees a new
 * shape (measured: 26 recompilations of simulatePoint, 1.2 s of compiler
 * time in a 30-point sweep, before this split).
 */
/** what one cycle's stepping works on: the assembled parts, the sample buffers and the cycle's timing */
interface CycleParts {
  model: EngineModel;
  net: Network;
  cylinder: CylinderVolume['cylinder'];
  valve: RestrictedConnector;
  inlet: OpenConnector;
  exhaustPort: RestrictedConnector | undefined;
  plenum: { readonly pressure: number } | undefined;
  /** per-degree traces being filled */
  tr: Traces;
  burnedTrace: Float64Array;
  /** per pipe: sampled pressure, velocity, temperature */
  sp: Float64Array[];
  su: Float64Array[];
  sT: Float64Array[];
  runnerIdx: number[];
  runnerNodes: number;
  probes: MapProbe[];
  chainSampled: Float64Array[][];
  /** θ of the cycle start, of its first whole-degree sample, and the offset φ of that sample [deg] */
  start: number;
  firstWhole: number;
  phi0: number;
  degPerSec: number;
  /** the cylinder's state at the cycle start */
  release: { pressure: number; temperature: number };
}

class CycleRun {
  readonly ctx: StepContext;
  steps = 0;
  delivered = 0;
  inletMass = 0;
  peakReverse = 0;
  soundSum = 0;
  valveP: number;
  portP: number;

  constructor(readonly parts: CycleParts) {
    this.ctx = { dt: 0, thetaMid: 0, theta1: 0, rpm: parts.model.rpm };
    this.valveP = parts.model.ambient.pressure;
    this.portP = parts.model.exhaust.backPressure;
  }

  /** run cycle number `cycle` from the cycle start through 720°, sampling each whole degree when `sampling` */
  cycle(cycle: number, sampling: boolean): void {
    const { model, net, cylinder, valve, inlet, exhaustPort, plenum, tr, burnedTrace, sp, su, sT, runnerIdx, runnerNodes, probes, chainSampled } = this.parts;
    const { start, firstWhole, phi0, degPerSec, release } = this.parts;
    const ctx = this.ctx;
    const { ambient, intake, exhaust, numerics } = model;
    cylinder.reset(start, release.pressure, release.temperature);
    net.startCycle();
    let delivered = 0;
    let inletMass = 0;
    let peakReverse = 0;
    let soundSum = 0;
    let steps = this.steps;
    let valveP = this.valveP;
    let portP = this.portP;
    let phi = 0; // degrees into the cycle
    let mark = 0; // samples taken
    let prevValveP = valveP;
    let prevPortP = portP;
    let prevCylP = cylinder.pressure;
    let prevCylM = cylinder.mass;
    let prevBurned = cylinder.burned;
    let prevPlenum = plenum ? plenum.pressure : ambient.pressure;
    while (phi < 720) {
      let dt = net.maxStableDt(numerics.courant);
      if (!(dt > 0) || !Number.isFinite(dt)) throw diverged(model, cycle, start, phi, 'the CFL time step is not finite');
      let dphi = dt * degPerSec;
      if (phi + dphi > 720) {
        dphi = 720 - phi;
        dt = dphi / degPerSec;
      }
      const theta0 = start + phi;
      ctx.dt = dt;
      ctx.thetaMid = mod720(theta0 + 0.5 * dphi);
      ctx.theta1 = theta0 + dphi;
      net.step(ctx);

      const mIv = valve.flow;
      if (mIv < 0 && -mIv > peakReverse) peakReverse = -mIv;
      delivered += mIv * dt;
      inletMass -= inlet.flow * dt;
      valveP = valve.endPressure;
      if (exhaustPort) portP = exhaustPort.endPressure;
      steps++;

      if (!Number.isFinite(cylinder.pressure) || !(cylinder.pressure > 0) || !Number.isFinite(valveP) || !(valveP > 0)) {
        throw diverged(model, cycle, start, phi + dphi, 'non-finite or negative pressure');
      }
      if ((steps & 63) === 0 && !net.healthy()) throw diverged(model, cycle, start, phi + dphi, 'a pipe or volume state went non-finite or negative');

      // whole-degree samples inside (φ, φ + dφ]
      const phiEnd = phi + dphi;
      while (sampling && mark < 720 && phi0 + mark <= phiEnd) {
        const at = phi0 + mark;
        const f = dphi > 0 ? Math.min(1, Math.max(0, (at - phi) / dphi)) : 1;
        const j = (firstWhole + mark) % 720;
        tr.valvePressure[j] = prevValveP + f * (valveP - prevValveP);
        tr.exhaustPortPressure[j] = prevPortP + f * (portP - prevPortP);
        tr.cylinderPressure[j] = prevCylP + f * (cylinder.pressure - prevCylP);
        tr.cylinderMass[j] = prevCylM + f * (cylinder.mass - prevCylM);
        burnedTrace[j] = prevBurned + f * (cylinder.burned - prevBurned);
        const pl = plenum ? plenum.pressure : ambient.pressure;
        tr.plenumPressure[j] = prevPlenum + f * (pl - prevPlenum);
        tr.valveFlow[j] = mIv;
        tr.inletFlow[j] = -inlet.flow;
        tr.lift[j] = valveLift(intake, j);
        tr.exhaustLift[j] = valveLift(exhaust, j);
        for (let i = 0; i < net.pipes.length; i++) net.pipes[i]!.scheme.sample(sp[i]!, su[i]!, sT[i]!);
        let asum = 0;
        for (let r = 0; r < runnerIdx.length; r++) {
          const T = sT[runnerIdx[r]!]!;
          for (let i = 0; i < T.length; i++) asum += Math.sqrt(GAMMA * R_AIR * T[i]!);
        }
        soundSum += asum / runnerNodes;
        for (let k = 0; k < probes.length; k++) probes[k]!.record(j, chainSampled[k]!);
        mark++;
      }
      prevValveP = valveP;
      prevPortP = portP;
      prevCylP = cylinder.pressure;
      prevCylM = cylinder.mass;
      prevBurned = cylinder.burned;
      prevPlenum = plenum ? plenum.pressure : ambient.pressure;
      phi = phiEnd;
    }
    this.delivered = delivered;
    this.inletMass = inletMass;
    this.peakReverse = peakReverse;
    this.soundSum = soundSum;
    this.steps = steps;
    this.valveP = valveP;
    this.portP = portP;
  }
}

/** the per-degree traces being filled: a cycle trace without its crank column */
type Traces = Omit<CycleTrace, 'crank'>;

interface MapOf {
  probe: MapProbe;
  idx: number[];
  name: string;
  role: PipeRole;
  start: string;
  end: string;
}

/** the point's result and its converged state, from the last cycle run */
function pointResult(
  run: CycleRun,
  chambers: readonly Chamber[],
  maps: readonly MapOf[],
  c: { refMass: number; converged: boolean; cycles: number; history: number[] },
): { result: PointResult; warmStart: WarmStart } {
  const { model, net, tr, burnedTrace, sp, su, sT } = run.parts;
  const { intake, exhaust, runner, numerics, rpm } = model;
  const { refMass, converged, cycles, history } = c;
  const { delivered, inletMass, peakReverse, soundSum, steps } = run;
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

  const warmStart: WarmStart = {
    pipes: net.pipes.map((p, i) => {
      p.scheme.sample(sp[i]!, su[i]!, sT[i]!);
      return { pressure: Array.from(sp[i]!), velocity: Array.from(su[i]!), temperature: Array.from(sT[i]!) };
    }),
    chambers: chambers.map((c) => ({ pressure: c.pressure, temperature: c.temperature })),
  };

  const pipes: PipeMap[] = maps.map((m) => ({
    name: m.name,
    role: m.role,
    label: `${m.name}: ${m.start} to ${m.end}`,
    length: m.probe.chain.reduce((s, p) => s + p.length, 0),
    start: m.start,
    end: m.end,
    x: m.probe.x,
    pressure: m.probe.pressure,
  }));
  const runnerMap = pipes[0]!;

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
    stats: { nodes: net.pipes.reduce((s, p) => s + p.scheme.mesh.n, 0), steps, scheme: numerics.scheme },
    trace: { crank, ...tr },
    runnerMap: { x: runnerMap.x, pressure: runnerMap.pressure },
    pipes,
  };
  return { result, warmStart };
}

/** the open-end correction [m] the runner is extended by (RunnerModel.endCorrection) */
export function openEndCorrection(model: EngineModel): number {
  return runnerEndCorrection(model);
}

/** the runner's sections with a straight virtual extension of length δ at the upstream end */
export function withEndCorrection(sections: readonly RunnerSection[], delta: number): RunnerSection[] {
  return extendedSections(sections, delta, 0);
}

/** The assembly simulatePoint steps for this model (for views and tests). */
export function engineAssembly(model: EngineModel): EngineAssembly {
  return assembleEngine(model);
}

function diverged(model: EngineModel, cycle: number, start: number, phi: number, what: string): SimulationError {
  const theta = Math.round(mod720(start + phi));
  return new SimulationError(
    'diverged',
    `the solver diverged (${what}) at ${model.rpm} rpm, cycle ${cycle}, crank ${theta}°; ` +
      `runner ${(totalLength(model.runner.sections) * 1000).toFixed(0)} mm, mesh ${(model.numerics.meshSize * 1000).toFixed(1)} mm, ` +
      `courant ${model.numerics.courant}, scheme ${model.numerics.scheme}`,
  );
}
