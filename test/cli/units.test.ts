/**
 * --units on the text commands and display.units in a case: display only.
 * The factors are checked in test/present/units.test.ts (NIST SP 811); here
 * the plumbing: which units a command shows, that JSON stays SI, that bad
 * values are exit 2 naming the field.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from './helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-units-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const FAST = ['--set', 'numerics.meshSize=20mm'];

describe('--units and display.units', () => {
  it('check shows in, ci, psi with --units imperial and mm, cc, kPa without', async () => {
    const met = await cli(['check', 'cases/demo.yaml']);
    const imp = await cli(['check', 'cases/demo.yaml', '--units', 'imperial']);
    expect(met.out).toMatch(/displacement\s+[\d.]+ cc/);
    expect(imp.out).toMatch(/displacement\s+[\d.]+ ci/);
    expect(imp.out).toMatch(/runner\s+[\d.]+ in, diameter [\d.]+ in/);
    expect(imp.out).not.toMatch(/\d (mm|kPa|cc)\b/);
  });

  it('a case with display.units: imperial shows imperial; --units metric wins over it', async () => {
    const text = readFileSync('cases/demo.yaml', 'utf8') + '\ndisplay: { units: imperial }\n';
    const file = join(dir, 'shop.yaml');
    writeFileSync(file, text);
    const shop = await cli(['run', file, ...FAST]);
    expect(shop.code, shop.err).toBe(0);
    expect(shop.out).toMatch(/cylinder pressure at IVC\s+[\d.]+ psi/);
    expect(shop.out).toMatch(/at IVC\s+[+−±][\d.]+ inHg vs ambient/);
    const metric = await cli(['run', file, ...FAST, '--units', 'metric']);
    expect(metric.out).toMatch(/cylinder pressure at IVC\s+[\d.]+ kPa/);
    // JSON stays SI whatever the display
    const json = JSON.parse((await cli(['run', file, ...FAST, '--json'])).out);
    expect(json.ivcPressure).toBeGreaterThan(5e4);
  });

  it('bad values are exit 2 naming the field', async () => {
    const bad = await cli(['check', 'cases/demo.yaml', '--units', 'furlongs']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^error: --units: expected one of metric, imperial, got 'furlongs'/);
    const badCase = await cli(['check', 'cases/demo.yaml', '--set', 'display.units=cubits']);
    expect(badCase.code).toBe(2);
    expect(badCase.err).toMatch(/^error: display\.units: /);
    for (const c of ['sweep', 'tune', 'compare', 'pipe', 'flow', 'calibrate', 'merge']) {
      const h = await cli([c, '--help']);
      expect(h.out, c).toContain('--units metric|imperial');
    }
  });

  it('tractwave help words prints the glossary within 80 columns', async () => {
    const r = await cli(['help', 'words']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('volumetric efficiency (ηv');
    expect(r.out).toContain('ringing phase');
    for (const line of r.out.split('\n')) expect([...line].length).toBeLessThanOrEqual(80);
  });
});
