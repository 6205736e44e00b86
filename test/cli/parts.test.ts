/**
 * The bundled cases with parts beyond the runner (an airbox with a snorkel,
 * an exhaust header, a side resonator) run in every command, and the JSON and
 * CSV carry the traces of the parts they have (DESIGN §3: trace.plenumPressure
 * with a plenum, trace.exhaustPortPressure with an exhaust pipe).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from './helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-parts-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const COARSE = ['--set', 'numerics.meshSize=20mm'];
const PARTS = ['cases/airbox-single.yaml', 'cases/enduro-single.yaml', 'cases/resonator-single.yaml'];

describe.each(PARTS)('%s in every command', (file) => {
  it('check prints the network in one line', async () => {
    const r = await cli(['check', file]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/ambient → .*runner/);
  });
  it('run (text and JSON)', async () => {
    const text = await cli(['run', file, ...COARSE]);
    expect(text.code, text.err).toBe(0);
    expect(text.out).toMatch(/volumetric efficiency/);
    const r = await cli(['run', file, ...COARSE, '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.volumetricEfficiency).toBeGreaterThan(0.5);
    expect('plenumPressure' in j.trace).toBe(file.includes('airbox'));
    expect('exhaustPortPressure' in j.trace).toBe(file.includes('enduro'));
    for (const k of ['plenumPressure', 'exhaustPortPressure']) if (k in j.trace) expect(j.trace[k]).toHaveLength(720);
  });
  it('sweep, compare and tune', async () => {
    const sweep = await cli(['sweep', file, ...COARSE, '--rpm', '5000:7000:1000', '--json']);
    expect(sweep.code, sweep.err).toBe(0);
    expect(JSON.parse(sweep.out).points).toHaveLength(3);
    const compare = await cli(['compare', file, file, '--rpm', '5000:6000:1000']);
    expect(compare.code, compare.err).toBe(0);
    const tune = await cli(['tune', file, ...COARSE, '--vary', 'runner.length=300mm:340mm:40mm', '--rpm', '5000:6000:1000', '--json']);
    expect(tune.code, tune.err).toBe(0);
    expect(JSON.parse(tune.out).designs).toHaveLength(2);
  });
});

describe('the parts in the outputs', () => {
  it('the run CSV has the exhaust-port column with an exhaust pipe', async () => {
    const f = join(dir, 'enduro.csv');
    const r = await cli(['run', 'cases/enduro-single.yaml', ...COARSE, '--csv', f]);
    expect(r.code, r.err).toBe(0);
    const lines = readFileSync(f, 'utf8').trim().split('\n');
    expect(lines[0]!.split(',')).toContain('exhaust_port_pressure_Pa');
    expect(lines).toHaveLength(721);
  });
  it('run prints the airbox swing and the exhaust port at overlap, sweep prints the network', async () => {
    const box = await cli(['run', 'cases/airbox-single.yaml', ...COARSE]);
    expect(box.out).toMatch(/airbox pressure .* kPa to .* kPa/);
    expect(box.out).toMatch(/airbox swings most at +\d+ Hz = \d+ × N\/120/);
    const ex = await cli(['run', 'cases/enduro-single.yaml', ...COARSE]);
    expect(ex.out).toMatch(/exhaust port at overlap .* (pulls gas through|pushes burned gas back)/);
    const sweep = await cli(['sweep', 'cases/resonator-single.yaml', ...COARSE, '--rpm', '6000:7000:1000']);
    expect(sweep.out).toContain('side tube 250×22 at 120 from the valve');
  });
  it('tune can vary the new parts', async () => {
    const r = await cli(['tune', 'cases/enduro-single.yaml', ...COARSE, '--vary', 'exhaust.pipe.length=500mm:900mm:400mm', '--rpm', '6000:7000:1000', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.designs).toHaveLength(2);
    expect(j.designs[0].meanVolumetricEfficiency).not.toBe(j.designs[1].meanVolumetricEfficiency);
  });
});

describe('the pipe lab rings a volume', () => {
  it('pipe on cases/pipe-helmholtz.yaml: the box rings near the formula, and --json has the volume trace', async () => {
    const text = await cli(['pipe', 'cases/pipe-helmholtz.yaml']);
    expect(text.code, text.err).toBe(0);
    const m = /right volume: .* ringing at ([\d.]+) Hz \(Helmholtz .*: ([\d.]+) Hz\)/.exec(text.out);
    expect(m, text.out).not.toBeNull();
    expect(Math.abs(Number(m![1]) / Number(m![2]) - 1)).toBeLessThan(0.05);
    const r = await cli(['pipe', 'cases/pipe-helmholtz.yaml', '--json']);
    const j = JSON.parse(r.out);
    expect(j.volumes).toHaveLength(1);
    expect(j.volumes[0].side).toBe('right');
    expect(j.volumes[0].pressure.length).toBe(j.volumes[0].time.length);
    const sod = JSON.parse((await cli(['pipe', 'cases/pipe-sod.yaml', '--json'])).out);
    expect('volumes' in sod).toBe(false);
  });
});
