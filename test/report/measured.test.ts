/** Reading a dyno sheet: columns with units, converted to SI; every problem names the file, row and column. */
import { describe, expect, it } from 'vitest';
import { parseMeasuredSheet } from '../../src/case/measured.js';
import { CaseError } from '../../src/case/errors.js';

describe('dyno sheets', () => {
  it('reads rpm with torque in lbf·ft and power in hp, in SI (NIST SP 811: 1.355818 N·m, 745.6999 W), empty cells unmeasured', () => {
    const s = parseMeasuredSheet('# invented\nrpm;torque_lbft;power_hp\n5000;10;1\n6000;;2\n', 'd.csv');
    expect(s.kinds).toEqual(['torque', 'power']);
    expect(s.points).toHaveLength(2);
    expect(s.points[0]!.torque).toBeCloseTo(13.55818, 9);
    expect(s.points[0]!.power).toBeCloseTo(745.6999, 9);
    expect(s.points[1]!.torque).toBeUndefined();
    expect(s.points[1]!.power).toBeCloseTo(1491.3998, 9);
  });

  it('reads ve_pct as a fraction and torque_Nm, power_kW as they are', () => {
    const s = parseMeasuredSheet('rpm,ve_pct,torque_Nm,power_kW\n4000,95.5,40,16.8\n', 'd.csv');
    expect(s.points[0]).toEqual({ rpm: 4000, volumetricEfficiency: 0.955, torque: 40, power: 16800 });
  });

  it.each([
    ['', /the measured sheet is empty/],
    ['speed,torque_Nm\n1,2\n', /row 1: no 'rpm' column/],
    ['rpm,torque_kgm\n1,2\n', /row 1, column 'torque_kgm': unknown column/],
    ['rpm\n1000\n', /row 1: no value column/],
    ['rpm,torque_Nm,torque_lbft\n1000,1,1\n', /two columns of the same quantity/],
    ['rpm,torque_Nm\n5000,40\n4000,41\n', /row 3, column 'rpm': 4000 does not increase/],
    ['rpm,torque_Nm\n5000,x\n', /row 2, column 'torque_Nm': 'x' is not a number/],
    ['rpm,torque_Nm\n5000,-3\n', /row 2, column 'torque_Nm': -3 is negative/],
    ['rpm,torque_Nm\n5000\n', /row 2: 1 cells, the header has 2/],
    ['rpm,torque_Nm\n', /no data rows/],
  ])('refuses %j', (text, message) => {
    let err: unknown;
    try {
      parseMeasuredSheet(text, 'sheet.csv');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(CaseError);
    expect((err as CaseError).path).toBe('sheet.csv');
    expect((err as CaseError).detail).toMatch(message);
  });
});
