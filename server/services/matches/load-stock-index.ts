/**
 * The stock a match is snapped to: every part (of one location, when the request names one), read in
 * one query and grouped by electrical model (shared/snapping/stock-index.ts). Parts whose available
 * quantity does not cover the build are read too: the snapper leaves them out and says how many.
 *
 * Reading 10k parts and indexing them costs more than most solves, so the parts are kept per
 * location and used again while the stock is unchanged, and each solve thread keeps its index of
 * them under the same fingerprint (solve-worker.ts). "Unchanged" is asked of the database in the
 * caller's own transaction, by a fingerprint of the very rows the index holds: their count and the
 * sum of a 64-bit hash of each whole row (every column, `reserved` and `updated_at` included). Any
 * insert, update or delete of one of those rows changes it, whatever order transactions commit in
 * (a version counter from a sequence would not: sequence order is not commit order). Two different
 * stocks share a fingerprint only by a hash collision (about 2^-64 per comparison). The fingerprint
 * is one scan without sending rows, a few milliseconds for 10k parts (bench/load-bench.ts).
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

/** The fingerprint of the parts a solve would read: `count:sum-of-row-hashes`. */
async function stockFingerprint(sequelize: Sequelize, location: string | null, transaction?: Transaction): Promise<string> {
  const row = await sequelize.query<{ n: string; h: string | null }>(
    `SELECT count(*)::text AS n, sum(hashtextextended(p::text, 0)::numeric)::text AS h FROM parts p ${location ? 'WHERE location = :location' : ''}`,
    { type: QueryTypes.SELECT, replacements: { location }, transaction, plain: true },
  );
  // sum() of no rows is NULL: written as 0, as the reader below writes an empty stock.
  return `${row?.n ?? '0'}:${row?.h ?? '0'}`;
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
  const fingerprint = await stockFingerprint(sequelize, options.location, transaction);
  const cached = cache.get(key);
  if (cached && cached.fingerprint === fingerprint) {
    stockIndexCacheStats.hits += 1;
    // Most recently used last.
    cache.delete(key);
    cache.set(key, cached);
    return { parts: cached.parts, key, fingerprint: cached.fingerprint };
  }
  stockIndexCacheStats.misses += 1;
  // Each row comes with its hash, so the index is kept under the fingerprint of exactly the rows it
  // was built from, whatever committed since the fingerprint above was taken.
  const rows = await sequelize.query<PartRow & { row_hash: string }>(
    `SELECT ${PART_ROW_COLUMNS}, hashtextextended(p::text, 0)::text AS row_hash FROM parts p ${options.location ? 'WHERE location = :location' : ''} ORDER BY kind, value_si, id`,
    { type: QueryTypes.SELECT, replacements: { location: options.location }, transaction },
  );
  let sum = 0n;
  for (const row of rows) sum += BigInt(row.row_hash);
  const parts: SnapPart[] = rows.map(presentPart);
  const rowsFingerprint = `${rows.length}:${rows.length === 0 ? '0' : sum.toString()}`;
  cache.delete(key);
  cache.set(key, { fingerprint: rowsFingerprint, parts });
  while (cache.size > STOCK_INDEX_CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
  return { parts, key, fingerprint: rowsFingerprint };
}
