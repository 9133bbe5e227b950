/**
 * The Sequelize connection and the test that tells a database outage from any other failure.
 * The pool reconnects by itself: once PostgreSQL is back, the next request gets a fresh connection.
 */
import { Sequelize, ConnectionError, ConnectionAcquireTimeoutError } from 'sequelize';

/** Opens a Sequelize instance on `databaseUrl` (nothing is connected until the first query). */
export function openDatabase(databaseUrl: string): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: 10, min: 0, idle: 10_000, acquire: 10_000, evict: 5_000 },
    dialectOptions: { connectionTimeoutMillis: 3_000, application_name: 'shelfmatch' },
    retry: { max: 0 },
  });
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

/** Answers `'up'` when a trivial query succeeds within `timeoutMs`, else `'down'`. */
export async function probeDatabase(sequelize: Sequelize, timeoutMs = 2_000): Promise<'up' | 'down'> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      sequelize.query('SELECT 1'),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error('probe timed out')), timeoutMs);
      }),
    ]);
    return 'up';
  } catch {
    return 'down';
  } finally {
    clearTimeout(timer);
  }
}
