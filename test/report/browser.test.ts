/**
 * The reports in a real browser: Debian's Chromium driven by playwright-core
 * (the system browser, headless, a fresh profile, no network). Each report
 * opens with no console error and asks for nothing outside its own file,
 * every chart has a box on the page, a screenshot is not blank, and printing
 * to PDF gives one page per section on A4 and on Letter.
 *
 * Skips, loudly, only when no Chromium can be found at all (set
 * TRACTWAVE_CHROMIUM to its path); .ci/run installs Debian's chromium first.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext } from 'playwright-core';
import { PNG } from 'pngjs';
import { BUNDLED, makeReport, tempDir, type MadeReport } from './reports.js';

const CANDIDATES = [process.env['TRACTWAVE_CHROMIUM'], '/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome-stable', '/usr/bin/google-chrome'];
const browserPath = CANDIDATES.find((p): p is string => p !== undefined && p !== '' && existsSync(p));

if (!browserPath) {
  const bar = '#'.repeat(78);
  console.warn(
    `\n${bar}\n# SKIPPED: the real-browser tests of the HTML report (test/report/browser.test.ts)\n` +
      `# No Chromium found at ${CANDIDATES.filter(Boolean).join(', ')}.\n` +
      '# Install it (apt-get install -y chromium) or set TRACTWAVE_CHROMIUM=/path/to/chromium.\n' +
      `${bar}\n`,
  );
}

/** launch flags for a root user in a container, no network chatter */
const FLAGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

/** pages of a PDF: its page objects (/Type /Page, not /Pages) */
function pdfPages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) ?? []).length;
}

describe.skipIf(!browserPath)('the report in a real browser (Chromium)', () => {
  const tmp = tempDir('tractwave-report-browser-');
  const profile = mkdtempSync(join(tmpdir(), 'tractwave-chromium-profile-'));
  let context: BrowserContext;
  const reports: MadeReport[] = [];

  beforeAll(async () => {
    for (const name of BUNDLED) reports.push(await makeReport(tmp.dir, name, [`cases/${name}.yaml`]));
    // everything at once: a compared design, an extra operating point and a dyno sheet
    writeFileSync(join(tmp.dir, 'dyno.csv'), 'rpm,torque_Nm\n5000,45\n6000,48\n7000,44\n');
    reports.push(
      await makeReport(tmp.dir, 'everything', ['cases/demo.yaml', '--at', '5000', '--compare', 'cases/airbox-single.yaml', '--measured', join(tmp.dir, 'dyno.csv')]),
    );
    context = await chromium.launchPersistentContext(profile, { executablePath: browserPath!, headless: true, args: FLAGS, viewport: { width: 1000, height: 1400 } });
  }, 180_000);

  afterAll(async () => {
    await context?.close();
    rmSync(profile, { recursive: true, force: true });
    tmp.remove();
  });

  it('made every report', () => {
    expect(reports.map((r) => [r.name, r.code, r.err])).toEqual(reports.map((r) => [r.name, 0, r.code === 0 ? r.err : 'failed']));
  });

  it.each([...BUNDLED, 'everything'])('%s: opens with no console error, fetches nothing, every chart has a box, and is not blank', async (name) => {
    const r = reports.find((x) => x.name === name)!;
    const page = await context.newPage();
    const problems: string[] = [];
    const requests: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') problems.push(`${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    await page.route('**/*', (route) => {
      const url = route.request().url();
      requests.push(url);
      return url.startsWith('file:') ? route.continue() : route.abort();
    });
    const url = pathToFileURL(r.file).href;
    await page.goto(url, { waitUntil: 'load' });
    expect(problems).toEqual([]);
    expect(requests).toEqual([url]);
    const boxes = await page.$$eval('figure.chart svg', (svgs) =>
      svgs.map((s) => {
        const b = s.getBoundingClientRect();
        return { chart: s.parentElement?.getAttribute('data-chart') ?? '', width: b.width, height: b.height };
      }),
    );
    expect(boxes.length).toBeGreaterThanOrEqual(name === 'everything' ? 7 : 5);
    for (const b of boxes) {
      expect(b.width, b.chart).toBeGreaterThan(300);
      expect(b.height, b.chart).toBeGreaterThan(100);
    }
    // a screenshot of the whole page: mostly paper, but well inked, in many shades
    const png = PNG.sync.read(await page.screenshot({ fullPage: true }));
    let inked = 0;
    const shades = new Set<number>();
    for (let i = 0; i < png.data.length; i += 4 * 7) {
      const [red, green, blue] = [png.data[i]!, png.data[i + 1]!, png.data[i + 2]!];
      if (red < 235 || green < 235 || blue < 235) inked++;
      shades.add(((red >> 4) << 8) | ((green >> 4) << 4) | (blue >> 4));
    }
    const samples = png.data.length / (4 * 7);
    expect(inked / samples).toBeGreaterThan(0.05);
    expect(shades.size).toBeGreaterThan(50);
    await page.close();
  });

  it.each([...BUNDLED, 'everything'])('%s: prints one page per section on A4 and on Letter', async (name) => {
    const r = reports.find((x) => x.name === name)!;
    const page = await context.newPage();
    await page.goto(pathToFileURL(r.file).href, { waitUntil: 'load' });
    const sections = await page.$$eval('section.page', (s) => s.length);
    // the design, the speed range, each operating point, the mass balance; and a page of maps of the other pipes (snorkel, exhaust pipe, resonators) after each point of a case that has them
    const pipePages = await page.$$eval('section.page.pipes', (s) => s.length);
    expect(sections).toBe((name === 'everything' ? 5 : 4) + pipePages);
    if (['airbox-single', 'resonator-single'].includes(name)) expect(pipePages).toBe(1);
    if (name === 'demo') expect(pipePages).toBe(0);
    await page.emulateMedia({ media: 'print' });
    // each section fits its page with 5 mm to spare at the page's content width (margins 11 mm a side, 11 + 12 mm top and bottom;
    // 96 px to the inch), so a line more of text cannot push one over
    const mm = 96 / 25.4;
    for (const [format, w, h] of [['A4', 210, 297], ['Letter', 215.9, 279.4]] as const) {
      await page.setViewportSize({ width: Math.floor((w - 22) * mm), height: Math.floor((h - 23) * mm) });
      const heights = await page.$$eval('section.page', (ss) => ss.map((x) => [x.id, x.getBoundingClientRect().height] as const));
      for (const [id, height] of heights) expect(height, `${format}: section ${id}`).toBeLessThanOrEqual((h - 23 - 5) * mm);
    }
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true });
      expect(pdfPages(pdf), format).toBe(sections);
    }
    await page.close();
  });
});
