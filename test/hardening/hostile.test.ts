/**
 * Hostile command lines, second round: each gets exit 2 and one line naming
 * the option or the field, at once (a hang or a heap abort shows as this
 * test's timeout or a crash; no timing is asserted), never a stack trace or
 * an "internal error".
 */
import { describe, expect, it } from 'vitest';
import { ROOT, tractwave, type CliResult } from './cli.js';

const DEMO = 'cases/demo.yaml';
/** argv as a short test title */
const title = (argv: string[]): string => argv.map((a) => (a.length > 60 ? `${a.slice(0, 40)}…(${a.length} chars)` : a)).join(' ');
const SOD = 'cases/pipe-sod.yaml';

function expectRefused(r: CliResult, path: string, fragment: string): void {
  expect(r.code, r.err).toBe(2);
  expect(r.errLines, r.err).toHaveLength(1);
  const line = r.errLines[0]!;
  expect(line.startsWith(`error: ${path}:`), line).toBe(true);
  expect(line).toContain(fragment);
  expect(r.err).not.toMatch(/internal error|\n\s+at \S/);
  expect(r.out).toBe('');
}

describe('--set and --vary paths', () => {
  it.each([
    // a huge list index used to build the list first (51 s, 4.6 GB, heap abort)
    [['run', DEMO, '--set', 'runner.sections.99999999.length=10mm'], 'runner.sections.99999999', 'has 0 entries'],
    [['run', 'cases/kart-single.yaml', '--set', 'runner.sections.5.length=10mm'], 'runner.sections.5', 'has 3 entries (0 to 2); 3 adds one at the end'],
    [['run', 'cases/kart-single.yaml', '--set', 'runner.sections.first.length=10mm'], 'runner.sections.first', 'expected an entry number'],
    [['run', DEMO, '--set', `runner.sections.${'9'.repeat(400)}.length=10mm`], `runner.sections.${'9'.repeat(400)}`, 'no entry'],
    // built-in property names were 'internal error'
    [['run', DEMO, '--set', '__proto__.polluted=1'], '__proto__.polluted', 'unknown key'],
    [['run', DEMO, '--set', 'runner.__proto__.x=1'], 'runner.__proto__.x', 'unknown key'],
    [['run', DEMO, '--set', 'runner.constructor=1'], 'runner.constructor', 'unknown key'],
    [['run', DEMO, '--set', 'engine.toString=5'], 'engine.toString', 'unknown key'],
    [['run', DEMO, '--set', 'hasOwnProperty=1'], 'hasOwnProperty', 'unknown key'],
    [['run', DEMO, '--set', 'engine.valueOf=1'], 'engine.valueOf', 'unknown key'],
    [['run', DEMO, '--set', 'numerics.isPrototypeOf=1'], 'numerics.isPrototypeOf', 'unknown key'],
    [['tune', DEMO, '--vary', 'runner.constructor=1:2:1'], 'runner.constructor', 'unknown key'],
    [['tune', DEMO, '--vary', '__proto__=1:2:1'], '__proto__', 'unknown key'],
    [['run', DEMO, '--set', 'engine.bore.x=1'], 'engine.bore.x', 'has no keys below it'],
    // deep nesting said "call stack"
    [['run', DEMO, '--set', `engine.bore=${'['.repeat(5000)}${']'.repeat(5000)}`], 'engine.bore', 'nested too deeply'],
    [['run', DEMO, '--set', `name=${'['.repeat(40)}${']'.repeat(40)}`], 'name', 'nested more than 32'],
    // Infinity was "got null"
    [['run', DEMO, '--set', 'intake.valves=.inf'], 'intake.valves', 'got Infinity'],
    [['run', DEMO, '--set', 'numerics.maxCycles=-.inf'], 'numerics.maxCycles', 'got -Infinity'],
    [['run', DEMO, '--set', 'numerics.scheme=.nan'], 'numerics.scheme', 'got NaN'],
  ].map(([argv, path, fragment]) => [title(argv as string[]), argv, path, fragment] as [string, string[], string, string]))('%s', async (_t, argv, path, fragment) => {
    expectRefused(await tractwave(argv), path, fragment);
  });

  it('a --vary error does not say "in --set"', async () => {
    const r = await tractwave(['tune', DEMO, '--vary', 'runner.lenght=300mm:400mm:50mm']);
    expectRefused(r, 'runner.lenght', "did you mean 'runner.length'");
    expect(r.err).not.toContain('--set');
  });
});

describe('speed limits in every range (100 to 100000 rpm, case/schema.ts speedProblem)', () => {
  it.each([
    [['sweep', DEMO, '--rpm', '1:3:1'], '--rpm', 'FROM must be between 100 and 100000 rpm, got 1 rpm'],
    [['sweep', DEMO, '--rpm', '50:200:50'], '--rpm', 'FROM must be between 100 and 100000'],
    [['sweep', DEMO, '--rpm', '150000:300000:50000'], '--rpm', 'between 100 and 100000'],
    [['sweep', DEMO, '--rpm', '90000:120000:10000'], '--rpm', 'TO must be between 100 and 100000 rpm, got 120000 rpm'],
    [['compare', DEMO, DEMO, '--rpm', '1:3:1'], '--rpm', 'between 100 and 100000'],
    [['tune', DEMO, '--vary', 'runner.length=300mm:400mm:50mm', '--rpm', '50:200:50'], '--rpm', 'between 100 and 100000'],
    [['run', DEMO, '--rpm', '99'], '--rpm', 'between 100 and 100000'],
    [['run', DEMO, '--set', 'rpm=100001'], 'rpm', 'between 100 and 100000'],
    [['sweep', DEMO, '--set', 'sweep.from=10rpm'], 'sweep.from', 'between 100 and 100000'],
  ].map(([argv, path, fragment]) => [title(argv as string[]), argv, path, fragment] as [string, string[], string, string]))('%s', async (_t, argv, path, fragment) => {
    expectRefused(await tractwave(argv), path, fragment);
  });
});

describe('estimated cost: refused above the limit with the estimate and the way out', () => {
  it.each([
    [['run', DEMO, '--set', 'numerics.meshSize=0.01mm'], 'numerics.meshSize'],
    [['sweep', DEMO, '--set', 'numerics.meshSize=0.05mm', '--rpm', '3000:4000:500'], 'numerics.meshSize'],
    [['tune', DEMO, '--vary', 'runner.length=300mm:400mm:50mm', '--set', 'numerics.meshSize=0.1mm'], 'numerics.meshSize'],
    [['compare', DEMO, DEMO, '--set', 'numerics.meshSize=0.1mm'], 'numerics.meshSize'],
    [['pipe', SOD, '--set', 'pipe.meshSize=0.001mm'], 'pipe.meshSize'],
  ].map(([argv, path]) => [title(argv as string[]), argv, path] as [string, string[], string]))('%s', async (_t, argv, path) => {
    const r = await tractwave(argv);
    expectRefused(r, path, 'this would take about');
    expect(r.err).toContain('--allow-long');
    expect(r.err).toMatch(/node updates/);
  });
});

describe('values no engine meets: refused unless --allow-extreme', () => {
  it.each([
    [['run', DEMO, '--set', 'exhaust.backPressure=10MPa'], 'exhaust.backPressure'],
    [['run', DEMO, '--set', 'ambient.pressure=1Pa'], 'ambient.pressure'],
    [['run', DEMO, '--set', 'ambient.temperature=2000K'], 'ambient.temperature'],
    [['run', DEMO, '--set', 'intake.diameter=60mm'], 'intake.diameter'],
    [['check', DEMO, '--set', 'exhaust.gasTemperature=20K'], 'exhaust.gasTemperature'],
    [['sweep', DEMO, '--set', 'engine.compressionRatio=60'], 'engine.compressionRatio'],
  ].map(([argv, path]) => [title(argv as string[]), argv, path] as [string, string[], string]))('%s', async (_t, argv, path) => {
    expectRefused(await tractwave(argv), path, 'add --allow-extreme to run it anyway');
  });

  it('a million valves cannot fit in any bore: refused even with --allow-extreme', async () => {
    expectRefused(await tractwave(['run', DEMO, '--set', 'intake.valves=1000000', '--allow-extreme']), 'intake.valves', 'cannot fit in a 97 mm bore');
  });

  it('with --allow-extreme the run goes ahead, and an absurd result carries its warning (stderr and JSON)', async () => {
    const r = await tractwave(['run', DEMO, '--set', 'exhaust.backPressure=10MPa', '--set', 'numerics.meshSize=20mm', '--set', 'numerics.maxCycles=6', '--allow-extreme', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { volumetricEfficiency: number; warnings: string[] };
    expect(j.volumetricEfficiency).toBeLessThan(0);
    expect(j.warnings.some((w) => w.startsWith('ηv') && w.includes('below zero'))).toBe(true);
    expect(r.err).toMatch(/^warning: ηv -\d+\.\d % is below zero/m);
  }, 30_000);
});

describe('control characters from a case file are shown escaped, never sent to the terminal', () => {
  it('a name with an escape sequence, a bell and NUL', async () => {
    const { mkdtempSync, readFileSync, writeFileSync, rmSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const dir = mkdtempSync(join(tmpdir(), 'tractwave-ctl-'));
    try {
      const demo = readFileSync(join(ROOT, DEMO), 'utf8').replace(/^name: .*$/m, 'name: "evil\\e[2J\\e]0;title\\a\\0 single"');
      const file = join(dir, 'evil.yaml');
      writeFileSync(file, demo);
      for (const argv of [
        ['check', file],
        ['run', file, '--set', 'numerics.meshSize=20mm'],
      ]) {
        const r = await tractwave(argv);
        expect(r.code, r.err).toBe(0);
        expect(r.out).toContain('evil\\e[2J\\e]0;title\\x07\\0 single');
        expect(r.out).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
      }
      // the terminal view's header shows the session's name
      const { openCase } = await import('../../src/ui/case-session.js');
      expect((await openCase(file)).name).toBe('evil\\e[2J\\e]0;title\\x07\\0 single');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 30_000);
});

describe('the report command keeps the same guards', () => {
  it('speed limits, the cost limit and the plausibility ranges', async () => {
    expectRefused(await tractwave(['report', DEMO, '--out', 'never.html', '--rpm', '1:3:1']), '--rpm', 'between 100 and 100000');
    expectRefused(await tractwave(['report', DEMO, '--out', 'never.html', '--set', 'numerics.meshSize=0.05mm']), 'numerics.meshSize', '--allow-long');
    expectRefused(await tractwave(['report', DEMO, '--out', 'never.html', '--set', 'ambient.pressure=1Pa']), 'ambient.pressure', '--allow-extreme');
  });
});

describe('the terminal view keeps the same guards on an edit', () => {
  it('an edit whose point would take over a minute is refused naming the field; with --allow-long it is built', async () => {
    const { openCase } = await import('../../src/ui/case-session.js');
    const { join } = await import('node:path');
    const file = join(ROOT, DEMO);
    const session = await openCase(file);
    expect(() => session.build([{ path: 'numerics.meshSize', value: '0.1 mm' }])).toThrow(/a point would take about .*--allow-long/);
    expect(() => session.build([{ path: 'ambient.pressure', value: '1 Pa' }])).toThrow(/--allow-extreme/);
    const long = await openCase(file, { allowLong: true, allowExtreme: true });
    expect(long.build([{ path: 'numerics.meshSize', value: '0.1 mm' }]).numerics.meshSize).toBeCloseTo(1e-4, 12);
    expect(long.build([{ path: 'ambient.pressure', value: '1 Pa' }]).ambient.pressure).toBe(1);
  });
});
