/**
 * Validated case → core model.
 *
 * Cam card to absolute crank angle θ (0 = gas-exchange TDC, cycle 720°):
 *   intake opens  X° BTDC → θ = 720 − X      (mod 720)
 *   intake closes Y° ABDC → θ = 180 + Y      (mod 720)
 *   exhaust opens X° BBDC → θ = 540 − X      (mod 720)
 *   exhaust closes Y° ATDC → θ = Y           (mod 720)
 *
 * Card events are taken as the zero-lift ends of the lift curve, unless the
 * valve gives `checkingLift` (the lift at which the card was measured, e.g.
 * 1 mm). Then the events are widened with the core's lift profile: the card
 * angles are where the curve passes the checking lift, and the zero-lift
 * ends lie outside them (see `widenToZeroLift`).
 */
import type { EngineModel, PipeModel, RunnerSection, TablePoint, ValveModel } from '../core/model.js';
import type { PipeEndModel, PipeExperimentModel } from '../core/pipe-experiment-model.js';
import { DEFAULT_CD_TABLE, valveLift } from '../core/valve.js';
import { CaseError } from './errors.js';
import type { Case, PipeCase } from './schema.js';

export function wrap720(theta: number): number {
  const t = theta % 720;
  return t < 0 ? t + 720 : t;
}

export const cardToTheta = {
  intakeOpens: (btdc: number) => wrap720(720 - btdc),
  intakeCloses: (abdc: number) => wrap720(180 + abdc),
  exhaustOpens: (bbdc: number) => wrap720(540 - bbdc),
  exhaustCloses: (atdc: number) => wrap720(atdc),
};

/** fold an angle difference into (−360, 360] */
function fold(d: number): number {
  const w = wrap720(d);
  return w > 360 ? w - 720 : w;
}

/** Absolute θ back to the card convention (negative = the other side of the dead centre). */
export const thetaToCard = {
  intakeOpens: (theta: number) => fold(720 - theta),
  intakeCloses: (theta: number) => fold(theta - 180),
  exhaustOpens: (theta: number) => fold(540 - theta),
  exhaustCloses: (theta: number) => fold(theta),
};

/** Phases φ₁ < φ₂ (0..1 of the zero-lift duration) where the lift profile first and last reaches `fraction` of max lift. */
export function profileCrossings(liftTable: TablePoint[] | undefined, fraction: number): { rise: number; fall: number } | undefined {
  // a probe valve open over 0..360° with unit max lift: lift = profile(φ)
  const probe: ValveModel = { count: 1, diameter: 1, maxLift: 1, openAngle: 0, closeAngle: 360, cdTable: [], ...(liftTable ? { liftTable } : {}) };
  const f = (phi: number) => valveLift(probe, phi * 360) - fraction;
  const N = 720;
  let rise: number | undefined;
  let fall: number | undefined;
  const bisect = (a: number, b: number) => {
    let fa = f(a);
    for (let k = 0; k < 60; k++) {
      const m = 0.5 * (a + b);
      const fm = f(m);
      if (fa < 0 === fm < 0) {
        a = m;
        fa = fm;
      } else b = m;
    }
    return 0.5 * (a + b);
  };
  for (let i = 0; i < N; i++) {
    const a = i / N;
    const b = (i + 1) / N;
    if (rise === undefined && f(a) < 0 && f(b) >= 0) rise = bisect(a, b);
    if (f(a) >= 0 && f(b) < 0) fall = bisect(a, b);
  }
  if (rise === undefined || fall === undefined || !(fall > rise)) return undefined;
  return { rise, fall };
}

/**
 * Zero-lift open/close angles from card angles measured at a checking lift.
 * With card duration Dc and crossings φ₁, φ₂: D = Dc/(φ₂ − φ₁),
 * θo = θo,card − φ₁·D, θc = θo + D.
 */
export function widenToZeroLift(
  openCard: number,
  closeCard: number,
  checkingLift: number,
  maxLift: number,
  liftTable: TablePoint[] | undefined,
  path: string,
): { open: number; close: number } {
  const c = profileCrossings(liftTable, checkingLift / maxLift);
  if (!c) throw new CaseError(path, 'the lift profile never reaches the checking lift');
  const cardDuration = wrap720(closeCard - openCard);
  const D = cardDuration / (c.fall - c.rise);
  if (!(D < 720))
    throw new CaseError(path, `widening the card events to zero lift gives a duration of ${D.toFixed(1)} deg, more than a whole cycle`);
  const open = wrap720(openCard - c.rise * D);
  return { open, close: wrap720(open + D) };
}

/**
 * The card events after the valve's `duration` and `shift` (both optional),
 * still in card terms (opens ° before its dead centre, closes ° after its
 * dead centre; intake BTDC/ABDC, exhaust BBDC/ATDC):
 *  - duration D: both events move apart (or together) by the same angle about
 *    the same centre line, so that opens + 180 + closes = D:
 *      w = (D − (opens + 180 + closes))/2;  opens + w, closes + w;
 *  - shift S: both events move S crank degrees later (S > 0, retard) or
 *    earlier (S < 0, advance):  opens − S, closes + S.
 *    Intake opens 30 BTDC, closes 60 ABDC with shift −10 (10° advance):
 *    opens 40 BTDC, closes 50 ABDC.
 * Duration is applied first; then the shift moves the result.
 */
export function effectiveCard(v: Pick<Case['intake'], 'opens' | 'closes' | 'shift' | 'duration'>): { opens: number; closes: number } {
  let opens = v.opens;
  let closes = v.closes;
  if (v.duration !== undefined) {
    const w = (v.duration - (opens + 180 + closes)) / 2;
    opens += w;
    closes += w;
  }
  if (v.shift !== undefined) {
    opens -= v.shift;
    closes += v.shift;
  }
  return { opens, closes };
}

function valveModel(
  v: Case['intake'],
  openTheta: number,
  closeTheta: number,
  path: string,
): ValveModel {
  let open = openTheta;
  let close = closeTheta;
  if (v.checkingLift !== undefined) {
    const w = widenToZeroLift(open, close, v.checkingLift, v.maxLift, v.liftTable, `${path}.checkingLift`);
    open = w.open;
    close = w.close;
  }
  return {
    count: v.valves,
    diameter: v.diameter,
    maxLift: v.maxLift,
    openAngle: open,
    closeAngle: close,
    ...(v.liftTable ? { liftTable: v.liftTable } : {}),
    // the case's table (or the one of its flow sheet, measured-files.ts), scaled by cdScale
    cdTable: (v.cdTable ?? DEFAULT_CD_TABLE).map((p) => ({ x: p.x, y: p.y * (v.cdScale ?? 1) })),
  };
}

function copySection(s: RunnerSection): RunnerSection {
  return { length: s.length, diameterStart: s.diameterStart, diameterEnd: s.diameterEnd };
}

/** a pipe's sections and wall; the wall at `defaultWall` [K] unless the case gives one */
function pipeModel(
  p: { sections: RunnerSection[]; wallTemperature?: number | undefined; friction: number; heatTransfer: boolean },
  defaultWall: number,
): PipeModel {
  return { sections: p.sections.map(copySection), wallTemperature: p.wallTemperature ?? defaultWall, friction: p.friction, heatTransfer: p.heatTransfer };
}

function plenumModel(inlet: Extract<Case['inlet'], { kind: 'plenum' }>, ambientTemperature: number): Extract<EngineModel['inlet'], { kind: 'plenum' }> {
  return {
    kind: 'plenum',
    volume: inlet.volume,
    ...(inlet.feedDiameter !== undefined ? { feedDiameter: inlet.feedDiameter } : {}),
    feedCd: inlet.feedCd,
    ...(inlet.snorkel ? { snorkel: { ...pipeModel(inlet.snorkel, ambientTemperature), entryLoss: inlet.snorkel.entryLoss } } : {}),
    ...(inlet.supply ? { supply: { pressure: inlet.supply.pressure, temperature: inlet.supply.temperature } } : {}),
  };
}

/** Build the core's engine model from a validated case. Throws CaseError for inconsistent events. */
export function toEngineModel(c: Case, fallbackName = 'case'): EngineModel {
  const ic = effectiveCard(c.intake);
  const ec = effectiveCard(c.exhaust);
  const intake = valveModel(c.intake, cardToTheta.intakeOpens(ic.opens), cardToTheta.intakeCloses(ic.closes), 'intake');
  const exhaustValve = valveModel(c.exhaust, cardToTheta.exhaustOpens(ec.opens), cardToTheta.exhaustCloses(ec.closes), 'exhaust');
  return {
    name: c.name ?? fallbackName,
    engine: {
      bore: c.engine.bore,
      stroke: c.engine.stroke,
      rod: c.engine.rod,
      compressionRatio: c.engine.compressionRatio,
      ...(c.engine.wallTemperature !== undefined ? { wallTemperature: c.engine.wallTemperature } : {}),
    },
    ambient: { pressure: c.ambient.pressure, temperature: c.ambient.temperature },
    intake,
    exhaust: {
      ...exhaustValve,
      backPressure: c.exhaust.backPressure,
      gasTemperature: c.exhaust.gasTemperature,
      ...(c.exhaust.releasePressure !== undefined ? { releasePressure: c.exhaust.releasePressure } : {}),
      // the exhaust pipe's wall: at the gas temperature unless the case says otherwise
      ...(c.exhaust.pipe ? { pipe: pipeModel(c.exhaust.pipe, c.exhaust.gasTemperature) } : {}),
    },
    runner: {
      sections: c.runner.sections.map(copySection),
      wallTemperature: c.runner.wallTemperature ?? c.ambient.temperature,
      friction: c.runner.friction,
      heatTransfer: c.runner.heatTransfer,
      entryLoss: c.runner.entryLoss,
      ...(c.runner.resonator && c.runner.resonator.length > 0 ? { resonators: c.runner.resonator.map((r) => ({ ...r })) } : {}),
    },
    inlet: c.inlet.kind === 'plenum' ? plenumModel(c.inlet, c.ambient.temperature) : { kind: 'ambient' },
    rpm: c.rpm,
    numerics: { ...c.numerics },
  };
}

/** A pipe-case end; a volume end starts at its own state or, by default, at that side's initial state. */
function pipeEndModel(end: PipeCase['ends']['left'], side: { pressure: number; temperature: number }): PipeEndModel {
  if (end === 'closed' || end === 'open') return end;
  return { volume: end.volume, pressure: end.pressure ?? side.pressure, temperature: end.temperature ?? side.temperature };
}

/** Build the core's pipe-experiment model from a validated pipe case. */
export function toPipeModel(c: PipeCase, fallbackName = 'pipe'): PipeExperimentModel {
  return {
    name: c.name ?? fallbackName,
    pipe: {
      length: c.pipe.length,
      diameter: c.pipe.diameter,
      meshSize: c.pipe.meshSize,
      wallFriction: c.pipe.wallFriction,
      friction: c.pipe.wallFriction ? c.pipe.friction : 0,
      wallHeatTransfer: c.pipe.wallHeatTransfer,
      wallTemperature: c.pipe.wallTemperature ?? c.initial.left.temperature,
    },
    ends: { left: pipeEndModel(c.ends.left, c.initial.left), right: pipeEndModel(c.ends.right, c.initial.right) },
    initial: {
      split: c.initial.split,
      left: { ...c.initial.left },
      right: { ...c.initial.right },
    },
    times: [...c.times],
    numerics: { ...c.numerics },
  };
}
