/**
 * Writing output files safely: never over an existing file unless forced,
 * and atomically (a temporary file in the same directory, then a rename), so
 * a reader never sees half a file and a failure leaves no partial output.
 */
import { existsSync } from 'node:fs';
import { link, open, rename, rm } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { randomBytes } from 'node:crypto';
import { CaseError } from '../case/errors.js';

/**
 * Write `text` to `file` (relative to `cwd`, default the process's).
 * Errors are CaseErrors labelled with `option` (e.g. "--csv") or the file name.
 */
export async function writeFileAtomic(
  file: string,
  text: string,
  opts: { force?: boolean; option?: string; cwd?: string } = {},
): Promise<void> {
  const label = opts.option ?? file;
  const full = resolve(opts.cwd ?? process.cwd(), file);
  if (!opts.force && existsSync(full)) throw new CaseError(label, `'${file}' already exists; add --force to overwrite it`, 'option');
  const dir = dirname(full);
  if (!existsSync(dir)) throw new CaseError(label, `the directory of '${file}' does not exist`, 'option');
  const tmp = join(dir, `.${basename(full)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  let handle;
  try {
    handle = await open(tmp, 'wx');
    await handle.writeFile(text, 'utf8');
    await handle.sync();
    await handle.close();
    handle = undefined;
    if (opts.force) await rename(tmp, full);
    else {
      // no-clobber: a hard link fails if the name appeared meanwhile
      try {
        await link(tmp, full);
        await rm(tmp, { force: true });
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        if (code === 'EEXIST') throw new CaseError(label, `'${file}' already exists; add --force to overwrite it`, 'option');
        if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'EXDEV') throw e;
        await rename(tmp, full); // the file system has no hard links
      }
    }
  } catch (e) {
    if (e instanceof CaseError) {
      await rm(tmp, { force: true }).catch(() => {});
      throw e;
    }
    if (handle) await handle.close().catch(() => {});
    await rm(tmp, { force: true }).catch(() => {});
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EACCES' || code === 'EPERM' || code === 'EROFS' || code === 'EISDIR' || code === 'ENOENT' || code === 'ENOTDIR')
      throw new CaseError(label, `cannot write '${file}' (${code})`, 'option');
    throw e;
  }
}
