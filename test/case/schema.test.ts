import { describe, expect, it } from 'vitest';
import { validateCase, validatePipeCase, DEFAULT_SCHEME, type Case } from '../../src/case/schema.js';
import { DEFAULT_SCHEME as CORE_DEFAULT } from '../../src/core/index.js';
import { baseCase } from './fixture.js';

function ok(data: unknown): Case {
  const r = validateCase(data);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
}

function firstIssue(data: unknown): { path: string; message: string } {
  const r = validateCase(data);
  if (r.ok) throw new Error('expected the case to be rejected');
  return r.issues[0]!;
}

describe('case schema: defaults', () => {
  const c = ok(baseCase());
  it('converts values to SI', () => {
    expect(c.engine.bore).toBeCloseTo(0.086, 12);
    expect(c.ambient.temperature).toBeCloseTo(293.15, 10);
    expect(c.exhaust.backPressure).toBe(105000);
  });
  it('fills the runner and numerics defaults', () => {
    expect(c.runner.friction).toBe(0.005);
    expect(c.runner.heatTransfer).toBe(true);
    expect(c.runner.entryLoss).toBe(0.05);
    expect(c.runner.wallTemperature).toBeUndefined();
    expect(c.inlet).toEqual({ kind: 'ambient' });
    expect(c.numerics).toEqual({ meshSize: 0.01, courant: 0.9, maxCycles: 30, tolerance: 1e-4, scheme: CORE_DEFAULT });
    expect(DEFAULT_SCHEME).toBe(CORE_DEFAULT);
  });
  it('turns a single-section runner into one section', () => {
    expect(c.runner.sections).toEqual([{ length: 0.3, diameterStart: 0.04, diameterEnd: 0.04 }]);
  });
  it('defaults the plenum feed Cd to 0.8 and accepts named entry losses', () => {
    const d = baseCase();
    d.inlet = { kind: 'plenum', volume: '5 L', feedDiameter: '45 mm' };
    d.runner.entryLoss = 'plain';
    const v = ok(d);
    expect(v.inlet).toEqual({ kind: 'plenum', volume: 0.005, feedDiameter: 0.045, feedCd: 0.8 });
    expect(v.runner.entryLoss).toBe(0.5);
  });
  it('accepts the analysis keys sweep, band and estimate', () => {
    const d = baseCase();
    d.sweep = { from: '3000 rpm', to: 9000, step: 250 };
    d.band = { from: 5000, to: 8000 };
    d.estimate = { airFuelRatio: 12.8, fuelHeatingValue: '44 MJ/kg', brakeEfficiency: 0.28 };
    const v = ok(d);
    expect(v.sweep).toEqual({ from: 3000, to: 9000, step: 250 });
    expect(v.estimate?.fuelHeatingValue).toBe(44e6);
  });
  it('accepts a runner of sections and tables', () => {
    const d = baseCase();
    d.runner = { sections: [{ length: '50 mm', diameterStart: '50 mm', diameterEnd: '40 mm' }, { length: 0.25, diameterStart: 0.04, diameterEnd: 0.036 }] };
    d.intake.cdTable = [[0, 0.7], [0.1, 0.65], [0.3, 0.5]];
    d.intake.liftTable = [[0, 0], [0.5, 1], [1, 0]];
    const v = ok(d);
    expect(v.runner.sections).toHaveLength(2);
    expect(v.intake.cdTable).toEqual([{ x: 0, y: 0.7 }, { x: 0.1, y: 0.65 }, { x: 0.3, y: 0.5 }]);
  });
});

describe('case schema: issues name the field', () => {
  const set = (mut: (d: Record<string, any>) => void) => {
    const d = baseCase();
    mut(d);
    return d;
  };
  it.each([
    ['unknown key with suggestion', (d: any) => (d.runner.lenght = 1), 'runner.lenght', "did you mean 'length'"],
    ['unknown top-level key', (d: any) => (d.rmp = 1), 'rmp', "did you mean 'rpm'"],
    ['missing key', (d: any) => delete d.engine.bore, 'engine.bore', 'required'],
    ['missing group', (d: any) => delete d.ambient, 'ambient', 'required'],
    ['negative length', (d: any) => (d.runner.diameter = '-40 mm'), 'runner.diameter', 'must be positive, got -40 mm'],
    ['negative bare number (read in the model unit)', (d: any) => (d.runner.length = -0.3), 'runner.length', 'must be positive, got -0.3 m'],
    ['zero size', (d: any) => (d.engine.stroke = 0), 'engine.stroke', 'must be positive'],
    ['unit of the wrong kind', (d: any) => (d.runner.length = '3 kPa'), 'runner.length', "unit 'kPa' is a pressure, expected a length"],
    ['rod too short', (d: any) => (d.engine.rod = '40 mm'), 'engine.rod', 'half the stroke'],
    ['valve larger than the bore', (d: any) => (d.intake.diameter = '90 mm'), 'intake.diameter', 'smaller than the bore'],
    ['exhaust valve larger than the bore', (d: any) => (d.exhaust.diameter = 0.2), 'exhaust.diameter', 'smaller than the bore'],
    ['compression ratio', (d: any) => (d.engine.compressionRatio = 1), 'engine.compressionRatio', 'greater than 1'],
    ['IVC before IVO', (d: any) => (d.intake.closes = -250), 'intake.closes', 'between 0 and 720'],
    ['duration over a cycle', (d: any) => (d.intake.closes = 600), 'intake.closes', 'between 0 and 720'],
    ['Courant above 1', (d: any) => (d.numerics = { courant: 1.2 }), 'numerics.courant', '(0, 1]'],
    ['Courant zero', (d: any) => (d.numerics = { courant: 0 }), 'numerics.courant', '(0, 1]'],
    ['bad scheme', (d: any) => (d.numerics = { scheme: 'charcteristics' }), 'numerics.scheme', "did you mean 'characteristics'"],
    ['bad inlet kind', (d: any) => (d.inlet = { kind: 'plenm' }), 'inlet.kind', "did you mean 'plenum'"],
    ['plenum without volume', (d: any) => (d.inlet = { kind: 'plenum', feedDiameter: 0.04 }), 'inlet.volume', 'required'],
    ['runner with both forms', (d: any) => (d.runner.sections = [{ length: 0.3, diameterStart: 0.04, diameterEnd: 0.04 }]), 'runner.length', 'not both'],
    ['runner without diameter', (d: any) => delete d.runner.diameter, 'runner.diameter', 'required'],
    ['fractional valve count', (d: any) => (d.intake.valves = 1.5), 'intake.valves', 'whole number'],
    ['string for a boolean', (d: any) => (d.runner.heatTransfer = 'yes'), 'runner.heatTransfer', 'true or false'],
    ['Cd table not increasing', (d: any) => (d.intake.cdTable = [[0.2, 0.6], [0.1, 0.6]]), 'intake.cdTable.1', 'increase'],
    ['checking lift above max lift', (d: any) => (d.intake.checkingLift = '10 mm'), 'intake.checkingLift', 'below maxLift'],
    ['wrong type for a group', (d: any) => (d.engine = 5), 'engine', 'expected a mapping'],
  ])('%s', (_label, mut, path, message) => {
    const i = firstIssue(set(mut));
    expect(i.path).toBe(path);
    expect(i.message).toContain(message);
  });
});

describe('pipe case schema', () => {
  const pipe = () => ({
    pipe: { length: '1 m', diameter: '50 mm' },
    ends: { left: 'closed', right: 'open' },
    initial: { left: { pressure: '1 bar', temperature: 300 }, right: { pressure: 1e4, temperature: 300 } },
    times: ['1 ms', 0.002],
  });
  it('fills defaults', () => {
    const r = validatePipeCase(pipe());
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.value.pipe).toMatchObject({ meshSize: 0.01, wallFriction: true, wallHeatTransfer: true });
      expect(r.value.initial.split).toBe(0.5);
      expect(r.value.initial.left.velocity).toBe(0);
      expect(r.value.times).toEqual([0.001, 0.002]);
    }
  });
  it.each([
    ['split outside 0..1', (d: any) => (d.initial.split = 1.5), 'initial.split'],
    ['times not increasing', (d: any) => (d.times = [0.002, 0.001]), 'times.1'],
    ['bad end kind', (d: any) => (d.ends.left = 'shut'), 'ends.left'],
    ['no times', (d: any) => (d.times = []), 'times'],
  ])('%s names %s', (_l, mut, path) => {
    const d: any = pipe();
    mut(d);
    const r = validatePipeCase(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.path).toBe(path);
  });
});
