/**
 * The stock-list import (stock-csv.md, "What an upload does"): read and check every row, then apply
 * all of it in one transaction, or nothing. Imports take one transaction-level advisory lock, so two
 * uploads at once run one after the other and each sees the other's result; the parts it touches are
 * also row-locked against other writers (builds). Writes are bulk: COPY into a temporary table, one
 * INSERT ... ON CONFLICT DO UPDATE, one UPDATE for zeroed parts, one INSERT of the change records.
 */
import { createHash } from 'node:crypto';
import { Decimal } from 'decimal.js';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { StockFileProblem, StockImportMode, StockImportReport } from '../../../shared/api/stock.js';
import { StockImport } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { copyRows } from './copy-rows.js';
import { PART_ROW_COLUMNS, toleranceOf, type PartRow } from './present-part.js';
import { fieldsOfColumns, partKey, readStockFile, type CheckedRow, type PartFields, type StockFileReading } from './read-stock-file.js';

/** Key of the advisory lock every import holds for its transaction ("SMSTOCK" in ASCII). */
export const STOCK_IMPORT_LOCK_KEY = 0x534d53544f434b;

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

/** Columns of the temporary table the file's created and updated parts are copied into. */
const STAGE_COLUMNS = [
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
  'change',
  'quantity_before',
  'before',
  'after',
] as const;

/** What the file does to one part. */
interface PlannedWrite {
  change: 'created' | 'updated';
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
    await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: STOCK_IMPORT_LOCK_KEY }, transaction });
    const existing = locations.length
      ? await sequelize.query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts WHERE location IN (:locations) ORDER BY id FOR UPDATE`, {
          replacements: { locations },
          type: QueryTypes.SELECT,
          transaction,
        })
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
    await applyPlan(sequelize, transaction, importId, plan);
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
      plan.writes.push({ change: 'created', part: row.part, quantityBefore: null, before: null, after: null });
      continue;
    }
    const merged = mergeIntoCurrent(current, row.part, spoken);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    for (const c of compared) {
      if (sameValue(c.field, current[c.column], row.part[c.field])) continue;
      if (c.api === 'tolerance') {
        before.tolerance = toleranceOf(current.tolerance_kind, current.tolerance_value);
        after.tolerance = toleranceOf(merged.toleranceKind, merged.toleranceValue);
      } else {
        before[c.api] = current[c.column];
        after[c.api] = row.part[c.field];
      }
    }
    const quantityChanged = current.quantity !== row.part.quantity;
    if (!quantityChanged && Object.keys(after).length === 0) {
      plan.unchanged += 1;
    } else {
      plan.writes.push({ change: 'updated', part: merged, quantityBefore: current.quantity, before, after });
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
  if (field === 'unitCost') return new Decimal(stored as string).equals(incoming as string);
  return stored === incoming;
}

/** Writes the plan inside `transaction`: bulk upsert, bulk zeroing, change records. */
async function applyPlan(sequelize: Sequelize, transaction: Transaction, importId: number, plan: ImportPlan): Promise<void> {
  if (plan.writes.length > 0) {
    await sequelize.query(
      `CREATE TEMPORARY TABLE stock_import_stage (
         part_number TEXT, location TEXT, kind TEXT, value_si DOUBLE PRECISION, tolerance_kind TEXT,
         tolerance_value DOUBLE PRECISION, srf_hz DOUBLE PRECISION, q DOUBLE PRECISION, q_frequency_hz DOUBLE PRECISION,
         esr_ohm DOUBLE PRECISION, quantity INTEGER, package TEXT, voltage_rating_v DOUBLE PRECISION,
         current_rating_a DOUBLE PRECISION, series TEXT, unit_cost NUMERIC(12, 4), manufacturer_part TEXT, description TEXT,
         change TEXT, quantity_before INTEGER, before JSONB, after JSONB
       ) ON COMMIT DROP`,
      { transaction },
    );
    await copyRows(
      transaction,
      'stock_import_stage',
      STAGE_COLUMNS,
      plan.writes.map((w) => {
        const p = w.part;
        return [
          p.partNumber, p.location, p.kind, p.valueSi, p.toleranceKind, p.toleranceValue, p.srfHz, p.q, p.qFrequencyHz,
          p.esrOhm, p.quantity, p.package, p.voltageRatingV, p.currentRatingA, p.series, p.unitCost, p.manufacturerPart,
          p.description, w.change, w.quantityBefore, w.before, w.after,
        ];
      }),
    );
    const partColumns = STAGE_COLUMNS.slice(0, 18);
    await sequelize.query(
      `INSERT INTO parts (${partColumns.join(', ')}, last_import_id, created_at, updated_at)
       SELECT ${partColumns.join(', ')}, :importId, now(), now() FROM stock_import_stage
       ON CONFLICT (part_number, location) DO UPDATE SET
         ${partColumns.slice(2).map((c) => `${c} = EXCLUDED.${c}`).join(', ')},
         last_import_id = EXCLUDED.last_import_id, updated_at = now()`,
      { replacements: { importId }, transaction },
    );
    await sequelize.query(
      `INSERT INTO stock_import_changes (import_id, part_id, change, quantity_before, quantity_after, before, after)
       SELECT :importId, p.id, s.change, s.quantity_before, s.quantity, s.before, s.after
       FROM stock_import_stage s JOIN parts p ON p.part_number = s.part_number AND p.location = s.location`,
      { replacements: { importId }, transaction },
    );
  }
  if (plan.zeroed.length > 0) {
    const ids = plan.zeroed.map((z) => z.id);
    const before = plan.zeroed.map((z) => z.quantityBefore);
    await sequelize.query('UPDATE parts SET quantity = 0, last_import_id = :importId, updated_at = now() WHERE id = ANY(ARRAY[:ids]::int[])', {
      replacements: { importId, ids },
      transaction,
    });
    await sequelize.query(
      `INSERT INTO stock_import_changes (import_id, part_id, change, quantity_before, quantity_after)
       SELECT :importId, z.id, 'zeroed', z.before, 0 FROM unnest(ARRAY[:ids]::int[], ARRAY[:before]::int[]) AS z(id, before)`,
      { replacements: { importId, ids, before }, transaction },
    );
  }
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
