/**
 * Measured cam lift logs: the model follows the log; cam degrees are crank
 * degrees halved; the lash moves the events to where the logged lift passes
 * it (the geometry of a sin² lobe, solved by hand below); a checking-lift
 * card read off the log widens back to the log's own zero-lift ends.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import YAML from 'yaml';
import { loadCase, parseYamlText } from '../../src/case/load.js';
import { simulatePoint } from '../../src/core/engine.js';
import { valveLift } from '../../src/core/valve.js';
import { liftCrossings } from '../../src/case/lift-file.js';

const dir = mkdtempSync(join(tmpdir(), 'tractwave-lift-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const demo = parseYamlText(readFileSync('cases/demo.yaml', 'utf8'), 'cases/demo.yaml');

/** the demo case with its intake valve from a lift log written beside it */
function withLog(name: string, csv: string, intake: Record<string, unknown> = {}): string {
  writeFileSync(join(dir, `${name}.csv`), csv);
  const d = structuredClone(demo) as Record<string, any>;
  const { opens: _o, closes: _c, maxLift: _m, ...rest } = d.intake;
  d.intake = { ...rest, liftFile: `${name}.csv`, ...intake };
  const f = join(dir, `${name}.yaml`);
  writeFileSync(f, YAML.stringify(d));
  return f;
}

describe("a lift log that traces the card's own lift curve", async () => {
  const card = await loadCase('cases/demo.yaml');
  const iv = card.model.intake; // opens 30 BTDC (θ 690), closes 60 ABDC (θ 240)
  const rows: string[] = [];
  for (let th = -50; th <= 260; th++) rows.push(`${th},${(valveLift(iv, th) * 1000).toFixed(6)}`);
  const crankFile = withLog('card-crank', `crank_deg,lift_mm\n${rows.join('\n')}\n`);
  const camRows = rows.map((r) => {
    const [th, l] = r.split(',');
    return `${Number(th) / 2},${l}`;
  });
  const camFile = withLog('card-cam', `cam_deg,lift_mm\n${camRows.join('\n')}\n`);
  const fromLog = await loadCase(crankFile);
  const fromCam = await loadCase(camFile);

  it('puts the events where the card has them, and the same max lift', () => {
    expect(fromLog.model.intake.openAngle).toBeCloseTo(690, 6);
    expect(fromLog.model.intake.closeAngle).toBeCloseTo(240, 6);
    expect(fromLog.model.intake.maxLift).toBeCloseTo(iv.maxLift, 9);
  });

  it.each([5000, 6500, 8000])('gives the same ηv within 0.3 percent at %d rpm (the card is the reference)', (rpm) => {
    const a = simulatePoint({ ...card.model, rpm }).result.volumetricEfficiency;
    const b = simulatePoint({ ...fromLog.model, rpm }).result.volumetricEfficiency;
    expect(Math.abs(b / a - 1)).toBeLessThan(0.003);
  });

  it('cam degrees and crank degrees agree (cam angle × 2 = crank angle)', () => {
    expect(fromCam.model.intake.openAngle).toBeCloseTo(fromLog.model.intake.openAngle, 9);
    expect(fromCam.model.intake.closeAngle).toBeCloseTo(fromLog.model.intake.closeAngle, 9);
    expect(fromCam.model.intake.liftTable).toEqual(fromLog.model.intake.liftTable);
  });
});

describe('lash: the valve opens where the logged lift passes it', () => {
  // a lobe at the follower: P·sin²(π(θ − θ0)/D), P 10.2 mm, D 320°, θ0 = −60°, logged every degree
  const P = 10.2;
  const D = 320;
  const t0 = -60;
  const rows: string[] = [];
  for (let th = -80; th <= 280; th++) {
    const phi = (th - t0) / D;
    rows.push(`${th},${phi > 0 && phi < 1 ? (P * Math.sin(Math.PI * phi) ** 2).toFixed(6) : '0'}`);
  }
  const csv = `crank_deg,lift_mm\n${rows.join('\n')}\n`;

  it.each([0.1, 0.2, 0.35])('lash %f mm: events at P·sin²(πφ) = lash, max lift P − lash', async (lash) => {
    const l = await loadCase(withLog(`lash-${lash}`, csv, { lash: `${lash} mm` }));
    // by hand: φ = asin(√(lash/P))/π from each end of the lobe
    const phi = Math.asin(Math.sqrt(lash / P)) / Math.PI;
    const open = t0 + phi * D;
    const close = t0 + (1 - phi) * D;
    expect(l.model.intake.openAngle).toBeCloseTo(open + 720, 1); // θ wrapped into 0..720
    expect(l.model.intake.closeAngle).toBeCloseTo(close, 1);
    expect(l.model.intake.maxLift * 1000).toBeCloseTo(P - lash, 6);
    // more lash, shorter duration: the events move in by the same angle at each end (a symmetric lobe)
    expect(open - t0).toBeCloseTo(t0 + D - close, 6);
  });

  it('a checking-lift card read off the log widens back to the log\'s zero-lift ends', async () => {
    const l = await loadCase(withLog('checking', csv, { lash: '0.2 mm', checkingLift: '1 mm' }));
    const log = l.files.intake.lift!.log;
    const zero = liftCrossings(log, 0)!;
    const at1 = liftCrossings(log, 0.001)!;
    // the card is the 1 mm events (intake opens BTDC, closes ABDC) ...
    expect(l.case.intake.opens).toBeCloseTo(-at1.open, 9);
    expect(l.case.intake.closes).toBeCloseTo(at1.close - 180, 9);
    // ... and the model's events are the zero-lift ends of the log
    expect(l.model.intake.openAngle).toBeCloseTo(zero.open + 720, 6);
    expect(l.model.intake.closeAngle).toBeCloseTo(zero.close, 6);
  });

  it('the model lift follows every logged point (after lash)', async () => {
    const l = await loadCase(withLog('follow', csv, { lash: '0.2 mm' }));
    for (const th of [-40, 0, 60, 100, 150, 240]) {
      const phi = (th - t0) / D;
      const expected = Math.max(0, P * Math.sin(Math.PI * phi) ** 2 - 0.2) / 1000;
      expect(valveLift(l.model.intake, ((th % 720) + 720) % 720)).toBeCloseTo(expected, 8);
    }
  });

  it('check prints the duration at zero and at checking lift, the lobe centre and the max lift', async () => {
    const { cli } = await import('../cli/helpers.js');
    const r = await cli(['check', withLog('check', csv, { lash: '0.2 mm', checkingLift: '1 mm' })]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/intake lift log .*lash 0\.20 mm subtracted/);
    expect(r.out).toMatch(/at zero lift\s+opens .* BTDC, closes .* ABDC, duration \d+\.\d°/);
    expect(r.out).toMatch(/at 1\.00 mm checking lift\s+opens/);
    // the symmetric lobe is centred at θ0 + D/2 = 100° ATDC
    expect(r.out).toMatch(/lobe centre\s+100\.0° ATDC/);
    expect(r.out).toMatch(/max lift\s+10\.00 mm/);
  });
});

describe('a case with a lift log gives no card of its own', () => {
  it.each([['opens', 30], ['closes', 60], ['maxLift', '10 mm']])('intake.%s is refused beside liftFile', async (key, value) => {
    const f = withLog(`dup-${key}`, 'crank_deg,lift_mm\n-40,0\n100,10\n250,0\n', { [key]: value });
    await expect(loadCase(f)).rejects.toThrow(new RegExp(`intake\\.${key}: not used with intake\\.liftFile`));
  });
});
