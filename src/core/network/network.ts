/**
 * One stepper for any assembly of pipes, volumes and connectors (types.ts).
 *
 * One step of length dt (chosen by the caller, ≤ maxStableDt):
 *   1. every pipe hands over the waves arriving at its ends (`incoming`, at
 *      mid-step), and every volume estimates its state at mid-step (`predict`);
 *   2. every connector solves its ends against those mid-step states of the
 *      volumes it touches (valve areas at mid-step) and adds the flows to them;
 *   3. every volume advances with exactly the flows its connectors reported
 *      (so mass and energy are conserved across every joint);
 *   4. every pipe advances its interior with its end states.
 * Samples, cycles and convergence belong to the layer above (engine.ts).
 */
import { SimulationError } from '../errors.js';
import { Pipe } from './pipe.js';
import { createVolume } from './volumes.js';
import { createConnector } from './registry.js';
import type { Connector, NetworkSpec, PipeEnd, StepContext, Volume } from './types.js';

export class Network {
  readonly pipes: Pipe[];
  readonly volumes: Volume[];
  readonly connectors: Connector[];
  private readonly pipeByName = new Map<string, Pipe>();
  private readonly volumeByName = new Map<string, Volume>();
  private readonly connectorByName = new Map<string, Connector>();

  constructor(readonly spec: NetworkSpec) {
    validateNetwork(spec);
    this.pipes = spec.pipes.map((p) => new Pipe(p, spec.numerics.meshSize, spec.numerics.scheme));
    for (const p of this.pipes) this.pipeByName.set(p.spec.name, p);
    this.volumes = spec.volumes.map(createVolume);
    for (const v of this.volumes) this.volumeByName.set(v.name, v);
    this.connectors = spec.connectors.map((c) => createConnector(c, this));
    for (const c of this.connectors) this.connectorByName.set(c.name, c);
  }

  pipe(name: string): Pipe {
    const p = this.pipeByName.get(name);
    if (!p) throw new SimulationError('invalid', `the network has no pipe '${name}'`);
    return p;
  }

  volume(name: string): Volume {
    const v = this.volumeByName.get(name);
    if (!v) throw new SimulationError('invalid', `the network has no volume '${name}'`);
    return v;
  }

  connector(name: string): Connector {
    const c = this.connectorByName.get(name);
    if (!c) throw new SimulationError('invalid', `the network has no connector '${name}'`);
    return c;
  }

  end(pipe: string, side: 'left' | 'right'): PipeEnd {
    const p = this.pipe(pipe);
    return side === 'left' ? p.left : p.right;
  }

  /** largest stable step [s] over all pipes at Courant number `courant` */
  maxStableDt(courant: number): number {
    let dt = Infinity;
    for (const p of this.pipes) {
      const d = p.scheme.maxStableDt(courant);
      if (d < dt) dt = d;
    }
    return dt;
  }

  /** advance the whole assembly by ctx.dt */
  step(ctx: StepContext): void {
    const dt = ctx.dt;
    const { pipes, connectors, volumes } = this;
    for (let i = 0; i < pipes.length; i++) {
      const p = pipes[i]!;
      p.scheme.incoming('left', dt, p.left.incoming);
      p.scheme.incoming('right', dt, p.right.incoming);
    }
    for (let i = 0; i < volumes.length; i++) volumes[i]!.predict(ctx);
    for (let i = 0; i < connectors.length; i++) connectors[i]!.solve(ctx);
    for (let i = 0; i < volumes.length; i++) volumes[i]!.advance(ctx);
    for (let i = 0; i < pipes.length; i++) {
      const p = pipes[i]!;
      p.scheme.step(dt, p.left.state, p.right.state);
    }
  }

  /** start of an engine cycle: connectors forget remembered gas */
  startCycle(): void {
    for (const c of this.connectors) c.startCycle?.();
  }

  /** true when every pipe state and every volume's pressure and temperature are finite and positive */
  healthy(): boolean {
    for (const p of this.pipes) if (!p.scheme.healthy()) return false;
    for (const v of this.volumes) if (!(v.pressure > 0 && v.temperature > 0 && Number.isFinite(v.pressure) && Number.isFinite(v.temperature))) return false;
    return true;
  }

  /** gas mass in the pipes and the non-fixed volumes [kg] */
  mass(): number {
    let m = 0;
    for (const p of this.pipes) m += p.scheme.mass();
    for (const v of this.volumes) if (Number.isFinite(v.mass)) m += v.mass;
    return m;
  }
}

/**
 * Check an assembly before it runs: unique names, every pipe end joined by
 * exactly one connector, every volume a connector names exists, a junction
 * joins at least two ends. Throws SimulationError('invalid') naming the part.
 */
export function validateNetwork(spec: NetworkSpec): void {
  const bad = (msg: string): never => {
    throw new SimulationError('invalid', `network: ${msg}`);
  };
  const names = new Set<string>();
  for (const n of [...spec.pipes.map((p) => p.name), ...spec.volumes.map((v) => v.name), ...spec.connectors.map((c) => c.name)]) {
    if (names.has(n)) bad(`the name '${n}' is used twice`);
    names.add(n);
  }
  const volumes = new Set(spec.volumes.map((v) => v.name));
  const joined = new Map<string, string>();
  for (const p of spec.pipes) {
    if (p.sections.length === 0) bad(`pipe '${p.name}' has no sections`);
    for (const s of p.sections) if (!(s.length > 0 && s.diameterStart > 0 && s.diameterEnd > 0)) bad(`pipe '${p.name}' has a section without positive length and diameters`);
  }
  const pipeNames = new Set(spec.pipes.map((p) => p.name));
  const join = (c: string, pipe: string, side: string) => {
    if (!pipeNames.has(pipe)) bad(`connector '${c}' names a pipe '${pipe}' that does not exist`);
    const key = `${pipe}.${side}`;
    const other = joined.get(key);
    if (other !== undefined) bad(`the ${side} end of pipe '${pipe}' is joined twice ('${other}' and '${c}')`);
    joined.set(key, c);
  };
  const needVolume = (c: string, v: string) => {
    if (!volumes.has(v)) bad(`connector '${c}' names a volume '${v}' that does not exist`);
  };
  for (const c of spec.connectors) {
    switch (c.kind) {
      case 'closed':
        join(c.name, c.end.pipe, c.end.side);
        break;
      case 'open':
      case 'restricted':
        join(c.name, c.end.pipe, c.end.side);
        needVolume(c.name, c.volume);
        break;
      case 'orifice':
        needVolume(c.name, c.from);
        needVolume(c.name, c.to);
        break;
      case 'junction':
        if (c.ends.length < 2) bad(`junction '${c.name}' joins fewer than two pipe ends`);
        for (const e of c.ends) join(c.name, e.pipe, e.side);
        break;
    }
  }
  for (const p of spec.pipes)
    for (const side of ['left', 'right'] as const) if (!joined.has(`${p.name}.${side}`)) bad(`the ${side} end of pipe '${p.name}' is not joined to anything`);
}
