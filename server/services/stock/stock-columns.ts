/**
 * The stock-list CSV schema (handbook stock-csv.md): its columns in file order, which are required,
 * and how a header cell is read (case-insensitive; space, `_` and `-` alike).
 */

/** Every column, in the order the export writes them. */
export const STOCK_COLUMNS = [
  'part_number',
  'kind',
  'value',
  'tolerance',
  'srf',
  'q',
  'q_freq',
  'esr',
  'quantity',
  'package',
  'voltage_rating',
  'current_rating',
  'location',
  'series',
  'unit_cost',
  'manufacturer_part',
  'description',
] as const;

/** One column of the schema. */
export type StockColumn = (typeof STOCK_COLUMNS)[number];

/** Columns a file must have. */
export const REQUIRED_COLUMNS: readonly StockColumn[] = ['part_number', 'kind', 'value', 'tolerance', 'quantity'];

/** The location of rows that name none. */
export const DEFAULT_LOCATION = 'main';

/** `Part Number`, `part-number`, ` PART_NUMBER ` all read as `part_number`. */
export function normalizeHeaderName(cell: string): string {
  return cell.trim().toLowerCase().replace(/[\s_-]+/g, '_');
}

/** The schema column a header cell names, or null when it names none. */
export function columnOfHeader(cell: string): StockColumn | null {
  const name = normalizeHeaderName(cell);
  return (STOCK_COLUMNS as readonly string[]).includes(name) ? (name as StockColumn) : null;
}
