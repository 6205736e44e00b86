import { fileURLToPath } from 'node:url';
import { runCli } from '../../src/cli/main.js';
import { memoryIo } from '../../src/cli/io.js';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url)).replace(/\/$/, '');

export interface CliRun {
  code: number;
  out: string;
  err: string;
}

/** Run the CLI in-process with captured output, cwd at the repository root unless given. */
export async function cli(argv: string[], opts: { cwd?: string; tty?: boolean } = {}): Promise<CliRun> {
  const io = memoryIo({ cwd: opts.cwd ?? ROOT, stdinIsTTY: opts.tty ?? false, stdoutIsTTY: opts.tty ?? false });
  const code = await runCli(argv, io);
  return { code, out: io.out(), err: io.err() };
}
