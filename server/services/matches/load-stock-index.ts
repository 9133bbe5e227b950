/**
 * The stock a match is snapped to: every part (of one location, when the request names one), read in
 * one query and grouped by electrical model (shared/snapping/stock-index.ts). Parts whose available
 * quantity does not cover the build are read too: the snapper leaves them out and says how many.
 *
 * Reading 10k parts and indexing them costs more than most solves, so the parts are kept per
 * location and used again while the stock is unchanged, and each solve thread keeps its index of
 * them under the same fingerprint (solve-worker.ts). "Unchanged" is asked of the database in the
 * caller's own transaction: the fingerprint is the location's row of `stock_versions` ('' for all
 * locations), which PostgreSQL raises in the same transaction as any statement that changes a part
 * there, in commit order (migration 0007 says how). One row read, whatever the size of the stock;
 * the parts and the version they are kept under come from one statement, so one snapshot.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import { PART_ROW_COLUMNS, presentPart, type PartRow } from '../stock/present-part.js';

/** Locations (and "all") whose index is kept; the least recently used one goes beyond that. */
export const STOCK_INDEX_CACHE_ENTRIES = 16;

interface CachedStock {
  fingerprint: string;
  parts: SnapPart[];
}

/** Per Sequelize instance (one per database), by location ('' for all). */
const caches = new WeakMap<Sequelize, Map<string, CachedStock>>();

/** How the last call was answered (for tests and the bench). */
export const stockIndexCacheStats = { hits: 0, misses: 0 };

/** The fingerprint of the parts a solve would read: the version of their location's stock. */
async function stockFingerprint(sequelize: Sequelize, key: string, transaction?: Transaction): Promise<string> {
  const row = await sequelize.query<{ version: string }>('SELECT version::text AS version FROM stock_versions WHERE location = :key', {
    type: QueryTypes.SELECT,
    replacements: { key },
    transaction,
    plain: true,
  });
  // A location no statement has written to yet has no row: it holds no parts.
  return `v${row?.version ?? '0'}`;
}

/**
 * The parts a solve is snapped to (the same objects while the stock is unchanged: read only), and
 * the location key and fingerprint they are kept under (solve threads key their indexes so).
 */
export async function loadSolveStock(
  sequelize: Sequelize,
  options: { location: string | null },
  transaction?: Transaction,
): Promise<{ parts: SnapPart[]; key: string; fingerprint: string }> {
  let cache = caches.get(sequelize);
  if (!cache) {
    cache = new Map();
    caches.set(sequelize, cache);
  }
  const key = options.location ?? '';
  const fingerprint = await stockFingerprint(sequelize, key, transaction);
  const cached = cache.get(key);
  if (cached && cached.fingerprint === fingerprint) {
    stockIndexCacheStats.hits += 1;
    // Most recently used last.
    cache.delete(key);
    cache.set(key, cached);
    return { parts: cached.parts, key, fingerprint: cached.fingerprint };
  }
  stockIndexCacheStats.misses += 1;
  // The version beside the rows, from the same snapshot, so the index is kept under the version of
  // exactly the rows it was built from, whatever committed since the fingerprint above was read.
  // One row with no part when the location holds none.
  const joined = await sequelize.query<PartRow & { stock_version: string; id: number | null }>(
    `SELECT v.version::text AS stock_version, ${PART_ROW_COLUMNS}
       FROM (SELECT coalesce((SELECT version FROM stock_versions WHERE location = :key), 0) AS version) v
       LEFT JOIN parts p ON ${options.location ? 'p.location = :key' : 'true'}
      ORDER BY p.kind, p.value_si, p.id`,
    { type: QueryTypes.SELECT, replacements: { key }, transaction },
  );
  const rowsFingerprint = `v${joined[0]?.stock_version ?? '0'}`;
  const rows = joined.filter((row) => row.id !== null);
  const parts: SnapPart[] = rows.map(presentPart);
  cache.delete(key);
  cache.set(key, { fingerprint: rowsFingerprint, parts });
  while (cache.size > STOCK_INDEX_CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
  return { parts, key, fingerprint: rowsFingerprint };
}
