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

    const cellOf = (column: StockColumn): string => {
      const at = columnAt.indexOf(column);
      return at < 0 ? '' : (cells[at] ?? '');
    };
    const checked = checkRow(cellOf, line, problems, result.warnings);
    if (checked.keyReadable) {
      const key = partKey(checked.partNumber, checked.location);
      const first = seen.get(key);
      if (first !== undefined) {
        problems.push({
          line,
          column: 'part_number',
          value: cellOf('part_number'),
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

/** Checks one data row; pushes its problems and warnings; returns the part when it has none. */
function checkRow(cellOf: (column: StockColumn) => string, line: number, problems: StockFileProblem[], warnings: StockFileProblem[]): RowCheck {
  const before = problems.length;
  const read = <T>(column: StockColumn, reader: (cell: string) => T, required = false): T | null => {
    const raw = cellOf(column);
    if (raw.trim() === '') {
      if (required) problems.push({ line, column, value: raw, message: `${column} is required` });
      return null;
    }
    try {
      return reader(raw);
    } catch (error) {
      if (!(error instanceof CellProblem)) throw error;
      problems.push({ line, column, value: raw, message: error.message });
      return null;
    }
  };
  const text = (column: keyof typeof TEXT_LIMITS) => (cell: string) => readText(unescapeFormulaCell(cell.trim()), column, TEXT_LIMITS[column]);

  const partNumber = read('part_number', text('part_number'), true);
  const location = read('location', text('location')) ?? DEFAULT_LOCATION;
  const kind = read('kind', readKind, true);
  const valueSi = kind ? read('value', (cell) => readPartValue(cell, kind), true) : null;
  if (!kind && cellOf('value').trim() === '') problems.push({ line, column: 'value', value: '', message: 'value is required' });
  const tolerance = kind && valueSi !== null ? read('tolerance', (cell) => readTolerance(cell, kind, valueSi), true) : null;
  if ((!kind || valueSi === null) && cellOf('tolerance').trim() === '') problems.push({ line, column: 'tolerance', value: '', message: 'tolerance is required' });
  const srfHz = read('srf', (cell) => readFrequency(cell, 'srf'));
  const q = read('q', readQ);
  const qFrequencyHz = read('q_freq', (cell) => readFrequency(cell, 'q_freq'));
  if (q !== null && qFrequencyHz === null && cellOf('q_freq').trim() === '') {
    problems.push({ line, column: 'q_freq', value: '', message: `q_freq is required with q: give the frequency Q was measured at, like 100MHz` });
  }
  if (q === null && qFrequencyHz !== null && cellOf('q').trim() === '') {
    problems.push({ line, column: 'q', value: '', message: 'q_freq is given but q is blank: give the Q measured at that frequency, or leave both blank' });
  }
  const esrOhm = read('esr', readEsr);
  const quantity = read('quantity', readQuantity, true);
  const pkg = read('package', text('package'));
  const voltageRatingV = read('voltage_rating', (cell) => readRating(cell, 'voltage_rating'));
  const currentRatingA = read('current_rating', (cell) => readRating(cell, 'current_rating'));
  if (kind === 'inductor' && voltageRatingV !== null) {
    problems.push({ line, column: 'voltage_rating', value: cellOf('voltage_rating'), message: 'voltage_rating is for capacitors, but this row is an inductor: leave it blank or fix the kind' });
  }
  if (kind === 'capacitor' && currentRatingA !== null) {
    problems.push({ line, column: 'current_rating', value: cellOf('current_rating'), message: 'current_rating is for inductors, but this row is a capacitor: leave it blank or fix the kind' });
  }
  const series = read('series', readSeries);
  const unitCost = read('unit_cost', readUnitCost);
  const manufacturerPart = read('manufacturer_part', text('manufacturer_part'));
  const description = read('description', text('description'));

  if (series && kind && valueSi !== null && !isStandardValue(valueSi, series)) {
    const quantityName = QUANTITY_OF_KIND[kind];
    warnings.push({
      line,
      column: 'value',
      value: cellOf('value'),
      message: `${formatValue(valueSi, quantityName)} is not an ${series} value (the nearest ${series} value is ${formatValue(nearestStandardValue(valueSi, series), quantityName)})`,
    });
  }
  if (pkg !== null && /^(201|402|603|805)$/.test(pkg)) {
    warnings.push({ line, column: 'package', value: cellOf('package'), message: `package "${pkg}" looks like 0${pkg} with its leading zero lost by a spreadsheet; it is stored as written` });
  }

  const keyReadable = partNumber !== null;
  const result: RowCheck = { keyReadable, partNumber: partNumber ?? '', location };
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

function isBlank(cells: string[]): boolean {
  return cells.every((cell) => cell.trim() === '');
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
