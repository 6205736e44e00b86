/**
 * The keys added for a smoother first hour, through Ink at 80×24 with the
 * fake session and the SYNTHETIC engine (fixtures.ts; screen and keys, not
 * physics): line editing in a field, ctrl+z undo over several edits, up to
 * three pinned baselines labelled by what differs from the present design,
 * the large Valve chart cycling, zoom shown in the header, the save prompt's
 * cursor and the Case title after saving. Each waits for a condition.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup } from 'ink-testing-library';
import { startView } from './view-harness.js';

const DOWN = '\u001b[B';
const LEFT = '\u001b[D';
const ENTER = '\r';
const ctrl = (letter: string): string => String.fromCharCode(letter.charCodeAt(0) - 96);
const start = startView;

afterEach(() => {
  cleanup();
});

describe('line editing in a field', () => {
  it('ctrl+u clears what was typed (it no longer inserts "u"); ← and ctrl+a/e move; ctrl+w deletes a word', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('4', DOWN, ENTER, '3', '5', '0');
    await t.until('350▌');
    await t.press(ctrl('u'));
    await t.until(/Runner length\s+▌/);
    expect(t.row('Runner length')).toMatch(/▶ Runner length\s+▌ mm/);
    // type 45, go left one and put a 2 between: 425
    await t.press('4', '5', LEFT, '2');
    await t.until('42▌5');
    // ctrl+a to the start, 1 there: 1425; ctrl+e to the end
    await t.press(ctrl('a'), '1');
    await t.until('1▌425');
    await t.press(ctrl('e'));
    await t.until('1425▌');
    // ctrl+w takes the number back
    await t.press(ctrl('w'));
    await t.until(/Runner length\s+▌/);
    await t.press('4', '0', '0', ENTER);
    await t.runs(2);
    expect(t.engine.runs.at(-1)?.runner.sections[0]?.length).toBeCloseTo(0.4, 12);
  });

  it('the save prompt edits its file name the same way: ctrl+w, ← and typing in the middle', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('w');
    await t.until('/cases/synthetic-3.yaml▌');
    // delete the word before the cursor ("synthetic-3.yaml"), type a new name, then fix a letter in the middle
    await t.press(ctrl('w'));
    await t.until('as: /cases/▌');
    await t.press(...'tst.yaml', ...Array.from({ length: 7 }, () => LEFT), 'e');
    await t.until('/cases/te▌st.yaml');
    await t.press(ENTER);
    await t.until('Saved to /cases/test.yaml');
    expect(t.session.saved.at(-1)?.path).toBe('/cases/test.yaml');
    // the Case title now names the saved file
    expect(t.frame().split('\n')[1]).toContain('saved as /cases/test.yaml');
  });
});

describe('ctrl+z undo', () => {
  it('takes back several edits, one at a time, re-running each', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('4', DOWN, '.');
    await t.runs(2);
    await t.until(/Runner length\s+310/);
    await t.press('.');
    await t.runs(3);
    await t.until(/Runner length\s+320/);
    await t.press('+');
    await t.runs(4);
    await t.until('6250 rpm');
    await t.press(ctrl('z'));
    await t.until('Undone: back to engine speed 6000 rpm');
    await t.runs(5);
    expect(t.engine.runs.at(-1)?.rpm).toBe(6000);
    await t.press(ctrl('z'));
    await t.until(/Runner length\s+310/);
    await t.press(ctrl('z'));
    await t.until(/Runner length\s+300/);
    await t.runs(7);
    expect(t.engine.runs.at(-1)?.runner.sections[0]?.length).toBeCloseTo(0.3, 12);
    await t.press(ctrl('z'));
    await t.until('Nothing to undo');
  });
});

describe('several pinned baselines', () => {
  it('p pins up to three, each labelled with what differs from the present design; b picks which to compare', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('4', 'p');
    await t.until('Pinned this result as A');
    await t.press(DOWN, '.');
    await t.runs(2);
    await t.press('p');
    await t.until('Pinned this result as B');
    await t.press('.');
    await t.runs(3);
    await t.press('p');
    await t.until('Pinned this result as C');
    await t.press('.');
    await t.runs(4);
    await t.until(/Runner length\s+330/);
    // the pins, labelled against the present 330 mm design
    await t.until('pin A');
    const f = t.frame();
    expect(f).toMatch(/pin A [\d.]+ % \(runner length 300 mm\)/);
    expect(f).toMatch(/pin B [\d.]+ % \(runner length 310 mm\)/);
    expect(f).toMatch(/pin C [\d.]+ % \(runner length 320 mm\)/);
    // the most recent pin is compared: its row label and the baseline line
    expect(f).toContain('Baseline, pin C: runner length 320 mm');
    // b goes on to the previous result, then pin A
    await t.press('b');
    await t.until('Comparing with previous result: runner length 320 mm');
    await t.press('b');
    await t.until('Comparing with pin A: runner length 300 mm');
    // the field column shows the compared pin's value
    expect(t.frame()).toContain('(baseline 300)');
    // a fourth pin drops the oldest
    await t.press('p');
    await t.until('the oldest dropped');
    await t.until(/pin A [\d.]+ % \(runner length 310 mm\)/);
    // P clears them
    await t.press('P');
    await t.until('Pins cleared');
    expect(t.frame()).not.toContain('pin A');
  });

  it('after a speed change the baseline says what differed: the speed, not the present runner length', async () => {
    const t = start();
    await t.until('IVC');
    await t.press('4', DOWN, '.');
    await t.runs(2);
    await t.press('+');
    await t.runs(3);
    await t.until('Baseline, previous result: engine speed 6000 rpm');
    expect(t.frame()).not.toMatch(/Baseline, previous result: runner length/);
  });
});

describe('the Valve view charts at 80×24', () => {
  it('one chart is large, the others one-line strips; c cycles which is large', async () => {
    const t = start();
    await t.until('IVC');
    const heights = (): number[] => {
      const lines = t.frame().split('\n');
      const at = ['Pressure at the valve', 'Flow through the valve', 'Gas in the cylinder'].map((s) => lines.findIndex((l) => l.startsWith(s)));
      const axis = lines.findIndex((l) => /^\s+└/.test(l));
      return [at[1]! - at[0]! - 1, at[2]! - at[1]! - 1, axis - at[2]! - 1];
    };
    const big = heights();
    expect(big[0]).toBeGreaterThanOrEqual(8);
    expect(big.slice(1)).toEqual([1, 1]);
    await t.press('c');
    expect(heights()[1]).toBeGreaterThanOrEqual(8);
    expect([heights()[0], heights()[2]]).toEqual([1, 1]);
    await t.press('c');
    expect(heights()[2]).toBeGreaterThanOrEqual(8);
    await t.press('c');
    expect(heights()[0]).toBeGreaterThanOrEqual(8);
  });

  it('the cylinder-mass title reads the mass delivered since IVO, beside the baseline\'s', async () => {
    const t = start();
    await t.until('IVC');
    await t.until(/delivered since IVO [−-]?[\d.]+ mg/);
    await t.press('4', DOWN, '.');
    await t.runs(2);
    await t.press('1');
    await t.until(/since IVO [−-]?[\d.]+ mg \(baseline [−-]?[\d.]+\)/);
  });

  it('the zoom shows in the header', async () => {
    const t = start();
    await t.until('IVC');
    expect(t.frame().split('\n')[0]).not.toContain('zoom');
    await t.press('z');
    await t.until('zoom 360°');
    await t.press('z');
    await t.until('zoom 180°');
    await t.press('Z', 'Z');
    expect(t.frame().split('\n')[0]).not.toContain('zoom');
  });
});
