/**
 * The stock-list import (stock-csv.md, "What an upload does"): read and check every row, then apply
 * all of it in one transaction, or nothing. Every import takes one transaction-level advisory lock
 * ({@link lockStockQuantities}), so two uploads at once run one after the other and each sees the
 * other's result; anything else that writes quantities on hand takes the same lock.
 *
 * Writes are set-based and never a query per row. The reader hands over the accepted rows already
 * in COPY text form; they are COPYed into a temporary stage table, and PostgreSQL compares them with
 * the stock itself: one UPDATE ... FROM changes the parts whose fields or count differ and records
 * their change rows (before/after of the fields that differ) from its RETURNING; one INSERT ...
 * SELECT creates the parts the stock lacks and records theirs; in replace mode one UPDATE zeroes the
 * parts of the named locations the file leaves out, and records theirs. No part row travels to
 * JavaScript; the counts come from what those statements did.
 */
import { createHash } from 'node:crypto';
import { type Sequelize, type Transaction } from 'sequelize';
import type { StockFileProblem, StockImportMode, StockImportReport } from '../../../shared/api/stock.js';
import { StockImport } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { conflict } from '../../errors.js';
import { clientOf, openBinaryCopy } from './copy-rows.js';
import { STAGE_COLUMNS, decodeStockFile, fieldsOfColumns, readStockText, splitPartKey, type PartFields, type StageColumn, type StockFileReading } from './read-stock-file.js';

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

/** `work_mem` of an import's transaction. */
const IMPORT_WORK_MEM = '64MB';

/** The temporary table accepted rows are COPYed into (dropped at the end of the transaction). */
const STAGE_TABLE = 'stock_import_stage';

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
  column: Exclude<StageColumn, 'line' | 'part_number' | 'location' | 'quantity'>;
}

/** In the order the old per-row comparison listed them; `tolerance` is one API field over two columns. */
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

/** The columns of `parts` an import writes for a new part: every stage column but `line`. */
const PART_COLUMNS = STAGE_COLUMNS.map(([column]) => column).filter((column) => column !== 'line');

/**
 * The SQL of one import, built from the columns its file has (identifiers from the constant lists
 * above, never from the file).
 *
 * `apply` is one statement; PostgreSQL runs every part of a WITH on one snapshot, so each sees the
 * stock as it was before any write here. `j` joins each staged row with the part it names (none
 * when the part is new; in replace mode also each part of the named locations that no staged row
 * names, with no line) and keeps one narrow row per pair: the part id, the counts, whether
 * anything differs and, for parts that differ, the fields that do, before and after. From `j`,
 * `updated` rewrites the parts that differ, `created` inserts the missing ones, `zeroed` sets to 0
 * the parts no row names (unless a rejected row names them), and `recorded` writes one change row
 * for each. The result: the counts and the rows the reserved-stock warnings need.
 */
function importStatements(reading: StockFileReading, mode: StockImportMode) {
  const spoken = new Set(fieldsOfColumns(reading.columns));
  const compared = COMPARED.filter((c) => spoken.has(c.field));
  const replace = mode === 'replace';
  const oldColumn = (column: StageColumn) => `old_${column}`;
  // In the join `d`: `old_<column>` is the stored part's value, `<column>` the staged row's.
  const value = (side: 'old' | 'new', column: StageColumn) => (side === 'old' ? `d.${oldColumn(column)}` : `d.${column}`);
  // The stage holds the cost as the file's canonical decimal text; `parts` as NUMERIC(12,4).
  const stored = (row: string, column: StageColumn) => (column === 'unit_cost' ? `${row}.unit_cost::numeric` : `${row}.${column}`);
  const differs = (column: ComparedField['column']) =>
    `${value('old', column)} IS DISTINCT FROM ${column === 'unit_cost' ? `${value('new', column)}::numeric` : value('new', column)}`;
  const toleranceDiffers = `(${differs('tolerance_kind')} OR ${differs('tolerance_value')})`;
  const tolerance = (side: 'old' | 'new') =>
    `CASE ${value(side, 'tolerance_kind')} WHEN 'relative' THEN jsonb_build_object('mode', 'relative', 'fraction', ${value(side, 'tolerance_value')})` +
    ` ELSE jsonb_build_object('mode', 'absolute', 'deltaSi', ${value(side, 'tolerance_value')}) END`;
  // Costs as text: the stored one as NUMERIC(12,4) writes it ("0.0200"), the file's canonical one ("0.02").
  const jsonValue = (side: 'old' | 'new', column: ComparedField['column']) =>
    column === 'unit_cost' && side === 'old' ? `to_jsonb(${value(side, column)}::text)` : `to_jsonb(${value(side, column)})`;
  // Only the fields that differ, by their API names; NULL when only the count changed.
  const fieldsJson = (side: 'old' | 'new') => {
    const pieces: string[] = [];
    for (const c of compared) {
      if (c.column === 'tolerance_value') continue;
      if (c.column === 'tolerance_kind') {
        pieces.push(`CASE WHEN ${toleranceDiffers} THEN jsonb_build_object('tolerance', ${tolerance(side)}) ELSE '{}'::jsonb END`);
      } else {
        pieces.push(`CASE WHEN ${differs(c.column)} THEN jsonb_build_object('${c.api}', ${jsonValue(side, c.column)}) ELSE '{}'::jsonb END`);
      }
    }
    return `NULLIF(${pieces.join(' || ')}, '{}'::jsonb)`;
  };
  const anyDiffers = ['o.quantity <> s.quantity', ...compared.map((c) => `o.${c.column} IS DISTINCT FROM ${stored('s', c.column)}`)].join(' OR ');
  const updatedColumns: StageColumn[] = ['quantity', ...compared.map((c) => c.column)];

  const apply = `WITH j AS MATERIALIZED (
      SELECT d.line, d.part_id, d.old_quantity, d.quantity, d.reserved, d.changed, d.lone_part_number, d.lone_location,
        CASE WHEN d.changed THEN ${fieldsJson('old')} END AS before,
        CASE WHEN d.changed THEN ${fieldsJson('new')} END AS after
      FROM (
        SELECT s.*, o.id AS part_id, o.quantity AS old_quantity, o.reserved,
          CASE WHEN s.line IS NULL THEN o.part_number END AS lone_part_number, CASE WHEN s.line IS NULL THEN o.location END AS lone_location,
          ${compared.map((c) => `o.${c.column} AS ${oldColumn(c.column)}`).join(', ')},
          (s.line IS NOT NULL AND o.id IS NOT NULL AND (${anyDiffers})) AS changed
        FROM ${STAGE_TABLE} s ${replace ? 'FULL' : 'LEFT'} JOIN (SELECT * FROM parts WHERE location = ANY($2::text[])) o
          ON o.location = s.location AND o.part_number = s.part_number
        OFFSET 0) d),
    updated AS (
      UPDATE parts p SET ${updatedColumns.map((c) => `${c} = ${stored('s', c)}`).join(', ')}, last_import_id = $1, updated_at = now()
      FROM j JOIN ${STAGE_TABLE} s ON s.line = j.line
      WHERE j.changed AND p.id = j.part_id
      RETURNING p.id, j.old_quantity AS quantity_before, j.quantity AS quantity_after, j.before, j.after),
    created AS (
      INSERT INTO parts (${PART_COLUMNS.join(', ')}, last_import_id)
      SELECT ${PART_COLUMNS.map((c) => stored('s', c)).join(', ')}, $1 FROM ${STAGE_TABLE} s JOIN j ON j.line = s.line
      WHERE j.part_id IS NULL
      RETURNING id, quantity),
    ${
      replace
        ? `zeroed AS (
      UPDATE parts p SET quantity = 0, last_import_id = $1, updated_at = now()
      FROM j WHERE j.line IS NULL AND j.old_quantity <> 0 AND p.id = j.part_id
        AND NOT EXISTS (SELECT 1 FROM unnest($3::text[], $4::text[]) AS r(location, part_number)
          WHERE r.location = j.lone_location AND r.part_number = j.lone_part_number)
      RETURNING p.id, j.old_quantity AS quantity_before, j.reserved, j.lone_part_number AS part_number, j.lone_location AS location),`
        : ''
    }
    recorded AS (
      INSERT INTO stock_import_changes (import_id, part_id, change, quantity_before, quantity_after, before, after)
      SELECT $1, id, 'updated', quantity_before, quantity_after, before, after FROM updated
      UNION ALL SELECT $1, id, 'created', NULL, quantity, NULL, NULL FROM created
      ${replace ? "UNION ALL SELECT $1, id, 'zeroed', quantity_before, 0, NULL, NULL FROM zeroed" : ''})
    SELECT (SELECT count(*) FROM updated)::int AS updated, (SELECT count(*) FROM created)::int AS created,
      ${replace ? '(SELECT count(*) FROM zeroed)::int' : '0'} AS zeroed,
      (SELECT coalesce(json_agg(json_build_array(line, quantity, reserved) ORDER BY line), '[]'::json)
        FROM j WHERE j.line IS NOT NULL AND j.reserved > j.quantity) AS below_reserved,
      ${
        replace
          ? "(SELECT coalesce(json_agg(json_build_array(part_number, location, reserved) ORDER BY location, part_number), '[]'::json) FROM zeroed WHERE reserved > 0)"
          : "'[]'::json"
      } AS zeroed_reserved`;

  return {
    apply,
    kept: `SELECT count(*)::int AS kept FROM unnest($2::text[], $3::text[]) AS r(location, part_number)
      WHERE r.location = ANY($1::text[])
        AND EXISTS (SELECT 1 FROM parts p WHERE p.location = r.location AND p.part_number = r.part_number)
        AND NOT EXISTS (SELECT 1 FROM ${STAGE_TABLE} s WHERE s.location = r.location AND s.part_number = r.part_number)`,
  };
}

/**
 * Imports one stock-list file. The transaction (and the stock lock) is taken first and the file is
 * read into the stage table while it is read; a refused file rolls all of that back.
 *
 * With `within`, the import runs inside that transaction, in a savepoint: applied, it is committed
 * (or rolled back) with the caller's work, so a caller that reads quantities under the stock lock
 * and writes them back through the importer (receiving) does both atomically; refused or a dry
 * run, only the savepoint is rolled back. The caller's transaction keeps the import's planner
 * settings (`work_mem`, no merge joins, no JIT) until it ends.
 * @throws HttpError 400 (not UTF-8) or 413 (too many rows) before anything is applied
 */
export async function importStockList(sequelize: Sequelize, upload: StockUpload, within?: Transaction): Promise<StockImportOutcome> {
  const text = decodeStockFile(upload.bytes);
  const sha256 = createHash('sha256').update(upload.bytes).digest('hex');

  const transaction = await sequelize.transaction(within ? { transaction: within } : {});
  let reading: StockFileReading;
  try {
    await lockStockQuantities(sequelize, transaction);
    const client = clientOf(transaction);
    // Room to hash the whole file and the stock of its locations in memory (the default 4 MB spills
    // 100,000-row joins to disk), and no merge joins: they sort both sides by text under the
    // database's collation, many times slower than hashing them. No JIT: compiling the plan's
    // expressions costs more than it saves on one pass over the rows. For this transaction only.
    await client.query(`SET LOCAL work_mem = '${IMPORT_WORK_MEM}'; SET LOCAL enable_mergejoin = off; SET LOCAL jit = off`);
    await client.query(`CREATE TEMPORARY TABLE ${STAGE_TABLE} (${STAGE_COLUMNS.map(([name, type]) => `${name} ${type}`).join(', ')}) ON COMMIT DROP`);
    const copy = openBinaryCopy(transaction, STAGE_TABLE, STAGE_COLUMNS.map(([name]) => name));
    try {
      reading = await readStockText(text, (chunk) => copy.write(chunk));
    } catch (error) {
      await copy.abort();
      throw error;
    }
    if (reading.rejected.length > 0 && (!upload.skipInvalid || reading.fatal)) {
      await copy.abort();
      await transaction.rollback();
    } else {
      await copy.end();
      return await applyImport(transaction, upload, reading, sha256, within !== undefined);
    }
  } catch (error) {
    await transaction.rollback().catch(() => undefined);
    if ((error as { code?: string }).code === UNIQUE_VIOLATION) {
      throw conflict('A part in the file was created by someone else while this import ran; nothing was applied. Upload the file again.');
    }
    throw error;
  }

  // Refused: nothing applied; the history keeps the attempt (not for a dry run).
  const report = reportOf(upload, reading, { created: 0, updated: 0, unchanged: 0, zeroed: 0 }, reading.warnings, null, false);
  if (!upload.dryRun) {
    const entry = await StockImport.create(historyEntry(upload, reading, sha256, reading.locations, 'rejected', report, reading.warnings));
    report.importId = Number(entry.id);
  }
  return { status: 422, report };
}

/** Applies a staged file inside `transaction`, records it, and commits (rolls back for a dry run). */
async function applyImport(transaction: Transaction, upload: StockUpload, reading: StockFileReading, sha256: string, nested: boolean): Promise<StockImportOutcome> {
  const client = clientOf(transaction);
  // The history entry's id first, so the parts and change rows can carry it; the entry itself is
  // written once the counts are known.
  const [{ id }] = (await client.query<{ id: string }>("SELECT nextval(pg_get_serial_sequence('stock_imports', 'id')) AS id")).rows;
  const importId = Number(id);
  const { counts, warnings: applyWarnings } = await applyRows(transaction, importId, reading, upload.mode);
  const warnings = [...reading.warnings, ...applyWarnings];
  const report = reportOf(upload, reading, counts, warnings, null, !upload.dryRun);
  await StockImport.create({ id: importId, ...historyEntry(upload, reading, sha256, reading.locations, 'applied', report, warnings) }, { transaction });
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
    // Released into the caller's transaction, the stage table would outlive the import.
    if (nested) await clientOf(transaction).query(`DROP TABLE ${STAGE_TABLE}`);
    await transaction.commit();
    report.importId = importId;
  }
  return { status: 200, report };
}

/** What applying did: the counts, and the warnings only the current stock can tell. */
interface Applied {
  counts: { created: number; updated: number; unchanged: number; zeroed: number };
  warnings: StockFileProblem[];
}

/**
 * Applies the staged rows inside `transaction` (which holds the stock lock, so the stock compared
 * with is the stock written to).
 */
async function applyRows(transaction: Transaction, importId: number, reading: StockFileReading, mode: StockImportMode): Promise<Applied> {
  const client = clientOf(transaction);
  const sql = importStatements(reading, mode);
  const warnings: StockFileProblem[] = [];
  const rejectedKeys = [...reading.rejectedKeys].map(splitPartKey);
  const rejectedLocations = rejectedKeys.map((key) => key.location);
  const rejectedNumbers = rejectedKeys.map((key) => key.partNumber);
  const [result] = (
    await client.query<{ updated: number; created: number; zeroed: number; below_reserved: [number, number, number][]; zeroed_reserved: [string, string, number][] }>(
      sql.apply,
      mode === 'replace' ? [importId, reading.locations, rejectedLocations, rejectedNumbers] : [importId, reading.locations],
    )
  ).rows;
  for (const [line, quantity, reserved] of result.below_reserved) {
    warnings.push({ line, column: 'quantity', value: String(quantity), message: `quantity ${quantity} is below the ${reserved} reserved for builds; those builds will be short` });
  }
  for (const [partNumber, location, reserved] of result.zeroed_reserved) {
    warnings.push({
      line: 0,
      column: 'quantity',
      value: '',
      message: `part ${partNumber} at ${location} is not in the file, so replace mode sets it to 0, but ${reserved} are reserved for builds`,
    });
  }
  if (mode === 'replace' && rejectedKeys.length > 0) {
    const [{ kept }] = (await client.query<{ kept: number }>(sql.kept, [reading.locations, rejectedLocations, rejectedNumbers])).rows;
    if (kept > 0) {
      warnings.push({
        line: 0,
        column: 'part_number',
        value: '',
        message: `${kept} part(s) on skipped rows keep their quantities: replace mode does not zero a part whose row was rejected`,
      });
    }
  }
  const { created, updated, zeroed } = result;
  return { counts: { created, updated, unchanged: reading.accepted - created - updated, zeroed }, warnings };
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
