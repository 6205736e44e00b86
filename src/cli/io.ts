/**
 * What a command may touch of the outside world. `main.ts` fills it from the
 * process; tests pass string buffers. Commands write only through it.
 */
export interface TextSink {
  write(text: string): unknown;
}

export interface CliIo {
  stdout: TextSink;
  stderr: TextSink;
  /** stdout is a terminal */
  stdoutIsTTY: boolean;
  /** stdin is a terminal */
  stdinIsTTY: boolean;
  /** stderr is a terminal (progress displays) */
  stderrIsTTY: boolean;
  /** rows of the terminal stdout writes to, when it is one */
  stdoutRows?: number;
  /** working directory relative paths are resolved against */
  cwd: string;
  /** the TERM environment variable ('dumb': no full-screen view) */
  term?: string;
  /** environment variables a command may read (tune --shard auto); main.ts passes process.env */
  env?: Readonly<Record<string, string | undefined>>;
}

/** An in-memory CliIo for tests and embedding. */
export function memoryIo(overrides: Partial<Omit<CliIo, 'stdout' | 'stderr'>> = {}): CliIo & { out: () => string; err: () => string } {
  let out = '';
  let err = '';
  return {
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
    stdoutIsTTY: false,
    stdinIsTTY: false,
    stderrIsTTY: false,
    cwd: process.cwd(),
    env: {},
    ...overrides,
    out: () => out,
    err: () => err,
  };
}
