/**
 * Output files: nothing is overwritten without --force, and every write is
 * atomic (a temporary file in the same directory, then a rename), so no
 * half-written file and no temporary file is ever left behind
 * (DESIGN §3 and the project rules on user files).
 */
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ROOT, tractwave } from './cli.js';

const DEMO = join(ROOT, 'cases/demo.yaml');
/** a coarse mesh keeps each run short; the file handling is what is tested */
const FAST = ['--set', 'numerics.meshSize=20mm'];
const root = mkdtempSync(join(tmpdir(), 'tractwave-files-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

let dir = '';
let n = 0;
beforeEach(() => {
  dir = join(root, `t${n++}`);
  mkdirSync(dir);
});

const KEEP = 'my own notes, not a trace\n';

describe('run --csv', () => {
  it('refuses to overwrite an existing file without --force: exit 2, the file unchanged, nothing else written', async () => {
    const target = join(dir, 'trace.csv');
    writeFileSync(target, KEEP);
    const before = statSync(target).mtimeMs;
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'trace.csv'], dir);
    expect(r.code).toBe(2);
    expect(r.errLines).toHaveLength(1);
    expect(r.errLines[0]).toMatch(/^error: --csv: .*already exists.*--force/);
    expect(readFileSync(target, 'utf8')).toBe(KEEP);
    expect(statSync(target).mtimeMs).toBe(before);
    expect(readdirSync(dir)).toEqual(['trace.csv']);
  }, 20_000);

  it('with --force replaces the file with a whole trace and leaves no temporary file', async () => {
    const target = join(dir, 'trace.csv');
    writeFileSync(target, KEEP);
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'trace.csv', '--force'], dir);
    expect(r.code, r.err).toBe(0);
    const text = readFileSync(target, 'utf8');
    expect(text).not.toContain(KEEP.trim());
    const lines = text.trim().split('\n');
    expect(lines.length).toBe(721); // a header and one row per crank degree (DESIGN §3: 720 samples)
    const width = lines[0]!.split(',').length;
    expect(lines.every((l) => l.split(',').length === width)).toBe(true); // no truncated row
    expect(readdirSync(dir)).toEqual(['trace.csv']);
  }, 20_000);

  it('writes a new file and leaves nothing else in the directory', async () => {
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'new.csv'], dir);
    expect(r.code, r.err).toBe(0);
    expect(readdirSync(dir)).toEqual(['new.csv']);
    expect(readFileSync(join(dir, 'new.csv'), 'utf8').trim().split('\n')).toHaveLength(721);
  }, 20_000);

  it('a directory of that name is not replaced, even with --force, and no temporary file is left', async () => {
    mkdirSync(join(dir, 'out.csv'));
    writeFileSync(join(dir, 'out.csv', 'inside.txt'), KEEP);
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'out.csv', '--force'], dir);
    expect(r.code).toBe(2);
    expect(r.errLines).toHaveLength(1);
    expect(r.errLines[0]).toMatch(/^error: --csv: /);
    expect(readFileSync(join(dir, 'out.csv', 'inside.txt'), 'utf8')).toBe(KEEP);
    expect(readdirSync(dir)).toEqual(['out.csv']);
  }, 20_000);

  it('a missing directory is bad input naming --csv, and nothing is created', async () => {
    const r = await tractwave(['run', DEMO, ...FAST, '--csv', 'no/such/dir/trace.csv'], dir);
    expect(r.code).toBe(2);
    expect(r.errLines[0]).toMatch(/^error: --csv: /);
    expect(readdirSync(dir)).toEqual([]);
  }, 20_000);
});

describe('sweep --csv', () => {
  it('refuses to overwrite without --force and replaces atomically with it', async () => {
    const target = join(dir, 'curve.csv');
    writeFileSync(target, KEEP);
    const argv = ['sweep', DEMO, ...FAST, '--rpm', '5000:5500:500', '--jobs', '1', '--csv', 'curve.csv'];
    const refused = await tractwave(argv, dir);
    expect(refused.code).toBe(2);
    expect(refused.errLines[0]).toMatch(/^error: --csv: .*--force/);
    expect(readFileSync(target, 'utf8')).toBe(KEEP);

    const forced = await tractwave([...argv, '--force'], dir);
    expect(forced.code, forced.err).toBe(0);
    const rows = readFileSync(target, 'utf8').trim().split('\n');
    expect(rows.length).toBe(3); // a header and the two speeds
    expect(readdirSync(dir)).toEqual(['curve.csv']);
  }, 30_000);
});
