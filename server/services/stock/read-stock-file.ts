/**
 * Reads a stock-list file (stock-csv.md) into checked rows, ready to COPY: UTF-8 only, comma or semicolon
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
import { BinaryCopyWriter } from './copy-rows.js';
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

/**
 * The stage table's columns (the temporary table the importer COPYs accepted rows into), in the
 * order {@link readStockFile} writes them in: the row's line, then the part as `parts` stores it,
 * except `unit_cost`, which stays the file's canonical decimal text ("0.012") until it is written.
 */
export const STAGE_COLUMNS = [
  ['line', 'INTEGER'],
  ['part_number', 'TEXT'],
  ['location', 'TEXT'],
  ['kind', 'TEXT'],
  ['value_si', 'DOUBLE PRECISION'],
  ['tolerance_kind', 'TEXT'],
  ['tolerance_value', 'DOUBLE PRECISION'],
  ['srf_hz', 'DOUBLE PRECISION'],
  ['q', 'DOUBLE PRECISION'],
  ['q_frequency_hz', 'DOUBLE PRECISION'],
  ['esr_ohm', 'DOUBLE PRECISION'],
  ['quantity', 'INTEGER'],
  ['package', 'TEXT'],
  ['voltage_rating_v', 'DOUBLE PRECISION'],
  ['current_rating_a', 'DOUBLE PRECISION'],
  ['series', 'TEXT'],
  ['unit_cost', 'TEXT'],
  ['manufacturer_part', 'TEXT'],
  ['description', 'TEXT'],
] as const;

/** One column of the stage table. */
export type StageColumn = (typeof STAGE_COLUMNS)[number][0];

/** What reading a file gives. */
export interface StockFileReading {
  /** The columns the header has (a merge leaves the others as they are on existing parts). */
  columns: ReadonlySet<StockColumn>;
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
  /** How many rows passed every check. */
  accepted: number;
  /** The distinct locations of those rows, sorted. */
  locations: string[];
  /** Those rows in COPY binary format with the {@link STAGE_COLUMNS}, in file order. */
  staged: Buffer[];
}

/** The identity of a part: part number and location. */
export function partKey(partNumber: string, location: string): string {
  return `${partNumber}\u0000${location}`;
}

/** The part number and location of a {@link partKey} (part numbers hold no control characters). */
export function splitPartKey(key: string): { partNumber: string; location: string } {
  const at = key.indexOf('\u0000');
  return { partNumber: key.slice(0, at), location: key.slice(at + 1) };
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
 * Decodes a stock-list file as UTF-8 and makes every line end a line feed.
 * @throws HttpError 400 when the bytes are not UTF-8
 */
export function decodeStockFile(bytes: Uint8Array): string {
  const decoded = decodeUtf8File(bytes);
  if (!decoded.ok) {
    throw new HttpError(400, 'not_utf8', decoded.problem.message, [{ field: 'file', line: decoded.problem.line, message: decoded.problem.message }]);
  }
  return decoded.text.includes('\r') ? decoded.text.replace(/\r\n?/g, '\n') : decoded.text;
}

/**
 * Decodes, parses and checks a stock-list file. Rows are parsed and checked one at a time and only
 * what the import needs is kept (each accepted row as a stage-table row), so a 100,000-row file
 * never holds its cells all at once.
 * @throws HttpError 400 when the bytes are not UTF-8; 413 beyond {@link MAX_STOCK_ROWS} data rows
 */
export function readStockFile(bytes: Uint8Array): StockFileReading {
  const text = decodeStockFile(bytes);
  const result = emptyReading();
  const writer = new BinaryCopyWriter();
  const rows = readRows(text, result, writer);
  let step = rows.next();
  while (!step.done) step = rows.next();
  if (step.value) result.staged = writer.finish();
  return result;
}

/**
 * {@link readStockFile} of decoded text that hands the staged rows to `sink` while it reads: each
 * buffer as it fills, with a turn of the event loop now and then, so they can be on their way to
 * the database (a COPY) while the rest is read. The reading's `staged` stays empty; when the file
 * is refused at its header nothing is handed over.
 * @throws HttpError 413 beyond {@link MAX_STOCK_ROWS} data rows
 */
export async function readStockText(text: string, sink: (chunk: Buffer) => Promise<void>): Promise<StockFileReading> {
  const result = emptyReading();
  const writer = new BinaryCopyWriter();
  const rows = readRows(text, result, writer);
  let step = rows.next();
  while (!step.done) {
    for (const chunk of writer.take()) await sink(chunk);
    await new Promise((resolve) => setImmediate(resolve));
    step = rows.next();
  }
  if (step.value) for (const chunk of writer.finish()) await sink(chunk);
  return result;
}

function emptyReading(): StockFileReading {
  return {
    columns: new Set(),
    rowsRead: 0,
    rejected: [],
    rejectedRows: 0,
    warnings: [],
    fatal: false,
    rejectedKeys: new Set(),
    accepted: 0,
    locations: [],
    staged: [],
  };
}

/** Records read between the pauses of {@link readRows}. */
const RECORDS_PER_PAUSE = 4096;

/**
 * Reads `text` into `result`, writing each accepted row into `writer`; pauses (yields) every few
 * thousand records of a file without quotes. Returns false when the file was refused at its
 * header (then nothing in `writer` is meant to be sent).
 */
function* readRows(text: string, result: StockFileReading, writer: BinaryCopyWriter): Generator<undefined, boolean, undefined> {
  const fileProblem = (message: string, column = '', value = '') => {
    result.rejected.push({ line: 1, column, value, message });
    result.fatal = true;
  };

  let index = -1;
  let header: string[] | null = null;
  let headerIndex = -1;
  let checker: RowChecker | null = null;
  let tooManyRows = false;
  const unnamed: number[] = [];
  const unnamedWithData = new Set<number>();
  /** The line each part was first seen on, by location then part number (no key string per row). */
  const seen = new Map<string, Map<string, number>>();
  const problems: StockFileProblem[] = [];
  const locations = new Set<string>();

  /** The header row: map each cell to a column; unknown names are warned about and ignored. False when the file is refused. */
  const readHeader = (cells: string[], quoteError: string | undefined): boolean => {
    for (let i = 0; i < cells.length; i += 1) {
      const cell = cells[i];
      const column = columnOfHeader(cell);
      if (column === null) {
        if (cell.trim() === '') unnamed.push(i);
        else result.warnings.push({ line: headerIndex + 1, column: cell.trim(), value: cell, message: `unknown column "${cell.trim()}" is ignored; the columns are ${STOCK_COLUMNS.join(', ')}` });
      } else if (result.columns.has(column)) {
        fileProblem(`the header names column ${column} twice; keep one`, column, cell);
        return false;
      } else {
        (result.columns as Set<StockColumn>).add(column);
      }
    }
    const missing = REQUIRED_COLUMNS.filter((c) => !result.columns.has(c));
    if (missing.length > 0) {
      const found = cells.map((c) => c.trim()).filter(Boolean).join(', ') || 'nothing';
      for (const column of missing) {
        result.rejected.push({ line: headerIndex + 1, column, value: '', message: `the header has no ${column} column (it has ${found}); a stock list needs part_number, kind, value, tolerance and quantity` });
      }
      result.fatal = true;
      return false;
    }
    if (quoteError) {
      fileProblem(quoteError);
      return false;
    }
    checker = new RowChecker(cells, result.warnings);
    return true;
  };

  /** One data row: checked, then either its problems kept or its stage row written. */
  const readRow = (cells: string[], quoteError: string | undefined, rowChecker: RowChecker, width: number): void => {
    const line = index + 1;
    problems.length = 0;
    if (quoteError) {
      problems.push({ line, column: '', value: '', message: quoteError });
      result.fatal = true;
    }
    for (let i = width; i < cells.length; i += 1) {
      if (cells[i].trim() !== '') {
        problems.push({ line, column: `(cell ${i + 1})`, value: cells[i], message: `this row has ${cells.length} cells but the header has ${width}: check for an unquoted delimiter inside a cell` });
        break;
      }
    }
    for (const i of unnamed) if ((cells[i] ?? '').trim() !== '') unnamedWithData.add(i);

    const part = rowChecker.check(cells, line, problems);
    if (rowChecker.partNumber !== null) {
      let atLocation = seen.get(rowChecker.location);
      if (atLocation === undefined) {
        atLocation = new Map();
        seen.set(rowChecker.location, atLocation);
      }
      const first = atLocation.get(rowChecker.partNumber);
      if (first !== undefined) {
        problems.push({
          line,
          column: 'part_number',
          value: rowChecker.cell('part_number'),
          message: `part_number "${rowChecker.partNumber}" at location "${rowChecker.location}" is already on line ${first}; each part may appear once per location`,
        });
      } else {
        atLocation.set(rowChecker.partNumber, line);
      }
      if (problems.length > 0) (result.rejectedKeys as Set<string>).add(partKey(rowChecker.partNumber, rowChecker.location));
    }
    if (problems.length > 0) {
      for (const problem of problems) result.rejected.push(problem);
      result.rejectedRows += 1;
    } else if (part) {
      stageRow(writer, line, part);
      result.accepted += 1;
      locations.add(rowChecker.location);
    }
  };

  /** One record (a row as a spreadsheet counts them, blank ones included); false stops reading. */
  const onRecord = (cells: string[], quoteError: string | undefined): boolean => {
    index += 1;
    if (isBlank(cells)) return true;
    if (header === null) {
      header = cells;
      headerIndex = index;
      return readHeader(cells, quoteError);
    }
    result.rowsRead += 1;
    if (result.rowsRead > MAX_STOCK_ROWS) {
      tooManyRows = true;
      return false;
    }
    readRow(cells, quoteError, checker!, header.length);
    return true;
  };

  const delimiter = detectDelimiter(text);
  if (!text.includes('"')) {
    // No quote anywhere: every line is one record and every delimiter splits, which is what
    // papaparse does too in this case (its "fast mode"); done here without its per-row overhead.
    for (let from = 0, records = 1; ; records += 1) {
      const end = text.indexOf('\n', from);
      if (!onRecord((end < 0 ? text.slice(from) : text.slice(from, end)).split(delimiter), undefined) || end < 0) break;
      from = end + 1;
      if (records % RECORDS_PER_PAUSE === 0) yield;
    }
  } else {
    Papa.parse<string[]>(text, {
      delimiter,
      newline: '\n',
      skipEmptyLines: false,
      step: (step, parser) => {
        if (!onRecord(step.data, quoteErrorOf(step.errors))) parser.abort();
      },
    });
  }
  if (tooManyRows) {
    throw tooLarge(`The file has more than ${MAX_STOCK_ROWS.toLocaleString('en')} rows, the most one upload may hold; nothing was applied. Split it by location and upload each part.`);
  }
  if (header === null) {
    fileProblem('The file is empty: it needs a header row naming the columns (part_number, kind, value, tolerance, quantity, ...) and one row per part.');
    return false;
  }
  if (checker === null) return false;
  result.locations = [...locations].sort();
  for (const i of unnamedWithData) {
    result.warnings.unshift({ line: headerIndex + 1, column: `(cell ${i + 1})`, value: '', message: `column ${i + 1} has no header name, so its cells are ignored` });
  }
  return true;
}

/** The message of the first quoting problem papaparse found in one record, if any. */
function quoteErrorOf(errors: Papa.ParseError[]): string | undefined {
  for (const error of errors) {
    if (error.type === 'Quotes') {
      return error.code === 'MissingQuotes'
        ? 'a quoted field that starts on this line is never closed, so the rest of the file was read as one cell: add the closing "'
        : 'a quoted field is followed by other characters before the next delimiter; inside quotes, write a quote as ""';
    }
  }
  return undefined;
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
const readToleranceCell: CellReader<RowChecker, Tolerance> = (cell, row) => readTolerance(cell, row.kind!, row.valueSi!);

/**
 * Checks data rows one at a time; one instance per file, so reading a row allocates no closures
 * (100,000-row files spend their time in these few functions).
 */
class RowChecker {
  private cells: string[] = [];
  private line = 0;
  private problems: StockFileProblem[] = [];
  /** Cell index of each schema column in the file's rows, -1 when the file has no such column. */
  private readonly at: Readonly<Record<StockColumn, number>>;
  /** The current row's part number, null when it could not be read. */
  partNumber: string | null = null;
  /** The current row's location (the default when blank or unreadable). */
  location = DEFAULT_LOCATION;
  /** The current row's kind and value, once read (for its tolerance). */
  kind: PartKind | null = null;
  valueSi: number | null = null;

  constructor(
    header: readonly string[],
    private readonly warnings: StockFileProblem[],
  ) {
    const at = Object.fromEntries(STOCK_COLUMNS.map((c) => [c, -1])) as Record<StockColumn, number>;
    header.forEach((cell, i) => {
      const column = columnOfHeader(cell);
      if (column !== null) at[column] = i;
    });
    this.at = at;
  }

  /** The raw cell of `column` in the current row ('' when the file has no such column). */
  cell(column: StockColumn): string {
    const at = this.at[column];
    return at < 0 ? '' : (this.cells[at] ?? '');
  }

  private read<A, T>(column: StockColumn, reader: CellReader<A, T>, argument: A, required: boolean): T | null {
    const raw = this.cell(column);
    if (raw === '' || raw.trim() === '') {
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

  /**
   * Checks one row; pushes its problems onto `problems` and its warnings; sets {@link partNumber}
   * and {@link location}; returns the part when the row has no problems.
   */
  check(cells: string[], line: number, problems: StockFileProblem[]): PartFields | null {
    this.cells = cells;
    this.line = line;
    this.problems = problems;
    const before = problems.length;

    const partNumber = this.read('part_number', readTextCell, 'part_number', true);
    const location = this.read('location', readTextCell, 'location', false) ?? DEFAULT_LOCATION;
    this.partNumber = partNumber;
    this.location = location;
    const kind = this.read('kind', readKindCell, null, true);
    const valueSi = kind ? this.read('value', readValueCell, kind, true) : null;
    if (!kind && this.cell('value').trim() === '') this.problem('value', '', 'value is required');
    this.kind = kind;
    this.valueSi = valueSi;
    const tolerance = kind && valueSi !== null ? this.read('tolerance', readToleranceCell, this, true) : null;
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

    if (problems.length !== before) return null;
    return {
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
}

/** Writes one accepted row as a stage-table row, in {@link STAGE_COLUMNS} order. */
function stageRow(writer: BinaryCopyWriter, line: number, p: PartFields): void {
  writer.row(STAGE_COLUMNS.length);
  writer.int4(line);
  writer.text(p.partNumber);
  writer.text(p.location);
  writer.text(p.kind);
  writer.float8(p.valueSi);
  writer.text(p.toleranceKind);
  writer.float8(p.toleranceValue);
  writer.float8(p.srfHz);
  writer.float8(p.q);
  writer.float8(p.qFrequencyHz);
  writer.float8(p.esrOhm);
  writer.int4(p.quantity);
  writer.text(p.package);
  writer.float8(p.voltageRatingV);
  writer.float8(p.currentRatingA);
  writer.text(p.series);
  writer.text(p.unitCost);
  writer.text(p.manufacturerPart);
  writer.text(p.description);
}

/** Series membership, remembered per series and value: stock lists repeat values. */
const seriesMemberships = new Map<ESeriesName, Map<number, boolean>>();
const MEMBERSHIP_MEMO_LIMIT = 20_000;

function isSeriesMember(valueSi: number, series: ESeriesName): boolean {
  let ofSeries = seriesMemberships.get(series);
  if (ofSeries === undefined) {
    ofSeries = new Map();
    seriesMemberships.set(series, ofSeries);
  }
  let member = ofSeries.get(valueSi);
  if (member === undefined) {
    member = isStandardValue(valueSi, series);
    if (ofSeries.size >= MEMBERSHIP_MEMO_LIMIT) ofSeries.clear();
    ofSeries.set(valueSi, member);
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
  let headerLine = '';
  for (let from = 0; from < text.length; ) {
    const end = text.indexOf('\n', from);
    const line = text.slice(from, end < 0 ? text.length : end);
    if (line.trim() !== '') {
      headerLine = line;
      break;
    }
    if (end < 0) break;
    from = end + 1;
  }
  const score = (delimiter: string) => {
    const cells = headerLine.split(delimiter).map((cell) => cell.replace(/"/g, ''));
    return { known: cells.filter((cell) => columnOfHeader(cell) !== null).length, cells: cells.length };
  };
  const comma = score(',');
  const semicolon = score(';');
  if (semicolon.known !== comma.known) return semicolon.known > comma.known ? ';' : ',';
  return semicolon.cells > comma.cells ? ';' : ',';
}
