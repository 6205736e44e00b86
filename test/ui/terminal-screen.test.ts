/**
 * What the user's terminal shows, not what the view meant to write: the
 * view as `tractwave` runs it (the bundle, bin/tractwave.js) on a
 * pseudo-terminal of 80×24 (util-linux `script`), driven by keys, and its
 * output fed to a terminal emulator (@xterm/headless, the emulator core of
 * the xterm.js project, from the npm registry). The screen must hold one
 * frame: the header on the first row, the key hints on the last row of the
 * frame, nothing of an earlier frame left over. Ink 6.8.0's line-by-line
 * renderer, as installed, draws each frame one row lower than the last
 * (scripts/ink-line-fix.mjs); this test is what catches that.
 */
import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Terminal } from '@xterm/headless';
import { HAS_SCRIPT } from '../support/has-script.js';
import { ROOT } from '../hardening/cli.js';
import { fixInkLogUpdate, INK_LINE_FAULT, INK_LINE_FIXED } from '../../scripts/ink-line-fix.mjs';

const BUNDLE = join(ROOT, 'dist', 'tractwave.mjs');
const COLS = 80;
const ROWS = 24;

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

/** run the bundled view on an 80×24 pty, press `keys` (each after its wait for text to appear), and return everything it wrote before `q` */
async function drive(steps: readonly { key: string; waitFor?: string; settle?: number }[]): Promise<string> {
  const cmd = `stty cols ${COLS} rows ${ROWS}; exec "${process.execPath}" bin/tractwave.js cases/demo.yaml`;
  const child = spawn('script', ['-qfec', cmd, '/dev/null'], {
    cwd: ROOT,
    env: { ...process.env, SHELL: '/bin/sh', TERM: 'xterm-256color', NO_COLOR: '1', CI: 'true' },
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout.on('data', (d: Buffer) => (out += d.toString()));
  const exited = new Promise<number | null>((r) => child.on('exit', r));
  const waitFor = async (text: string, from: number): Promise<void> => {
    const t0 = Date.now();
    while (!out.slice(from).includes(text)) {
      if (Date.now() - t0 > 30_000) throw new Error(`the view did not show '${text}' within 30 s; it wrote: ${JSON.stringify(out.slice(-400))}`);
      await sleep(50);
    }
  };
  try {
    await waitFor('cycles', 0); // the first point's result is on the screen
    for (const s of steps) {
      const from = out.length;
      child.stdin.write(s.key);
      if (s.waitFor) await waitFor(s.waitFor, from);
      await sleep(s.settle ?? 400);
    }
    const shown = out;
    child.stdin.write('q');
    expect(await exited).toBe(0);
    return shown;
  } finally {
    child.kill('SIGKILL');
  }
}

/** the emulated screen after `data`, row by row (trailing blanks trimmed) */
function screen(data: string): Promise<string[]> {
  const term = new Terminal({ cols: COLS, rows: ROWS, allowProposedApi: true });
  return new Promise((resolve) =>
    term.write(data, () => {
      const buf = term.buffer.active;
      const rows: string[] = [];
      for (let y = 0; y < ROWS; y++) rows.push(buf.getLine(buf.viewportY + y)?.translateToString(true) ?? '');
      term.dispose();
      resolve(rows);
    }),
  );
}

/** one whole frame: header on row 1, hints on row 23 (the frame is one row shorter than the terminal), the header nowhere else */
function expectOneFrame(rows: string[], tab: string): void {
  const text = rows.join('\n');
  expect(rows[0], text).toMatch(/^Club racer 450/);
  expect(rows[0], text).toContain(tab);
  expect(rows.filter((r) => /Valve.+Runner.+Sweep.+Case/.test(r)), text).toHaveLength(1);
  expect(rows.filter((r) => r.includes('q quit')), text).toHaveLength(1);
  expect(rows[ROWS - 2], text).toMatch(/q quit/);
  expect(rows[ROWS - 1], text).toBe('');
}

describe.skipIf(!HAS_SCRIPT)('the view on a real terminal (bundle, 80×24, emulated screen)', () => {
  it('is built (npm run build) — the view users run is the bundle', () => {
    expect(existsSync(BUNDLE), 'dist/tractwave.mjs is missing: run `npm run build`').toBe(true);
  });

  it.skipIf(!existsSync(BUNDLE))(
    'holds one frame after the first point, a view change, playing the cycle and stepping the crank',
    async () => {
      const data = await drive([
        { key: '3', waitFor: 'against engine speed', settle: 2500 }, // the sweep fills in
        { key: '1', waitFor: 'Pressure at the valve' },
        { key: ' ', settle: 1200 }, // play the cycle
        { key: ' ' }, // stop
        { key: '\u001b[C' }, // one degree on
      ]);
      // the view changed and played: many frames were drawn line by line over each other
      expect((data.match(/Pressure at the valve/g) ?? []).length).toBeGreaterThan(3);
      expectOneFrame(await screen(data), '[1 Valve]');
    },
    60_000,
  );

  it.skipIf(!existsSync(BUNDLE))(
    'holds one frame in the Sweep view after its points came in',
    async () => {
      const data = await drive([{ key: '3', waitFor: 'against engine speed', settle: 3000 }]);
      expectOneFrame(await screen(data), '[3 Sweep]');
    },
    60_000,
  );
});

describe("the fix of Ink's line-by-line renderer", () => {
  const installed = readFileSync(join(ROOT, 'node_modules', 'ink', 'build', 'log-update.js'), 'utf8');
  it('applies to the installed Ink exactly once (a new Ink version makes this fail: check its renderer again)', () => {
    const fixed = fixInkLogUpdate(installed);
    expect(fixed).toContain(INK_LINE_FIXED);
    expect(fixed).not.toContain(INK_LINE_FAULT);
    expect(fixed.length - installed.length).toBe(INK_LINE_FIXED.length - INK_LINE_FAULT.length);
  });
  it('refuses a renderer it was not written for', () => {
    expect(() => fixInkLogUpdate('export default {};')).toThrow(/not the one/);
  });
});
