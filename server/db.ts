/**
 * The Sequelize connection and the test that tells a database outage from any other failure.
 * The pool reconnects by itself: once PostgreSQL is back, the next request gets a fresh connection.
 */
import { Sequelize, ConnectionError, ConnectionAcquireTimeoutError } from 'sequelize';
import { databaseUnavailable, serverBusy, type HttpError } from './errors.js';

/** Opens a Sequelize instance on `databaseUrl` (nothing is connected until the first query); `pool` for tests of a full pool. */
export function openDatabase(databaseUrl: string, pool: { max?: number; acquireMs?: number } = {}): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: pool.max ?? 10, min: 0, idle: 10_000, acquire: pool.acquireMs ?? 10_000, evict: 5_000 },
    dialectOptions: { connectionTimeoutMillis: 3_000, application_name: 'shelfmatch' },
    retry: { max: 0 },
  });
}

/**
 * Whether `error` is the pool's acquire timeout: PostgreSQL answered, but no connection came free
 * within the acquire time (every one in use, or the event loop too busy to hand one out).
 * Sequelize's ConnectionAcquireTimeoutError is a ConnectionError, so ask this first.
 */
export function isPoolBusy(error: unknown): boolean {
  return error instanceof ConnectionAcquireTimeoutError;
}

/** Whether `error` means PostgreSQL is unreachable (refused, reset, shut down, pool timed out). */
export function isDatabaseUnavailable(error: unknown): boolean {
  if (error instanceof ConnectionError || error instanceof ConnectionAcquireTimeoutError) return true;
  const e = error as { name?: string; code?: string; parent?: { code?: string }; original?: { code?: string }; message?: string } | null;
  if (!e) return false;
  const codes = [e.code, e.parent?.code, e.original?.code];
  // 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now, 08xxx connection exceptions.
  if (codes.some((c) => c && (/^08/.test(c) || /^57P0[123]$/.test(c) || ['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT'].includes(c)))) return true;
  return /Connection terminated|terminating connection|ECONNREFUSED|Client has encountered a connection error/i.test(e.message ?? '');
}

/** The 503 that `error` stands for (the server busy, or the database out of reach), or null. */
export function unavailableError(error: unknown): HttpError | null {
  if (isPoolBusy(error)) return serverBusy();
  if (isDatabaseUnavailable(error)) return databaseUnavailable();
  return null;
}

/** Whether every connection of the pool is in use and requests queue for one. */
function poolIsFull(sequelize: Sequelize): boolean {
  const pool = (sequelize.connectionManager as unknown as { pool?: { using?: number; maxSize?: number; waiting?: number } }).pool;
  return typeof pool?.using === 'number' && typeof pool.maxSize === 'number' && pool.using >= pool.maxSize && (pool.waiting ?? 0) > 0;
}

/**
 * Answers `'up'` when a trivial query succeeds within `timeoutMs`; `'busy'` when it did not because
 * it was still queued for a connection of a full pool (PostgreSQL answers; the server is loaded);
 * else `'down'`.
 */
export async function probeDatabase(sequelize: Sequelize, timeoutMs = 2_000): Promise<'up' | 'down' | 'busy'> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      sequelize.query('SELECT 1'),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error('probe timed out')), timeoutMs);
      }),
    ]);
    return 'up';
  } catch (error) {
    return isPoolBusy(error) || poolIsFull(sequelize) ? 'busy' : 'down';
  } finally {
    clearTimeout(timer);
  }
}
