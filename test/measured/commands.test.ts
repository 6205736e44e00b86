/**
 * The commands with measured data, end to end: sweep and compare with a dyno
 * sheet, calibrate --json and --out, check on the bundled example.
 * (Own regression of the outputs' shape, no external source; the physics
 * checks are in the other files of this folder.)
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { loadCase } from '../../src/case/load.js';
import { cli, ROOT } from '../cli/helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-mcmd-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const EX = 'cases/measured-single.yaml';
const SHEET = 'cases/measured/dyno.csv';

describe('sweep --measured', async () => {
  const json = await cli(['sweep', EX, '--rpm', '5000:7000:1000', '--measured', SHEET, '--json', '--jobs', '1']);
  const text = await cli(['sweep', EX, '--rpm', '5000:7000:1000', '--jobs', '1']); // the case's own `measured` key

  it('JSON: measured [{rpm, torque, power, model, difference}], model read off the curve', () => {
    expect(json.code, json.err).toBe(0);
    const j = JSON.parse(json.out);
    expect(j.measuredFile).toBe(SHEET);
    const sheet = readFileSync(SHEET, 'utf8').split('\n').filter((l) => /^\d/.test(l));
    expect(j.measured).toHaveLength(sheet.length);
    const at6000 = j.measured.find((m: { rpm: number }) => m.rpm === 6000);
    const p6000 = j.points.find((p: { rpm: number }) => p.rpm === 6000);
    expect(at6000.model.torque).toBeCloseTo(p6000.torque, 9);
    expect(at6000.difference.torque).toBeCloseTo(p6000.torque - at6000.torque, 9);
    expect(at6000.power).toBeCloseTo(Number(sheet.find((l) => l.startsWith('6000,'))!.split(',')[2]) * 1000, 6);
    // outside the swept speeds the model has no value
    expect(j.measured.find((m: { rpm: number }) => m.rpm === 9000).model.torque).toBeNull();
  });

  it('text: the torque chart with measured points and the table of measured speeds', () => {
    expect(text.code, text.err).toBe(0);
    expect(text.out).toMatch(/estimated brake torque \[N·m\] against speed, ● measured/);
    expect(text.out).toContain('●');
    expect(text.out).toMatch(/measured \(cases\/measured\/dyno\.csv\) against the model at the measured speeds/);
    expect(text.out).toMatch(/^\s+6000\s+36\.3\s+\d+\.\d\s+[+−-]\d+\.\d/m);
  });
});

describe('compare --measured', () => {
  it('shows the sheet against both designs', async () => {
    const r = await cli(['compare', EX, EX, '--set', 'runner.length=300mm', '--rpm', '6000:7000:1000', '--measured', SHEET, '--json', '--jobs', '1']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    const m = j.measured.find((x: { rpm: number }) => x.rpm === 7000);
    expect(Object.keys(m).sort()).toEqual(['a', 'b', 'power', 'rpm', 'torque']);
    expect(m.a.model.torque).toBeCloseTo(j.a.points[1].torque, 9);
    expect(m.b.difference.torque).toBeCloseTo(j.b.points[1].torque - m.torque, 9);
  });
});

describe('calibrate', () => {
  // a sheet from the demo itself (20 mm mesh), torque × 1.1: brake efficiency 0.30 → 0.33
  const mesh = ['--set', 'numerics.meshSize=20mm'];
  it('--json: fit, uncertainty, residual and points; --out writes a copy that loads with the fitted value', async () => {
    const sweep = JSON.parse((await cli(['sweep', 'cases/demo.yaml', ...mesh, '--rpm', '5000:8000:1000', '--json', '--jobs', '1'])).out);
    const sheet = join(dir, 'demo-dyno.csv');
    writeFileSync(sheet, `# made from the model, torque × 1.1\nrpm,torque_Nm\n${sweep.points.map((p: { rpm: number; torque: number }) => `${p.rpm},${p.torque * 1.1}`).join('\n')}\n`);
    const out = join(dir, 'out', 'calibrated.yaml');
    const { mkdirSync } = await import('node:fs');
    mkdirSync(join(dir, 'out'));
    const r = await cli(['calibrate', 'cases/demo.yaml', ...mesh, '--measured', sheet, '--fit', 'brakeEfficiency', '--json', '--out', out]);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.fit.brakeEfficiency).toBeCloseTo(0.33, 4);
    expect(Object.keys(j)).toEqual(expect.arrayContaining(['fit', 'residual', 'points', 'uncertainty', 'covers']));
    expect(j.points).toHaveLength(4);
    expect(j.residual.rmsRelative).toBeLessThan(1e-4);
    const copy = readFileSync(out, 'utf8');
    expect(copy).toMatch(/^# Calibrated by tractwave calibrate from demo\.yaml:/);
    expect(copy).toMatch(/estimate\.brakeEfficiency fitted to the brake torque/);
    const again = await loadCase(out);
    expect(again.case.estimate?.brakeEfficiency).toBeCloseTo(0.33, 4);
    expect(again.model.numerics.meshSize).toBe(0.02); // the --set went into the copy too
    // never over an existing file without --force
    const twice = await cli(['calibrate', 'cases/demo.yaml', ...mesh, '--measured', sheet, '--fit', 'brakeEfficiency', '--out', out]);
    expect(twice.code).toBe(2);
    expect(twice.err).toMatch(/^error: --out: .*already exists; add --force/);
  });

  it('--out elsewhere rewrites the file names of the case so the copy still finds its files', async () => {
    const out = join(dir, 'example-calibrated.yaml');
    const r = await cli(['calibrate', EX, '--fit', 'brakeEfficiency', '--out', out]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/estimate\.brakeEfficiency\s+0\.3\d{3}\s+± 0\.\d{4}\s+\(0\.3\d{3} to 0\.3\d{3}\)\s+was 0\.2800/);
    const copy = readFileSync(out, 'utf8');
    const rel = relative(dir, join(ROOT, 'cases', 'measured', 'intake-lift.csv'));
    expect(copy).toContain(`liftFile: ${rel}`);
    const l = await loadCase(out);
    expect(l.files.intake.lift).toBeDefined();
    expect(l.files.dyno?.points.length).toBe(12);
    expect(existsSync(out)).toBe(true);
  }, 60_000);
});

describe('check on the bundled example', () => {
  it('lists the lift logs, the flow sheet, the dyno sheet, the trace and the altitude', async () => {
    const r = await cli(['check', EX]);
    expect(r.code, r.err).toBe(0);
    for (const words of ['intake lift log cases/measured/intake-lift.csv', 'exhaust lift log cases/measured/exhaust-lift.csv (', 'cam_deg', 'intake flow sheet cases/measured/intake-flow.csv', 'dyno sheet cases/measured/dyno.csv: 12 speeds', 'pressure trace cases/measured/trace.csv', 'at 450 m (U.S. Standard Atmosphere 1976'])
      expect(r.out).toContain(words);
  });

  it('every file of the example says it is made up', () => {
    for (const f of ['intake-lift', 'exhaust-lift', 'intake-flow', 'dyno', 'trace']) expect(readFileSync(`cases/measured/${f}.csv`, 'utf8')).toMatch(/^# MADE-UP DATA, not a measurement/);
    expect(readFileSync(EX, 'utf8')).toMatch(/MADE UP/);
  });
});

describe('help of the new commands', () => {
  it.each(['flow', 'calibrate', 'run', 'sweep', 'compare'])('%s --help fits 80 columns and names its measured options', async (command) => {
    const r = await cli([command, '--help']);
    expect(r.code).toBe(0);
    for (const line of r.out.split('\n')) expect([...line].length, line).toBeLessThanOrEqual(80);
    const words = { flow: '--test-pressure', calibrate: '--fit', run: '--measured-trace', sweep: '--measured', compare: '--measured' }[command]!;
    expect(r.out).toContain(words);
  });
});
