/**
 * The one error type the engine throws for bad input. The server turns it into a 400 with
 * `details` (handbook api.md: `{error: {code, message, details}}`); the browser shows `message`
 * beside the field named by `field`.
 */

/** One located problem: which field, what was given, what is wrong and how to write it. */
export interface EngineInputProblem {
  /** Dotted path of the field as the request names it (`load`, `frequencyHz`, `parts.0.srfHz`). */
  field: string;
  /** What was given, as given (a string, a number, or anything a JSON body may hold). */
  value: unknown;
  /** One sentence that quotes the value and shows an accepted form. */
  message: string;
  /** 1-based line of an uploaded file the problem is on (a measured Touchstone port). */
  line?: number;
}

/** Bad input to an engine function; `details` lists every problem found, `field`/`value` the first. */
export class EngineInputError extends Error {
  /** Field of the first problem. */
  readonly field: string;
  /** Value of the first problem. */
  readonly value: unknown;
  /** Every problem found (at least one). */
  readonly details: readonly EngineInputProblem[];

  constructor(field: string, value: unknown, message: string, details?: readonly EngineInputProblem[]) {
    super(message);
    this.name = 'EngineInputError';
    this.field = field;
    this.value = value;
    this.details = details && details.length > 0 ? details : [{ field, value, message }];
  }

  /** One error carrying several problems (the first gives `field`, `value` and `message`). */
  static fromProblems(problems: readonly EngineInputProblem[]): EngineInputError {
    if (problems.length === 0) throw new Error('EngineInputError.fromProblems needs at least one problem');
    const first = problems[0];
    const message =
      problems.length === 1 ? first.message : `${first.message} (and ${problems.length - 1} more problem(s))`;
    return new EngineInputError(first.field, first.value, message, problems);
  }
}

/** Whether `error` is an {@link EngineInputError} (also across bundles, by name). */
export function isEngineInputError(error: unknown): error is EngineInputError {
  return error instanceof EngineInputError || (error instanceof Error && error.name === 'EngineInputError');
}

/** Shows a value inside an error message: strings quoted, everything else as JSON-ish text. */
export function quoteValue(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (value === undefined) return 'nothing';
  try {
    const text = JSON.stringify(value) ?? String(value);
    return text.length > 200 ? `${text.slice(0, 200)}…` : text;
  } catch {
    // Nested too deeply for JSON (or for String, which recurses through arrays too).
    return Array.isArray(value) ? 'a deeply nested list' : 'a deeply nested object';
  }
}
