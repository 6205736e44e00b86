/**
 * A bare number is in SI units, so a size typed as millimetres without its
 * unit ("300" for a 300 mm runner) is read as metres. Sizes no intake runner
 * or single-cylinder engine has are refused, naming the field and saying how
 * to write the unit (common practice: intake runners are well under a metre,
 * bores under a few hundred millimetres).
 */
import { describe, expect, it } from 'vitest';
import { validateCase } from '../../src/case/schema.js';
import { baseCase } from './fixture.js';

function firstIssue(change: (c: Record<string, any>) => void): { path: string; message: string } | undefined {
  const c = baseCase();
  change(c);
  const r = validateCase(c);
  return r.ok ? undefined : r.issues[0];
}

describe('implausible sizes read from bare numbers', () => {
  it.each([
    ['runner.length', (c: Record<string, any>) => (c.runner = { length: 300, diameter: '38 mm' })],
    ['runner.diameter', (c: Record<string, any>) => (c.runner = { length: '300 mm', diameter: 38 })],
    ['runner.sections.1.length', (c: Record<string, any>) => (c.runner = { sections: [{ length: '50 mm', diameterStart: '44 mm', diameterEnd: '38 mm' }, { length: 250, diameterStart: '38 mm', diameterEnd: '36 mm' }] })],
    ['engine.bore', (c: Record<string, any>) => (c.engine.bore = 86)],
  ])('%s is refused with a hint about millimetres', (path, change) => {
    const i = firstIssue(change);
    expect(i?.path).toBe(path);
    expect(i?.message).toMatch(/plain number is in metres/);
    expect(i?.message).toMatch(/mm" if you meant millimetres/);
  });
  it('a long but real runner (1.2 m) is accepted', () => {
    expect(firstIssue((c) => (c.runner = { length: '1.2 m', diameter: '38 mm' }))).toBeUndefined();
  });
});
