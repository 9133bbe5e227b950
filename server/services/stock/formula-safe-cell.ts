/**
 * The formula-injection defence of every CSV Shelfmatch writes (stock-csv.md; OWASP "CSV
 * Injection"): a text cell that begins with `=`, `+`, `-`, `@`, tab or carriage return gets a leading
 * `'`, so a spreadsheet shows it as text instead of running it. The importer undoes exactly that, so
 * an export re-imports unchanged.
 */

/** First characters a spreadsheet may read as the start of a formula. */
const FORMULA_STARTS = new Set(['=', '+', '-', '@', '\t', '\r']);

/** The apostrophe spreadsheets read as "this cell is text". */
const TEXT_MARK = "'";

function startsLikeFormula(text: string): boolean {
  return text.length > 0 && FORMULA_STARTS.has(text[0]);
}

/**
 * `text` as it is written into a CSV cell: prefixed with `'` when it starts like a formula, and also
 * when it already starts with `'` followed by such a character or another `'` (so that
 * {@link unescapeFormulaCell} gives back exactly `text`).
 */
export function escapeFormulaCell(text: string): string {
  if (startsLikeFormula(text)) return TEXT_MARK + text;
  if (text.startsWith(TEXT_MARK) && (startsLikeFormula(text.slice(1)) || text[1] === TEXT_MARK)) return TEXT_MARK + text;
  return text;
}

/** Undoes {@link escapeFormulaCell}: drops one leading `'` when what follows starts like a formula or with `'`. */
export function unescapeFormulaCell(text: string): string {
  if (text.startsWith(TEXT_MARK) && (startsLikeFormula(text.slice(1)) || text[1] === TEXT_MARK)) return text.slice(1);
  return text;
}
