/**
 * The stock as a CSV in the import schema (stock-csv.md): every column, values written with SI
 * prefixes and units (`4.7pF`, `6.2GHz`), each number written so that the importer reads back the
 * very same double, so an export re-imports with no changes. Text cells get the formula-injection
 * defence.
 */
import { Decimal } from 'decimal.js';
import { QueryTypes, type Sequelize } from 'sequelize';
import { parseValue, type Quantity } from '../../../shared/engine/value-parse.js';
import { parseTolerance } from '../../../shared/engine/tolerance-codes.js';
import { escapeFormulaCell } from './formula-safe-cell.js';
import { canonicalMoney, PART_ROW_COLUMNS, type PartRow } from './present-part.js';
import { STOCK_COLUMNS } from './stock-columns.js';

/** Rows read from the database per batch while streaming. */
const EXPORT_BATCH_ROWS = 5000;

/** ASCII prefix letters by engineering exponent (BIPM SI Brochure, 9th ed., table 7; `u` for micro). */
const PREFIXES: ReadonlyMap<number, string> = new Map([
  [-15, 'f'],
  [-12, 'p'],
  [-9, 'n'],
  [-6, 'u'],
  [-3, 'm'],
  [0, ''],
  [3, 'k'],
  [6, 'M'],
  [9, 'G'],
  [12, 'T'],
]);

/** The trade writes small capacitances in pF (0.1pF, not 100fF) and small inductances in nH. */
const SMALLEST_EXPONENT: Readonly<Partial<Record<Quantity, number>>> = { capacitance: -12, inductance: -9 };

const UNIT_TEXT: Readonly<Partial<Record<Quantity, string>>> = {
  capacitance: 'F',
  inductance: 'H',
  frequency: 'Hz',
  voltage: 'V',
  current: 'A',
  resistance: 'ohm',
};

/**
 * `valueSi` in engineering notation with an ASCII prefix and unit (`4.7pF`, `868MHz`, `300mA`),
 * shifted in exact decimal arithmetic from the number's shortest round-trip digits; when the text
 * would not read back as exactly `valueSi`, the plain shortest form with the unit (`4.7e-12F`).
 */
export function exactValueText(valueSi: number, quantity: Quantity): string {
  const unit = UNIT_TEXT[quantity] ?? '';
  const decimal = new Decimal(valueSi);
  const exponent = Math.min(12, Math.max(SMALLEST_EXPONENT[quantity] ?? -15, Math.floor(decimal.e / 3) * 3));
  const text = `${decimal.times(new Decimal(10).pow(-exponent)).toFixed()}${PREFIXES.get(exponent)}${unit}`;
  try {
    if (parseValue(text, quantity, { sign: 'any' }) === valueSi) return text;
  } catch {
    // fall through to the plain form
  }
  return `${String(valueSi)}${unit}`;
}

/**
 * A relative tolerance (fraction) as the shortest percentage the importer reads back to exactly the
 * same fraction (the engine divides the percentage by 100): 0.05 -> `5%`.
 */
export function percentText(fraction: number): string {
  const percent = fraction * 100;
  for (let digits = 1; digits <= 17; digits += 1) {
    const text = `${new Decimal(percent.toPrecision(digits)).toFixed()}%`;
    const back = parseTolerance(text, 'capacitor');
    if (back.mode === 'relative' && back.fraction === fraction) return text;
  }
  return `${new Decimal(fraction).times(100).toFixed()}%`;
}

/** One CSV cell (RFC 4180): quoted when it holds a comma, quote, line break or edge spaces. */
export function csvCell(text: string): string {
  return /[",\n\r]|^\s|\s$/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The cells of one part, in {@link STOCK_COLUMNS} order. */
export function stockCsvCells(row: PartRow): string[] {
  const quantity: Quantity = row.kind === 'capacitor' ? 'capacitance' : 'inductance';
  const text = (value: string | null) => (value === null ? '' : escapeFormulaCell(value));
  const maybe = (value: number | null, q: Quantity) => (value === null ? '' : exactValueText(value, q));
  return [
    text(row.part_number),
    row.kind,
    exactValueText(row.value_si, quantity),
    row.tolerance_kind === 'relative' ? percentText(row.tolerance_value) : exactValueText(row.tolerance_value, quantity),
    maybe(row.srf_hz, 'frequency'),
    row.q === null ? '' : String(row.q),
    maybe(row.q_frequency_hz, 'frequency'),
    row.esr_ohm === null ? '' : `${String(row.esr_ohm)}ohm`,
    String(row.quantity),
    text(row.package),
    maybe(row.voltage_rating_v, 'voltage'),
    maybe(row.current_rating_a, 'current'),
    text(row.location),
    row.series ?? '',
    canonicalMoney(row.unit_cost) ?? '',
    text(row.manufacturer_part),
    text(row.description),
  ];
}

/**
 * The export, chunk by chunk: a UTF-8 byte-order mark (so spreadsheets read it as UTF-8), the header,
 * then every part (optionally of one location) by id, read in batches.
 */
export async function* exportStockList(sequelize: Sequelize, location?: string): AsyncGenerator<string> {
  let header = `\uFEFF${STOCK_COLUMNS.join(',')}\r\n`;
  let afterId = 0;
  for (;;) {
    const rows = await sequelize.query<PartRow>(
      `SELECT ${PART_ROW_COLUMNS} FROM parts WHERE id > :afterId ${location ? 'AND location = :location' : ''} ORDER BY id LIMIT :limit`,
      { replacements: { afterId, location: location ?? null, limit: EXPORT_BATCH_ROWS }, type: QueryTypes.SELECT },
    );
    // The header goes out with the first batch, so a failing first query fails before anything is sent.
    const body = rows.map((row) => stockCsvCells(row).map(csvCell).join(',') + '\r\n').join('');
    if (header || body) yield header + body;
    header = '';
    if (rows.length < EXPORT_BATCH_ROWS) return;
    afterId = rows[rows.length - 1].id;
  }
}
