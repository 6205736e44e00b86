/**
 * Checking an output file before any work is done: its folder exists and
 * takes new files, it is not a folder, and it is new unless --force. The
 * write itself is write-file.ts (atomic, never over a file unasked).
 */
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, openSync, statSync, unlinkSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { CaseError } from '../case/errors.js';
import type { CliIo } from './io.js';

/**
 * A file we may write: its folder exists and takes new files (probed with an
 * empty temporary file), it is not a folder, and it is new unless --force.
 * Checked before any simulation, so a bad target costs no waiting.
 */
export function checkTarget(file: string, option: string, io: Pick<CliIo, 'cwd'>, force: boolean): void {
  const full = resolve(io.cwd, file);
  const dir = dirname(full);
  if (!existsSync(dir) || !statSync(dir).isDirectory()) throw new CaseError(option, `the folder of '${file}' does not exist`, 'option');
  if (existsSync(full)) {
    if (statSync(full).isDirectory()) throw new CaseError(option, `'${file}' is a folder, not a file`, 'option');
    if (!force) throw new CaseError(option, `'${file}' already exists; add --force to overwrite it`, 'option');
  }
  const probe = join(dir, `.tractwave-probe-${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
  try {
    closeSync(openSync(probe, 'wx'));
    unlinkSync(probe);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code ?? String(e);
    throw new CaseError(option, `cannot write in the folder of '${file}' (${code})`, 'option');
  }
}

