/**
 * The sweep, tune and compare commands in-process: bad input exits 2 naming
 * the option, CSV exports have a header with units and are not overwritten
 * without --force, the text says what the figure of merit is. Coarse mesh.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const DEMO = join(ROOT, 'cases/demo.yaml');
const FAST = ['--set', 'numerics.meshSize=20mm', '--jobs', '1'];

async function cli(argv: string[], cwd = ROOT) {
  const io = memoryIo({ cwd });
  const code = await runCli(argv, io);
  return { code, out: io.out(), err: io.err() };
}

describe('bad ranges and options exit 2 naming the option', () => {
  it.each([
    [['sweep', DEMO, '--rpm', '9000:3000:250'], '--rpm'],
    [['sweep', DEMO, '--rpm', '3000:9000'], '--rpm'],
    [['sweep', DEMO, '--rpm', '3000:9000:0'], '--rpm'],
    [['sweep', DEMO, '--rpm', '3000mm:9000mm:250mm'], '--rpm'],
    [['sweep', DEMO, '--rpm', 'fast:9000:250'], '--rpm'],
    [['sweep', DEMO, '--rpm', '3000:9000:500', '--band', '2000:8000'], '--band'],
    [['sweep', DEMO, '--band', '8000:5000'], '--band'],
    [['sweep', DEMO, '--jobs', '0'], '--jobs'],
    [['sweep', DEMO, '--jobs', 'many'], '--jobs'],
    [['sweep', DEMO, '--json', '--csv', 'x.csv'], '--csv'],
    [['tune', DEMO], '--vary'],
    [['tune', DEMO, '--vary', 'runner.length'], '--vary'],
    [['tune', DEMO, '--vary', 'runner.length=450mm:250mm:50mm'], '--vary runner.length'],
    [['tune', DEMO, '--vary', 'runner.length=250mm:450mm:50cm'], '--vary runner.length'],
    [['tune', DEMO, '--vary', 'runner.length=250furlong:450furlong:50furlong'], '--vary runner.length'],
    [['tune', DEMO, '--vary', 'a=1:2:1', '--vary', 'b=1:2:1', '--vary', 'c=1:2:1', '--vary', 'd=1:2:1', '--vary', 'e=1:2:1'], '--vary'],
    [['tune', DEMO, '--vary', 'runner.lenght=250mm:450mm:50mm'], 'runner.lenght'],
    [['compare', DEMO], 'compare: missing B.yaml'],
    [['compare', DEMO, DEMO, '--rpm', '1:2'], '--rpm'],
  ])('%j', async (argv, option) => {
    const r = await cli(argv);
    expect(r.code).toBe(2);
    expect(r.err.startsWith(`error: ${option}`)).toBe(true);
    expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
    expect(r.err.trim().split('\n')).toHaveLength(1);
  });
});

describe('sweep', () => {
  it('prints the chart, the table, the band mean as figure of merit and the hand estimates', async () => {
    const r = await cli(['sweep', DEMO, '--rpm', '5000:8000:500', ...FAST]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('┤'); // the asciichart axis
    expect(r.out).toMatch(/band 5500–8000 rpm: mean ηv \d+\.\d %/); // the case's band, clipped to the range
    expect(r.out).toContain('not the peak');
    expect(r.out).toMatch(/quarter-wave: \d+\.\d Hz/);
    expect(r.out).toContain('ESTIMATES');
    for (const rpm of ['5000', '6500', '8000']) expect(r.out).toMatch(new RegExp(`^  ${rpm} `, 'm'));
    expect(r.err).toContain('clipped'); // the note about the case band
    for (const line of r.out.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  });

  it('--json has the documented fields', async () => {
    const r = await cli(['sweep', DEMO, '--rpm', '6000:7000:500', ...FAST, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.points).toHaveLength(3);
    for (const p of j.points) {
      for (const k of ['rpm', 'volumetricEfficiency', 'torque', 'power', 'converged', 'massImbalance']) expect(p).toHaveProperty(k);
      expect(p.pulse.verdict).toMatch(/wave/);
    }
    expect(j.band).toEqual({ from: 6000, to: 7000, meanVolumetricEfficiency: expect.any(Number) });
    expect([6000, 6500, 7000]).toContain(j.bestRpm);
    expect(j.estimates.quarterWaveFrequency).toBeGreaterThan(0);
  });

  it('--csv writes SI values under a header whose names end in the unit, as run --csv does; refuses to overwrite without --force', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-sweep-'));
    const argv = ['sweep', DEMO, '--rpm', '6000:7000:500', ...FAST, '--csv', 'out.csv'];
    const r = await cli(argv, dir);
    expect(r.code).toBe(0);
    const text = readFileSync(join(dir, 'out.csv'), 'utf8');
    const lines = text.trim().split('\n');
    expect(lines).toHaveLength(4);
    expect(lines[0]).toMatch(/^speed_rpm,volumetric_efficiency,torque_estimate_N_m,power_estimate_W,mass_imbalance,converged,cycles,trapped_mass_kg,residual_fraction,ivc_cylinder_pressure_Pa,valve_pressure_at_ivc_Pa,valve_pressure_at_ivc_vs_ambient_Pa,/);
    const cells = lines[1]!.split(',');
    expect(cells[0]).toBe('6000');
    // SI: ηv a fraction near 1, the trapped mass in kg (a 450 cc single: under a gram), the IVC pressure in Pa
    expect(Number(cells[1])).toBeGreaterThan(0.5);
    expect(Number(cells[1])).toBeLessThan(2);
    expect(Number(cells[7])).toBeLessThan(1e-3);
    expect(Number(cells[9])).toBeGreaterThan(5e4);
    // against the ambient (101325 Pa in the demo): the absolute value less the ambient
    expect(Number(cells[11])).toBeCloseTo(Number(cells[10]) - 101325, 6);
    writeFileSync(join(dir, 'out.csv'), 'mine\n');
    const again = await cli(argv, dir);
    expect(again.code).toBe(2);
    expect(again.err).toMatch(/^error: --csv: .*already exists/);
    expect(readFileSync(join(dir, 'out.csv'), 'utf8')).toBe('mine\n');
    expect((await cli([...argv, '--force'], dir)).code).toBe(0);
    expect(readFileSync(join(dir, 'out.csv'), 'utf8')).toBe(text);
  });
});

describe('tune', () => {
  it('ranks designs best first, says a band average decides, draws a heat map with a legend', async () => {
    const r = await cli(['tune', DEMO, '--vary', 'runner.length=250mm:450mm:100mm', '--rpm', '4000:9000:500', '--band', '5000:8000', ...FAST]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('A band average, not a peak');
    expect(r.out).toMatch(/^ *250 mm \|[.:\-=+*#%@]{22}\|$/m); // 11 speeds, two characters each
    expect(r.out).toContain('shades, lowest to highest');
    const ranks = [...r.out.matchAll(/^  (\d)\s+(\d+) mm\s+(\d+\.\d+)/gm)].map((m) => Number(m[3]));
    expect(ranks).toHaveLength(3);
    expect([...ranks].sort((a, b) => b - a)).toEqual(ranks);
  });

  it('--json: designs best first with values in SI', async () => {
    const r = await cli(['tune', DEMO, '--vary', 'runner.length=300mm:400mm:100mm', '--vary', 'intake.closes=50:70:20', '--rpm', '5000:8000:1000', ...FAST, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.designs).toHaveLength(4);
    const means = j.designs.map((d: { meanVolumetricEfficiency: number }) => d.meanVolumetricEfficiency);
    expect([...means].sort((a: number, b: number) => b - a)).toEqual(means);
    for (const d of j.designs) {
      expect([0.3, 0.4]).toContain(d.values['runner.length']);
      expect([50, 70]).toContain(d.values['intake.closes']);
      expect([5000, 6000, 7000, 8000]).toContain(d.peakRpm);
    }
  });
});

describe('compare', () => {
  it('overlays both curves, lists differences and says who wins where', async () => {
    const r = await cli(['compare', DEMO, join(ROOT, 'cases/airbox-single.yaml'), '--rpm', '5000:8000:1000', ...FAST]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('A (line ─)');
    expect(r.out).toContain('B (dots ·)');
    const flat = r.out.replace(/\s+/g, ' ');
    expect(flat).toMatch(/mean ηv \(area under the curve \/ band width\): A \d+\.\d+ %, B \d+\.\d+ %/);
    expect(flat).toMatch(/where each wins: (A wins|B wins|even at)/);
    expect(r.out).toMatch(/^  5000 /m);
  });

  it('a design compared with itself is even everywhere', async () => {
    const r = await cli(['compare', DEMO, DEMO, '--rpm', '6000:7000:500', ...FAST, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.wins).toEqual([{ winner: 'even', from: 6000, to: 7000, largestDifference: 0 }]);
    for (const d of j.difference) expect(d.difference).toBe(0);
  });
});

describe('tune --csv', () => {
  it('writes one row per design and speed in SI, the header naming each unit (the varied value too)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-tune-'));
    const r = await cli(['tune', DEMO, '--vary', 'runner.length=300mm:400mm:100mm', '--rpm', '6000:7000:500', ...FAST, '--csv', 't.csv'], dir);
    expect(r.code).toBe(0);
    const lines = readFileSync(join(dir, 't.csv'), 'utf8').trim().split('\n');
    expect(lines[0]).toBe(
      'runner.length_m,speed_rpm,volumetric_efficiency,torque_estimate_N_m,power_estimate_W,converged,band_mean_volumetric_efficiency,rank',
    );
    expect(lines).toHaveLength(1 + 2 * 3);
    expect(lines[1]!.startsWith('0.3,6000,')).toBe(true);
    expect(lines[6]!.startsWith('0.4,7000,')).toBe(true);
  });
});
