/**
 * The one error the Touchstone reader throws for a bad file. It names the line (1-based, as an
 * editor shows it) and says what is wrong and how it should read, so the upload form can show it
 * beside the file and the server can answer 400 with `details: [{line, message}]`.
 */

/** A malformed Touchstone file: `line` is where the problem is, `reason` what it is. */
export class TouchstoneError extends Error {
  /** 1-based line number in the file (the last line for "missing ..." problems found at the end). */
  readonly line: number;
  /** What is wrong, without the `Touchstone line N:` prefix that `message` carries. */
  readonly reason: string;

  constructor(line: number, reason: string) {
    super(`Touchstone line ${line}: ${reason}`);
    this.name = 'TouchstoneError';
    this.line = line;
    this.reason = reason;
  }
}

/** Whether `error` is a {@link TouchstoneError} (also across bundles, by name). */
export function isTouchstoneError(error: unknown): error is TouchstoneError {
  return error instanceof TouchstoneError || (error instanceof Error && error.name === 'TouchstoneError');
}
