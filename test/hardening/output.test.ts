/**
 * Output files and standard output under hostile conditions: --force never
 * replaces anything but a regular file (a device, a directory, a link to
 * either), a link to a regular file updates the file it points to, and every
 * file-system failure is one plain line: exit 2 when the name given is to
 * blame, 1 when the machine is (disk full), never "internal error" or a stack.
 */
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, lstatSync, mkdirSync, mkdtempSync, readFileSync, readlinkSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { reportError } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';
import { OutputError, writeError } from '../../src/cli/write-file.js';
import { CaseError } from '../../src/case/errors.js';
import { ROOT, tractwave } from './cli.js';

const DEMO = join(ROOT, 'cases/demo.yaml');
const FAST = ['--set', 'numerics.meshSize=20mm', '--set', 'numerics.maxCycles=4'];
const root = mkdtempSync(join(tmpdir(), 'tractwave-out-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));
let dir = '';
let n = 0;
beforeEach(() => {
  dir = join(root, `t${n++}`);
  mkdirSync(dir);
});

function oneLine(r: { code: number; errLines: string[]; err: string }, code: number, start: RegExp): void {
  expect(r.code, r.err).toBe(code);
  expect(r.errLines, r.err).toHaveLength(1);
  expect(r.errLines[0]).toMatch(start);
  expect(r.err).not.toMatch(/internal error|\n\s+at \S/);
}

describe('--force replaces only a regular file', () => {
  it.each([
    ['run', ['run', DEMO, ...FAST, '--csv', '/dev/null', '--force']],
    ['sweep', ['sweep', DEMO, ...FAST, '--rpm', '5000:5500:500', '--csv', '/dev/null', '--force']],
  ])('%s --csv /dev/null --force: refused, the device untouched', async (_c, argv) => {
    const before = lstatSync('/dev/null');
    const r = await tractwave(argv, dir);
    oneLine(r, 2, /^error: --csv: '\/dev\/null' is a device, not a file/);
    expect(r.out).toBe('');
    const after = lstatSync('/dev/null');
    expect(after.isCharacterDevice()).toBe(true);
    expect(after.ino).toBe(before.ino);
  }, 20_000);

  it('a symbolic link to a device is refused too', async () => {
    symlinkSync('/dev/null', join(dir, 'dev.csv'));
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'dev.csv', '--force'], dir);
    oneLine(r, 2, /^error: --csv: 'dev.csv' is a symbolic link to a device/);
    expect(readlinkSync(join(dir, 'dev.csv'))).toBe('/dev/null');
  }, 20_000);

  it('a symbolic link to a regular file: the file it points to is replaced, the link stays', async () => {
    writeFileSync(join(dir, 'real.csv'), 'old\n');
    symlinkSync('real.csv', join(dir, 'link.csv'));
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'link.csv', '--force'], dir);
    expect(r.code, r.err).toBe(0);
    expect(lstatSync(join(dir, 'link.csv')).isSymbolicLink()).toBe(true);
    expect(readFileSync(join(dir, 'real.csv'), 'utf8').split('\n')[0]).toMatch(/^crank_deg,/);
  }, 20_000);

  it('a dangling link is not followed to create a file elsewhere', async () => {
    symlinkSync(join(dir, 'elsewhere.csv'), join(dir, 'dangling.csv'));
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'dangling.csv', '--force'], dir);
    oneLine(r, 2, /^error: --csv: 'dangling.csv' is a symbolic link to nothing/);
    expect(existsSync(join(dir, 'elsewhere.csv'))).toBe(false);
  }, 20_000);
});

describe('file-system errors: one plain line', () => {
  it('a file used as a directory (ENOTDIR): exit 2 naming --csv, before the run', async () => {
    writeFileSync(join(dir, 'plain'), 'x');
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'plain/trace.csv'], dir);
    oneLine(r, 2, /^error: --csv: cannot write 'plain\/trace.csv': a part of the path is a file, not a directory/);
    expect(r.out).toBe('');
  });
  it('a name too long for the file system (ENAMETOOLONG): exit 2', async () => {
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', `${'n'.repeat(300)}.csv`], dir);
    oneLine(r, 2, /^error: --csv: cannot write '.*': the name is too long \(ENAMETOOLONG\)$/);
  });
  it.each([
    ['ENOSPC', 'no space left on the device'],
    ['EDQUOT', 'the disk quota is used up'],
    ['EBUSY', 'the file is busy (in use by another program)'],
    ['EIO', 'an input/output error of the device'],
  ])('%s (the machine, not the input): exit 1 with a plain line', (code, words) => {
    const err = writeError(Object.assign(new Error(`${code}: raw message`), { code }), 'out.csv', '--csv');
    expect(err).toBeInstanceOf(OutputError);
    const io = memoryIo();
    expect(reportError(err, io)).toBe(1);
    expect(io.err()).toBe(`error: --csv: cannot write 'out.csv': ${words} (${code})\n`);
  });
  it.each(['EACCES', 'EROFS', 'EISDIR', 'ENOTDIR', 'ENAMETOOLONG', 'ELOOP'])('%s (the name given): exit 2', (code) => {
    const err = writeError(Object.assign(new Error(code), { code }), 'out.csv', '--csv');
    expect(err).toBeInstanceOf(CaseError);
    const io = memoryIo();
    expect(reportError(err, io)).toBe(2);
    expect(io.err()).toMatch(/^error: --csv: cannot write 'out.csv': .+\n$/);
  });
});

describe('standard output that cannot be written', () => {
  it('run --json > /dev/full: one plain line, exit 1, no stack', () => {
    const r = spawnSync('sh', ['-c', `"${process.execPath}" --import tsx src/cli/main.ts run cases/demo.yaml --json --set numerics.meshSize=20mm > /dev/full`], {
      cwd: ROOT,
      encoding: 'utf8',
      timeout: 60_000,
    });
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toBe('error: standard output: cannot write: no space left on the device (ENOSPC)\n');
  }, 60_000);
});
