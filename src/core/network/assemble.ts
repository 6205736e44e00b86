/**
 * The engine as an assembly: EngineModel (plain data, SI) → NetworkSpec plus
 * the names of the parts the crank-angle stepper reads.
 *
 *   ambient ─(feed orifice | snorkel pipe)→ plenum ─(open)→ runner … ─(intake valve)→ cylinder
 *   supply  ─(feed orifice | snorkel pipe)→ plenum …   (boost: inlet.supply instead of the ambient)
 *   cylinder ─(exhaust valve)→ exhaust reservoir            (no exhaust pipe)
 *   cylinder ─(exhaust valve)→ exhaust pipe ─(open)→ back-pressure reservoir
 *   runner piece ─┬─ runner piece        a junction at each resonator, with
 *                 └─ side tube (closed end) | neck ─(open)→ cavity
 * Without a plenum the runner opens to the ambient.
 *
 * End corrections (end-correction.ts): the runner's upstream open end and both
 * snorkel ends and the exhaust pipe's tail unflanged; a side tube and a neck
 * flanged where they meet the runner; a neck flanged into its cavity.
 */
import { GAMMA } from '../gas.js';
import type { EngineModel, PipeModel, RunnerSection } from '../model.js';
import { totalLength } from '../pipe/mesh.js';
import { endCorrection } from './end-correction.js';
import type { ConnectorSpec, EndRef, NetworkSpec, PipeSpec, VolumeSpec } from './types.js';

/** cylinder pressure at exhaust valve opening when an exhaust pipe is given and the case names none [Pa] (full load, from memory) */
export const DEFAULT_RELEASE_PRESSURE = 4e5;

/** θ at which a cycle starts when the exhaust is a constant reservoir: exhaust-stroke BDC */
export const BDC_CYCLE_START = 540;

export interface EngineAssembly {
  network: NetworkSpec;
  /** volume name of the cylinder */
  cylinder: string;
  /** connector names */
  intakeValve: string;
  exhaustValve: string;
  /** the connector at the runner's upstream end */
  runnerInlet: string;
  /** the runner's pipes, upstream first (more than one when resonators split it) */
  runner: string[];
  /** volume name of the plenum, when there is one */
  plenum?: string;
  /** pipe name of the exhaust pipe, when there is one */
  exhaustPipe?: string;
  /** other pipes for the views, in order: snorkel, resonators */
  side: { name: string; role: 'snorkel' | 'resonator'; start: string; end: string }[];
  /** θ [deg] at which each cycle starts, and the cylinder state set there (all burned gas) */
  cycleStart: number;
  release: { pressure: number; temperature: number };
}

/** the runner's open-end correction [m]: RunnerModel.endCorrection, or 0.6133·r of the entry */
export function runnerEndCorrection(model: EngineModel): number {
  if (model.runner.endCorrection !== undefined) return Math.max(0, model.runner.endCorrection);
  const first = model.runner.sections[0];
  return first ? endCorrection('unflanged', first.diameterStart) : 0;
}

/** Cut sections at x [m] from their start: the part before and the part after. */
export function splitSections(sections: readonly RunnerSection[], x: number): [RunnerSection[], RunnerSection[]] {
  const before: RunnerSection[] = [];
  const after: RunnerSection[] = [];
  let start = 0;
  for (const s of sections) {
    const end = start + s.length;
    if (end <= x) before.push({ ...s });
    else if (start >= x) after.push({ ...s });
    else {
      const f = (x - start) / s.length;
      const d = s.diameterStart + f * (s.diameterEnd - s.diameterStart);
      before.push({ length: x - start, diameterStart: s.diameterStart, diameterEnd: d });
      after.push({ length: end - x, diameterStart: d, diameterEnd: s.diameterEnd });
    }
    start = end;
  }
  return [before, after];
}

export function assembleEngine(model: EngineModel): EngineAssembly {
  const { ambient, runner, exhaust, numerics } = model;
  const pipes: PipeSpec[] = [];
  const volumes: VolumeSpec[] = [];
  const connectors: ConnectorSpec[] = [];
  const side: EngineAssembly['side'] = [];
  const runnerWall = { friction: runner.friction, heatTransfer: runner.heatTransfer, wallTemperature: runner.wallTemperature };
  // fresh air: the ambient's, or with boost the supply's (the runner, the box and its pipes start there)
  const supply = model.inlet.kind === 'plenum' ? model.inlet.supply : undefined;
  const fresh = supply ? { pressure: supply.pressure, temperature: supply.temperature } : { pressure: ambient.pressure, temperature: ambient.temperature };
  const wallOf = (p: PipeModel) => ({ friction: p.friction, heatTransfer: p.heatTransfer, wallTemperature: p.wallTemperature });

  volumes.push({ kind: 'reservoir', name: 'ambient', pressure: ambient.pressure, temperature: ambient.temperature, burned: 0 });
  volumes.push({ kind: 'cylinder', name: 'cylinder', geometry: model.engine, ...(model.engine.wallTemperature !== undefined ? { wallTemperature: model.engine.wallTemperature } : {}) });

  // the runner, cut at each resonator
  const L = totalLength(runner.sections);
  const resonators = [...(runner.resonators ?? [])].sort((a, b) => b.at - a.at); // upstream first
  const names: string[] = [];
  let rest = runner.sections.map((s) => ({ ...s }));
  let cut = 0;
  const pieces: RunnerSection[][] = [];
  for (const r of resonators) {
    const [a, b] = splitSections(rest, L - r.at - cut);
    pieces.push(a);
    rest = b;
    cut = L - r.at;
  }
  pieces.push(rest);
  pieces.forEach((sections, i) => {
    const name = pieces.length === 1 ? 'runner' : `runner-${i + 1}`;
    names.push(name);
    pipes.push({
      name,
      sections,
      wall: runnerWall,
      extend: { left: i === 0 ? runnerEndCorrection(model) : 0, right: 0 },
      nativeBurned: 0,
      initial: fresh,
    });
  });
  const first = names[0]!;
  const last = names[names.length - 1]!;

  // upstream: ambient, or a plenum fed by an orifice or a snorkel
  const inlet = model.inlet;
  let upstream = 'ambient';
  let plenum: string | undefined;
  const feed: ConnectorSpec[] = [];
  if (inlet.kind === 'plenum') {
    plenum = 'plenum';
    upstream = plenum;
    // boost: the feed draws from a supply reservoir instead of the ambient
    const feedFrom = supply ? 'supply' : 'ambient';
    if (supply) volumes.push({ kind: 'reservoir', name: feedFrom, ...fresh, burned: 0 });
    volumes.push({ kind: 'chamber', name: plenum, volume: inlet.volume, ...fresh });
    if (inlet.snorkel) {
      const s = inlet.snorkel;
      const d0 = s.sections[0]!.diameterStart;
      const d1 = s.sections[s.sections.length - 1]!.diameterEnd;
      pipes.push({ name: 'snorkel', sections: s.sections, wall: wallOf(s), extend: { left: endCorrection('unflanged', d0), right: endCorrection('unflanged', d1) }, nativeBurned: 0, initial: fresh });
      feed.push({ kind: 'open', name: 'snorkel mouth', end: { pipe: 'snorkel', side: 'left' }, volume: feedFrom, entryLoss: s.entryLoss });
      feed.push({ kind: 'open', name: 'snorkel into the box', end: { pipe: 'snorkel', side: 'right' }, volume: plenum, entryLoss: 0 });
      side.push({ name: 'snorkel', role: 'snorkel', start: 'ambient end', end: 'airbox' });
    } else {
      const d = inlet.feedDiameter ?? 0;
      feed.push({ kind: 'orifice', name: 'plenum feed', from: feedFrom, to: plenum, area: { kind: 'fixed', area: inlet.feedCd * (Math.PI / 4) * d ** 2 } });
    }
  }
  connectors.push({ kind: 'open', name: 'runner inlet', end: { pipe: first, side: 'left' }, volume: upstream, entryLoss: runner.entryLoss });
  connectors.push({ kind: 'restricted', name: 'intake valve', end: { pipe: last, side: 'right' }, volume: 'cylinder', area: { kind: 'valve', valve: model.intake } });

  // exhaust: a constant reservoir behind the valve, or a pipe to the back pressure
  let exhaustPipe: string | undefined;
  const burnedGas = { pressure: exhaust.backPressure, temperature: exhaust.gasTemperature };
  if (exhaust.pipe) {
    exhaustPipe = 'exhaust';
    const p = exhaust.pipe;
    const dTail = p.sections[p.sections.length - 1]!.diameterEnd;
    volumes.push({ kind: 'reservoir', name: 'tailpipe', ...burnedGas, burned: 1 });
    pipes.push({ name: exhaustPipe, sections: p.sections, wall: wallOf(p), extend: { left: 0, right: endCorrection('unflanged', dTail) }, nativeBurned: 1, initial: burnedGas });
    connectors.push({ kind: 'restricted', name: 'exhaust valve', end: { pipe: exhaustPipe, side: 'left' }, volume: 'cylinder', area: { kind: 'valve', valve: exhaust } });
    connectors.push({ kind: 'open', name: 'exhaust outlet', end: { pipe: exhaustPipe, side: 'right' }, volume: 'tailpipe', entryLoss: 0 });
  } else {
    volumes.push({ kind: 'reservoir', name: 'exhaust', ...burnedGas, burned: 1 });
    connectors.push({ kind: 'orifice', name: 'exhaust valve', from: 'exhaust', to: 'cylinder', area: { kind: 'valve', valve: exhaust } });
  }
  connectors.push(...feed);

  // resonator junctions, upstream first, between runner pieces k and k+1
  resonators.forEach((r, k) => {
    const name = `resonator-${resonators.length - k}`; // numbered from the valve
    const ends: EndRef[] = [
      { pipe: names[k]!, side: 'right' },
      { pipe: names[k + 1]!, side: 'left' },
      { pipe: name, side: 'left' },
    ];
    if (r.kind === 'tube') {
      pipes.push({
        name,
        sections: [{ length: r.length, diameterStart: r.diameter, diameterEnd: r.diameter }],
        wall: runnerWall,
        extend: { left: endCorrection('flanged', r.diameter), right: 0 },
        nativeBurned: 0,
        initial: fresh,
      });
      connectors.push({ kind: 'closed', name: `${name} closed end`, end: { pipe: name, side: 'right' } });
      side.push({ name, role: 'resonator', start: 'runner', end: 'closed end' });
    } else {
      const dn = r.neckDiameter;
      pipes.push({
        name,
        sections: [{ length: r.neckLength, diameterStart: dn, diameterEnd: dn }],
        wall: runnerWall,
        extend: { left: endCorrection('flanged', dn), right: endCorrection('flanged', dn) },
        nativeBurned: 0,
        initial: fresh,
      });
      volumes.push({ kind: 'chamber', name: `${name} cavity`, volume: r.volume, ...fresh });
      connectors.push({ kind: 'open', name: `${name} neck`, end: { pipe: name, side: 'right' }, volume: `${name} cavity`, entryLoss: 0 });
      side.push({ name, role: 'resonator', start: 'runner', end: 'cavity' });
    }
    connectors.push({ kind: 'junction', name: `${name} junction`, ends });
  });

  const releaseAtEvo = exhaust.pipe !== undefined || exhaust.releasePressure !== undefined;
  const pRelease = exhaust.releasePressure ?? DEFAULT_RELEASE_PRESSURE;
  return {
    network: { pipes, volumes, connectors, numerics: { meshSize: numerics.meshSize, scheme: numerics.scheme } },
    cylinder: 'cylinder',
    intakeValve: 'intake valve',
    exhaustValve: 'exhaust valve',
    runnerInlet: 'runner inlet',
    runner: names,
    ...(plenum ? { plenum } : {}),
    ...(exhaustPipe ? { exhaustPipe } : {}),
    side,
    cycleStart: releaseAtEvo ? exhaust.openAngle : BDC_CYCLE_START,
    release: releaseAtEvo
      ? // isentropic blowdown from the release state ends at the exhaust gas temperature
        { pressure: pRelease, temperature: exhaust.gasTemperature * Math.pow(pRelease / exhaust.backPressure, (GAMMA - 1) / GAMMA) }
      : { pressure: exhaust.backPressure, temperature: exhaust.gasTemperature },
  };
}
