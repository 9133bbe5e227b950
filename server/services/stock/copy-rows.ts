/**
 * Bulk writes with PostgreSQL's COPY (pg-copy-streams) on the connection of a Sequelize transaction:
 * one round trip for any number of rows, never a query per row. Rows are encoded in COPY's binary
 * format (PostgreSQL manual, "COPY", section "Binary Format") by {@link BinaryCopyWriter}: numbers
 * go as their IEEE 754 / two's-complement bytes, so nothing is printed in JavaScript and parsed
 * again by the server.
 */
import { once } from 'node:events';
import { finished } from 'node:stream/promises';
import type { Transaction } from 'sequelize';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

/** The binary COPY header: the 11-byte signature, 32-bit flags (0) and header-extension length (0). */
const BINARY_HEADER = Buffer.from([0x50, 0x47, 0x43, 0x4f, 0x50, 0x59, 0x0a, 0xff, 0x0d, 0x0a, 0x00, 0, 0, 0, 0, 0, 0, 0, 0]);

/** Bytes per buffer handed to the COPY stream. */
const CHUNK_BYTES = 256 * 1024;

/**
 * Writes rows in COPY binary format into a list of buffers: per row a 16-bit field count, then per
 * field a 32-bit byte length (-1 for NULL) and the bytes; a 16-bit -1 ends the data. Fields must be
 * written in the table's column order with the column's type: {@link int4} for INTEGER,
 * {@link float8} for DOUBLE PRECISION, {@link text} for TEXT (UTF-8, as the server encoding is).
 * A row may straddle two buffers: COPY data is one byte stream, whatever the message boundaries.
 */
export class BinaryCopyWriter {
  /** Filled buffers not yet taken, in order; {@link finish} adds the last one. */
  private chunks: Buffer[] = [];
  private buffer = Buffer.allocUnsafe(CHUNK_BYTES);
  private view = new DataView(this.buffer.buffer, this.buffer.byteOffset, this.buffer.byteLength);
  private at = 0;
  private rows = 0;

  constructor() {
    BINARY_HEADER.copy(this.buffer, 0);
    this.at = BINARY_HEADER.length;
  }

  /** Rows begun so far. */
  get rowCount(): number {
    return this.rows;
  }

  /** Makes room for `bytes` more bytes, moving on to a new buffer when this one is full. */
  private room(bytes: number): void {
    if (this.at + bytes <= this.buffer.length) return;
    this.chunks.push(this.buffer.subarray(0, this.at));
    this.buffer = Buffer.allocUnsafe(Math.max(CHUNK_BYTES, bytes));
    this.view = new DataView(this.buffer.buffer, this.buffer.byteOffset, this.buffer.byteLength);
    this.at = 0;
  }

  /** Starts a row of `fields` fields. */
  row(fields: number): void {
    this.room(2);
    this.view.setInt16(this.at, fields);
    this.at += 2;
    this.rows += 1;
  }

  /** A NULL field. */
  nul(): void {
    this.room(4);
    this.view.setInt32(this.at, -1);
    this.at += 4;
  }

  /** An INTEGER field (a whole number within 32 bits) or NULL. */
  int4(value: number | null): void {
    if (value === null) return this.nul();
    this.room(8);
    this.view.setInt32(this.at, 4);
    this.view.setInt32(this.at + 4, value);
    this.at += 8;
  }

  /** A DOUBLE PRECISION field or NULL. */
  float8(value: number | null): void {
    if (value === null) return this.nul();
    this.room(12);
    this.view.setInt32(this.at, 8);
    this.view.setFloat64(this.at + 4, value);
    this.at += 12;
  }

  /** A TEXT field (UTF-8; no NUL characters, which PostgreSQL text cannot hold) or NULL. */
  text(value: string | null): void {
    if (value === null) return this.nul();
    const length = value.length;
    // UTF-8 takes at most 3 bytes per UTF-16 code unit.
    this.room(4 + 3 * length);
    const start = this.at + 4;
    let end = start;
    let i = 0;
    // Plain ASCII byte by byte (most cells); the rest of a string with anything else by the encoder.
    for (; i < length; i += 1) {
      const code = value.charCodeAt(i);
      if (code > 0x7f) break;
      this.buffer[end++] = code;
    }
    if (i < length) end += this.buffer.write(i === 0 ? value : value.slice(i), end, 'utf8');
    this.view.setInt32(this.at, end - start);
    this.at = end;
  }

  /** The buffers filled since the last call, in order (the one being filled stays). */
  take(): Buffer[] {
    const filled = this.chunks;
    this.chunks = [];
    return filled;
  }

  /** Ends the data; returns every buffer not yet taken, the last one included. */
  finish(): Buffer[] {
    this.room(2);
    this.view.setInt16(this.at, -1);
    this.at += 2;
    this.chunks.push(this.buffer.subarray(0, this.at));
    return this.take();
  }
}

/**
 * The raw pg client a Sequelize transaction runs on, for COPY and for bulk queries whose results
 * are too large for Sequelize's per-row processing. Queries on it run inside the transaction.
 */
export function clientOf(transaction: Transaction): pg.Client {
  const client = (transaction as unknown as { connection?: pg.Client }).connection;
  if (!client || typeof client.query !== 'function') throw new Error('copyRows: the transaction has no pg connection yet.');
  return client;
}

/** A COPY ... FROM STDIN in progress, fed buffer by buffer. */
export interface CopyIn {
  /** Sends one buffer; waits while the connection is backed up. Rejects once the COPY has failed. */
  write(chunk: Buffer): Promise<void>;
  /** Ends the data and waits until the server has taken all of it. */
  end(): Promise<void>;
  /** Abandons the COPY (the server is told so and stops); the transaction must then roll back. */
  abort(): Promise<void>;
}

/**
 * Starts `COPY table (columns) FROM STDIN (FORMAT binary)` inside `transaction`, to be fed with the
 * buffers of a {@link BinaryCopyWriter} while they are still being written.
 * @param table a trusted SQL identifier (never user input)
 */
export function openBinaryCopy(transaction: Transaction, table: string, columns: readonly string[]): CopyIn {
  const stream = clientOf(transaction).query(copyFrom(`COPY ${table} (${columns.join(', ')}) FROM STDIN (FORMAT binary)`));
  const done = finished(stream);
  // Observed by whichever of write/end/abort comes next; never left unhandled meanwhile.
  done.catch(() => undefined);
  return {
    async write(chunk) {
      if (stream.destroyed) return done;
      if (!stream.write(chunk)) await Promise.race([once(stream, 'drain'), done]);
    },
    async end() {
      stream.end();
      await done;
    },
    async abort() {
      if (!stream.destroyed) stream.destroy(new Error('the import was refused or failed while its rows were being copied'));
      await done.catch(() => undefined);
    },
  };
}
