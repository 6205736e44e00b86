/**
 * The pipe lab with a 0-D volume at an end (core/pipe-experiment.ts on the
 * network stepper): a pipe into a closed volume rings as a Helmholtz
 * resonator, and a closed assembly keeps its gas.
 */
import { describe, expect, it } from 'vitest';
import { runPipeExperiment } from '../../src/core/pipe-experiment.js';
import type { PipeExperimentModel } from '../../src/core/pipe-experiment-model.js';
import type { SchemeName } from '../../src/core/model.js';
import { soundSpeed } from '../../src/core/gas.js';
import { zeroCrossingFrequency } from '../../src/analysis/ringing.js';
import { loadPipeCase } from '../../src/case/load.js';

function lab(scheme: SchemeName, left: PipeExperimentModel['ends']['left'], volume: number, L: number, D: number, tEnd: number): PipeExperimentModel {
  const room = { pressure: 1e5, temperature: 293.15, velocity: 0 };
  return {
    name: 'lab',
    pipe: { length: L, diameter: D, meshSize: 0.005, wallFriction: false, friction: 0, wallHeatTransfer: false, wallTemperature: 293.15 },
    ends: { left, right: { volume, pressure: 1.01e5, temperature: 293.15 * Math.pow(1.01, 0.4 / 1.4) } },
    initial: { split: 1, left: room, right: room },
    times: [tEnd],
    numerics: { courant: 0.9, scheme },
  };
}

describe('a pipe open to the room at one end and into a closed volume at the other rings at f = (a/2π)·√(S/(V·L)) (Kinsler et al., Fundamentals of Acoustics)', () => {
  // the lab's pipe has no end corrections (it is exactly L), so L_eff = L;
  // the pipe's own volume (here 6 % of V) lowers the 1-D frequency a little
  it.each([
    ['conservative', 3e-3, 0.15, 0.04],
    ['characteristics', 3e-3, 0.15, 0.04],
    ['conservative', 1e-3, 0.1, 0.03],
  ] as const)('%s: V %f m³, pipe %f m × %f m, within 5 per cent', (scheme, V, L, D) => {
    const S = (Math.PI / 4) * D * D;
    const expected = (soundSpeed(293.15) / (2 * Math.PI)) * Math.sqrt(S / (V * L));
    const r = runPipeExperiment(lab(scheme, 'open', V, L, D, 8 / expected));
    const v = r.volumes[0]!;
    expect(v.side).toBe('right');
    expect(v.time.length).toBeGreaterThan(100);
    const f = zeroCrossingFrequency(v.time, v.pressure);
    expect(Math.abs(f / expected - 1)).toBeLessThan(0.05);
  });
});

describe('a pipe closed at one end into a closed volume keeps its gas', () => {
  it.each(['conservative', 'characteristics'] as const)('%s: pipe + volume mass constant to round-off', (scheme) => {
    const r = runPipeExperiment({ ...lab(scheme, 'closed', 2e-3, 0.3, 0.04, 0.02), times: [0, 0.01, 0.02] });
    const m0 = r.mass[0]!;
    for (const m of r.mass) expect(Math.abs(m / m0 - 1)).toBeLessThan(1e-12);
  });
});

describe('the bundled Helmholtz pipe case', () => {
  it('cases/pipe-helmholtz.yaml loads with the box at its own state and the room at the pipe state', async () => {
    const { model } = await loadPipeCase('cases/pipe-helmholtz.yaml');
    expect(model.ends.left).toBe('open');
    expect(model.ends.right).toEqual({ volume: 0.003, pressure: 102000, temperature: 293.15 });
  });
  it('a volume end without pressure or temperature starts at that side of the split', async () => {
    const { model } = await loadPipeCase('cases/pipe-helmholtz.yaml', { set: ['ends.right={volume: 1 L}'] });
    expect(model.ends.right).toEqual({ volume: 0.001, pressure: 100000, temperature: 293.15 });
  });
  it('a bad end is named', async () => {
    await expect(loadPipeCase('cases/pipe-helmholtz.yaml', { set: ['ends.right=shut'] })).rejects.toThrow(/ends\.right: expected 'closed', 'open' or a volume/);
    await expect(loadPipeCase('cases/pipe-helmholtz.yaml', { set: ['ends.right={volume: 1 L, presure: 1 bar}'] })).rejects.toThrow(/ends\.right\.presure: unknown key/);
    await expect(loadPipeCase('cases/pipe-helmholtz.yaml', { set: ['ends.right={volume: -1 L}'] })).rejects.toThrow(/ends\.right\.volume: must be positive/);
  });
});
