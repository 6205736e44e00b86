/**
 * The new options of the commands as bad input: exit 2, one line
 * `error: <option or file>: <what is wrong>`, nothing on stdout, no stack
 * (DESIGN §3). (The bad case files and measured-data files are in the
 * corpus test/fixtures/bad-cases/measured-*.yaml; the flow sheets in flow-bench.test.ts.)
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { tractwave } from '../hardening/cli.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-badopt-'));
const f = (name: string) => join(dir, name);
beforeAll(() => {
  writeFileSync(f('ve.csv'), 'rpm,ve_pct\n5000,95\n6000,101\n7000,104\n');
  writeFileSync(f('one.csv'), 'rpm,torque_Nm\n6000,40\n');
  writeFileSync(f('badcol.csv'), 'rpm,torque_kgm\n6000,4\n');
  writeFileSync(f('exists.yaml'), 'keep me\n');
  writeFileSync(f('short-trace.csv'), 'crank_deg,pressure_kPa\n0,101\n10,102\n20,103\n30,104\n40,105\n50,106\n60,107\n70,108\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const DEMO = 'cases/demo.yaml';
const EX = 'cases/measured-single.yaml';

describe('bad options of calibrate, sweep, compare and run', () => {
  it.each([
    [() => ['calibrate', DEMO], '--measured', 'required: a dyno sheet'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--fit', 'cdscale'], '--fit', "unknown value 'cdscale' (did you mean 'cdScale'?)"],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--fit', 'cdScale,cdScale'], '--fit', 'named twice'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--fit', 'brakeEfficiency'], '--fit', 'cannot be fitted to a measured ηv'],
    [() => ['calibrate', DEMO, '--measured', f('one.csv'), '--fit', 'brakeEfficiency,cdScale'], '--fit', 'at least 2 measured speeds'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--quantity', 'torque'], '--quantity', 'has no torque column'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--quantity', 'boost'], '--quantity', 'expected torque, power or ve'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--fit', 'cdScale', '--out', f('exists.yaml')], '--out', 'already exists; add --force'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--fit', 'cdScale', '--out', f('copy.txt')], '--out', 'should be a case file'],
    [() => ['calibrate', DEMO, '--measured', f('ve.csv'), '--force'], '--force', 'only applies with --out'],
    [() => ['calibrate', DEMO, '--measured', f('no-such.csv')], f('no-such.csv'), 'file not found'],
    [() => ['sweep', DEMO, '--measured', f('badcol.csv')], f('badcol.csv'), "row 1, column 'torque_kgm': unknown column"],
    [() => ['compare', DEMO, EX, '--measured', f('no-such.csv')], f('no-such.csv'), 'file not found'],
    [() => ['run', DEMO, '--sensor-at', '80mm'], '--sensor-at', 'only applies with --measured-trace'],
    [() => ['run', DEMO, '--tdc-offset', '3'], '--tdc-offset', 'only applies with --measured-trace'],
    [() => ['run', EX, '--tdc-offset', '3 mm'], '--tdc-offset', 'expected an angle'],
    [() => ['run', EX, '--sensor-at', '-5mm'], '--sensor-at', 'must not be negative'],
    [() => ['run', DEMO, '--measured-trace', f('no-such.csv')], f('no-such.csv'), 'file not found'],
    [() => ['run', DEMO, '--measured-trace', f('short-trace.csv')], f('short-trace.csv'), "row 9, column 'crank_deg': the trace covers 80 crank degrees"],
  ])('%#', async (argv, path, fragment) => {
    const r = await tractwave(argv());
    expect(r.code, r.err).toBe(2);
    expect(r.errLines, r.err).toHaveLength(1);
    expect(r.errLines[0]!.startsWith(`error: ${path}:`), r.errLines[0]).toBe(true);
    expect(r.errLines[0]).toContain(fragment);
    expect(r.err).not.toMatch(/\n\s+at \S/);
    expect(r.out).toBe('');
  });
});
