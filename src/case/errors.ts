/**
 * The one error type of bad user input. `path` names the field ("runner.length"),
 * the file ("cases/x.yaml:12:3") or the option ("--rpm"); `message` says what
 * is wrong. The CLI prints `error: <path>: <message>` and exits 2.
 */
export type CaseErrorCode = 'invalid' | 'unknown-key' | 'yaml' | 'file' | 'option';

export class CaseError extends Error {
  readonly code: CaseErrorCode;
  readonly path: string;
  readonly detail: string;

  constructor(path: string, detail: string, code: CaseErrorCode = 'invalid') {
    super(path ? `${path}: ${detail}` : detail);
    this.name = 'CaseError';
    this.code = code;
    this.path = path;
    this.detail = detail;
  }
}

export function isCaseError(e: unknown): e is CaseError {
  return e instanceof CaseError;
}
