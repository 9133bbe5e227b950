/**
 * The import history (stock-csv.md: "every import is recorded"): who uploaded what, when, with which
 * result, and per part what changed, so stores can see what changed since the previous import.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import type {
  PartChange,
  PartChangeKind,
  PartKind,
  StockFileProblem,
  StockImportDetail,
  StockImportListResponse,
  StockImportMode,
  StockImportStatus,
  StockImportSummary,
} from '../../../shared/api/stock.js';
import { notFound } from '../../errors.js';

interface ImportRow {
  id: string;
  status: StockImportStatus;
  created_at: Date;
  user_id: number | null;
  user_name: string | null;
  user_email: string | null;
  file_name: string;
  sha256: string;
  size_bytes: number;
  mode: StockImportMode;
  skip_invalid: boolean;
  rows_read: number;
  created_count: number;
  updated_count: number;
  unchanged_count: number;
  zeroed_count: number;
  rejected_count: number;
  warning_count: number;
  locations: string[];
}

const IMPORT_COLUMNS = `i.id, i.status, i.created_at, i.user_id, u.name AS user_name, u.email AS user_email, i.file_name, i.sha256,
  i.size_bytes, i.mode, i.skip_invalid, i.rows_read, i.created_count, i.updated_count, i.unchanged_count, i.zeroed_count,
  i.rejected_count, i.warning_count, i.locations`;

function presentImport(row: ImportRow): StockImportSummary {
  return {
    id: Number(row.id),
    status: row.status,
    createdAt: new Date(row.created_at).toISOString(),
    user: row.user_id === null ? null : { id: row.user_id, name: row.user_name ?? '', email: row.user_email ?? '' },
    fileName: row.file_name,
    sha256: row.sha256,
    sizeBytes: row.size_bytes,
    mode: row.mode,
    skipInvalid: row.skip_invalid,
    rowsRead: row.rows_read,
    created: row.created_count,
    updated: row.updated_count,
    unchanged: row.unchanged_count,
    zeroed: row.zeroed_count,
    rejectedCount: row.rejected_count,
    warningCount: row.warning_count,
    locations: row.locations,
  };
}

/** A page of the history, newest first. */
export async function listStockImports(sequelize: Sequelize, page: number, pageSize: number): Promise<StockImportListResponse> {
  const rows = await sequelize.query<ImportRow>(
    `SELECT ${IMPORT_COLUMNS} FROM stock_imports i LEFT JOIN users u ON u.id = i.user_id
     ORDER BY i.created_at DESC, i.id DESC LIMIT :limit OFFSET :offset`,
    { replacements: { limit: pageSize, offset: (page - 1) * pageSize }, type: QueryTypes.SELECT },
  );
  const [{ total }] = await sequelize.query<{ total: string }>('SELECT count(*) AS total FROM stock_imports', { type: QueryTypes.SELECT });
  return { items: rows.map(presentImport), total: Number(total) };
}

/** Options of {@link getStockImport}: a page of the changes, optionally of one kind. */
export interface ChangePage {
  page: number;
  pageSize: number;
  change?: PartChangeKind;
}

interface ChangeRow {
  part_id: number;
  part_number: string;
  location: string;
  kind: PartKind;
  change: PartChangeKind;
  quantity_before: number | null;
  quantity_after: number;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/**
 * One import with its problems and a page of its per-part changes (by location, then part number).
 * Its changes are measured from the stock as the previous applied import left it (plus anything
 * changed in between), which is `previousImportId`.
 * @throws HttpError 404 when there is no such import
 */
export async function getStockImport(sequelize: Sequelize, id: number, changePage: ChangePage): Promise<StockImportDetail> {
  const [row] = await sequelize.query<ImportRow & { problems: { rejected: StockFileProblem[]; warnings: StockFileProblem[]; truncated?: boolean } }>(
    `SELECT ${IMPORT_COLUMNS}, i.problems FROM stock_imports i LEFT JOIN users u ON u.id = i.user_id WHERE i.id = :id`,
    { replacements: { id }, type: QueryTypes.SELECT },
  );
  if (!row) throw notFound(`Stock import ${id}`);
  const [previous] = await sequelize.query<{ id: string }>(
    "SELECT id FROM stock_imports WHERE status = 'applied' AND id < :id ORDER BY id DESC LIMIT 1",
    { replacements: { id }, type: QueryTypes.SELECT },
  );
  const where = changePage.change ? 'c.import_id = :id AND c.change = :change' : 'c.import_id = :id';
  const replacements = { id, change: changePage.change ?? null, limit: changePage.pageSize, offset: (changePage.page - 1) * changePage.pageSize };
  const changes = await sequelize.query<ChangeRow>(
    `SELECT c.part_id, p.part_number, p.location, p.kind, c.change, c.quantity_before, c.quantity_after, c.before, c.after
     FROM stock_import_changes c JOIN parts p ON p.id = c.part_id
     WHERE ${where} ORDER BY p.location, p.part_number LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT },
  );
  const [{ total }] = await sequelize.query<{ total: string }>(`SELECT count(*) AS total FROM stock_import_changes c WHERE ${where}`, {
    replacements,
    type: QueryTypes.SELECT,
  });
  const summary = presentImport(row);
  return {
    ...summary,
    previousImportId: previous ? Number(previous.id) : null,
    rejected: row.problems.rejected,
    warnings: row.problems.warnings,
    problemsTruncated: row.problems.truncated === true,
    changes: changes.map(presentChange),
    changesTotal: Number(total),
    page: changePage.page,
    pageSize: changePage.pageSize,
  };
}

function presentChange(row: ChangeRow): PartChange {
  const before = row.before ?? {};
  const after = row.after ?? {};
  const names = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return {
    partId: row.part_id,
    partNumber: row.part_number,
    location: row.location,
    kind: row.kind,
    change: row.change,
    quantityBefore: row.quantity_before,
    quantityAfter: row.quantity_after,
    fields: names.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null })),
  };
}
