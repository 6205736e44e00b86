import { describe, expect, it } from 'vitest';
import { parseArgs, type OptionSpec } from '../../src/cli/args.js';
import { CaseError } from '../../src/case/errors.js';

const specs: OptionSpec[] = [
  { name: 'json', type: 'boolean', description: '' },
  { name: 'csv', type: 'string', value: 'FILE', description: '' },
  { name: 'set', type: 'list', value: 'path=value', description: '' },
  { name: 'rpm', type: 'string', description: '' },
];

describe('parseArgs', () => {
  it('reads flags, values in both spellings, lists and positionals', () => {
    const a = parseArgs(['case.yaml', '--json', '--csv=out.csv', '--set', 'a=1', '--set=b=2', '--rpm', '-5'], specs);
    expect(a.positionals).toEqual(['case.yaml']);
    expect(a.flag('json')).toBe(true);
    expect(a.string('csv')).toBe('out.csv');
    expect(a.list('set')).toEqual(['a=1', 'b=2']);
    expect(a.string('rpm')).toBe('-5');
    expect(a.help).toBe(false);
  });
  it('stops at --', () => {
    expect(parseArgs(['--', '--json'], specs).positionals).toEqual(['--json']);
  });
  it('sees -h and --help', () => {
    expect(parseArgs(['-h'], specs).help).toBe(true);
    expect(parseArgs(['x', '--help'], specs).help).toBe(true);
  });
  it.each([
    [['--jsno'], '--jsno', 'did you mean --json'],
    [['--csv'], '--csv', 'needs a value'],
    [['--csv', '--json'], '--csv', 'needs a value'],
    [['--json=1'], '--json', 'takes no value'],
    [['--csv', 'a', '--csv', 'b'], '--csv', 'more than once'],
    [['-x'], '-x', 'unknown option'],
  ])('%j → %s', (argv, path, message) => {
    try {
      parseArgs(argv, specs);
      throw new Error('expected a CaseError');
    } catch (e) {
      expect(e).toBeInstanceOf(CaseError);
      expect((e as CaseError).path).toBe(path);
      expect((e as CaseError).detail).toContain(message);
    }
  });
});

describe('reportError: exit codes (DESIGN §3)', async () => {
  const { reportError } = await import('../../src/cli/main.js');
  const { memoryIo } = await import('../../src/cli/io.js');
  const { SimulationError } = await import('../../src/core/engine.js');
  it.each([
    [new CaseError('runner.length', 'must be positive, got -1 m'), 2, 'error: runner.length: must be positive, got -1 m\n'],
    [new SimulationError('diverged', 'state went negative at θ 231°'), 1, 'error: state went negative at θ 231°\n'],
  ])('%s', (e, code, text) => {
    const io = memoryIo();
    expect(reportError(e, io)).toBe(code);
    expect(io.err()).toBe(text);
  });
  it('an unexpected error is an internal failure, exit 1, without a stack unless asked', () => {
    const io = memoryIo();
    const before = process.env.TRACTWAVE_DEBUG;
    delete process.env.TRACTWAVE_DEBUG;
    expect(reportError(new TypeError('x is undefined'), io)).toBe(1);
    if (before !== undefined) process.env.TRACTWAVE_DEBUG = before;
    expect(io.err()).toMatch(/^internal error: x is undefined\n/);
    expect(io.err()).not.toMatch(/\n\s+at /);
  });
});
