/** Range parsing of the command line (FROM:TO:STEP, LO:HI, path=FROM:TO:STEP). Pure; no outside source needed. */
import { describe, expect, it } from 'vitest';
import { parseBand, parseGrid, parseVary, RangeInputError } from '../../src/analysis/range.js';

describe('parseGrid', () => {
  it.each([
    ['3000:9000:250', 3000, 9000, 250, '', 25],
    ['3000:9000:1000', 3000, 9000, 1000, '', 7],
    ['3000:9100:1000', 3000, 9100, 1000, '', 7], // TO off the grid: last value 9000
    ['6000:6000:250', 6000, 6000, 250, '', 1],
    ['3000rpm:9000rpm:250rpm', 3000, 9000, 250, 'rpm', 25],
    ['3000 rpm:9000 rpm:250 rpm', 3000, 9000, 250, 'rpm', 25],
    ['3000:9000:250rpm', 3000, 9000, 250, 'rpm', 25],
    ['250mm:450mm:50mm', 250, 450, 50, 'mm', 5],
    ['0.25:0.45:0.05', 0.25, 0.45, 0.05, '', 5],
    ['1e3:2e3:5e2', 1000, 2000, 500, '', 3],
  ])('%s', (text, from, to, step, unit, count) => {
    const g = parseGrid(text, '--rpm');
    expect(g.from).toBe(from);
    expect(g.to).toBe(to);
    expect(g.step).toBe(step);
    expect(g.unit).toBe(unit);
    expect(g.values).toHaveLength(count);
    expect(g.values[0]).toBe(from);
    expect(g.values[count - 1]).toBeLessThanOrEqual(to);
  });

  it('gives clean decimal values (no binary noise)', () => {
    expect(parseGrid('0.25:0.45:0.05', '--x').values).toEqual([0.25, 0.3, 0.35, 0.4, 0.45]);
  });

  it.each([
    ['3000:9000', /FROM:TO:STEP/],
    ['3000:9000:250:5', /FROM:TO:STEP/],
    ['3000::250', /FROM:TO:STEP/],
    ['abc:9000:250', /FROM 'abc' is not a number/],
    ['3000:9000:0', /STEP must be above zero/],
    ['3000:9000:-250', /STEP must be above zero/],
    ['9000:3000:250', /TO \(3000\) must not be below FROM \(9000\)/],
    ['0:9000:250', /FROM must be above zero/],
    ['3000mm:9000rpm:250', /mixes units \(mm, rpm\)/],
    ['1:100000:1', /too many/],
    ['', /FROM:TO:STEP/],
  ])('refuses %j', (text, message) => {
    let err: unknown;
    try {
      parseGrid(text, '--rpm');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RangeInputError);
    const e = err as RangeInputError;
    expect(e.option).toBe('--rpm');
    expect(e.message.startsWith('--rpm: ')).toBe(true);
    expect(e.detail).toMatch(message);
  });

  it('refuses a unit that is not allowed for the option', () => {
    expect(() => parseGrid('3000mm:9000mm:250mm', '--rpm', { units: ['rpm'] })).toThrow(/unit 'mm' is not allowed/);
    expect(parseGrid('3000rpm:9000rpm:250rpm', '--rpm', { units: ['rpm'] }).unit).toBe('rpm');
  });
});

describe('parseBand', () => {
  it.each([
    ['5000:8000', 5000, 8000],
    ['5000rpm:8000rpm', 5000, 8000],
    [' 5000 : 8000 ', 5000, 8000],
  ])('%j', (text, from, to) => {
    expect(parseBand(text, '--band')).toMatchObject({ from, to });
  });
  it.each([['8000:5000'], ['5000:5000'], ['5000'], ['5000:8000:250'], ['a:b']])('refuses %j', (text) => {
    expect(() => parseBand(text, '--band')).toThrow(/^--band: /);
  });
});

describe('parseVary', () => {
  it('splits the path and keeps the unit for --set', () => {
    const v = parseVary('runner.length=250mm:450mm:50mm');
    expect(v.path).toBe('runner.length');
    expect(v.setValues).toEqual(['250 mm', '300 mm', '350 mm', '400 mm', '450 mm']);
  });
  it('allows zero and negative values (angles)', () => {
    expect(parseVary('intake.closes=-10:20:10').grid.values).toEqual([-10, 0, 10, 20]);
  });
  it.each([['runner.length'], ['=1:2:1'], ['runner..length=1:2:1'], ['runner.length=1:2']])('refuses %j naming --vary', (text) => {
    expect(() => parseVary(text)).toThrow(/^--vary/);
  });
});
