/** The terminal view's report (key r) through the real case session: the edited case, written once, never over a file unasked. */
import { afterAll, describe, expect, it } from 'vitest';
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { openCase } from '../../src/ui/case-session.js';
import { FileExistsError } from '../../src/ui/save.js';
import { ROOT } from '../cli/helpers.js';
import { chartsOf, tempDir } from './reports.js';

const tmp = tempDir('tractwave-report-view-');
afterAll(() => tmp.remove());

describe('the report of the case being edited in the terminal view', () => {
  it('offers a name beside the case, writes the edited design and refuses to replace a file unless asked', async () => {
    const file = join(tmp.dir, 'mine.yaml');
    copyFileSync(join(ROOT, 'cases/demo.yaml'), file);
    const session = await openCase(file);
    const target = await session.suggestReportPath();
    expect(target).toBe(join(tmp.dir, 'mine-report.html'));
    const edits = [{ path: 'runner.length', value: '320 mm' }];
    expect(await session.report(edits, target, false)).toBe(target);
    const html = readFileSync(target, 'utf8');
    expect(html.includes('runner 320×40 →')).toBe(true); // the edited runner, in the network line
    expect(html.includes('<td>320.0 mm, Ø 40.0 mm</td>')).toBe(true); // and in the case table
    expect(chartsOf(html).size).toBeGreaterThanOrEqual(4);
    expect(await session.suggestReportPath()).toBe(join(tmp.dir, 'mine-report-2.html'));
    writeFileSync(join(tmp.dir, 'other.html'), 'mine');
    await expect(session.report(edits, join(tmp.dir, 'other.html'), false)).rejects.toBeInstanceOf(FileExistsError);
    expect(readFileSync(join(tmp.dir, 'other.html'), 'utf8')).toBe('mine');
  }, 120_000);
});
