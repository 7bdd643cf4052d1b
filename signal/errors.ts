/** Typed errors the engine throws: each names what is wrong and what to try, in plain words. */

export type CaptureErrorCode =
  | 'EMPTY_FILE'
  | 'NOT_TEXT'
  | 'NO_NUMERIC_DATA'
  | 'ONE_COLUMN'
  | 'BAD_NUMBER'
  | 'TOO_LARGE'
  | 'BAD_MAPPING'
  | 'BAD_SETTINGS'
  | 'CANCELLED'
  | 'NOTHING_TO_ANALYSE';

export class CaptureError extends Error {
  readonly code: CaptureErrorCode;
  /** 1-based line in the file, when the problem is at a line. */
  readonly line?: number;
  /** 1-based column (field) in that line. */
  readonly column?: number;

  constructor(code: CaptureErrorCode, message: string, where: { line?: number; column?: number } = {}) {
    super(message);
    this.name = 'CaptureError';
    this.code = code;
    this.line = where.line;
    this.column = where.column;
  }

  toJSON() {
    return { code: this.code, message: this.message, line: this.line, column: this.column };
  }
}

export function isCaptureError(e: unknown): e is CaptureError {
  return e instanceof CaptureError;
}
