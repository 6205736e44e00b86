/**
 * Flow bench → Cd with the compressible orifice equation (Heywood,
 * Internal Combustion Engine Fundamentals, 1988, App. C). The sheets here
 * are made with the test's own writing of that equation,
 *   ṁ = Cd·A·p0/√(R·T0)·(p/p0)^(1/γ)·√(2γ/(γ−1)·(1 − (p/p0)^((γ−1)/γ)))
 * (equation numbers from memory), so the check does not reuse the code it checks.
 * Test depressions 28 and 10 inH2O are the usual bench settings (common practice).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { benchIdealFlux } from '../../src/core/flow-bench.js';
import { benchPoints, CFM, parseFlowSheet } from '../../src/case/flow-sheet.js';
import { cli } from '../cli/helpers.js';

const R = 287.05;
const G = 1.4;
const INH2O = 249.08891; // conventional inch of water, NIST SP 811
const P0 = 101325;
const T0 = 293.15;

/** the orifice equation as Heywood writes it (subsonic), area A [m²] */
function heywoodFlow(cd: number, A: number, p0: number, T0: number, p: number): number {
  const pr = p / p0;
  return ((cd * A * p0) / Math.sqrt(R * T0)) * Math.pow(pr, 1 / G) * Math.sqrt(((2 * G) / (G - 1)) * (1 - Math.pow(pr, (G - 1) / G)));
}

const dir = mkdtempSync(join(tmpdir(), 'tractwave-flow-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string, text: string) => {
  const f = join(dir, name);
  writeFileSync(f, text);
  return f;
};

describe('the orifice equation on the bench', () => {
  it('gives the REFERENCES example: A 1 cm², 101325 Pa, 293.15 K, Cd 1, p/p0 0.9 → 14.760 g/s; choked → 23.917 g/s', () => {
    // computed from Heywood 1988, App. C (REFERENCES.md)
    expect(benchIdealFlux({ pressure: P0, temperature: T0, testPressure: 0.1 * P0 }) * 1e-4 * 1000).toBeCloseTo(14.76, 2);
    expect(benchIdealFlux({ pressure: P0, temperature: T0, testPressure: 0.6 * P0 }) * 1e-4 * 1000).toBeCloseTo(23.917, 2);
  });
});

// a known Cd table on the curtain area, 2 valves of 34 mm
const D = 0.034;
const N = 2;
const TABLE = [
  [1, 0.71],
  [2, 0.69],
  [4, 0.64],
  [6, 0.58],
  [8, 0.5],
  [10, 0.43],
] as const;

describe.each([28, 10])('a sheet made from a known Cd table at %d inH2O', (inH2O) => {
  const dp = inH2O * INH2O;
  const rows = TABLE.map(([mm, cd]) => ({ mm, cd, mdot: heywoodFlow(cd, N * Math.PI * D * (mm / 1000), P0, T0, P0 - dp) }));
  const rho0 = P0 / (R * T0);
  const sheets = {
    kg: `lift_mm,flow_kg_per_s\n${rows.map((r) => `${r.mm},${r.mdot}`).join('\n')}\n`,
    ls: `lift_mm,flow_L_per_s\n${rows.map((r) => `${r.mm},${(r.mdot / rho0) * 1000}`).join('\n')}\n`,
    cfm: `# cubic feet per minute at the room state\nlift_in;flow_cfm\n${rows.map((r) => `${r.mm / 25.4};${r.mdot / rho0 / CFM}`).join('\n')}\n`,
  };
  const setup = { diameter: D, valves: N, pressure: P0, temperature: T0, testPressure: dp };

  it.each(Object.keys(sheets))('gives the Cd back within 1 % (%s column)', (k) => {
    const pts = benchPoints(parseFlowSheet(sheets[k as keyof typeof sheets], 's.csv'), setup);
    expect(pts).toHaveLength(TABLE.length);
    pts.forEach((p, i) => {
      expect(Math.abs(p.cd / TABLE[i]![1] - 1)).toBeLessThan(0.01);
      expect(p.ld).toBeCloseTo(TABLE[i]![0] / 1000 / D, 9);
      // Cd on the valve head area: the same flow over n·π·D²/4 instead of n·π·D·L, i.e. Cd·4L/D
      expect(p.cdValveArea).toBeCloseTo((p.cd * 4 * TABLE[i]![0]) / 1000 / D, 9);
    });
  });

  it('cfm, L/s and kg/s columns agree', () => {
    const cd = (k: keyof typeof sheets) => benchPoints(parseFlowSheet(sheets[k], 's.csv'), setup).map((p) => p.cd);
    const kg = cd('kg');
    cd('ls').forEach((v, i) => expect(v).toBeCloseTo(kg[i]!, 10));
    cd('cfm').forEach((v, i) => expect(v).toBeCloseTo(kg[i]!, 10));
  });

  it('the flow command prints the same points as JSON', async () => {
    const f = file(`sheet-${inH2O}.csv`, sheets.cfm);
    const r = await cli(['flow', f, '--diameter', '34mm', '--valves', '2', '--test-pressure', `${inH2O}inH2O`, '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j.points[0]).sort()).toEqual(['cd', 'cdValveArea', 'flow', 'ld', 'lift']);
    j.points.forEach((p: { cd: number; lift: number }, i: number) => {
      expect(Math.abs(p.cd / TABLE[i]![1] - 1)).toBeLessThan(0.01);
      expect(p.lift).toBeCloseTo(TABLE[i]![0] / 1000, 12);
    });
    expect(j.testPressure).toBeCloseTo(dp, 6);
  });
});

describe('a case with a flow sheet uses its Cd table; cdScale scales it', () => {
  it('the bundled example: the intake Cd table is the sheet\'s, on the case\'s valves', async () => {
    const { loadCase } = await import('../../src/case/load.js');
    const l = await loadCase('cases/measured-single.yaml');
    const sheet = l.files.intake.flow!;
    const pts = benchPoints(sheet.sheet, sheet.setup);
    expect(l.model.intake.cdTable.map((p) => p.y)).toEqual(pts.map((p) => p.cd));
    expect(sheet.setup.testPressure).toBeCloseTo(28 * INH2O, 6);
    const scaled = await loadCase('cases/measured-single.yaml', { set: ['intake.cdScale=0.9'] });
    scaled.model.intake.cdTable.forEach((p, i) => expect(p.y).toBeCloseTo(0.9 * pts[i]!.cd, 12));
  });
});

describe('bad sheets: exit 2, the file, row and column named', () => {
  it.each([
    ['lift not increasing', 'lift_mm,flow_cfm\n1,30\n3,80\n2,60\n', "row 4, column 'lift_mm': the lift must increase"],
    ['negative flow', 'lift_mm,flow_cfm\n1,30\n2,-60\n', "row 3, column 'flow_cfm': -60 is negative"],
    ['missing flow column', 'lift_mm\n1\n2\n', "row 1: no 'flow_cfm' or 'flow_L_per_s' or 'flow_kg_per_s' column"],
    ['missing lift column', 'flow_cfm\n30\n', "row 1: no 'lift_mm' or 'lift_in' column"],
    ['a unit we do not know', 'lift_mm,flow_scfm\n1,30\n', "row 1, column 'flow_scfm': unknown column"],
    ['text in a cell', '# bench 3\nlift_mm,flow_cfm\n1,30\n2,sixty\n', "row 4, column 'flow_cfm': 'sixty' is not a number"],
    ['zero lift', 'lift_mm,flow_cfm\n0,0\n1,30\n', "row 2, column 'lift_mm': the lift must be above zero"],
    ['a short row', 'lift_mm,flow_cfm\n1,30\n2\n', 'row 3: 1 cells, the header has 2'],
  ])('%s', async (_label, text, message) => {
    const f = file(`bad-${_label.replace(/\W+/g, '-')}.csv`, text);
    const r = await cli(['flow', f, '--diameter', '34mm', '--test-pressure', '28inH2O']);
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toContain(`error: ${f}: ${message}`);
    expect(r.out).toBe('');
  });

  it.each([
    [['--test-pressure', '28inH2O'], '--diameter', 'required'],
    [['--diameter', '34mm'], '--test-pressure', 'required'],
    [['--diameter', '34kPa', '--test-pressure', '28inH2O'], '--diameter', 'expected a length'],
    [['--diameter', '34mm', '--test-pressure', '2bar'], '--test-pressure', 'below the room pressure'],
    [['--diameter', '34mm', '--test-pressure', '28inH2O', '--valves', 'two'], '--valves', 'whole number'],
  ])('%j', async (opts, path, message) => {
    const f = file('good.csv', 'lift_mm,flow_cfm\n1,30\n');
    const r = await cli(['flow', f, ...opts]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(new RegExp(`^error: ${path}: .*${message}`));
  });
});
