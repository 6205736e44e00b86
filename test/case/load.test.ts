import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import YAML from 'yaml';
import { CaseError } from '../../src/case/errors.js';
import { loadCase, loadPipeCase, parseCase, applySets, MAX_CASE_BYTES } from '../../src/case/load.js';
import { R_AIR } from '../../src/core/gas.js';
import { baseCase } from './fixture.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tractwave-load-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function caseError(fn: () => unknown): CaseError {
  try {
    fn();
  } catch (e) {
    if (e instanceof CaseError) return e;
    throw e;
  }
  throw new Error('expected a CaseError');
}

async function caseErrorAsync(p: Promise<unknown>): Promise<CaseError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof CaseError) return e;
    throw e;
  }
  throw new Error('expected a CaseError');
}

const text = () => YAML.stringify(baseCase());

describe('YAML parsing', () => {
  it('loads YAML and JSON alike', () => {
    expect(parseCase(text()).model.rpm).toBe(6500);
    expect(parseCase(JSON.stringify(baseCase())).model.rpm).toBe(6500);
  });
  it('reports malformed YAML with its line', () => {
    const bad = 'name: x\nengine:\n  bore: 86 mm\n stroke: 86 mm\n';
    const e = caseError(() => parseCase(bad, 'bad.yaml'));
    expect(e.path).toBe('bad.yaml:4:1');
    expect(e.detail).toContain('malformed YAML');
  });
  it('rejects custom tags (plain data only)', () => {
    const e = caseError(() => parseCase(`${text()}extra: !!js/function "function () {}"\n`, 'tag.yaml'));
    expect(e.path).toMatch(/^tag\.yaml:\d+:\d+$/);
    expect(e.detail).toContain('no custom tags');
  });
  it('rejects duplicate keys with the line', () => {
    const e = caseError(() => parseCase('rpm: 1\nrpm: 2\n', 'dup.yaml'));
    expect(e.path).toBe('dup.yaml:2:1');
  });
  it('rejects a file that is not a mapping', () => {
    expect(caseError(() => parseCase('- 1\n- 2\n', 'list.yaml')).detail).toContain('mapping');
    expect(caseError(() => parseCase('', 'empty.yaml')).detail).toContain('empty');
  });
  it('says which file is missing', async () => {
    const e = await caseErrorAsync(loadCase(join(dir, 'nope.yaml')));
    expect(e.path).toBe(join(dir, 'nope.yaml'));
    expect(e.detail).toBe('file not found');
  });
  it('refuses files over 1 MB', async () => {
    const f = join(dir, 'huge.yaml');
    writeFileSync(f, `${text()}# ${'x'.repeat(MAX_CASE_BYTES)}\n`);
    const e = await caseErrorAsync(loadCase(f));
    expect(e.detail).toContain('1 MB');
  });
  it('resolves a relative name against cwd and reports it as given', async () => {
    writeFileSync(join(dir, 'rel.yaml'), text());
    const l = await loadCase('rel.yaml', { cwd: dir });
    expect(l.file).toBe('rel.yaml');
    expect(l.model.name).toBe('test single');
  });
});

describe('--set overrides', () => {
  it.each([
    ['runner.length=320mm', (l: ReturnType<typeof parseCase>) => l.model.runner.sections[0]!.length, 0.32],
    ['runner.length=0.32', (l: ReturnType<typeof parseCase>) => l.model.runner.sections[0]!.length, 0.32],
    ['intake.closes=70', (l: ReturnType<typeof parseCase>) => l.model.intake.closeAngle, 250],
    ['numerics.scheme=conservative', (l: ReturnType<typeof parseCase>) => l.model.numerics.scheme, 'conservative'],
    ['runner.heatTransfer=false', (l: ReturnType<typeof parseCase>) => l.model.runner.heatTransfer, false],
    ['ambient.temperature=30 degC', (l: ReturnType<typeof parseCase>) => l.model.ambient.temperature, 303.15],
  ] as const)('%s', (set, get, expected) => {
    const v = get(parseCase(text(), '', { set: [set] }));
    if (typeof expected === 'number') expect(v as number).toBeCloseTo(expected, 10);
    else expect(v).toBe(expected);
  });
  it('switches to a plenum with three sets', () => {
    const l = parseCase(text(), '', { set: ['inlet.kind=plenum', 'inlet.volume=4L', 'inlet.feedDiameter=40mm'] });
    expect(l.model.inlet).toEqual({ kind: 'plenum', volume: 0.004, feedDiameter: 0.04, feedCd: 0.8 });
  });
  it('sets inside a list of sections', () => {
    const d = baseCase();
    d.runner = { sections: [{ length: 0.05, diameterStart: 0.05, diameterEnd: 0.04 }, { length: 0.25, diameterStart: 0.04, diameterEnd: 0.04 }] };
    const l = parseCase(YAML.stringify(d), '', { set: ['runner.sections.1.length=200mm'] });
    expect(l.model.runner.sections[1]!.length).toBeCloseTo(0.2, 12);
  });
  it('applies --rpm after --set', () => {
    expect(parseCase(text(), '', { set: ['rpm=3000'], rpm: 8000 }).model.rpm).toBe(8000);
  });
  it.each([
    ['runner.lenght=0.3', 'runner.lenght', "did you mean 'runner.length'"],
    ['rnner.length=0.3', 'rnner.length', "did you mean 'runner'"],
    ['numerics.courrant=0.5', 'numerics.courrant', "did you mean 'numerics.courant'"],
    ['numerics=0.5', 'numerics', 'group of keys'],
    ['novalue', '--set', 'path=value'],
  ])('%s is rejected naming %s', (set, path, message) => {
    const e = caseError(() => parseCase(text(), '', { set: [set] }));
    expect(e.path).toBe(path);
    expect(e.detail).toContain(message);
  });
  it('does not change the raw data it was given', () => {
    const raw = baseCase();
    applySets(raw, ['rpm=1000']);
    expect(raw.rpm).toBe(1000);
  });
});

describe('every file in cases/ loads', () => {
  const casesDir = fileURLToPath(new URL('../../cases', import.meta.url));
  const files = readdirSync(casesDir).filter((f) => f.endsWith('.yaml'));
  it('has the demo, a kart single, an airbox single and two pipe experiments', () => {
    expect(files).toEqual(expect.arrayContaining(['demo.yaml', 'kart-single.yaml', 'airbox-single.yaml', 'pipe-sod.yaml', 'pipe-pulse.yaml']));
  });
  it.each(files)('%s', async (f) => {
    const path = join(casesDir, f);
    const raw = YAML.parse(await import('node:fs').then((fs) => fs.readFileSync(path, 'utf8'))) as Record<string, unknown>;
    if ('pipe' in raw) {
      const l = await loadPipeCase(path);
      expect(l.model.times.length).toBeGreaterThan(0);
    } else {
      const l = await loadCase(path);
      expect(l.model.rpm).toBeGreaterThan(0);
      expect(l.model.runner.sections.length).toBeGreaterThan(0);
    }
  });
  it('the demo is an open-to-ambient single of about 450 cc with a bellmouth near 6500 rpm', async () => {
    const m = (await loadCase(join(casesDir, 'demo.yaml'))).model;
    const vd = (Math.PI / 4) * m.engine.bore ** 2 * m.engine.stroke;
    expect(vd).toBeGreaterThan(420e-6);
    expect(vd).toBeLessThan(460e-6);
    expect(m.inlet.kind).toBe('ambient');
    expect(m.runner.entryLoss).toBe(0.05);
  });
  it("pipe-sod.yaml holds Sod's initial states: density ratio 8, pressure ratio 10 (Sod 1978)", async () => {
    const m = (await loadPipeCase(join(casesDir, 'pipe-sod.yaml'))).model;
    const rho = (s: { pressure: number; temperature: number }) => s.pressure / (R_AIR * s.temperature);
    expect(rho(m.initial.left)).toBeCloseTo(1.0, 3);
    expect(rho(m.initial.right)).toBeCloseTo(0.125, 4);
    expect(m.initial.left.pressure / m.initial.right.pressure).toBe(10);
    expect(m.pipe.wallFriction).toBe(false);
    expect(m.pipe.wallHeatTransfer).toBe(false);
    expect(m.pipe.friction).toBe(0);
  });
  it('writes nothing into cases/', () => {
    expect(readdirSync(casesDir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });
});
