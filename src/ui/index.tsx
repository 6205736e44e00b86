/**
 * The terminal view's entry: `startUi(casePath)` loads the case, takes over
 * the terminal (the alternate screen, so the shell's screen comes back as it
 * was), runs until the user quits, and resolves with the exit code.
 */
import React from 'react';
import { render } from 'ink';
import { App } from './app.js';
import { openCase } from './case-session.js';
import { threadEngine } from './engine-service.js';

export { App } from './app.js';
export type { AppProps } from './app.js';
export { openCase, type CaseSession } from './case-session.js';
export { inlineEngine, threadEngine, type EngineService } from './engine-service.js';

const ENTER_ALT = '\u001b[?1049h\u001b[H';
const LEAVE_ALT = '\u001b[?25h\u001b[?1049l';

/** exit codes of the signals that end the view, as a shell reports them: 128 + the signal's number */
export const SIGNAL_EXIT: Readonly<Record<'SIGINT' | 'SIGTERM' | 'SIGHUP', number>> = { SIGHUP: 129, SIGINT: 130, SIGTERM: 143 };

export interface UiOptions {
  /** accept values outside the working ranges (--allow-extreme) */
  allowExtreme?: boolean;
  /** accept edits whose point would take long (--allow-long) */
  allowLong?: boolean;
}

/** set to true by the bundle (scripts/bundle.mjs), which carries the fix of Ink's line-by-line renderer (scripts/ink-line-fix.mjs) */
declare const __TRACTWAVE_INK_LINE_FIX__: boolean | undefined;

/** whether this build's Ink draws line by line correctly: the bundle only (Ink 6.8.0 as installed draws each frame a row low) */
export const INK_LINE_FIX = typeof __TRACTWAVE_INK_LINE_FIX__ !== 'undefined' && __TRACTWAVE_INK_LINE_FIX__ === true;

/**
 * How the view draws (Ink's render options; bench/pool.ts measures with these).
 * Over SSH every byte counts: with `incrementalRendering` Ink rewrites only
 * the lines that changed since the last frame instead of erasing and
 * writing the whole screen; playing the cycle changes a few columns of most
 * chart rows, so this roughly halves the bytes per frame (bench/RESULTS.md).
 * Only where Ink's renderer carries our fix (the bundle, which `tractwave`
 * runs); from the sources the view redraws whole frames.
 */
export const VIEW_RENDER_OPTIONS = {
  exitOnCtrlC: false, // ctrl+c is a key like q: the app leaves cleanly
  patchConsole: true,
  maxFps: 30,
  incrementalRendering: INK_LINE_FIX,
} as const;

/**
 * How long the view waits after the last change before running the point
 * [ms]. Key repeat comes every 30–50 ms, so a held key still runs once at the
 * end; the point itself takes a few tens of ms on a warm worker, so an edit
 * shows in about 100 ms (bench/pool.ts).
 */
export const VIEW_DEBOUNCE_MS = 40;

export async function startUi(casePath: string, options: UiOptions = {}): Promise<number> {
  const session = await openCase(casePath, options); // a bad case throws CaseError: the CLI prints it, exit 2
  const engine = threadEngine();
  const out = process.stdout;
  const useAlt = out.isTTY === true;
  let restored = false;
  const restore = (): void => {
    if (restored) return;
    restored = true;
    if (useAlt) out.write(LEAVE_ALT);
  };
  if (useAlt) out.write(ENTER_ALT);
  process.once('exit', restore);

  const app = render(<App session={session} engine={engine} debounceMs={VIEW_DEBOUNCE_MS} />, VIEW_RENDER_OPTIONS);
  // a signal leaves as cleanly as q, and the exit code says which signal it was
  let code = 0;
  const handlers = (Object.keys(SIGNAL_EXIT) as (keyof typeof SIGNAL_EXIT)[]).map((sig) => {
    const h = (): void => {
      if (code === 0) code = SIGNAL_EXIT[sig];
      app.unmount();
    };
    process.on(sig, h);
    return [sig, h] as const;
  });
  try {
    await app.waitUntilExit();
    return code;
  } finally {
    for (const [sig, h] of handlers) process.off(sig, h);
    app.cleanup();
    restore();
    process.off('exit', restore);
    await engine.close();
  }
}
