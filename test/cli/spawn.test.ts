/**
 * The entry point as a real process (kept to two spawns: tsx start-up is
 * about a second each). Everything else is tested in-process.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { ROOT } from './helpers.js';

function tractwave(args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 30_000 });
}

describe('src/cli/main.ts as a process', () => {
  it('bad input: exit status 2, one line on stderr, no stack trace', () => {
    const r = tractwave(['run', 'cases/demo.yaml', '--set', 'runner.length=320 furlong']);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe("error: runner.length: unknown unit 'furlong' (units: mm, cm, m, in)\n");
  });
  it('check: exit status 0 and the report on stdout', () => {
    const r = tractwave(['check', 'cases/airbox-single.yaml']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('the case is valid');
    expect(r.stdout).toMatch(/airbox through its snorkel\s+\d+\.\d Hz/);
  });
});
