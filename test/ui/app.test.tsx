/**
 * The terminal view through Ink at a fixed size, with a fake case session and
 * a fake engine that answers with SYNTHETIC results (fixtures.ts). These test
 * the screen and the keys, not physics.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup } from 'ink-testing-library';
import { startView } from './view-harness.js';

const RIGHT = '\u001b[C';
const DOWN = '\u001b[B';
const TAB = '\t';
const ENTER = '\r';
const BACKSPACE = '\u007f';

const start = startView;

function expectFits(frame: string, columns: number, rows: number): void {
  const lines = frame.split('\n');
  expect(lines.length).toBeLessThanOrEqual(rows - 1);
  for (const l of lines) expect([...l].length).toBeLessThanOrEqual(columns);
}

afterEach(() => {
  cleanup();
});

describe('the terminal view', () => {
  it('first frame shows IVO/IVC on the crank axis and a crank readout', async () => {
    const t = start();
    await t.until('IVC');
    const f = t.frame();
    expect(f).toContain('IVO');
    expect(f).toContain('IVC');
    expect(f).toContain('TDC');
    expect(f).toContain('θ   0°');
    expect(f).toMatch(/Pressure at the valve +\d+\.\d kPa/);
    expect(f).toContain('synthetic verdict');
    expect(t.engine.runs).toHaveLength(1);
  });

  it('→ moves the cursor and changes the readout', async () => {
    const t = start();
    await t.until('IVC');
    const before = t.frame().split('\n')[1];
    await t.press(RIGHT, RIGHT, RIGHT, RIGHT, RIGHT);
    const f = t.frame();
    expect(f).toContain('θ   5°');
    expect(f.split('\n')[1]).not.toBe(before);
  });

  it('? shows the help with every key, "quit" and the safety caution; esc closes it', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('?');
    const f = t.frame();
    expect(f).toContain('quit');
    expect(f).toContain('Safety');
    expect(f).toContain('ten degrees');
    expectFits(f, 80, 24);
    // esc alone is told apart from an escape sequence after a short wait: wait for the help to close
    t.app.stdin.write('\u001b');
    await t.untilTrue(() => !t.frame().includes('Safety'), 'the help closing on esc');
  });

  it('tab cycles the views', async () => {
    const t = start();
    await t.until('IVC');
    const seen: string[] = [];
    for (let k = 0; k < 4; k++) {
      await t.press(TAB);
      // the tab of the current view is in brackets, with its number when the header has room
      seen.push(/\[(?:\d )?(\w+)\]/.exec(t.frame())?.[1] ?? '?');
    }
    expect(seen).toEqual(['Runner', 'Sweep', 'Case', 'Valve']);
  });

  it('an edit in the case view re-runs the point and shows the old result as the baseline', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('4', DOWN, ENTER, '4', '2', '0', ENTER);
    await t.untilTrue(() => t.engine.runs.length === 2, 'a second run after the edit');
    await t.until('(baseline 300)');
    expect(t.engine.runs).toHaveLength(2);
    expect(t.engine.runs[1]?.runner.sections[0]?.length).toBeCloseTo(0.42, 12);
    let f = t.frame();
    expect(f).toContain('420 mm');
    expect(f).toContain('(baseline 300)');
    expect(f).toMatch(/baseline \d+\.\d %/);
    await t.press('1');
    await t.until('· baseline');
    f = t.frame();
    expect(f).toContain('· baseline');
    expect(f).toMatch(/\d·|·\d|··/); // the baseline curve's dots are drawn
  });

  it('+ and - change the engine speed and re-run', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('+');
    await t.untilTrue(() => t.engine.runs.length === 2, 'a re-run at the new speed');
    await t.until('6250 rpm');
    expect(t.engine.runs.at(-1)?.rpm).toBe(6250);
    await t.press('-', '-');
    await t.untilTrue(() => t.engine.runs.at(-1)?.rpm === 5750, 'a run at 5750 rpm');
    expect(t.engine.runs.at(-1)?.rpm).toBe(5750);
  });

  it('runs the sweep in the background and shows the band mean and best speed', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('3', 's');
    await t.until(/mean ηv \d/);
    const f = t.frame();
    expect(f).toContain('7 points');
    expect(f).toMatch(/mean ηv \d+\.\d %/);
    expect(f).toMatch(/Best \d+ rpm/);
    expect(f).toContain('5000–8000 rpm');
  });

  it('saves to a new name, and asks before overwriting an existing file', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('w');
    await t.until('/cases/synthetic-3.yaml');
    await t.press(ENTER);
    await t.until('Saved to');
    expect(t.session.saved).toEqual([{ edits: [], path: '/cases/synthetic-3.yaml', overwrite: false }]);
    expect(t.frame()).toContain('Saved to /cases/synthetic-3.yaml');
    // now type the name of a file that exists
    await t.press('w');
    await t.press(...Array.from({ length: 6 }, () => BACKSPACE), '2.yaml', ENTER);
    await t.until('/cases/synthetic-2.yaml already exists. Overwrite it?');
    expect(t.session.saved).toHaveLength(1);
    await t.press('y');
    await t.until('Saved to /cases/synthetic-2.yaml');
    expect(t.session.saved[1]).toEqual({ edits: [], path: '/cases/synthetic-2.yaml', overwrite: true });
  });

  it('r writes a report of the case being edited, asks before replacing a file and says where it went', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('+'); // an edit: the report is of the edited case
    await t.until('6250');
    await t.press('r');
    expect(t.frame()).toContain('Write the report of this case (HTML) to: /cases/synthetic-report.html');
    await t.press(ENTER);
    await t.until('Report written to');
    expect(t.session.reports).toEqual([{ edits: [{ path: 'rpm', value: '6250' }], path: '/cases/synthetic-report.html', overwrite: false }]);
    expect(t.frame()).toContain('Report written to /cases/synthetic-report.html');
    // the next name offered is a new one; asked for an existing name, it asks first
    await t.press('r');
    expect(t.frame()).toContain('/cases/synthetic-report-2.html');
    await t.press(...Array.from({ length: 7 }, () => BACKSPACE), '.html', ENTER);
    await t.until('already exists');
    expect(t.frame()).toContain('/cases/synthetic-report.html already exists. Overwrite it?');
    expect(t.session.reports).toHaveLength(1);
    await t.press('n');
    await t.press('\u001b'); // esc: no report
    await t.until('No report written.');
    expect(t.session.reports).toHaveLength(1);
  });

  it.each([
    [80, 24],
    [72, 22],
    [120, 40],
  ])('at %i × %i no line is wider than the terminal in any view (colour on, ANSI stripped)', async (columns, rows) => {
    const t = start({ columns, rows }, true);
    await t.until('IVC');
    expectFits(t.frame(), columns, rows);
    // each key changes the screen: the Runner, Sweep (which starts the sweep), Case and Valve views, the sweep
    // stopped or run again from the Valve view's neighbour, and the help
    for (const k of ['2', '3', '4', '1', '?']) {
      await t.press(k);
      expectFits(t.frame(), columns, rows);
    }
    await t.press('?'); // closes the help
    await t.press('3');
    await t.until(/mean ηv \d/); // the sweep has finished: its full screen
    expectFits(t.frame(), columns, rows);
  });

  it('a window smaller than usable shows a clear note instead of the views', async () => {
    const t = start({ columns: 60, rows: 20 });
    await t.until('Make the window larger');
    const f = t.frame();
    expect(f).not.toContain('IVC');
    expectFits(f, 60, 20);
  });

  it('without colour the frame carries no escape codes', async () => {
    const t = start({ columns: 80, rows: 24 }, false);
    await t.until('IVC');
    expect(t.app.lastFrame()).not.toMatch(/\u001b\[/);
  });
});
