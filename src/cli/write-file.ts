/**
 * Writing output files safely: never over an existing file unless forced,
 * never over anything but a regular file (or a symbolic link to one, whose
 * file is the one replaced) even when forced, and atomically (a temporary
 * file in the same directory, then a rename), so a reader never sees half a
 * file and a failure leaves no partial output.
 *
 * Failures are one plain line: a CaseError (exit 2) when the name given is
 * the problem (exists, not a file, no such directory, too long, no
 * permission), an OutputError (exit 1) when the machine is (disk full, busy,
 * an I/O error).
 */
import { link, open, rename, rm, stat } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { randomBytes } from 'node:crypto';
import { CaseError } from '../case/errors.js';
import { inspectTarget } from '../case/target.js';

/** An output could not be written for a reason of the machine, not of the input: exit 1, one line. */
export class OutputError extends Error {
  constructor(
    readonly path: string,
    readonly detail: string,
  ) {
    super(`${path}: ${detail}`);
    this.name = 'OutputError';
  }
}

/** the words for a file-system error code, and whether the name given is to blame */
const ERRNO: Record<string, { text: string; input: boolean }> = {
  EACCES: { text: 'permission denied', input: true },
  EPERM: { text: 'operation not permitted', input: true },
  EROFS: { text: 'the file system is read-only', input: true },
  EISDIR: { text: 'it is a directory', input: true },
  ENOTDIR: { text: 'a part of the path is a file, not a directory', input: true },
  ENOENT: { text: 'the directory does not exist', input: true },
  ENAMETOOLONG: { text: 'the name is too long', input: true },
  ELOOP: { text: 'too many symbolic links in the path', input: true },
  ENOSPC: { text: 'no space left on the device', input: false },
  EDQUOT: { text: 'the disk quota is used up', input: false },
  EFBIG: { text: 'the file would be too large', input: false },
  EBUSY: { text: 'the file is busy (in use by another program)', input: false },
  ETXTBSY: { text: 'the file is busy (in use by another program)', input: false },
  EIO: { text: 'an input/output error of the device', input: false },
  EMFILE: { text: 'too many open files', input: false },
  ENFILE: { text: 'too many open files', input: false },
  EAGAIN: { text: 'the resource is temporarily unavailable', input: false },
};

/** A file-system error in words: "no space left on the device (ENOSPC)". */
export function errnoWords(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code ?? '';
  const known = ERRNO[code];
  const text = known ? known.text : e instanceof Error ? e.message.split('\n')[0]! : String(e);
  return `${text}${code ? ` (${code})` : ''}`;
}

/** A file-system error while writing `file` as one plain error (CaseError or OutputError). */
export function writeError(e: unknown, file: string, label: string): Error {
  if (e instanceof CaseError || e instanceof OutputError) return e;
  const what = `cannot write '${file}': ${errnoWords(e)}`;
  return ERRNO[(e as NodeJS.ErrnoException).code ?? '']?.input ? new CaseError(label, what, 'option') : new OutputError(label, what);
}

/**
 * Check, before any work is done, that `file` may be written: refused when it
 * exists and `force` is off, always when it is not a regular file, and when
 * its directory is missing. Returns the path to write.
 */
export async function checkOutputFile(file: string, opts: { force?: boolean; option?: string; cwd?: string } = {}): Promise<string> {
  const label = opts.option ?? file;
  const full = resolve(opts.cwd ?? process.cwd(), file);
  let target;
  try {
    target = inspectTarget(full);
  } catch (e) {
    throw writeError(e, file, label);
  }
  if (target.kind === 'other') throw new CaseError(label, `'${file}' is ${target.what}, not a file: it is never replaced; choose a file name`, 'option');
  if (target.kind === 'file' && !opts.force) throw new CaseError(label, `'${file}' already exists; add --force to overwrite it`, 'option');
  const dir = dirname(target.path);
  try {
    if (!(await stat(dir)).isDirectory()) throw new CaseError(label, `cannot write '${file}': a part of the path is a file, not a directory`, 'option');
  } catch (e) {
    if (e instanceof CaseError) throw e;
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') throw new CaseError(label, `the directory of '${file}' does not exist`, 'option');
    throw writeError(e, file, label);
  }
  return target.path;
}

/**
 * Write `text` to `file` (relative to `cwd`, default the process's).
 * Errors are labelled with `option` (e.g. "--csv") or the file name.
 */
export async function writeFileAtomic(
  file: string,
  text: string,
  opts: { force?: boolean; option?: string; cwd?: string } = {},
): Promise<void> {
  const label = opts.option ?? file;
  const full = await checkOutputFile(file, opts);
  const dir = dirname(full);
  const tmp = join(dir, `.${basename(full).slice(0, 120)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  let handle;
  try {
    handle = await open(tmp, 'wx');
    await handle.writeFile(text, 'utf8');
    await handle.sync();
    await handle.close();
    handle = undefined;
    if (opts.force) {
      // the name may have become something else meanwhile: look again just before the rename
      const again = inspectTarget(full);
      if (again.kind === 'other') throw new CaseError(label, `'${file}' is ${again.what}, not a file: it is never replaced; choose a file name`, 'option');
      await rename(tmp, full);
    } else {
      // no-clobber: a hard link fails if the name appeared meanwhile
      try {
        await link(tmp, full);
        await rm(tmp, { force: true });
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === 'EEXIST') throw new CaseError(label, `'${file}' already exists; add --force to overwrite it`, 'option');
        if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'EXDEV') throw e;
        if ((inspectTarget(full)).kind !== 'none') throw new CaseError(label, `'${file}' already exists; add --force to overwrite it`, 'option');
        await rename(tmp, full); // the file system has no hard links
      }
    }
  } catch (e) {
    if (handle) await handle.close().catch(() => {});
    await rm(tmp, { force: true }).catch(() => {});
    throw writeError(e, file, label);
  }
}
