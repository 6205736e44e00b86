/**
 * The terminal view as a real process on a pseudo-terminal (util-linux
 * `script` gives it one): a signal ends it like `q` does, with the terminal
 * restored (the alternate screen left), and with the exit code a shell
 * expects of that signal (128 + its number: SIGHUP 129, SIGINT 130, SIGTERM
 * 143; POSIX shell convention). And TERM=dumb is refused like a missing
 * terminal, pointing to the text commands.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync, spawn } from 'node:child_process';
import { runCli } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';
import { HAS_SCRIPT } from '../support/has-script.js';
import { ROOT } from './cli.js';


const LEAVE_ALT = '\u001b[?1049l';

/** start the view on a pseudo-terminal, wait for its first frame, send `signal` to it, resolve with its exit code and output */
function viewUntilSignal(signal: NodeJS.Signals): Promise<{ code: number | null; out: string }> {
  return new Promise((resolve, reject) => {
    // `exec`: whatever shell `script` starts (bash, or dash when SHELL is unset as on a build machine) is replaced by the view,
    // so the signal below reaches the view and not a shell waiting on it (dash defers SIGINT until its child ends)
    const cmd = `exec "${process.execPath}" --import tsx src/cli/main.ts cases/demo.yaml --allow-long`;
    const child = spawn('script', ['-qfec', cmd, '/dev/null'], {
      cwd: ROOT,
      // CI set as on a build machine: the view must still draw its frames (Ink alone would hold them back)
      env: { ...process.env, SHELL: '/bin/sh', TERM: 'xterm-256color', COLUMNS: '80', LINES: '24', NO_COLOR: '1', CI: 'true' },
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    let out = '';
    let sent = false;
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      // the first frame is drawn: signal the view itself (the child of `script`)
      if (!sent && out.includes('IVC')) {
        sent = true;
        const rows = execFileSync('ps', ['-o', 'pid=,args=', '--ppid', String(child.pid)], { encoding: 'utf8' }).trim().split('\n');
        const line = rows.find((r) => r.includes('src/cli/main.ts'));
        const pid = Number(line?.trim().split(/\s+/)[0]);
        if (!(pid > 0) || line?.includes(' -c ')) reject(new Error(`no view process directly under script (${rows.join(' | ')})`));
        else process.kill(pid, signal);
      }
    });
    child.on('error', reject);
    child.on('exit', (code) => resolve({ code, out }));
  });
}

describe.skipIf(!HAS_SCRIPT)('the terminal view ended by a signal', () => {
  it.each([
    ['SIGTERM', 143],
    ['SIGINT', 130],
    ['SIGHUP', 129],
  ] as const)('%s: exit %i, the terminal restored', async (signal, code) => {
    const r = await viewUntilSignal(signal);
    expect(r.code, r.out.slice(-400)).toBe(code);
    expect(r.out).toContain(LEAVE_ALT);
    // restored after the last frame, not before it
    expect(r.out.lastIndexOf(LEAVE_ALT)).toBeGreaterThan(r.out.lastIndexOf('IVC'));
  }, 60_000);
});

describe('TERM=dumb', () => {
  it('is refused like a missing terminal, pointing to run and sweep (exit 2, one line)', async () => {
    const io = memoryIo({ stdinIsTTY: true, stdoutIsTTY: true, stderrIsTTY: true, term: 'dumb', cwd: ROOT });
    expect(await runCli(['cases/demo.yaml'], io)).toBe(2);
    const lines = io.err().trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^error: the interactive view needs a terminal that can move the cursor \(TERM is dumb\); use `tractwave run cases\/demo.yaml`/);
    expect(io.out()).toBe('');
  });
  it('without a TTY the message says so', async () => {
    const io = memoryIo({ cwd: ROOT });
    expect(await runCli(['cases/demo.yaml'], io)).toBe(2);
    expect(io.err()).toMatch(/needs a terminal \(stdin and stdout are not a TTY\)/);
  });
  it('an unknown option of the view is named', async () => {
    const io = memoryIo({ cwd: ROOT });
    expect(await runCli(['cases/demo.yaml', '--allow-everything'], io)).toBe(2);
    expect(io.err()).toMatch(/^error: --allow-everything: unknown option/);
  });
});
