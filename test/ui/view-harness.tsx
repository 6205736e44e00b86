/**
 * The terminal view through Ink at a fixed size, with the fake case session
 * and the SYNTHETIC engine (fixtures.ts), and the waits the view tests use:
 * each waits for a condition and fails saying what it waited for, never a
 * fixed delay.
 */
import React from 'react';
import { render } from 'ink-testing-library';
import { App } from '../../src/ui/app.js';
import { stripAnsi } from '../../src/ui/text.js';
import { fakeEngine, fakeSession } from './fixtures.js';

/** how long a condition may take to show before the test fails with what it waited for */
export const WAIT_MS = 5000;
/** one turn of the event loop: Ink renders after the input handler returns */
export const tick = (ms = 10): Promise<void> => new Promise((r) => setTimeout(r, ms));

/** Poll `cond` until it holds; fail after WAIT_MS with `what()` (and the frame) in the message. */
export async function waitFor(cond: () => boolean, what: () => string): Promise<void> {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > WAIT_MS) throw new Error(`${what()} (waited ${WAIT_MS / 1000} s)`);
    await tick();
  }
}

export function startView(size = { columns: 80, rows: 24 }, color = false) {
  const session = fakeSession();
  const engine = fakeEngine();
  const app = render(<App session={session} engine={engine} size={size} color={color} debounceMs={0} />);
  const frame = (): string => stripAnsi(app.lastFrame() ?? '');
  /** press keys one by one, each time waiting until the frame shows its effect */
  const press = async (...keys: string[]): Promise<void> => {
    for (const k of keys) {
      const before = frame();
      app.stdin.write(k);
      await waitFor(() => frame() !== before, () => `key ${JSON.stringify(k)} changed nothing on the screen; the frame was:\n${before}`);
    }
  };
  /** wait until the frame shows `text` (the first point, a re-run) */
  const until = async (text: string | RegExp): Promise<void> => {
    const has = (): boolean => (typeof text === 'string' ? frame().includes(text) : text.test(frame()));
    await waitFor(has, () => `the frame never showed ${String(text)}; it is:\n${frame()}`);
  };
  /** wait until a condition holds */
  const untilTrue = async (cond: () => boolean, what = 'the condition'): Promise<void> => {
    await waitFor(cond, () => `${what} never held; the frame is:\n${frame()}`);
  };
  /** wait until the engine has been asked for `n` points and the view shows no run going on */
  const runs = async (n: number): Promise<void> =>
    waitFor(() => engine.runs.length >= n && !frame().includes('Running'), () => `run ${n} never finished; the frame is:\n${frame()}`);
  /** the line of the frame that shows `label` */
  const row = (label: string): string => frame().split('\n').find((l) => l.includes(label)) ?? '';
  return { app, session, engine, frame, press, until, untilTrue, runs, row };
}
