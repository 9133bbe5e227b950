/**
 * Reads a stock-list file (stock-csv.md) into checked rows: UTF-8 only, comma or semicolon
 * (detected from the header), quoted fields, header names in any case with space/_/- alike. Every
 * row is checked; each problem is `{line, column, value, message}` with `line` counted as a
 * spreadsheet counts rows (header = 1; a quoted field with line breaks stays one row).
 * Nothing here touches the database.
 */
import Papa from 'papaparse';
import type { PartKind, StockFileProblem, Tolerance } from '../../../shared/api/stock.js';
import { isStandardValue, nearestStandardValue, type ESeriesName } from '../../../shared/engine/e-series.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { HttpError, tooLarge } from '../../errors.js';
import { decodeUtf8File } from './text-encoding.js';
import { DEFAULT_LOCATION, REQUIRED_COLUMNS, STOCK_COLUMNS, columnOfHeader, type StockColumn } from './stock-columns.js';
import { unescapeFormulaCell } from './formula-safe-cell.js';
import {
  CellProblem,
  QUANTITY_OF_KIND,
  readEsr,
  readFrequency,
  readKind,
  readPartValue,
  readQ,
  readQuantity,
  readRating,
  readSeries,
  readText,
  readTolerance,
  readUnitCost,
} from './stock-cell-parsing.js';

/** Most data rows one file may hold (stock-csv.md). */
export const MAX_STOCK_ROWS = 200_000;

/** Text limits of the parts table. */
const TEXT_LIMITS = { part_number: 64, location: 64, package: 16, manufacturer_part: 100, description: 500 } as const;

/** A part as one checked row describes it; optional columns the row leaves blank are null. */
export interface PartFields {
  partNumber: string;
  location: string;
  kind: PartKind;
  valueSi: number;
  toleranceKind: Tolerance['mode'];
  toleranceValue: number;
  srfHz: number | null;
  q: number | null;
  qFrequencyHz: number | null;
  esrOhm: number | null;
  quantity: number;
  package: string | null;
  voltageRatingV: number | null;
  currentRatingA: number | null;
  series: ESeriesName | null;
  unitCost: string | null;
  manufacturerPart: string | null;
  description: string | null;
}

/** One row that passed every check. */
export interface CheckedRow {
  line: number;
  part: PartFields;
}

/** What reading a file gives. */
export interface StockFileReading {
  /** The columns the header has (a merge leaves the others as they are on existing parts). */
  columns: ReadonlySet<StockColumn>;
  rows: CheckedRow[];
  rowsRead: number;
  /** Every problem, in line order. */
  rejected: StockFileProblem[];
  /** How many data rows have at least one problem. */
  rejectedRows: number;
  warnings: StockFileProblem[];
  /** When set, no row may be applied whatever the uploader chose (a header or quoting problem). */
  fatal: boolean;
  /** `partKey`s of rejected rows whose part number could be read: replace mode must not zero them. */
  rejectedKeys: ReadonlySet<string>;
}

/** The identity of a part: part number and location. */
export function partKey(partNumber: string, location: string): string {
  return `${partNumber}\u0000${location}`;
}

const FIELD_OF_COLUMN = {
  srf: 'srfHz',
  q: 'q',
  q_freq: 'qFrequencyHz',
  esr: 'esrOhm',
  package: 'package',
  voltage_rating: 'voltageRatingV',
  current_rating: 'currentRatingA',
  series: 'series',
  unit_cost: 'unitCost',
  manufacturer_part: 'manufacturerPart',
  description: 'description',
} as const satisfies Partial<Record<StockColumn, keyof PartFields>>;

/** The part fields each optional column fills, so a merge can tell which fields the file speaks for. */
export function fieldsOfColumns(columns: ReadonlySet<StockColumn>): (keyof PartFields)[] {
  const fields: (keyof PartFields)[] = ['kind', 'valueSi', 'toleranceKind', 'toleranceValue', 'quantity'];
  for (const [column, field] of Object.entries(FIELD_OF_COLUMN)) if (columns.has(column as StockColumn)) fields.push(field);
  // Q means nothing without its frequency: a file that speaks for one speaks for both.
  if (fields.includes('q') !== fields.includes('qFrequencyHz')) fields.push(fields.includes('q') ? 'qFrequencyHz' : 'q');
  return fields;
}

/**
 * Decodes, parses and checks a stock-list file.
 * @throws HttpError 400 when the bytes are not UTF-8; 413 beyond {@link MAX_STOCK_ROWS} data rows
 */
export function readStockFile(bytes: Uint8Array): StockFileReading {
  const decoded = decodeUtf8File(bytes);
  if (!decoded.ok) {
    throw new HttpError(400, 'not_utf8', decoded.problem.message, [{ field: 'file', line: decoded.problem.line, message: decoded.problem.message }]);
  }
  const text = decoded.text.replace(/\r\n?/g, '\n');
  const result: StockFileReading = {
    columns: new Set(),
    rows: [],
    rowsRead: 0,
    rejected: [],
    rejectedRows: 0,
    warnings: [],
    fatal: false,
    rejectedKeys: new Set(),
  };
  const fileProblem = (message: string, column = '', value = '') => {
    result.rejected.push({ line: 1, column, value, message });
    result.fatal = true;
    return result;
  };

  const parsed = Papa.parse<string[]>(text, { delimiter: detectDelimiter(text), newline: '\n', skipEmptyLines: false });
  const records = parsed.data;
  const headerIndex = records.findIndex((cells) => !isBlank(cells));
  if (headerIndex < 0) return fileProblem('The file is empty: it needs a header row naming the columns (part_number, kind, value, tolerance, quantity, ...) and one row per part.');

  const quoteErrors = new Map<number, string>();
  for (const error of parsed.errors) {
    if (error.type === 'Quotes' && error.row !== undefined && !quoteErrors.has(error.row)) {
      quoteErrors.set(
        error.row,
        error.code === 'MissingQuotes'
          ? 'a quoted field that starts on this line is never closed, so the rest of the file was read as one cell: add the closing "'
          : 'a quoted field is followed by other characters before the next delimiter; inside quotes, write a quote as ""',
      );
    }
  }

  // Header: map each cell to a column; unknown names are warned about and ignored.
  const header = records[headerIndex];
  const columnAt: (StockColumn | null)[] = [];
  const unnamed: number[] = [];
  for (let i = 0; i < header.length; i += 1) {
    const cell = header[i];
    const column = columnOfHeader(cell);
    columnAt.push(column);
    if (column === null) {
      if (cell.trim() === '') unnamed.push(i);
      else result.warnings.push({ line: headerIndex + 1, column: cell.trim(), value: cell, message: `unknown column "${cell.trim()}" is ignored; the columns are ${STOCK_COLUMNS.join(', ')}` });
    } else if (result.columns.has(column)) {
      return fileProblem(`the header names column ${column} twice; keep one`, column, cell);
    } else {
      (result.columns as Set<StockColumn>).add(column);
    }
  }
  const missing = REQUIRED_COLUMNS.filter((c) => !result.columns.has(c));
  if (missing.length > 0) {
    const found = header.map((c) => c.trim()).filter(Boolean).join(', ') || 'nothing';
    for (const column of missing) {
      result.rejected.push({ line: headerIndex + 1, column, value: '', message: `the header has no ${column} column (it has ${found}); a stock list needs part_number, kind, value, tolerance and quantity` });
    }
    result.fatal = true;
    return result;
  }
  if (quoteErrors.has(headerIndex)) return fileProblem(quoteErrors.get(headerIndex)!);

  const indexOfColumn = new Map<StockColumn, number>();
  columnAt.forEach((column, i) => column !== null && indexOfColumn.set(column, i));
  const checker = new RowChecker(indexOfColumn, result.warnings);
  const seen = new Map<string, number>();
  const unnamedWithData = new Set<number>();
  for (let index = headerIndex + 1; index < records.length; index += 1) {
    const cells = records[index];
    if (isBlank(cells)) continue;
    result.rowsRead += 1;
    if (result.rowsRead > MAX_STOCK_ROWS) {
      throw tooLarge(`The file has more than ${MAX_STOCK_ROWS.toLocaleString('en')} rows, the most one upload may hold; nothing was applied. Split it by location and upload each part.`);
    }
    const line = index + 1;
    const problems: StockFileProblem[] = [];
    const quoteError = quoteErrors.get(index);
    if (quoteError) {
      problems.push({ line, column: '', value: '', message: quoteError });
      result.fatal = true;
    }
    for (let i = header.length; i < cells.length; i += 1) {
      if (cells[i].trim() !== '') {
        problems.push({ line, column: `(cell ${i + 1})`, value: cells[i], message: `this row has ${cells.length} cells but the header has ${header.length}: check for an unquoted delimiter inside a cell` });
        break;
      }
    }
    for (const i of unnamed) if ((cells[i] ?? '').trim() !== '') unnamedWithData.add(i);

    const checked = checker.check(cells, line, problems);
    if (checked.keyReadable) {
      const key = partKey(checked.partNumber, checked.location);
      const first = seen.get(key);
      if (first !== undefined) {
        problems.push({
          line,
          column: 'part_number',
          value: checker.cell('part_number'),
          message: `part_number "${checked.partNumber}" at location "${checked.location}" is already on line ${first}; each part may appear once per location`,
        });
      } else {
        seen.set(key, line);
      }
      if (problems.length > 0) (result.rejectedKeys as Set<string>).add(key);
    }
    if (problems.length > 0) {
      result.rejected.push(...problems);
      result.rejectedRows += 1;
    } else {
      result.rows.push({ line, part: checked.part! });
    }
  }
  for (const i of unnamedWithData) {
    result.warnings.unshift({ line: headerIndex + 1, column: `(cell ${i + 1})`, value: '', message: `column ${i + 1} has no header name, so its cells are ignored` });
  }
  return result;
}

interface RowCheck {
  keyReadable: boolean;
  partNumber: string;
  location: string;
  part?: PartFields;
}

/** A cell reader that takes one extra argument (the row's kind, a column name). */
type CellReader<A, T> = (cell: string, argument: A) => T;

const readTextCell: CellReader<keyof typeof TEXT_LIMITS, string> = (cell, column) => readText(unescapeFormulaCell(cell.trim()), column, TEXT_LIMITS[column]);
const readValueCell: CellReader<PartKind, number> = (cell, kind) => readPartValue(cell, kind);
const readFrequencyCell: CellReader<'srf' | 'q_freq', number> = (cell, column) => readFrequency(cell, column);
const readRatingCell: CellReader<'voltage_rating' | 'current_rating', number> = (cell, column) => readRating(cell, column);
const readPlain = <T>(reader: (cell: string) => T): CellReader<null, T> => (cell) => reader(cell);
const readKindCell = readPlain(readKind);
const readQCell = readPlain(readQ);
const readEsrCell = readPlain(readEsr);
const readQuantityCell = readPlain(readQuantity);
const readSeriesCell = readPlain(readSeries);
const readUnitCostCell = readPlain(readUnitCost);

/**
 * Checks data rows one at a time; one instance per file, so reading a row allocates no closures
 * (100,000-row files spend their time in these few functions).
 */
class RowChecker {
  private cells: string[] = [];
  private line = 0;
  private problems: StockFileProblem[] = [];

  constructor(
    private readonly indexOfColumn: ReadonlyMap<StockColumn, number>,
    private readonly warnings: StockFileProblem[],
  ) {}

  /** The raw cell of `column` in the current row ('' when the file has no such column). */
  cell(column: StockColumn): string {
    const at = this.indexOfColumn.get(column);
    return at === undefined ? '' : (this.cells[at] ?? '');
  }

  private read<A, T>(column: StockColumn, reader: CellReader<A, T>, argument: A, required: boolean): T | null {
    const raw = this.cell(column);
    if (raw.trim() === '') {
      if (required) this.problems.push({ line: this.line, column, value: raw, message: `${column} is required` });
      return null;
    }
    try {
      return reader(raw, argument);
    } catch (error) {
      if (!(error instanceof CellProblem)) throw error;
      this.problems.push({ line: this.line, column, value: raw, message: error.message });
      return null;
    }
  }

  private problem(column: string, value: string, message: string): void {
    this.problems.push({ line: this.line, column, value, message });
  }

  /** Checks one row; pushes its problems onto `problems` and its warnings; returns the part when it has none. */
  check(cells: string[], line: number, problems: StockFileProblem[]): RowCheck {
    this.cells = cells;
    this.line = line;
    this.problems = problems;
    const before = problems.length;

    const partNumber = this.read('part_number', readTextCell, 'part_number', true);
    const location = this.read('location', readTextCell, 'location', false) ?? DEFAULT_LOCATION;
    const kind = this.read('kind', readKindCell, null, true);
    const valueSi = kind ? this.read('value', readValueCell, kind, true) : null;
    if (!kind && this.cell('value').trim() === '') this.problem('value', '', 'value is required');
    const tolerance = kind && valueSi !== null ? this.read('tolerance', (cell: string) => readTolerance(cell, kind, valueSi), null, true) : null;
    if ((!kind || valueSi === null) && this.cell('tolerance').trim() === '') this.problem('tolerance', '', 'tolerance is required');
    const srfHz = this.read('srf', readFrequencyCell, 'srf', false);
    const q = this.read('q', readQCell, null, false);
    const qFrequencyHz = this.read('q_freq', readFrequencyCell, 'q_freq', false);
    if (q !== null && qFrequencyHz === null && this.cell('q_freq').trim() === '') {
      this.problem('q_freq', '', 'q_freq is required with q: give the frequency Q was measured at, like 100MHz');
    }
    if (q === null && qFrequencyHz !== null && this.cell('q').trim() === '') {
      this.problem('q', '', 'q_freq is given but q is blank: give the Q measured at that frequency, or leave both blank');
    }
    const esrOhm = this.read('esr', readEsrCell, null, false);
    const quantity = this.read('quantity', readQuantityCell, null, true);
    const pkg = this.read('package', readTextCell, 'package', false);
    const voltageRatingV = this.read('voltage_rating', readRatingCell, 'voltage_rating', false);
    const currentRatingA = this.read('current_rating', readRatingCell, 'current_rating', false);
    if (kind === 'inductor' && voltageRatingV !== null) {
      this.problem('voltage_rating', this.cell('voltage_rating'), 'voltage_rating is for capacitors, but this row is an inductor: leave it blank or fix the kind');
    }
    if (kind === 'capacitor' && currentRatingA !== null) {
      this.problem('current_rating', this.cell('current_rating'), 'current_rating is for inductors, but this row is a capacitor: leave it blank or fix the kind');
    }
    const series = this.read('series', readSeriesCell, null, false);
    const unitCost = this.read('unit_cost', readUnitCostCell, null, false);
    const manufacturerPart = this.read('manufacturer_part', readTextCell, 'manufacturer_part', false);
    const description = this.read('description', readTextCell, 'description', false);

    if (series && kind && valueSi !== null && !isSeriesMember(valueSi, series)) {
      const quantityName = QUANTITY_OF_KIND[kind];
      this.warnings.push({
        line,
        column: 'value',
        value: this.cell('value'),
        message: `${formatValue(valueSi, quantityName)} is not an ${series} value (the nearest ${series} value is ${formatValue(nearestStandardValue(valueSi, series), quantityName)})`,
      });
    }
    if (pkg !== null && /^(201|402|603|805)$/.test(pkg)) {
      this.warnings.push({ line, column: 'package', value: this.cell('package'), message: `package "${pkg}" looks like 0${pkg} with its leading zero lost by a spreadsheet; it is stored as written` });
    }

    const result: RowCheck = { keyReadable: partNumber !== null, partNumber: partNumber ?? '', location };
    if (problems.length === before) {
      result.part = {
        partNumber: partNumber!,
        location,
        kind: kind!,
        valueSi: valueSi!,
        toleranceKind: tolerance!.mode,
        toleranceValue: tolerance!.mode === 'relative' ? tolerance!.fraction : tolerance!.deltaSi,
        srfHz,
        q,
        qFrequencyHz,
        esrOhm,
        quantity: quantity!,
        package: pkg,
        voltageRatingV,
        currentRatingA,
        series,
        unitCost,
        manufacturerPart,
        description,
      };
    }
    return result;
  }
}

/** Series membership, remembered per (series, value): stock lists repeat values. */
const seriesMemberships = new Map<string, boolean>();
const MEMBERSHIP_MEMO_LIMIT = 20_000;

function isSeriesMember(valueSi: number, series: ESeriesName): boolean {
  const key = `${series} ${valueSi}`;
  let member = seriesMemberships.get(key);
  if (member === undefined) {
    member = isStandardValue(valueSi, series);
    if (seriesMemberships.size >= MEMBERSHIP_MEMO_LIMIT) seriesMemberships.clear();
    seriesMemberships.set(key, member);
  }
  return member;
}

function isBlank(cells: string[]): boolean {
  for (const cell of cells) if (cell.trim() !== '') return false;
  return true;
}

/**
 * Comma or semicolon: whichever splits the header into more schema column names (then more cells).
 * Reading the header rather than guessing from the data keeps `4,7`-style cells from misleading it.
 */
export function detectDelimiter(text: string): ',' | ';' {
  const headerLine = text.split('\n').find((line) => line.trim() !== '') ?? '';
  const score = (delimiter: string) => {
    const cells = headerLine.split(delimiter).map((cell) => cell.replace(/"/g, ''));
    return { known: cells.filter((cell) => columnOfHeader(cell) !== null).length, cells: cells.length };
  };
  const comma = score(',');
  const semicolon = score(';');
  if (semicolon.known !== comma.known) return semicolon.known > comma.known ? ';' : ',';
  return semicolon.cells > comma.cells ? ';' : ',';
}
