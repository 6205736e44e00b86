/**
 * Checking an output file before any work is done: its folder exists and
 * takes new files, it is a regular file (or a link to one) or nothing yet,
 * and it is new unless --force. The write itself is write-file.ts (atomic,
 * never over a file unasked, never over anything but a regular file).
 */
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, openSync, statSync, unlinkSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { CaseError } from '../case/errors.js';
import type { CliIo } from './io.js';
import { inspectTarget } from '../case/target.js';
import { writeError } from './write-file.js';

/**
 * A file we may write: its folder exists and takes new files (probed with an
 * empty temporary file), it is not a folder, and it is new unless --force.
 * Checked before any simulation, so a bad target costs no waiting.
 */
export function checkTarget(file: string, option: string, io: Pick<CliIo, 'cwd'>, force: boolean): void {
  const full = resolve(io.cwd, file);
  let target;
  try {
    target = inspectTarget(full);
  } catch (e) {
    throw writeError(e, file, option);
  }
  // never over a device, a folder, a pipe, a socket, or a link to one (case/target.ts), even with --force
  if (target.kind === 'other') throw new CaseError(option, `'${file}' is ${target.what}, not a file: it is never replaced; choose a file name`, 'option');
  if (target.kind === 'file' && !force) throw new CaseError(option, `'${file}' already exists; add --force to overwrite it`, 'option');
  const folder = dirname(target.path);
  if (!existsSync(folder) || !statSync(folder).isDirectory())
    throw new CaseError(option, existsSync(folder) ? `cannot write '${file}': a part of the path is a file, not a directory` : `the folder of '${file}' does not exist`, 'option');
  const probe = join(folder, `.tractwave-probe-${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
  try {
    closeSync(openSync(probe, 'wx'));
    unlinkSync(probe);
  } catch (e) {
    throw writeError(e, file, option);
  }
}
