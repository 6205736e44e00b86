/**
 * Saving an edited case from the terminal view, and the case session's
 * values (the bundled demo case, copied into a temporary directory).
 */
import { mkdtemp, readFile, readdir, rm, writeFile, copyFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/index.js';
import { defaultSweepPlan, fieldValues, openCase, toDisplay } from '../../src/ui/case-session.js';
import { editedCaseText, FileExistsError, saveEditedCase, suggestSavePath, writeFileAtomic } from '../../src/ui/save.js';

let dir = '';
let demo = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tractwave-ui-'));
  demo = join(dir, 'demo.yaml');
  await copyFile(new URL('../../cases/demo.yaml', import.meta.url), demo);
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('edited case text', () => {
  it('puts the new values in, keeps the comments, and notes what changed', async () => {
    const original = await readFile(demo, 'utf8');
    const text = editedCaseText(original, [
      { path: 'runner.length', value: '420 mm' },
      { path: 'rpm', value: '7250' },
    ], 'demo.yaml');
    expect(text).toContain('length: 420 mm');
    expect(text).toContain('rpm: 7250');
    expect(text).toContain('Saved by tractwave from demo.yaml');
    expect(text).toContain('runner.length: 420 mm');
    // a comment of the original file survives
    const comment = original.split('\n').find((l) => l.trim().startsWith('#') && l.length > 20);
    expect(comment).toBeDefined();
    expect(text).toContain((comment as string).trim());
  });
  it("a changed line's own comment gives way to the old value", async () => {
    const original = await readFile(demo, 'utf8');
    const text = editedCaseText(original, [{ path: 'runner.length', value: '420 mm' }], 'demo.yaml');
    const line = text.split('\n').find((l) => l.trim().startsWith('length:'));
    expect(line).toMatch(/length: 420 mm # changed by tractwave, was 380 mm/);
  });
});

describe('saving', () => {
  it('suggests the first free numbered name beside the case', async () => {
    expect(await suggestSavePath(demo)).toBe(join(dir, 'demo-2.yaml'));
    const taken = new Set([join(dir, 'demo-2.yaml'), join(dir, 'demo-3.yaml')]);
    expect(await suggestSavePath(demo, async (p) => taken.has(p))).toBe(join(dir, 'demo-4.yaml'));
    expect(await suggestSavePath(join(dir, 'demo-7.yaml'), async () => false)).toBe(join(dir, 'demo-8.yaml'));
  });

  it('writes a new file that loads with the edited value, and leaves no temporary file', async () => {
    const target = join(dir, 'demo-2.yaml');
    const written = await saveEditedCase(demo, [{ path: 'runner.length', value: '420 mm' }], target, { overwrite: false });
    expect(written).toBe(target);
    const loaded = await loadCase(target);
    expect(loaded.model.runner.sections[0]?.length).toBeCloseTo(0.42, 12);
    const names = await readdir(dir);
    expect(names.filter((n) => n.endsWith('.tmp'))).toEqual([]);
  });

  it('refuses to replace an existing file without the confirm, and replaces it with it', async () => {
    const target = join(dir, 'taken.yaml');
    await writeFile(target, 'keep me\n');
    await expect(saveEditedCase(demo, [], target, { overwrite: false })).rejects.toBeInstanceOf(FileExistsError);
    expect(await readFile(target, 'utf8')).toBe('keep me\n');
    await saveEditedCase(demo, [{ path: 'rpm', value: '5000' }], target, { overwrite: true });
    expect((await loadCase(target)).model.rpm).toBe(5000);
  });

  it('never writes over the case it came from without the confirm', async () => {
    await expect(saveEditedCase(demo, [], demo, { overwrite: false })).rejects.toBeInstanceOf(FileExistsError);
  });

  it('does not write a case that would not load', async () => {
    const target = join(dir, 'bad.yaml');
    await expect(saveEditedCase(demo, [{ path: 'runner.length', value: '-3 mm' }], target, { overwrite: false })).rejects.toThrow(/runner\.length/);
    expect((await readdir(dir)).includes('bad.yaml')).toBe(false);
  });

  it('writes atomically: an existing target is never half written', async () => {
    const target = join(dir, 'atomic.txt');
    await writeFileAtomic(target, 'one\n', false);
    await expect(writeFileAtomic(target, 'two\n', false)).rejects.toBeInstanceOf(FileExistsError);
    expect(await readFile(target, 'utf8')).toBe('one\n');
    await writeFileAtomic(target, 'two\n', true);
    expect(await readFile(target, 'utf8')).toBe('two\n');
  });
});

describe('case session', () => {
  it('shows the demo values in display units and builds the model with edits', async () => {
    const session = await openCase(demo);
    const loaded = await loadCase(demo);
    const { values: v, fields } = fieldValues(loaded);
    expect(session.values).toEqual(v);
    expect(fields.map((f) => f.path)).toContain('runner.length');
    expect(v['runner.length']).toBeCloseTo((loaded.model.runner.sections[0]?.length ?? 0) * 1000, 9);
    expect(v['ambient.temperature']).toBeCloseTo(loaded.model.ambient.temperature - 273.15, 9);
    expect(v['ambient.pressure']).toBeCloseTo(loaded.model.ambient.pressure / 1000, 9);
    expect(v['rpm']).toBe(loaded.model.rpm);
    const m = session.build([{ path: 'runner.length', value: '333 mm' }, { path: 'ambient.temperature', value: '30 degC' }]);
    expect(m.runner.sections[0]?.length).toBeCloseTo(0.333, 12);
    expect(m.ambient.temperature).toBeCloseTo(303.15, 9);
  });

  it('offers each section of a runner given in sections, edits it, and saves it', async () => {
    const kart = join(dir, 'kart.yaml');
    await copyFile(new URL('../../cases/kart-single.yaml', import.meta.url), kart);
    const session = await openCase(kart);
    const paths = session.fields.map((f) => f.path);
    expect(paths).not.toContain('runner.length');
    expect(paths).toContain('runner.sections.1.length');
    expect(paths).toContain('runner.sections.0.diameterStart');
    const loaded = await loadCase(kart);
    expect(session.values['runner.sections.1.length']).toBeCloseTo((loaded.model.runner.sections[1]?.length ?? 0) * 1000, 9);
    const edit = [{ path: 'runner.sections.1.length', value: '300 mm' }];
    expect(session.build(edit).runner.sections[1]?.length).toBeCloseTo(0.3, 12);
    const target = join(dir, 'kart-2.yaml');
    await session.save(edit, target, false);
    const again = await loadCase(target);
    expect(again.model.runner.sections[1]?.length).toBeCloseTo(0.3, 12);
    expect(again.model.runner.sections).toHaveLength(loaded.model.runner.sections.length);
  });

  it('reports a bad edit with the field path', async () => {
    const session = await openCase(demo);
    expect(() => session.build([{ path: 'runner.diameter', value: '0 mm' }])).toThrow(/runner\.diameter/);
  });

  it.each([
    [0.3, 'mm', 300],
    [293.15, 'degC', 20],
    [101325, 'kPa', 101.325],
    [0.006, 'L', 6],
    [6500, '', 6500],
  ])('shows %d (model units) as %d in %s', (si, unit, shown) => {
    expect(toDisplay(si, unit)).toBeCloseTo(shown, 9);
  });

  it('plans a default sweep around the case speed with the band inside it', () => {
    const p = defaultSweepPlan(6000);
    expect(p.rpms[0]).toBe(3000);
    expect(p.rpms.at(-1)).toBe(8500);
    expect(p.band.from).toBeGreaterThanOrEqual(3000);
    expect(p.band.to).toBeLessThanOrEqual(8500);
    expect(p.band.to).toBeGreaterThan(p.band.from);
  });
});

describe('where an edited case is offered', () => {
  it('a bundled case in the checkout: beside it, under a new name (the shipped file stays)', async () => {
    const { saveDirFor, suggestSavePath } = await import('../../src/ui/save.js');
    const bundled = new URL('../../cases/demo.yaml', import.meta.url).pathname;
    const dir = await saveDirFor(bundled, '/somewhere/else');
    expect(dir).toBe(dirname(bundled));
    expect(await suggestSavePath(bundled, async () => false, dir)).toBe(join(dirname(bundled), 'demo-2.yaml'));
  });
  it('a case inside an installed package (node_modules): the working directory', async () => {
    const { saveDirFor } = await import('../../src/ui/save.js');
    expect(await saveDirFor('/home/me/shop/node_modules/tractwave/cases/demo.yaml', '/somewhere/else')).toBe('/somewhere/else');
  });
  it("a user's own case: beside it", async () => {
    const { saveDirFor } = await import('../../src/ui/save.js');
    const own = await mkdtemp(join(tmpdir(), 'tw-own-'));
    expect(await saveDirFor(join(own, 'mine.yaml'), '/somewhere/else')).toBe(own);
    await rm(own, { recursive: true, force: true });
  });
  it('a saved copy says so on its first line (the bundled-case lists leave such copies out)', async () => {
    const { editedCaseText, SAVED_MARK } = await import('../../src/ui/save.js');
    const text = editedCaseText('name: x\nrpm: 6000\n', [{ path: 'rpm', value: '6500' }], 'demo.yaml');
    expect(text.startsWith(`${SAVED_MARK}demo.yaml`)).toBe(true);
  });
});
