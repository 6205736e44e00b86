// Ink 6.8.0's line-by-line renderer (incrementalRendering, ink/build/log-update.js)
// moves the cursor up one line too few when the frame before ended with a
// newline, which every frame shorter than the terminal does: each frame is
// then drawn one row lower than the last, and the screen fills with stale
// lines (seen in tmux at 80×24, and with a three-line Ink app). The full
// redraw has no such fault. The bundle (scripts/bundle.mjs) carries this
// one-line fix of that file, and only the bundle turns line-by-line
// rendering on (src/ui/index.tsx, __TRACTWAVE_INK_LINE_FIX__).
// test/ui/terminal-screen.test.ts feeds the bundled view's output to a
// terminal emulator and checks the screen.

/** the renderer's line, and the fixed one: up to the first line of the last frame, wherever its newline left the cursor */
export const INK_LINE_FAULT = 'buffer.push(ansiEscapes.cursorUp(previousVisible - 1));';
export const INK_LINE_FIXED = "buffer.push(ansiEscapes.cursorUp(previousVisible - (previousOutput.endsWith('\\n') ? 0 : 1)));";

/** Ink's log-update.js with the fix; throws when the file is not the one this fix is for (another Ink version) */
export function fixInkLogUpdate(source) {
  const at = source.indexOf(INK_LINE_FAULT);
  if (at < 0 || source.indexOf(INK_LINE_FAULT, at + 1) >= 0) {
    throw new Error('ink/build/log-update.js is not the one scripts/ink-line-fix.mjs fixes (Ink 6.8.0): check the line-by-line renderer again before changing Ink');
  }
  return source.slice(0, at) + INK_LINE_FIXED + source.slice(at + INK_LINE_FAULT.length);
}

/** esbuild plugin: apply the fix when Ink's log-update.js is bundled */
export const inkLineFix = {
  name: 'tractwave-ink-line-fix',
  setup(b) {
    b.onLoad({ filter: /[\\/]ink[\\/]build[\\/]log-update\.js$/ }, async (args) => {
      const { readFile } = await import('node:fs/promises');
      return { contents: fixInkLogUpdate(await readFile(args.path, 'utf8')), loader: 'js' };
    });
  },
};
