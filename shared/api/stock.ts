/**
 * Request and response shapes of the stock routes (handbook api.md, "Stock"; the CSV schema is
 * stock-csv.md). Numbers are SI base units: farads, henries, hertz, ohms, volts, amperes. Money is a
 * decimal string (never a float).
 */
import type { Tolerance } from '../engine/tolerance-codes.js';

/** The two kinds of part Shelfmatch snaps to. */
export type PartKind = 'capacitor' | 'inductor';

/** Every part kind, in the order screens list them. */
export const PART_KINDS: readonly PartKind[] = ['capacitor', 'inductor'];

/** `merge` creates or updates the parts in the file; `replace` also zeroes the rest of its locations. */
export type StockImportMode = 'merge' | 'replace';

/** Every import mode; the first is the default. */
export const STOCK_IMPORT_MODES: readonly StockImportMode[] = ['merge', 'replace'];

/**
 * A part's tolerance, in the engine's own shape (shared/engine/tolerance-codes.ts): `relative` as a
 * fraction of the nominal value (5 % is `{mode: 'relative', fraction: 0.05}`), `absolute` in the
 * unit of the value (±0.1 pF is `{mode: 'absolute', deltaSi: 1e-13}`).
 */
export type { Tolerance } from '../engine/tolerance-codes.js';

/** One stocked part as `GET /api/parts` lists it. */
export interface PartItem {
  id: number;
  partNumber: string;
  kind: PartKind;
  /** Nominal value in F (capacitor) or H (inductor). */
  value: number;
  tolerance: Tolerance;
  /** Self-resonant frequency in Hz; null means "limit unknown". */
  srfHz: number | null;
  /** Quality factor at `qFrequencyHz`; null when not given. */
  q: number | null;
  qFrequencyHz: number | null;
  /** Series loss resistance in ohms; wins over `q`. */
  esrOhm: number | null;
  /** On hand. */
  quantity: number;
  /** Held for builds. */
  reserved: number;
  /** On hand minus reserved, never below zero. */
  available: number;
  package: string | null;
  /** Capacitors: rated (DC) voltage in V. */
  voltageRating: number | null;
  /** Inductors: rated (DC) current in A. */
  currentRating: number | null;
  location: string;
  /** E-series the value is taken from (`E6` ... `E192`), as the stock list says. */
  series: string | null;
  /** Exact decimal string with up to 4 decimal places, e.g. `"0.0125"`. */
  unitCost: string | null;
  manufacturerPart: string | null;
  description: string | null;
}

/** Columns `GET /api/parts` can sort by (`sort=`). */
export const PART_SORT_FIELDS = [
  'partNumber',
  'kind',
  'value',
  'quantity',
  'available',
  'location',
  'srfHz',
  'package',
  'unitCost',
] as const;

/** One of {@link PART_SORT_FIELDS}. */
export type PartSortField = (typeof PART_SORT_FIELDS)[number];

/** Query of `GET /api/parts` (all optional; `page` is 1-based). */
export interface PartListQuery {
  kind?: PartKind;
  location?: string;
  /** Matches part number, manufacturer part, description or package; a value such as `4p7` also matches the value. */
  search?: string;
  sort?: PartSortField;
  order?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
}

/** Largest `pageSize` `GET /api/parts` accepts. */
export const MAX_PART_PAGE_SIZE = 500;

/** `GET /api/parts` answer. */
export interface PartListResponse {
  items: PartItem[];
  total: number;
}

/** `GET /api/parts/locations` answer: every location that holds parts, for filters. */
export interface PartLocationsResponse {
  items: string[];
}

/** One located problem in a stock-list file. */
export interface StockFileProblem {
  /** The row as a spreadsheet counts it (header = 1); 0 for a note about the stock rather than one row. */
  line: number;
  /** The column as the schema names it (`value`, `q_freq`), or as the file wrote an unknown one. */
  column: string;
  /** The cell as written. */
  value: string;
  message: string;
}

/** `POST /api/stock/imports` answer: 200 when applied or a dry run, 422 (with `error` too) when rows were rejected. */
export interface StockImportReport {
  /** Whether the stock was changed. */
  applied: boolean;
  /** Whether this was a dry run (nothing is ever applied). */
  dryRun: boolean;
  mode: StockImportMode;
  /** Data rows read (blank lines not counted). */
  rowsRead: number;
  created: number;
  updated: number;
  unchanged: number;
  zeroed: number;
  rejected: StockFileProblem[];
  warnings: StockFileProblem[];
  /** The history entry, or null for a dry run. */
  importId: number | null;
  /** How many data rows were rejected (`rejected` may hold several problems per row). */
  rejectedRows: number;
  /** Whether `rejected` or `warnings` lists only the first 1,000 entries. */
  truncated: boolean;
}

/** Form fields of `POST /api/stock/imports` besides `file` (all strings, as multipart sends them). */
export interface StockImportFields {
  mode?: StockImportMode;
  dryRun?: 'true' | 'false';
  skipInvalid?: 'true' | 'false';
}

/** `applied` changed the stock; `rejected` was refused whole and changed nothing. */
export type StockImportStatus = 'applied' | 'rejected';

/** One entry of the import history. */
export interface StockImportSummary {
  id: number;
  status: StockImportStatus;
  /** ISO 8601 time of the upload. */
  createdAt: string;
  user: { id: number; name: string; email: string } | null;
  fileName: string;
  /** SHA-256 of the uploaded bytes, hex. */
  sha256: string;
  sizeBytes: number;
  mode: StockImportMode;
  skipInvalid: boolean;
  rowsRead: number;
  created: number;
  updated: number;
  unchanged: number;
  zeroed: number;
  rejectedCount: number;
  warningCount: number;
  /** The locations the file named. */
  locations: string[];
}

/** What happened to one part in one import. */
export type PartChangeKind = 'created' | 'updated' | 'zeroed';

/** One part's change in an import: quantity before and after, and every other field that changed. */
export interface PartChange {
  partId: number;
  partNumber: string;
  location: string;
  kind: PartKind;
  change: PartChangeKind;
  /** Null for a created part. */
  quantityBefore: number | null;
  quantityAfter: number;
  /** The changed fields (PartItem names) with their old and new values; empty for created and zeroed parts. */
  fields: { field: string; before: unknown; after: unknown }[];
}

/** `GET /api/stock/imports/:id` answer: the entry, its problems and a page of its changes. */
export interface StockImportDetail extends StockImportSummary {
  /** The previous applied import, which this one's changes are measured from. */
  previousImportId: number | null;
  rejected: StockFileProblem[];
  warnings: StockFileProblem[];
  /** Whether `rejected` and `warnings` were cut to the first entries kept. */
  problemsTruncated: boolean;
  changes: PartChange[];
  changesTotal: number;
  page: number;
  pageSize: number;
}

/** `GET /api/stock/imports` answer, newest first. */
export interface StockImportListResponse {
  items: StockImportSummary[];
  total: number;
}
