/**
 * Bad input: each gets exit 2 and ONE line "error: <field.path>: <what is wrong>",
 * no stack trace (DESIGN §3).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { cli } from './helpers.js';
import { baseCase } from '../case/fixture.js';

// made at collection time: the table below names files in it
const dir = mkdtempSync(join(tmpdir(), 'tractwave-bad-'));
const file = (name: string, text: string) => {
  const f = join(dir, name);
  writeFileSync(f, text);
  return f;
};
const yamlOf = (mut: (d: Record<string, any>) => void) => {
  const d = baseCase();
  mut(d);
  return YAML.stringify(d);
};

beforeAll(() => {
  file('missing-bore.yaml', yamlOf((d) => delete d.engine.bore));
  file('typo.yaml', yamlOf((d) => (d.runner = { lenght: '300 mm', diameter: '40 mm' })));
  file('malformed.yaml', 'name: x\nengine:\n  bore: 86 mm\n stroke: 86 mm\n'); // line 4 is indented wrongly
  file('tagged.yaml', `${yamlOf(() => {})}\nextra: !shell "rm -rf"\n`);
  file('short-rod.yaml', yamlOf((d) => (d.engine.rod = '40 mm')));
  file('big-valve.yaml', yamlOf((d) => (d.intake.diameter = '90 mm')));
  file('ivc-before-ivo.yaml', yamlOf((d) => (d.intake.closes = -250)));
  file('huge.yaml', `${yamlOf(() => {})}# ${'x'.repeat(1100 * 1024)}\n`);
  file('list.yaml', '- 1\n- 2\n');
  file('existing.csv', 'keep me\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const demo = 'cases/demo.yaml';

describe('bad input: exit 2, one line naming the field', () => {
  it.each([
    ['unknown unit', () => ['run', demo, '--set', 'runner.length=320 furlong'], 'runner.length', "unknown unit 'furlong'"],
    ['unit of the wrong kind', () => ['run', demo, '--set', 'runner.length=5kPa'], 'runner.length', 'is a pressure, expected a length'],
    ['negative length', () => ['run', demo, '--set', 'runner.diameter=-38mm'], 'runner.diameter', 'must be positive'],
    ['missing key', () => ['run', join(dir, 'missing-bore.yaml')], 'engine.bore', 'required'],
    ['unknown key in the file, with a suggestion', () => ['check', join(dir, 'typo.yaml')], 'runner.lenght', "did you mean 'length'"],
    ['malformed YAML with its line', () => ['run', join(dir, 'malformed.yaml')], `${join(dir, 'malformed.yaml')}:4:1`, 'malformed YAML'],
    ['custom YAML tag', () => ['run', join(dir, 'tagged.yaml')], `${join(dir, 'tagged.yaml')}:`, 'no custom tags'],
    ['file over 1 MB', () => ['run', join(dir, 'huge.yaml')], join(dir, 'huge.yaml'), '1 MB'],
    ['not a mapping', () => ['run', join(dir, 'list.yaml')], join(dir, 'list.yaml'), 'mapping'],
    ['missing file', () => ['run', 'cases/no-such-case.yaml'], 'cases/no-such-case.yaml', 'file not found'],
    ['unknown --set path, with a suggestion', () => ['run', demo, '--set', 'runner.lenght=0.3'], 'runner.lenght', "did you mean 'runner.length'"],
    ['--set without =', () => ['run', demo, '--set', 'runner.length'], '--set', 'path=value'],
    ['--set of a key of another inlet kind', () => ['run', demo, '--set', 'inlet.volume=5L'], 'inlet.volume', "does not apply while inlet.kind is 'ambient'"],
    ['a runner length typed in mm without its unit', () => ['run', demo, '--set', 'runner.length=380'], 'runner.length', 'plain number is in metres'],
    ['bad --rpm', () => ['run', demo, '--rpm', 'fast'], '--rpm', 'expected a speed in rpm'],
    ['negative --rpm', () => ['run', demo, '--rpm', '-6500'], '--rpm', 'between 100 and 100000'],
    ['--rpm with a wrong unit', () => ['run', demo, '--rpm', '6500 kPa'], '--rpm', 'expected a speed'],
    ['--rpm without a value', () => ['run', demo, '--rpm'], '--rpm', 'needs a value'],
    ['rod too short', () => ['run', join(dir, 'short-rod.yaml')], 'engine.rod', 'half the stroke'],
    ['valve larger than the bore', () => ['run', join(dir, 'big-valve.yaml')], 'intake.diameter', 'smaller than the bore'],
    ['IVC before IVO', () => ['run', join(dir, 'ivc-before-ivo.yaml')], 'intake.closes', 'between 0 and 720'],
    ['Courant above 1', () => ['run', demo, '--set', 'numerics.courant=1.5'], 'numerics.courant', '(0, 1]'],
    ['unknown scheme', () => ['run', demo, '--set', 'numerics.scheme=fastest'], 'numerics.scheme', 'expected one of'],
    ['unknown inlet kind', () => ['run', demo, '--set', 'inlet.kind=plenm'], 'inlet.kind', "did you mean 'plenum'"],
    ['unknown option', () => ['run', demo, '--jsn'], '--jsn', 'did you mean --json'],
    ['unknown command', () => ['rn', demo], 'rn', "did you mean 'run'"],
    ['missing CASE', () => ['run'], 'run', 'missing CASE'],
    ['two outputs', () => ['run', demo, '--json', '--csv', join(dir, 'x.csv')], '--csv', 'choose one'],
    ['a pipe case given to run', () => ['run', 'cases/pipe-sod.yaml'], 'cases/pipe-sod.yaml', 'tractwave pipe'],
    ['an engine case given to pipe', () => ['pipe', demo], demo, 'tractwave run'],
    ['pipe split outside 0..1', () => ['pipe', 'cases/pipe-pulse.yaml', '--set', 'initial.split=2'], 'initial.split', 'between 0 and 1'],
    ['a split beyond what the characteristics scheme is checked for', () => ['pipe', 'cases/pipe-sod.yaml', '--set', 'numerics.scheme=characteristics', '--set', 'initial.right.pressure=10Pa'], 'numerics.scheme', 'pressure ratio of 1000, this one is 10000'],
    ['csv over an existing file', () => ['run', demo, '--csv', join(dir, 'existing.csv')], '--csv', '--force'],
  ])('%s', async (_label, argv, path, message) => {
    const r = await cli(argv());
    expect(r.code).toBe(2);
    const lines = r.err.split('\n').filter((l) => l !== '');
    expect(lines).toHaveLength(1);
    expect(lines[0]!.startsWith(`error: ${path}`)).toBe(true);
    expect(lines[0]).toContain(message);
    expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
    expect(r.out).toBe('');
  });

  it('left the existing file alone', () => {
    expect(readFileSync(join(dir, 'existing.csv'), 'utf8')).toBe('keep me\n');
  });
});

describe('no terminal', () => {
  it('tractwave with no command and no TTY points to run and sweep, exit 2', async () => {
    const r = await cli([]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: .*terminal.*tractwave run.*tractwave sweep/);
  });
  it('tractwave CASE with no TTY names the case in the hint', async () => {
    const r = await cli([demo]);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`tractwave run ${demo}`);
  });
});
