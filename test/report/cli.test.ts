/**
 * The report command's options and files: bad options and targets are exit 2
 * with one line naming the option, before anything is simulated; an existing
 * file is kept without --force; the writes leave no temporary file; --svg
 * on report, sweep and run writes the charts as SVG files.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, ROOT } from '../cli/helpers.js';
import { axisTitles, tempDir } from './reports.js';

const tmp = tempDir('tractwave-report-cli-');
afterAll(() => tmp.remove());
const at = (name: string) => join(tmp.dir, name);

/** one line on stderr, `error: <option>: ...`, exit 2 */
function expectBadOption(r: { code: number; err: string }, option: string): void {
  expect(r.code, r.err).toBe(2);
  const lines = r.err.split('\n').filter((l) => l.trim() !== '');
  expect(lines).toHaveLength(1);
  expect(lines[0]!.startsWith(`error: ${option}: `), lines[0]).toBe(true);
  expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
}

describe('report: bad options and targets (exit 2, naming the option)', () => {
  it.each([
    ['no --out', ['cases/demo.yaml'], '--out'],
    ['--out not .html', ['cases/demo.yaml', '--out', 'report.txt'], '--out'],
    ['--out in a folder that does not exist', ['cases/demo.yaml', '--out', '/nonexistent-folder-of-tractwave/r.html'], '--out'],
    ['--out where nothing can be written', ['cases/demo.yaml', '--out', '/proc/tractwave-report.html'], '--out'],
    ['--units unknown', ['cases/demo.yaml', '--units', 'furlongs', '--out', 'x.html'], '--units'],
    ['--at not a speed', ['cases/demo.yaml', '--at', 'fast', '--out', 'x.html'], '--at'],
    ['--at out of range', ['cases/demo.yaml', '--at', '5000,999999', '--out', 'x.html'], '--at'],
    ['--rpm not a range', ['cases/demo.yaml', '--rpm', '3000-9000', '--out', 'x.html'], '--rpm'],
    ['--band outside the speeds', ['cases/demo.yaml', '--rpm', '4000:6000:500', '--band', '3000:9000', '--out', 'x.html'], '--band'],
    ['an unknown option', ['cases/demo.yaml', '--colour', 'red', '--out', 'x.html'], '--colour'],
    ['--jobs zero', ['cases/demo.yaml', '--jobs', '0', '--out', 'x.html'], '--jobs'],
  ])('%s', async (_what, args, option) => {
    const r = await cli(['report', ...args.map((a) => (a === 'cases/demo.yaml' ? join(ROOT, a) : a))], { cwd: tmp.dir });
    expectBadOption(r, option);
  });

  it('--out naming a folder', async () => {
    mkdirSync(at('folder.html'));
    expectBadOption(await cli(['report', 'cases/demo.yaml', '--out', at('folder.html')]), '--out');
  });

  it('--svg naming a file', async () => {
    writeFileSync(at('not-a-folder'), 'x');
    expectBadOption(await cli(['report', 'cases/demo.yaml', '--svg', at('not-a-folder'), '--out', at('y.html')]), '--svg');
  });

  it('a missing --compare case names the file', async () => {
    const r = await cli(['report', 'cases/demo.yaml', '--compare', 'cases/nothing-here.yaml', '--out', at('z.html')]);
    expect(r.code).toBe(2);
    expect(r.err).toBe("error: cases/nothing-here.yaml: file not found\n");
  });

  it('a bad dyno sheet names the file, the row and the column', async () => {
    writeFileSync(at('dyno.csv'), 'rpm,torque_Nm\n5000,40\n6000,forty\n');
    const r = await cli(['report', 'cases/demo.yaml', '--measured', at('dyno.csv'), '--out', at('w.html')]);
    expect(r.code).toBe(2);
    expect(r.err).toBe(`error: ${at('dyno.csv')}: row 3, column 'torque_Nm': 'forty' is not a number\n`);
  });
});

describe('report: existing files and atomic writes', () => {
  it('keeps an existing file without --force and says so before simulating', async () => {
    writeFileSync(at('kept.html'), 'mine');
    const r = await cli(['report', 'cases/demo.yaml', '--out', at('kept.html')]);
    expectBadOption(r, '--out');
    expect(r.err).toContain('already exists; add --force');
    expect(readFileSync(at('kept.html'), 'utf8')).toBe('mine');
  });

  it('replaces it with --force, in one rename: no temporary file is left and the new file is whole', async () => {
    writeFileSync(at('replaced.html'), 'mine');
    const r = await cli(['report', 'cases/demo.yaml', '--rpm', '5000:7000:1000', '--force', '--out', at('replaced.html')]);
    expect(r.code, r.err).toBe(0);
    const html = readFileSync(at('replaced.html'), 'utf8');
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html.trimEnd().endsWith('</html>')).toBe(true);
    expect(readdirSync(tmp.dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });
});

describe('--svg: each chart as its own file', () => {
  it('report --svg DIR writes every chart of the report, each with titled axes', async () => {
    const r = await cli(['report', 'cases/demo.yaml', '--rpm', '5000:8000:500', '--at', '5000', '--svg', at('slides'), '--out', at('slides.html')]);
    expect(r.code, r.err).toBe(0);
    const files = readdirSync(at('slides')).sort();
    const best = /best [\d.]+ % at (\d+) rpm/.exec(r.out)?.[1];
    expect(files).toEqual(
      ['mass-balance.svg', `runner-${best}rpm.svg`, 'runner-5000rpm.svg', 'speed-output.svg', 'speed-ve.svg', `valve-${best}rpm.svg`, 'valve-5000rpm.svg'].sort(),
    );
    for (const f of files) {
      const svg = readFileSync(join(at('slides'), f), 'utf8');
      expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"'), f).toBe(true);
      for (const t of axisTitles(svg)) expect(t, `${f}: ${t}`).toMatch(/\[[^\]]+\]/);
    }
    // a second run keeps them unless --force
    const again = await cli(['report', 'cases/demo.yaml', '--rpm', '5000:8000:500', '--svg', at('slides'), '--out', at('slides-2.html')]);
    expectBadOption(again, '--svg');
    expect(existsSync(at('slides-2.html'))).toBe(false);
  });

  it('sweep --svg FILE writes the ηv curve; run --svg FILE the valve chart', async () => {
    const s = await cli(['sweep', 'cases/demo.yaml', '--rpm', '5000:7000:500', '--svg', at('curve.svg')]);
    expect(s.code, s.err).toBe(0);
    expect(s.out).toContain(`wrote the chart of ηv against speed to ${at('curve.svg')}`);
    expect(axisTitles(readFileSync(at('curve.svg'), 'utf8'))).toEqual(['engine speed [rpm]', 'volumetric efficiency ηv [%]']);
    const r = await cli(['run', 'cases/demo.yaml', '--svg', at('valve.svg')]);
    expect(r.code, r.err).toBe(0);
    const titles = axisTitles(readFileSync(at('valve.svg'), 'utf8'));
    expect(titles).toContain('valve pressure [kPa]');
    expect(titles).toContain('valve flow [g/s]');
    expect(titles).toContain('cylinder mass [mg]');
    // existing file: refused without --force, replaced with it
    expectBadOption(await cli(['run', 'cases/demo.yaml', '--svg', at('valve.svg')]), '--svg');
    expect((await cli(['run', 'cases/demo.yaml', '--svg', at('valve.svg'), '--force'])).code).toBe(0);
    expectBadOption(await cli(['sweep', 'cases/demo.yaml', '--svg', at('curve.png')]), '--svg');
  });
});

describe('report --units imperial, --compare, --measured', () => {
  it('draws the compared design and the measured points, in imperial units', async () => {
    writeFileSync(at('dyno-hp.csv'), '# an invented dyno sheet\nrpm,torque_lbft,power_hp\n5000,33,31.4\n6000,36,41.1\n7000,,47.0\n');
    const r = await cli([
      'report', 'cases/demo.yaml', '--rpm', '5000:7000:1000', '--compare', 'cases/airbox-single.yaml', '--measured', at('dyno-hp.csv'),
      '--units', 'imperial', '--out', at('all.html'),
    ]);
    expect(r.code, r.err).toBe(0);
    const html = readFileSync(at('all.html'), 'utf8');
    expect(html).toContain('Road 390 single with airbox');
    expect(html).toContain('measured (dyno sheet)');
    expect(html).toContain('brake torque [lb·ft]');
    expect(html).toContain('brake power [hp]');
    expect(html).toContain('valve pressure [psi]');
    expect(html).toContain('units imperial');
    expect(html).toContain('data-key="compare.volumetricEfficiency"');
  });
});

describe('help', () => {
  it.each(['report', 'run', 'sweep'])('%s --help fits 80 columns and names --svg', async (command) => {
    const r = await cli([command, '--help']);
    expect(r.code).toBe(0);
    for (const line of r.out.split('\n')) expect([...line].length, line).toBeLessThanOrEqual(80);
    expect(r.out).toContain('--svg');
  });
});
