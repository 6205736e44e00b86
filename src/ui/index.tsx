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
// loaded here so a single-file bundle started as the point worker serves points
import './worker.js';

export { App } from './app.js';
export type { AppProps } from './app.js';
export { openCase, type CaseSession } from './case-session.js';
export { inlineEngine, threadEngine, type EngineService } from './engine-service.js';

const ENTER_ALT = '\u001b[?1049h\u001b[H';
const LEAVE_ALT = '\u001b[?25h\u001b[?1049l';

export async function startUi(casePath: string): Promise<number> {
  const session = await openCase(casePath); // a bad case throws CaseError: the CLI prints it, exit 2
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

  const app = render(<App session={session} engine={engine} />, {
    exitOnCtrlC: false, // ctrl+c is a key like q: the app leaves cleanly
    patchConsole: true,
    maxFps: 30,
  });
  const stop = (): void => app.unmount();
  const signals: NodeJS.Signals[] = ['SIGINT', 'SIGTERM', 'SIGHUP'];
  for (const sig of signals) process.on(sig, stop);
  try {
    await app.waitUntilExit();
    return 0;
  } finally {
    for (const sig of signals) process.off(sig, stop);
    app.cleanup();
    restore();
    process.off('exit', restore);
    await engine.close();
  }
}
