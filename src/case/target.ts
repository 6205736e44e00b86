/**
 * What is at the name an output file is to be written to, before anything
 * is replaced: nothing, a regular file (or a symbolic link to one: the file
 * it points to is the one replaced), or something that must never be
 * replaced by a regular file (a directory, a device, a pipe, a socket).
 * Used by the command line's --csv and the terminal view's save.
 */
import { lstatSync, realpathSync, statSync, type Stats } from 'node:fs';

export type TargetKind = 'none' | 'file' | 'other';

export interface Target {
  kind: TargetKind;
  /** the path to write: the file a symbolic link points to, else the path itself */
  path: string;
  /** for 'other': what it is, in words ("a directory", "a device") */
  what?: string;
}

function whatIs(s: Stats): string {
  if (s.isDirectory()) return 'a directory';
  if (s.isCharacterDevice() || s.isBlockDevice()) return 'a device';
  if (s.isFIFO()) return 'a named pipe';
  if (s.isSocket()) return 'a socket';
  return 'not a regular file';
}

/** What is at `full` now (synchronous: a few system calls, made before any work). */
export function inspectTarget(full: string): Target {
  let l;
  try {
    l = lstatSync(full);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return { kind: 'none', path: full };
    throw e;
  }
  if (l.isFile()) return { kind: 'file', path: full };
  if (l.isSymbolicLink()) {
    let s;
    try {
      s = statSync(full);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return { kind: 'other', path: full, what: 'a symbolic link to nothing' };
      throw e;
    }
    if (s.isFile()) return { kind: 'file', path: realpathSync(full) };
    return { kind: 'other', path: full, what: `a symbolic link to ${whatIs(s)}` };
  }
  return { kind: 'other', path: full, what: whatIs(l) };
}
