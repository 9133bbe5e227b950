/**
 * Stock import benchmark (handbook quality.md "Benchmarks"): 100,000 generated stock-list rows
 * uploaded through the HTTP API (multer, UTF-8 check, every cell checked, one locked transaction,
 * binary COPY into a stage table, one set-based statement that compares, writes and records the
 * per-part changes, history and audit) against PostgreSQL's own `COPY ... FROM STDIN (FORMAT csv)`
 * of the very same file into a bare table of text columns, side by side in one run on one private
 * cluster. Target: within 3x.
 *
 * Four import cases: all rows new; the same file again in replace mode (nothing changes); every
 * count changed (merge); then a daily list in which 1 % of the counts changed (merge).
 *
 * More lines say where the rest goes, measured in the same run: PostgreSQL's own COPY of the
 * same parts, already typed, into a table shaped like `parts` (its constraints and indexes), which
 * is the least any import that stores them there can cost; the same for the first import's change
 * rows into a table shaped like `stock_import_changes` (the per-part history the import keeps), so
 * the two together are the floor of an import of new parts; the same parts into their typed
 * columns and checks with no index, then with the primary key alone (the least any store of typed,
 * addressable parts can cost, whatever its other indexes); and reading and checking the file in
 * JavaScript alone (readStockFile on the same bytes, no database).
 * A report, never a test. Run: npx tsx bench/stock-import-bench.ts
 */
import { rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import pg from 'pg';
import { from as copyFrom, to as copyTo } from 'pg-copy-streams';
import { pino } from 'pino';
import { PgCluster } from '../scripts/pg-cluster.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db.js';
import { initModels } from '../server/models/index.js';
import { migrate } from '../server/migrations/index.js';
import { createApp } from '../server/app.js';
import { createUser } from '../server/services/users/manage-users.js';
import { signToken } from '../server/auth/tokens.js';
import { mulberry32 } from '../shared/engine/seeded-random.js';
import { eSeriesValues } from '../shared/engine/e-series.js';
import { readStockFile } from '../server/services/stock/read-stock-file.js';
import { formatMs } from './report.js';

const ROOT = resolve(import.meta.dirname, '..');
const BENCH_PG_PORT = 54359;
const ROWS = 100_000;
/** Runs of each side; the median is reported. */
const RUNS = 3;
const TARGET_RATIO = 3;

const HEADER =
  'part_number,kind,value,tolerance,srf,q,q_freq,esr,quantity,package,voltage_rating,current_rating,location,series,unit_cost,manufacturer_part,description';

/** 100k plausible rows (all columns), half capacitors and half inductors, over four locations. */
/** `shift(i)` is added to row i's count. */
function generateStockCsv(rows: number, shift: (i: number) => number = () => 0): string {
  const random = mulberry32(7);
  const e24 = eSeriesValues('E24');
  const lines = [HEADER];
  for (let i = 0; i < rows; i += 1) {
    const cap = i % 2 === 0;
    const mantissa = e24[i % 24];
    const decade = cap ? [1, 10, 100][i % 3] : [1, 10][i % 2];
    const value = Number((mantissa * decade).toPrecision(3));
    const srfGHz = Number((cap ? 12 / Math.sqrt(value) : 19 / Math.sqrt(value)).toPrecision(3));
    const quantity = (Math.floor(random() * 4000) + shift(i)) % 5000;
    lines.push(
      [
        `BX-${cap ? 'C' : 'L'}${String(i).padStart(6, '0')}`,
        cap ? 'C' : 'L',
        cap ? `${value}pF` : `${value}nH`,
        cap ? (value < 10 ? 'C' : 'J') : '5%',
        `${srfGHz}GHz`,
        cap ? '' : String(20 + (i % 40)),
        cap ? '' : '500MHz',
        cap ? '0.3' : '',
        String(quantity),
        i % 3 === 0 ? '0603' : '0402',
        cap ? '50V' : '',
        cap ? '' : '300mA',
        ['main', 'lab', 'bench-a', 'bench-b'][i % 4],
        'E24',
        (0.004 + (i % 500) / 10000).toFixed(4),
        `MX-${i}`,
        cap ? 'C0G chip capacitor' : 'wirewound chip inductor',
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

async function uploadOnce(url: string, token: string, csv: Buffer, mode: 'merge' | 'replace'): Promise<{ ms: number; body: Record<string, unknown> }> {
  const form = new FormData();
  form.append('mode', mode);
  form.append('file', new Blob([new Uint8Array(csv)], { type: 'text/csv' }), 'bench.csv');
  const start = performance.now();
  const res = await fetch(`${url}/api/stock/imports`, { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
  const body = (await res.json()) as Record<string, unknown>;
  const ms = performance.now() - start;
  if (res.status !== 200) throw new Error(`import answered ${res.status}: ${JSON.stringify(body).slice(0, 400)}`);
  return { ms, body };
}

async function copyOnce(databaseUrl: string, csv: Buffer): Promise<number> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('DROP TABLE IF EXISTS bare_stock');
    await client.query(`CREATE TABLE bare_stock (${HEADER.split(',').map((c) => `${c} TEXT`).join(', ')})`);
    const start = performance.now();
    await pipeline(Readable.from([csv]), client.query(copyFrom('COPY bare_stock FROM STDIN (FORMAT csv, HEADER true)')));
    return performance.now() - start;
  } finally {
    await client.end();
  }
}

/**
 * PostgreSQL's COPY of what `COPY table (columns) TO` gives into an empty `LIKE table` with the same
 * fillfactor: by default INCLUDING ALL (constraints and indexes); `shape` gives other LIKE options
 * and statements to run on the new table `bench_shape` before the COPY.
 */
async function copyIntoShapeOf(
  client: pg.Client,
  table: string,
  columns: string,
  where = '',
  shape: { including: string; then?: string } = { including: 'INCLUDING ALL' },
): Promise<number> {
  const pieces: Buffer[] = [];
  const source = where ? `(SELECT ${columns} FROM ${table} WHERE ${where})` : `${table} (${columns})`;
  for await (const piece of client.query(copyTo(`COPY ${source} TO STDOUT`))) pieces.push(piece as Buffer);
  const text = Buffer.concat(pieces);
  const fillfactor = (
    await client.query<{ f: string | null }>(
      "SELECT (SELECT option_value FROM pg_options_to_table(reloptions) WHERE option_name = 'fillfactor') AS f FROM pg_class WHERE relname = $1",
      [table],
    )
  ).rows[0].f;
  await client.query('DROP TABLE IF EXISTS bench_shape');
  await client.query(`CREATE TABLE bench_shape (LIKE ${table} ${shape.including})${fillfactor ? ` WITH (fillfactor = ${Number(fillfactor)})` : ''}`);
  if (shape.then) await client.query(shape.then);
  const start = performance.now();
  await pipeline(Readable.from([text]), client.query(copyFrom(`COPY bench_shape (${columns}) FROM STDIN`)));
  const ms = performance.now() - start;
  await client.query('DROP TABLE bench_shape');
  return ms;
}

/**
 * The floor of an import of new parts, in two COPYs by PostgreSQL itself: the parts as the import
 * stored them into a table shaped like `parts` (its constraints and indexes), and the change rows
 * of the import `importId` into one shaped like `stock_import_changes`.
 */
async function copyIntoStoredShapes(databaseUrl: string, importId: number): Promise<{ parts: number; changes: number; typed: number; keyed: number }> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const columns =
      'part_number, location, kind, value_si, tolerance_kind, tolerance_value, srf_hz, q, q_frequency_hz, esr_ohm, quantity, package, voltage_rating_v, current_rating_a, series, unit_cost, manufacturer_part, description';
    const parts = await copyIntoShapeOf(client, 'parts', columns);
    const changes = await copyIntoShapeOf(client, 'stock_import_changes', 'import_id, part_id, change, quantity_before, quantity_after, before, after', `import_id = ${Number(importId)}`);
    // The least a store of these parts can be: their typed columns and checks, no index; then with
    // nothing but the primary key that reservations and the history point at.
    const typed = await copyIntoShapeOf(client, 'parts', columns, '', { including: 'INCLUDING DEFAULTS INCLUDING CONSTRAINTS' });
    const keyed = await copyIntoShapeOf(client, 'parts', columns, '', { including: 'INCLUDING DEFAULTS INCLUDING CONSTRAINTS', then: 'ALTER TABLE bench_shape ADD PRIMARY KEY (id)' });
    return { parts, changes, typed, keyed };
  } finally {
    await client.end();
  }
}

/** Reading and checking the file alone, in this process. */
function readOnce(csv: Buffer): number {
  const start = performance.now();
  const reading = readStockFile(csv);
  const ms = performance.now() - start;
  if (reading.accepted !== ROWS) throw new Error(`readStockFile accepted ${reading.accepted} rows`);
  return ms;
}

async function main(): Promise<void> {
  const baseDir = join(ROOT, 'tmp', 'stock-bench-postgres');
  rmSync(baseDir, { recursive: true, force: true });
  const cluster = new PgCluster({ baseDir, port: BENCH_PG_PORT });
  let server: Server | undefined;
  try {
    cluster.ensureStarted();
    cluster.ensureDatabase('stock_bench');
    const databaseUrl = cluster.url('stock_bench');
    const sequelize = openDatabase(databaseUrl);
    initModels(sequelize);
    await migrate(sequelize);
    const config = loadConfig({ JWT_SECRET: 'bench-secret-0123456789-abcdefghijklmnopqrstuvwxyz', DATABASE_URL: databaseUrl, LOG_LEVEL: 'silent' });
    const app = createApp(config, sequelize, pino({ level: 'silent' }));
    server = createServer(app);
    await new Promise<void>((ready) => server!.listen(0, '127.0.0.1', () => ready()));
    const address = server.address();
    const url = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`;
    const user = await createUser(sequelize, null, { email: 'bench@bench.example', name: 'Bench', role: 'stores', password: 'bench-password-1' });
    const token = signToken(user.id, config.jwtSecret, '1h');

    const csv = Buffer.from(generateStockCsv(ROWS));
    // Every count one more; then, from there, a daily list with every 100th count one more again.
    const changed = Buffer.from(generateStockCsv(ROWS, () => 1));
    const daily = Buffer.from(generateStockCsv(ROWS, (i) => (i % 100 === 0 ? 2 : 1)));
    console.log(`Stock import: ${ROWS.toLocaleString('en')} rows, ${(csv.length / 1024 / 1024).toFixed(1)} MB of CSV, ${RUNS} runs each, PostgreSQL on 127.0.0.1:${BENCH_PG_PORT}`);

    const copyMs: number[] = [];
    const freshMs: number[] = [];
    const sameMs: number[] = [];
    const dailyMs: number[] = [];
    const updateMs: number[] = [];
    const shapeMs: number[] = [];
    const changesShapeMs: number[] = [];
    const typedMs: number[] = [];
    const keyedMs: number[] = [];
    const readMs: number[] = [];
    for (let run = 0; run < RUNS; run += 1) {
      copyMs.push(await copyOnce(databaseUrl, csv));
      readMs.push(readOnce(csv));
      await sequelize.query('TRUNCATE stock_import_changes, parts, stock_imports RESTART IDENTITY CASCADE');
      const fresh = await uploadOnce(url, token, csv, 'merge');
      if (fresh.body.created !== ROWS) throw new Error(`expected ${ROWS} created, got ${JSON.stringify(fresh.body).slice(0, 300)}`);
      freshMs.push(fresh.ms);
      const shapes = await copyIntoStoredShapes(databaseUrl, Number(fresh.body.importId));
      shapeMs.push(shapes.parts);
      changesShapeMs.push(shapes.changes);
      typedMs.push(shapes.typed);
      keyedMs.push(shapes.keyed);
      const same = await uploadOnce(url, token, csv, 'replace');
      if (same.body.unchanged !== ROWS) throw new Error(`expected ${ROWS} unchanged, got ${JSON.stringify(same.body).slice(0, 300)}`);
      sameMs.push(same.ms);
      const update = await uploadOnce(url, token, changed, 'merge');
      if (update.body.updated !== ROWS) throw new Error(`expected ${ROWS} updated, got ${JSON.stringify(update.body).slice(0, 300)}`);
      updateMs.push(update.ms);
      const day = await uploadOnce(url, token, daily, 'merge');
      if (day.body.updated !== ROWS / 100) throw new Error(`expected ${ROWS / 100} updated, got ${JSON.stringify(day.body).slice(0, 300)}`);
      dailyMs.push(day.ms);
    }

    const copy = median(copyMs);
    const rows = (label: string, ms: number) =>
      `  ${label.padEnd(46)} ${formatMs(ms).padStart(10)}   ${Math.round(ROWS / (ms / 1000)).toLocaleString('en').padStart(9)} rows/s   ${(ms / copy).toFixed(2)}x COPY`;
    console.log(rows('PostgreSQL COPY (FORMAT csv) into a bare table', copy));
    console.log(rows('HTTP import, all rows new (created)', median(freshMs)));
    console.log(rows('HTTP import, same file again (replace, unchanged)', median(sameMs)));
    console.log(rows('HTTP import, daily list, 1 % of counts changed', median(dailyMs)));
    console.log(rows('HTTP import, every count changed (updated)', median(updateMs)));
    console.log('  where the rest goes (same run):');
    console.log(rows('PostgreSQL COPY of the typed parts into parts shape', median(shapeMs)));
    console.log(rows('PostgreSQL COPY of their change rows, history shape', median(changesShapeMs)));
    const floor = median(shapeMs.map((ms, i) => ms + changesShapeMs[i]));
    console.log(rows('  the two together: floor of an import of new parts', floor));
    console.log(rows('  typed parts columns and checks, no index', median(typedMs)));
    console.log(rows('  the same with its primary key only', median(keyedMs)));
    console.log(rows('reading and checking alone (JavaScript)', median(readMs)));
    const verdict = (label: string, ms: number) => `${label} ${(ms / copy).toFixed(2)}x ${ms / copy <= TARGET_RATIO ? 'MET' : 'NOT MET'}`;
    console.log(`  target within ${TARGET_RATIO}x of COPY: ${verdict('new', median(freshMs))}; ${verdict('unchanged', median(sameMs))}; ${verdict('daily', median(dailyMs))}; ${verdict('updated', median(updateMs))}`);
    console.log(
      `  new parts against their floor (PostgreSQL's own COPY into parts and history shapes): ${(median(freshMs) / floor).toFixed(2)}x; the floor alone is ${(floor / copy).toFixed(2)}x COPY into a bare table`,
    );
    const list = (values: number[]) => values.map((x) => x.toFixed(0)).join(' ');
    console.log(`  samples (ms): copy ${list(copyMs)}; new ${list(freshMs)}; same ${list(sameMs)}; daily ${list(dailyMs)}; updated ${list(updateMs)}; parts shape ${list(shapeMs)}; changes shape ${list(changesShapeMs)}; typed ${list(typedMs)}; keyed ${list(keyedMs)}; read ${list(readMs)}`);
    await sequelize.close();
  } finally {
    if (server) {
      server.closeAllConnections();
      await new Promise<void>((done) => server!.close(() => done()));
    }
    cluster.stop();
    rmSync(baseDir, { recursive: true, force: true });
  }
}

await main();
