/** The JSON error shape every route sends (handbook api.md). */
export interface ApiErrorBody {
  error: {
    /** Stable snake_case code, e.g. `invalid_input`, `database_unavailable`. */
    code: string;
    /** One sentence a person can act on. */
    message: string;
    /** Where the problem is, when the input had several parts. */
    details?: ApiErrorDetail[];
  };
}

/** One located problem in a request or a file. */
export interface ApiErrorDetail {
  /** Dotted path of the field (`load`, `band.lowHz`) or a CSV column name. */
  field?: string;
  /** 1-based line of a file, header = 1, as a spreadsheet shows it. */
  line?: number;
  column?: string;
  value?: unknown;
  message: string;
}
