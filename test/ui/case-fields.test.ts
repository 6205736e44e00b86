/**
 * The Case view offers every value a tuner changes at the bench (issue 12
 * item 7): valve diameter, max lift, compression ratio, the plenum feed and
 * snorkel, entry loss, each runner section; and an edit of each reaches the
 * model through the case loader's overrides (the same path as --set).
 * Checked against the values the bundled case files state.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/case/index.js';
import { buildEdited, fieldValues } from '../../src/ui/case-session.js';
import { fieldByPath, overrideText } from '../../src/ui/fields.js';
import { ROOT } from '../cli/helpers.js';

const file = (name: string) => join(ROOT, 'cases', name);

describe('the Case view fields', () => {
  it('demo.yaml: valve diameter 35 mm, max lift 10 mm, compression ratio 12.5, bellmouth entry loss 0.05 (the file\'s values)', async () => {
    const { fields, values } = fieldValues(await loadCase(file('demo.yaml')));
    const paths = fields.map((f) => f.path);
    for (const p of ['intake.diameter', 'intake.maxLift', 'engine.compressionRatio', 'runner.entryLoss', 'runner.length', 'runner.diameter']) expect(paths).toContain(p);
    expect(values['intake.diameter']).toBeCloseTo(35, 9);
    expect(values['intake.maxLift']).toBeCloseTo(10, 9);
    expect(values['engine.compressionRatio']).toBe(12.5);
    expect(values['runner.entryLoss']).toBe(0.05);
    // no plenum: no feed
    expect(paths).not.toContain('inlet.feedDiameter');
  });

  it('airbox-single.yaml: the snorkel (150 mm, 45 mm, plain end 0.5); an orifice feed instead shows its diameter and Cd', async () => {
    const snorkel = fieldValues(await loadCase(file('airbox-single.yaml')));
    expect(snorkel.values['inlet.snorkel.length']).toBeCloseTo(150, 9);
    expect(snorkel.values['inlet.snorkel.diameter']).toBeCloseTo(45, 9);
    expect(snorkel.values['inlet.snorkel.entryLoss']).toBe(0.5);
    expect(snorkel.values['inlet.feedDiameter']).toBeUndefined();
    const orifice = fieldValues(await loadCase(file('airbox-single.yaml'), { set: ['inlet.snorkel=null', 'inlet.feedDiameter=45mm', 'inlet.feedCd=0.75'] }));
    expect(orifice.values['inlet.feedDiameter']).toBeCloseTo(45, 9);
    expect(orifice.values['inlet.feedCd']).toBe(0.75);
  });

  it.each([
    ['intake.diameter', 33, (m: Model) => m.intake.diameter, 0.033],
    ['intake.maxLift', 9, (m: Model) => m.intake.maxLift, 0.009],
    ['engine.compressionRatio', 11, (m: Model) => m.engine.compressionRatio, 11],
    ['runner.entryLoss', 0.5, (m: Model) => m.runner.entryLoss, 0.5],
  ] as const)('an edit of %s to %s reaches the model', async (path, shown, pick, si) => {
    const loaded = await loadCase(file('demo.yaml'));
    const { fields } = fieldValues(loaded);
    const f = fieldByPath(path, fields);
    expect(f).toBeDefined();
    const model = buildEdited(structuredClone(loaded.data), file('demo.yaml'), [{ path, value: overrideText(f!, shown) }]);
    expect(pick(model)).toBeCloseTo(si, 9);
  });
});

type Model = ReturnType<typeof buildEdited>;
