/**
 * Bulk writes with PostgreSQL's COPY (pg-copy-streams) on the connection of a Sequelize transaction:
 * one round trip for any number of rows, never a query per row.
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Transaction } from 'sequelize';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

/** A value COPY's text format can carry. */
export type CopyValue = string | number | boolean | null | undefined | object;

/** Rows handed to the stream per chunk. */
const ROWS_PER_CHUNK = 2000;

/**
 * One field in COPY text format (PostgreSQL manual, "COPY", section "Text Format"): `\N` for null,
 * backslash, tab, line feed and carriage return escaped; objects as JSON; numbers as JavaScript's
 * shortest round-trip form, which float8 input reads back to the same double.
 */
export function copyField(value: CopyValue): string {
  if (value === null || value === undefined) return '\\N';
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  const text = typeof value === 'object' ? JSON.stringify(value) : value;
  return NEEDS_ESCAPE.test(text) ? text.replace(ESCAPED, (c) => COPY_ESCAPES[c]) : text;
}

const NEEDS_ESCAPE = /[\\\t\n\r]/;
const ESCAPED = /[\\\t\n\r]/g;
const COPY_ESCAPES: Readonly<Record<string, string>> = { '\\': '\\\\', '\t': '\\t', '\n': '\\n', '\r': '\\r' };

/**
 * The raw pg client a Sequelize transaction runs on, for COPY and for bulk queries whose results
 * are too large for Sequelize's per-row processing. Queries on it run inside the transaction.
 */
export function clientOf(transaction: Transaction): pg.Client {
  const client = (transaction as unknown as { connection?: pg.Client }).connection;
  if (!client || typeof client.query !== 'function') throw new Error('copyRows: the transaction has no pg connection yet.');
  return client;
}

/**
 * Streams `rows` into `table (columns)` with `COPY ... FROM STDIN` inside `transaction`.
 * @param table a trusted SQL identifier (never user input)
 */
export async function copyRows(transaction: Transaction, table: string, columns: readonly string[], rows: Iterable<readonly CopyValue[]>): Promise<void> {
  const client = clientOf(transaction);
  const stream = client.query(copyFrom(`COPY ${table} (${columns.join(', ')}) FROM STDIN`));
  function* chunks(): Generator<string> {
    let buffer: string[] = [];
    for (const row of rows) {
      buffer.push(row.map(copyField).join('\t'));
      if (buffer.length >= ROWS_PER_CHUNK) {
        yield buffer.join('\n') + '\n';
        buffer = [];
      }
    }
    if (buffer.length > 0) yield buffer.join('\n') + '\n';
  }
  await pipeline(Readable.from(chunks()), stream);
}
