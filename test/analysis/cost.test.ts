/**
 * The rough cost estimate said before a long tune (src/analysis/cost.ts). It
 * is a model of the work, not a measurement, so these check its form, not a
 * time (speed is measured in `npm run bench`, never asserted): the CFL time
 * step Δt = C·Δx/a (Courant, Friedrichs & Lewy 1928) makes the steps per
 * cycle grow as 1/Δx and as the cycle time 120/N; the work per step grows
 * with the mesh nodes. Own regression of our own estimate otherwise.
 */
import { describe, expect, it } from 'vitest';
import { pointSeconds, roughDuration, sweepsSeconds } from '../../src/analysis/cost.js';
import { parseCase } from '../../src/case/load.js';
import { costLine } from '../../src/cli/commands/tune.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from '../cli/helpers.js';

const demoText = readFileSync(join(ROOT, 'cases/demo.yaml'), 'utf8');
const demo = (set: string[] = []) => parseCase(demoText, 'demo.yaml', { set }).model;

describe('pointSeconds', () => {
  it('halves when the speed doubles (one cycle takes half the time: 120/N)', () => {
    const m = demo();
    expect(pointSeconds(m, 8000) / pointSeconds(m, 4000)).toBeCloseTo(0.5, 12);
  });
  it('more than doubles when the mesh is halved (twice the steps, each with more nodes)', () => {
    const r = pointSeconds(demo(['numerics.meshSize=5mm']), 6000) / pointSeconds(demo(['numerics.meshSize=10mm']), 6000);
    expect(r).toBeGreaterThan(2);
    expect(r).toBeLessThan(4);
  });
  it('grows with a smaller Courant number (a shorter step)', () => {
    expect(pointSeconds(demo(['numerics.courant=0.45']), 6000) / pointSeconds(demo(), 6000)).toBeCloseTo(2, 12);
  });
  it('counts a plenum as slower to converge', () => {
    const plenum = demo(['inlet.kind=plenum', 'inlet.volume=6L', 'inlet.feedDiameter=45mm']);
    expect(pointSeconds(plenum, 6000)).toBeGreaterThan(pointSeconds(demo(), 6000));
  });
});

describe('sweepsSeconds and the line before a long run', () => {
  it('scales with designs and divides by jobs', () => {
    const m = demo();
    const rpms = [4000, 6000, 8000];
    expect(sweepsSeconds(m, rpms, 10, 1)).toBeCloseTo(10 * sweepsSeconds(m, rpms, 1, 1), 9);
    expect(sweepsSeconds(m, rpms, 10, 2)).toBeCloseTo(sweepsSeconds(m, rpms, 10, 1) / 2, 9);
  });
  it('says nothing for a short run and gives an estimate for a long one', () => {
    const m = demo();
    const rpms = Array.from({ length: 29 }, (_, i) => 3000 + 250 * i);
    expect(costLine(m, rpms, 1, 2, 'tune')).toBeUndefined();
    const line = costLine(m, rpms, 2000, 2, 'tune (2000 designs)')!.replace(/\s+/g, ' ');
    expect(line).toMatch(/^tune \(2000 designs\): 2000 designs × 29 speeds = 58000 points; estimated about \d+ (s|min|h)/);
    expect(line).toContain('--shard K/N');
  });
  it.each([
    [0.2, '1 s'],
    [42, '42 s'],
    [600, '10 min'],
    [3 * 3600 + 20 * 60, '3 h 20 min'],
    [7200, '2 h'],
  ])('roughDuration(%d) = %s', (s, text) => {
    expect(roughDuration(s)).toBe(text);
  });
});
