// Make docs/report-demo.png, the README's picture of the demo report:
// the speed page and the best-speed page side by side, as Chromium shows them.
//   npx tractwave report cases/demo.yaml --out /tmp/demo.html
//   node scripts/report-screenshot.mjs /tmp/demo.html docs/report-demo.png
// Needs the system Chromium (TRACTWAVE_CHROMIUM or /usr/bin/chromium).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { PNG } from 'pngjs';

const [input, output] = process.argv.slice(2);
if (!input || !output) {
  console.error('usage: node scripts/report-screenshot.mjs REPORT.html OUT.png');
  process.exit(2);
}
const profile = mkdtempSync(join(tmpdir(), 'tractwave-shot-'));
const context = await chromium.launchPersistentContext(profile, {
  executablePath: process.env.TRACTWAVE_CHROMIUM || '/usr/bin/chromium',
  headless: true,
  args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  viewport: { width: 860, height: 1200 },
});
try {
  const page = await context.newPage();
  await page.goto(pathToFileURL(resolve(input)).href);
  const shots = [];
  for (const selector of ['section#speed', 'section.point']) shots.push(PNG.sync.read(await page.locator(selector).first().screenshot()));
  const gap = 24;
  const width = shots.reduce((w, s) => w + s.width, 0) + gap * (shots.length + 1);
  const height = Math.max(...shots.map((s) => s.height)) + 2 * gap;
  const out = new PNG({ width, height });
  out.data.fill(255);
  let x = gap;
  for (const s of shots) {
    PNG.bitblt(s, out, 0, 0, s.width, s.height, x, gap);
    x += s.width + gap;
  }
  writeFileSync(output, PNG.sync.write(out, { colorType: 2 }));
  console.log(`wrote ${output} (${width} × ${height})`);
} finally {
  await context.close();
  rmSync(profile, { recursive: true, force: true });
}
