/**
 * Saving an edited case from the terminal view.
 *
 * The saved file is the original case text with the edited values put in
 * (YAML document API, so the comments and layout of the original stay), and
 * a comment at the top saying what was changed. Before writing, the new text
 * is loaded back through the case loader, so a file that would not load is
 * never written. The write is atomic: a temporary file in the same directory,
 * then a hard link to the target name (which fails if the name exists, so no
 * file is replaced by a race) or, with `overwrite`, a rename over it.
 */
import { randomBytes } from 'node:crypto';
import { constants } from 'node:fs';
import { access, link, open, rename, unlink } from 'node:fs/promises';
import { inspectTarget } from '../case/target.js';
import { basename, dirname, extname, join, resolve } from 'node:path';
import YAML from 'yaml';
import { parseCase, parseSetValue, parseYamlText, readCaseText } from '../case/index.js';
import { movedFileKeys } from '../case/measured-files.js';
import type { Edit } from './state.js';

export class FileExistsError extends Error {
  constructor(readonly path: string) {
    super(`${path} already exists`);
    this.name = 'FileExistsError';
  }
}

export async function fileExists(path: string): Promise<boolean> {
  try {
    await access(path, constants.F_OK);
    return true;
  } catch {
    return false;
  }
}

/** The original text with the edits applied (comments kept) and a note on top. */
export function editedCaseText(original: string, edits: readonly Edit[], sourceName: string): string {
  const doc = YAML.parseDocument(original, { keepSourceTokens: false });
  for (const e of edits) {
    const value = parseSetValue(e.value, e.path);
    const segs = e.path.split('.');
    const old = doc.getIn(segs, true);
    const was = YAML.isScalar(old) ? String(old.value) : undefined; // read before setIn updates the node
    doc.setIn(segs, value);
    // the line's own comment described the old value: say what it was instead
    const now = doc.getIn(segs, true);
    if (YAML.isScalar(now) && was !== undefined) now.comment = ` changed by tractwave, was ${was}`;
  }
  const note = [
    ` Saved by tractwave from ${sourceName}.`,
    ...(edits.length > 0 ? [' Changed:', ...edits.map((e) => `   ${e.path}: ${e.value}`)] : [' No values changed.']),
  ].join('\n');
  const before = doc.commentBefore ? `${note}\n\n${doc.commentBefore}` : note;
  doc.commentBefore = before;
  return doc.toString({ lineWidth: 0 });
}

/**
 * The first free name for an edited case in `dir` (default: beside the case):
 * demo.yaml → demo-2.yaml, demo-3.yaml … (an already numbered name counts on
 * from its number).
 */
export async function suggestSavePath(
  caseFile: string,
  exists: (p: string) => Promise<boolean> = fileExists,
  dir: string = dirname(caseFile),
): Promise<string> {
  const ext = extname(caseFile) || '.yaml';
  const stem = basename(caseFile, ext);
  const m = /^(.*)-(\d+)$/.exec(stem);
  const base = m?.[1] ?? stem;
  let n = m ? Number(m[2]) + 1 : 2;
  for (; n < 10000; n++) {
    const candidate = join(dir, `${base}-${n}${ext}`);
    if (!(await exists(candidate))) return candidate;
  }
  return join(dir, `${base}-${randomBytes(3).toString('hex')}${ext}`);
}

/**
 * Where to offer saving an edited case: beside it, where a tuner looks for
 * it (a bundled case in the checkout too: the copy gets a new name, the
 * shipped file is never replaced, and the copy says on its first line that
 * tractwave saved it). Only a case inside an installed package (a
 * node_modules folder) is offered in the working directory instead.
 */
export async function saveDirFor(caseFile: string, cwd: string = process.cwd()): Promise<string> {
  const dir = dirname(resolve(caseFile));
  if (dir.split(/[\\/]/).includes('node_modules')) return cwd;
  return dir;
}

/** the first line of a case file tractwave saved (editedCaseText) */
export const SAVED_MARK = '# Saved by tractwave from ';

/** Write `text` to `target` atomically; refuse an existing target unless `overwrite`. */
export async function writeFileAtomic(target: string, text: string, overwrite: boolean): Promise<void> {
  const full = resolve(target);
  const tmp = join(dirname(full), `.${basename(full)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  const fh = await open(tmp, 'wx', 0o644);
  try {
    await fh.writeFile(text, 'utf8');
    await fh.sync();
  } finally {
    await fh.close();
  }
  try {
    if (overwrite) {
      await rename(tmp, full);
      return;
    }
    try {
      await link(tmp, full);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EEXIST') throw new FileExistsError(full);
      if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EXDEV') throw e;
      // a file system without hard links: check, then rename
      if (await fileExists(full)) throw new FileExistsError(full);
      await rename(tmp, full);
      return;
    }
    await unlink(tmp);
  } catch (e) {
    await unlink(tmp).catch(() => undefined);
    throw e;
  }
}

/**
 * Save the case `sourceFile` with `edits` to `target`. Returns the absolute
 * path written. Throws FileExistsError when the target exists and
 * `overwrite` is false, CaseError when the edited case would not load.
 */
export async function saveEditedCase(
  sourceFile: string,
  edits: readonly Edit[],
  target: string,
  opts: { overwrite: boolean; cwd?: string },
): Promise<string> {
  const full = resolve(opts.cwd ?? process.cwd(), target);
  if (resolve(sourceFile) === full && !opts.overwrite) throw new FileExistsError(full);
  const original = await readCaseText(sourceFile);
  // files the case names (lift logs, sheets) are relative to it: keep them found from the new place
  const moved = movedFileKeys(parseYamlText(original, sourceFile), sourceFile, full).map((m) => ({ path: m.path.join('.'), value: JSON.stringify(m.value) }));
  const text = editedCaseText(original, [...edits, ...moved], basename(sourceFile));
  parseCase(text, full); // throws CaseError if it would not load
  // never over a device, a folder or a pipe (nor a link to one), even when replacing is confirmed
  const where = inspectTarget(full);
  if (where.kind === 'other') throw new Error(`${full} is ${where.what}, not a file: choose another name`);
  await writeFileAtomic(where.path, text, opts.overwrite);
  return full;
}
