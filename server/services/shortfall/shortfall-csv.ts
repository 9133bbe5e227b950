/**
 * A shortfall list as CSV for purchasing and suppliers (papaparse `unparse`): one row per line with
 * the buy-to spec, values with SI prefixes and units (`6.8pF`, `1.736GHz`), a UTF-8 byte-order mark
 * so spreadsheets read it as UTF-8, and the formula-injection defence of every CSV Shelfmatch writes
 * (stock-csv.md; OWASP "CSV Injection"): a text cell that begins with `=`, `+`, `-`, `@`, tab or
 * carriage return gets a leading `'`.
 */
import Papa from 'papaparse';
import type { ShortfallLine } from '../../../shared/api/builds.js';
import { formatTolerance } from '../../../shared/engine/tolerance-codes.js';
import { escapeFormulaCell } from '../stock/formula-safe-cell.js';
import { exactValueText } from '../stock/export-stock-list.js';

/** The columns, in file order. */
export const SHORTFALL_CSV_COLUMNS = [
  'line',
  'kind',
  'buy_value',
  'series',
  'quantity',
  'tolerance',
  'tolerance_code',
  'min_srf',
  'package',
  'ideal_value',
  'short_quantity',
  'loss_with_buy_value_db',
  'reason',
  'matches',
  'received',
] as const;

/** Significant digits of the ideal value and the minimum SRF (more than any E-series needs). */
const SPEC_DIGITS = 4;

function rounded(valueSi: number): number {
  return Number(valueSi.toPrecision(SPEC_DIGITS));
}

/** One line's cells, in {@link SHORTFALL_CSV_COLUMNS} order; text cells formula-safe. */
export function shortfallCsvRow(line: ShortfallLine, index: number): (string | number)[] {
  const quantity = line.kind === 'capacitor' ? 'capacitance' : 'inductance';
  const text = (value: string) => escapeFormulaCell(value);
  return [
    index + 1,
    line.kind,
    exactValueText(line.buyValue, quantity),
    line.series,
    line.quantity,
    text(formatTolerance(line.tolerance, line.kind)),
    text(line.toleranceCode),
    exactValueText(rounded(line.minSrfHz), 'frequency'),
    text(line.package ?? ''),
    exactValueText(rounded(line.idealValue), quantity),
    line.shortQuantity,
    line.buyLossDb === null ? '' : Number(line.buyLossDb.toFixed(3)),
    text(line.reasonText),
    text(line.sources.map((s) => `${s.matchName} (${s.position})`).join('; ')),
    line.receivedQuantity,
  ];
}

/** The whole list as CSV text (BOM, header, CRLF line ends). */
export function shortfallCsv(lines: readonly ShortfallLine[]): string {
  return '\uFEFF' + Papa.unparse({ fields: [...SHORTFALL_CSV_COLUMNS], data: lines.map(shortfallCsvRow) }, { newline: '\r\n', quotes: false, escapeFormulae: false });
}

/** The file name purchasing and suppliers see: `shortfall-<build name>-<build id>.csv`, name made file-safe. */
export function shortfallCsvFileName(buildId: number, buildName: string): string {
  const safe = buildName.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
  return `shortfall-${safe ? `${safe}-` : ''}${buildId}.csv`;
}
