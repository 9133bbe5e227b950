/**
 * The stock-list import (stock-csv.md, "What an upload does"): read and check every row, then apply
 * all of it in one transaction, or nothing. Every import takes one transaction-level advisory lock
 * ({@link lockStockQuantities}), so two uploads at once run one after the other and each sees the
 * other's result; anything else that writes quantities on hand takes the same lock. Writes are bulk
 * and never a query per row: new parts are COPYed straight into `parts` and their change records
 * made by one INSERT ... SELECT; changed parts are COPYed into a temporary table and updated by one
 * UPDATE ... FROM; zeroed parts by one UPDATE; their change records by one COPY.
 */
import { createHash } from 'node:crypto';
import { Decimal } from 'decimal.js';
import { type Sequelize, type Transaction } from 'sequelize';
import type { StockFileProblem, StockImportMode, StockImportReport } from '../../../shared/api/stock.js';
import { StockImport } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { conflict } from '../../errors.js';
import { clientOf, copyRows, type CopyValue } from './copy-rows.js';
import { PART_ROW_COLUMNS, toleranceOf, type PartRow } from './present-part.js';
import { fieldsOfColumns, partKey, readStockFile, type CheckedRow, type PartFields, type StockFileReading } from './read-stock-file.js';

/** Key of the advisory lock every import holds for its transaction ("SMSTOCK" in ASCII). */
export const STOCK_IMPORT_LOCK_KEY = 0x534d53544f434b;

/**
 * Takes the stock lock for the rest of `transaction`: imports hold it, and so must any other code
 * that changes quantities on hand (e.g. receiving parts), so their reads and writes never interleave.
 */
export async function lockStockQuantities(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: STOCK_IMPORT_LOCK_KEY }, transaction });
}

/** PostgreSQL's unique_violation (Appendix A, error codes). */
const UNIQUE_VIOLATION = '23505';

/** Most rejected rows and warnings a report (and the history) lists; the counts stay exact. */
export const MAX_REPORTED_PROBLEMS = 1000;

/** One upload as the route hands it over. */
export interface StockUpload {
  bytes: Uint8Array;
  fileName: string;
  mode: StockImportMode;
  dryRun: boolean;
  skipInvalid: boolean;
  /** The uploader; null for the system (the demo seeder). */
  userId: number | null;
}

/** The report and the HTTP status it goes out with: 200 applied or dry run, 422 refused. */
export interface StockImportOutcome {
  status: 200 | 422;
  report: StockImportReport;
}

/** A part field the import compares, with its name in the API and its column in `parts`. */
interface ComparedField {
  field: keyof PartFields;
  api: string;
  column: keyof PartRow;
}

const COMPARED: readonly ComparedField[] = [
  { field: 'kind', api: 'kind', column: 'kind' },
  { field: 'valueSi', api: 'value', column: 'value_si' },
  { field: 'toleranceKind', api: 'tolerance', column: 'tolerance_kind' },
  { field: 'toleranceValue', api: 'tolerance', column: 'tolerance_value' },
  { field: 'srfHz', api: 'srfHz', column: 'srf_hz' },
  { field: 'q', api: 'q', column: 'q' },
  { field: 'qFrequencyHz', api: 'qFrequencyHz', column: 'q_frequency_hz' },
  { field: 'esrOhm', api: 'esrOhm', column: 'esr_ohm' },
  { field: 'package', api: 'package', column: 'package' },
  { field: 'voltageRatingV', api: 'voltageRating', column: 'voltage_rating_v' },
  { field: 'currentRatingA', api: 'currentRating', column: 'current_rating_a' },
  { field: 'series', api: 'series', column: 'series' },
  { field: 'unitCost', api: 'unitCost', column: 'unit_cost' },
  { field: 'manufacturerPart', api: 'manufacturerPart', column: 'manufacturer_part' },
  { field: 'description', api: 'description', column: 'description' },
];

/** The columns of `parts` an import writes, in {@link partCells} order. */
const PART_COLUMNS = [
  'part_number',
  'location',
  'kind',
  'value_si',
  'tolerance_kind',
  'tolerance_value',
  'srf_hz',
  'q',
  'q_frequency_hz',
  'esr_ohm',
  'quantity',
  'package',
  'voltage_rating_v',
  'current_rating_a',
  'series',
  'unit_cost',
  'manufacturer_part',
  'description',
] as const;

/** Column types of the temporary table changed parts are copied into (besides `id`). */
const STAGE_COLUMN_TYPES = `part_number TEXT, location TEXT, kind TEXT, value_si DOUBLE PRECISION, tolerance_kind TEXT,
  tolerance_value DOUBLE PRECISION, srf_hz DOUBLE PRECISION, q DOUBLE PRECISION, q_frequency_hz DOUBLE PRECISION,
  esr_ohm DOUBLE PRECISION, quantity INTEGER, package TEXT, voltage_rating_v DOUBLE PRECISION,
  current_rating_a DOUBLE PRECISION, series TEXT, unit_cost NUMERIC(12, 4), manufacturer_part TEXT, description TEXT`;

/** What the file does to one part. */
interface PlannedWrite {
  change: 'created' | 'updated';
  /** The existing part's id; null for a part the import creates. */
  partId: number | null;
  part: PartFields;
  quantityBefore: number | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/** The whole plan of an import, computed from the file and the locked current stock. */
interface ImportPlan {
  writes: PlannedWrite[];
  zeroed: { id: number; quantityBefore: number }[];
  unchanged: number;
  warnings: StockFileProblem[];
}

/**
 * Imports one stock-list file.
 * @throws HttpError 400 (not UTF-8) or 413 (too many rows) before anything is applied
 */
export async function importStockList(sequelize: Sequelize, upload: StockUpload): Promise<StockImportOutcome> {
  const reading = readStockFile(upload.bytes);
  const sha256 = createHash('sha256').update(upload.bytes).digest('hex');
  const locations = [...new Set(reading.rows.map((row) => row.part.location))].sort();
  const refused = reading.rejected.length > 0 && (!upload.skipInvalid || reading.fatal);

  if (refused) {
    const report = reportOf(upload, reading, { created: 0, updated: 0, unchanged: 0, zeroed: 0 }, reading.warnings, null, false);
    if (!upload.dryRun) {
      const entry = await StockImport.create(historyEntry(upload, reading, sha256, locations, 'rejected', report, reading.warnings));
      report.importId = Number(entry.id);
    }
    return { status: 422, report };
  }

  const transaction = await sequelize.transaction();
  try {
    await lockStockQuantities(sequelize, transaction);
    // Under the lock no other import or quantity writer runs, so a plain read is the state to compare with.
    const existing = locations.length
      ? (await clientOf(transaction).query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts WHERE location = ANY($1::text[])`, [locations])).rows
      : [];
    const plan = planImport(reading, existing, upload.mode);
    const warnings = [...reading.warnings, ...plan.warnings];
    const counts = {
      created: plan.writes.filter((w) => w.change === 'created').length,
      updated: plan.writes.filter((w) => w.change === 'updated').length,
      unchanged: plan.unchanged,
      zeroed: plan.zeroed.length,
    };
    const report = reportOf(upload, reading, counts, warnings, null, !upload.dryRun);
    const entry = await StockImport.create(historyEntry(upload, reading, sha256, locations, 'applied', report, warnings), { transaction });
    const importId = Number(entry.id);
    await applyPlan(transaction, importId, plan);
    await recordAudit(
      {
        actorId: upload.userId,
        action: 'stock.import',
        entityType: 'stock_import',
        entityId: importId,
        after: { fileName: upload.fileName, sha256, mode: upload.mode, skipInvalid: upload.skipInvalid, rowsRead: reading.rowsRead, ...counts, rejectedRows: reading.rejectedRows },
      },
      transaction,
    );
    if (upload.dryRun) {
      await transaction.rollback();
    } else {
      await transaction.commit();
      report.importId = importId;
    }
    return { status: 200, report };
  } catch (error) {
    await transaction.rollback().catch(() => undefined);
    if ((error as { code?: string }).code === UNIQUE_VIOLATION) {
      throw conflict('A part in the file was created by someone else while this import ran; nothing was applied. Upload the file again.');
    }
    throw error;
  }
}

/** Compares the file with the current stock of its locations: what to create, update and zero. */
function planImport(reading: StockFileReading, existing: PartRow[], mode: StockImportMode): ImportPlan {
  const byKey = new Map(existing.map((row) => [partKey(row.part_number, row.location), row]));
  const spoken = new Set(fieldsOfColumns(reading.columns));
  const compared = COMPARED.filter((c) => spoken.has(c.field));
  const plan: ImportPlan = { writes: [], zeroed: [], unchanged: 0, warnings: [] };
  const inFile = new Set<string>();

  for (const row of reading.rows) {
    const key = partKey(row.part.partNumber, row.part.location);
    inFile.add(key);
    const current = byKey.get(key);
    if (!current) {
      plan.writes.push({ change: 'created', partId: null, part: row.part, quantityBefore: null, before: null, after: null });
      continue;
    }
    let before: Record<string, unknown> | null = null;
    let after: Record<string, unknown> | null = null;
    for (const c of compared) {
      if (sameValue(c.field, current[c.column], row.part[c.field])) continue;
      before ??= {};
      after ??= {};
      if (c.api === 'tolerance') {
        before.tolerance = toleranceOf(current.tolerance_kind, current.tolerance_value);
        after.tolerance = toleranceOf(row.part.toleranceKind, row.part.toleranceValue);
      } else {
        before[c.api] = current[c.column];
        after[c.api] = row.part[c.field];
      }
    }
    if (current.quantity === row.part.quantity && after === null) {
      plan.unchanged += 1;
    } else {
      const merged = mergeIntoCurrent(current, row.part, spoken);
      plan.writes.push({ change: 'updated', partId: current.id, part: merged, quantityBefore: current.quantity, before: before ?? {}, after: after ?? {} });
    }
    warnIfBelowReserved(plan, row, current);
  }

  if (mode === 'replace') {
    for (const row of existing) {
      const key = partKey(row.part_number, row.location);
      if (inFile.has(key) || reading.rejectedKeys.has(key)) continue;
      if (row.quantity === 0) continue;
      plan.zeroed.push({ id: row.id, quantityBefore: row.quantity });
      if (row.reserved > 0) {
        plan.warnings.push({
          line: 0,
          column: 'quantity',
          value: '',
          message: `part ${row.part_number} at ${row.location} is not in the file, so replace mode sets it to 0, but ${row.reserved} are reserved for builds`,
        });
      }
    }
    const kept = [...reading.rejectedKeys].filter((key) => byKey.has(key) && !inFile.has(key)).length;
    if (kept > 0) {
      plan.warnings.push({
        line: 0,
        column: 'part_number',
        value: '',
        message: `${kept} part(s) on skipped rows keep their quantities: replace mode does not zero a part whose row was rejected`,
      });
    }
  }
  return plan;
}

function warnIfBelowReserved(plan: ImportPlan, row: CheckedRow, current: PartRow): void {
  if (row.part.quantity < current.reserved) {
    plan.warnings.push({
      line: row.line,
      column: 'quantity',
      value: String(row.part.quantity),
      message: `quantity ${row.part.quantity} is below the ${current.reserved} reserved for builds; those builds will be short`,
    });
  }
}

/** The part as it will be: the file's value for every field the file speaks for, the current one for the rest. */
function mergeIntoCurrent(current: PartRow, part: PartFields, spoken: ReadonlySet<keyof PartFields>): PartFields {
  const merged: PartFields = { ...part };
  for (const c of COMPARED) {
    if (!spoken.has(c.field)) (merged as unknown as Record<string, unknown>)[c.field] = current[c.column];
  }
  return merged;
}

function sameValue(field: keyof PartFields, stored: unknown, incoming: unknown): boolean {
  if (stored === null || incoming === null) return stored === incoming;
  // NUMERIC(12,4) comes back as "0.0120"; the file's cost is already canonical ("0.012").
  if (field === 'unitCost') return canonicalDecimalText(stored as string) === incoming || new Decimal(stored as string).equals(incoming as string);
  return stored === incoming;
}

/** `"0.0120"` -> `"0.012"`, `"3.0000"` -> `"3"`: trailing fraction zeros dropped, as Decimal#toFixed() writes it. */
function canonicalDecimalText(text: string): string {
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}

/** Writes the plan inside `transaction`: new parts, changed parts, zeroed parts, then every change record. */
async function applyPlan(transaction: Transaction, importId: number, plan: ImportPlan): Promise<void> {
  const client = clientOf(transaction);
  const created = plan.writes.filter((w) => w.change === 'created');
  const updated = plan.writes.filter((w) => w.change === 'updated');

  if (created.length > 0) {
    // Straight into parts (ids from the column default), then their change records from what landed.
    await copyRows(transaction, 'parts', [...PART_COLUMNS, 'last_import_id'], created.map((w) => [...partCells(w.part), importId]));
    await client.query(
      `INSERT INTO stock_import_changes (import_id, part_id, change, quantity_before, quantity_after)
       SELECT $1, id, 'created', NULL, quantity FROM parts WHERE last_import_id = $1`,
      [importId],
    );
  }
  if (updated.length > 0) {
    await client.query(`CREATE TEMPORARY TABLE stock_import_stage (id INTEGER PRIMARY KEY, ${STAGE_COLUMN_TYPES}) ON COMMIT DROP`);
    await copyRows(transaction, 'stock_import_stage', ['id', ...PART_COLUMNS], updated.map((w) => [w.partId, ...partCells(w.part)]));
    await client.query(
      `UPDATE parts p SET ${PART_COLUMNS.slice(2).map((c) => `${c} = s.${c}`).join(', ')}, last_import_id = $1, updated_at = now()
       FROM stock_import_stage s WHERE p.id = s.id`,
      [importId],
    );
  }
  if (plan.zeroed.length > 0) {
    await client.query('UPDATE parts SET quantity = 0, last_import_id = $1, updated_at = now() WHERE id = ANY($2::int[])', [importId, plan.zeroed.map((z) => z.id)]);
  }
  const fieldsOrNull = (fields: Record<string, unknown> | null) => (fields && Object.keys(fields).length > 0 ? fields : null);
  const changeRows: CopyValue[][] = updated.map((w) => [importId, w.partId, 'updated', w.quantityBefore, w.part.quantity, fieldsOrNull(w.before), fieldsOrNull(w.after)]);
  for (const z of plan.zeroed) changeRows.push([importId, z.id, 'zeroed', z.quantityBefore, 0, null, null]);
  if (changeRows.length > 0) {
    await copyRows(transaction, 'stock_import_changes', ['import_id', 'part_id', 'change', 'quantity_before', 'quantity_after', 'before', 'after'], changeRows);
  }
}

/** One part's cells in {@link PART_COLUMNS} order. */
function partCells(p: PartFields): CopyValue[] {
  return [
    p.partNumber, p.location, p.kind, p.valueSi, p.toleranceKind, p.toleranceValue, p.srfHz, p.q, p.qFrequencyHz, p.esrOhm,
    p.quantity, p.package, p.voltageRatingV, p.currentRatingA, p.series, p.unitCost, p.manufacturerPart, p.description,
  ];
}

function capped(problems: StockFileProblem[]): StockFileProblem[] {
  return problems.length > MAX_REPORTED_PROBLEMS ? problems.slice(0, MAX_REPORTED_PROBLEMS) : problems;
}

function reportOf(
  upload: StockUpload,
  reading: StockFileReading,
  counts: { created: number; updated: number; unchanged: number; zeroed: number },
  warnings: StockFileProblem[],
  importId: number | null,
  applied: boolean,
): StockImportOutcome['report'] {
  return {
    applied,
    dryRun: upload.dryRun,
    mode: upload.mode,
    rowsRead: reading.rowsRead,
    ...counts,
    rejected: capped(reading.rejected),
    warnings: capped(warnings),
    importId,
    rejectedRows: reading.rejectedRows,
    truncated: reading.rejected.length > MAX_REPORTED_PROBLEMS || warnings.length > MAX_REPORTED_PROBLEMS,
  };
}

function historyEntry(
  upload: StockUpload,
  reading: StockFileReading,
  sha256: string,
  locations: string[],
  status: 'applied' | 'rejected',
  report: StockImportOutcome['report'],
  warnings: StockFileProblem[],
) {
  return {
    userId: upload.userId,
    status,
    fileName: upload.fileName,
    sha256,
    sizeBytes: upload.bytes.length,
    mode: upload.mode,
    skipInvalid: upload.skipInvalid,
    rowsRead: reading.rowsRead,
    createdCount: report.created,
    updatedCount: report.updated,
    unchangedCount: report.unchanged,
    zeroedCount: report.zeroed,
    rejectedCount: reading.rejectedRows,
    warningCount: warnings.length,
    locations,
    problems: { rejected: report.rejected, warnings: report.warnings, truncated: report.truncated },
  };
}
