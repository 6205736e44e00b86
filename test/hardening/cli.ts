/** Run the command line in-process (src/cli/main.ts runCli) with captured output. */
import { fileURLToPath } from 'node:url';
import { runCli } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';

/** the repository root (no trailing slash) */
export const ROOT = fileURLToPath(new URL('../..', import.meta.url)).replace(/\/$/, '');

export interface CliResult {
  code: number;
  out: string;
  err: string;
  /** the non-empty lines of stderr */
  errLines: string[];
}

export async function tractwave(argv: string[], cwd = ROOT): Promise<CliResult> {
  const io = memoryIo({ cwd });
  const code = await runCli(argv, io);
  const err = io.err();
  return { code, out: io.out(), err, errLines: err.split('\n').filter((l) => l.trim() !== '') };
}
