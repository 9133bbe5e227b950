/**
 * A client that drops a stock-list upload half-way (handbook quality.md "Bad input, faults and
 * intruders"; stock-csv.md "All or nothing"): raw HTTP requests to a listening server send part of
 * a multipart body (cut in the HTTP headers, in a form field, in the file's part headers, in the
 * file, just before the closing boundary; with Content-Length and chunked) and then destroy the
 * socket. After each: the parts table, the import history, the change records and the audit trail
 * are exactly as before once the server has closed the connection and finished the request, and it
 * goes on serving: the next full upload (replace mode, so a half-applied one would show) is applied
 * whole. A client that sends the whole file and hangs up before the answer gets all or nothing.
 */
import { request as httpRequest, createServer, type Server } from 'node:http';
import { connect } from 'node:net';
import type { AddressInfo } from 'node:net';
import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { pino } from 'pino';
import { QueryTypes } from 'sequelize';
import { createApp } from '../../server/app.js';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, csvFile } from '../fixtures/stock/stock-upload.js';

const BOUNDARY = '----shelfmatch-drop-test-7f3a';

let t: TestApp;
let server: Server;
let port: number;
let stores: { id: number; token: string };
/** What the app logged at warn level and above. */
const logged: { level: number; msg: string; err?: { message?: string } }[] = [];

/** `rows` parts at `location`, quantities from `quantity(i)`. */
function stock(rows: number, quantity: (i: number) => number, location = 'main'): string {
  const lines: string[] = [];
  for (let i = 0; i < rows; i += 1) {
    const cap = i % 2 === 0;
    lines.push(`DR-${cap ? 'C' : 'L'}${String(i).padStart(5, '0')},${cap ? 'C' : 'L'},${cap ? '4.7pF' : '12nH'},${cap ? 'C' : '5%'},,,,,${quantity(i)},0402,${cap ? '50V' : ''},${cap ? '' : '300mA'},${location},,0.0100,,`);
  }
  return csvFile(FULL_HEADER, ...lines);
}

/** A multipart body with a `mode` field and the file, as a browser sends it. */
function multipart(csv: string, mode = 'replace'): Buffer {
  return Buffer.concat([
    Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="mode"\r\n\r\n${mode}\r\n`),
    Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="dropped.csv"\r\nContent-Type: text/csv\r\n\r\n`),
    Buffer.from(csv),
    Buffer.from(`\r\n--${BOUNDARY}--\r\n`),
  ]);
}

interface Snapshot {
  parts: unknown[];
  imports: number;
  changes: number;
  audit: number;
}

async function snapshot(): Promise<Snapshot> {
  const n = async (table: string) => Number((await t.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT }))[0].n);
  return {
    parts: await t.sequelize.query('SELECT * FROM parts ORDER BY id', { type: QueryTypes.SELECT }),
    imports: await n('stock_imports'),
    changes: await n('stock_import_changes'),
    audit: await n('audit_entries'),
  };
}

const pause = (ms: number) => new Promise((done) => setTimeout(done, ms));

/** Requests the app is still handling (counted until it ends the response, whether or not the client is still there). */
let handling = 0;

/**
 * Waits until the server holds no open connection and the app has finished every request it was
 * handling (a handler can go on after the client left; the database is compared only after).
 */
async function serverLetGo(): Promise<void> {
  for (let i = 0; i < 1000; i += 1) {
    const open = await new Promise<number>((resolve, reject) => server.getConnections((error, count) => (error ? reject(error) : resolve(count))));
    if (open === 0 && handling === 0) return;
    await pause(10);
  }
  throw new Error(`the server still holds the dropped connection or handles its request after 10 s (${handling} in hand)`);
}

/** Sends the first `cut` bytes of `body` with node:http, gives the server a moment with them, then destroys the socket. */
async function dropBody(body: Buffer, cut: number, chunked = false): Promise<void> {
  const headers: Record<string, string> = { Authorization: `Bearer ${stores.token}`, 'Content-Type': `multipart/form-data; boundary=${BOUNDARY}` };
  if (!chunked) headers['Content-Length'] = String(body.length);
  const seen = new Promise<void>((resolve) => server.once('request', () => resolve()));
  const req = httpRequest({ host: '127.0.0.1', port, method: 'POST', path: '/api/stock/imports', headers });
  req.on('error', () => undefined); // the hang-up is ours
  req.flushHeaders();
  await seen; // the server has the request line and headers
  if (cut > 0) await new Promise<void>((written) => req.write(body.subarray(0, cut), () => written()));
  await pause(100); // let the server read what arrived; nothing below depends on how long it takes
  req.destroy();
  await serverLetGo();
}

/** Sends only part of the HTTP request head over a raw socket, then hangs up. */
async function dropHead(cut: number): Promise<void> {
  const head = Buffer.from(`POST /api/stock/imports HTTP/1.1\r\nHost: 127.0.0.1\r\nAuthorization: Bearer ${stores.token}\r\nContent-Type: multipart/form-data; boundary=${BOUNDARY}\r\nContent-Length: 1000\r\n\r\n`);
  const socket = connect(port, '127.0.0.1');
  socket.on('error', () => undefined);
  await new Promise<void>((ready) => socket.once('connect', () => ready()));
  await new Promise<void>((written) => socket.write(head.subarray(0, Math.floor(head.length * cut)), () => written()));
  await pause(100);
  socket.destroy();
  await serverLetGo();
}

beforeAll(async () => {
  t = await startTestApp();
  stores = await t.addUser('stores');
  // The app of this file logs into `logged`, so the test can see how the hang-ups were taken.
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const line of chunk.toString('utf8').split('\n').filter(Boolean)) logged.push(JSON.parse(line));
      done();
    },
  });
  const app = createApp(t.config, t.sequelize, pino({ level: 'warn' }, sink));
  server = createServer((req, res) => {
    handling += 1;
    let ended = false;
    const end = res.end.bind(res) as (...args: unknown[]) => typeof res;
    res.end = ((...args: unknown[]) => {
      if (!ended) {
        ended = true;
        handling -= 1;
      }
      return end(...args);
    }) as typeof res.end;
    app(req, res);
  });
  await new Promise<void>((ready) => server.listen(0, '127.0.0.1', () => ready()));
  port = (server.address() as AddressInfo).port;
  const first = await request(server).post('/api/stock/imports').set('Authorization', `Bearer ${stores.token}`).attach('file', Buffer.from(stock(2000, (i) => 100 + i)), 'first.csv');
  expect(first.status, JSON.stringify(first.body).slice(0, 300)).toBe(200);
  expect(first.body.created).toBe(2000);
});
afterAll(async () => {
  server?.closeAllConnections();
  await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
  await t?.close();
});

describe('a client that drops a stock upload half-way', () => {
  // Replace mode with every quantity changed and half the parts left out: a partial apply would show.
  const csv = stock(1000, (i) => 7 * i);
  const body = multipart(csv);
  const fileStart = body.indexOf('\r\n\r\n', body.indexOf('name="file"')) + 4;
  const fileEnd = fileStart + Buffer.byteLength(csv);
  const cuts: [string, number][] = [
    ['after the HTTP headers, before any body', 0],
    ['inside the mode field', 30],
    ['inside the file part headers', body.indexOf('filename=') + 5],
    ['one byte into the file', fileStart + 1],
    ['half-way through the file', Math.floor((fileStart + fileEnd) / 2)],
    ['after the whole file, before the closing boundary', fileEnd],
    ['two bytes short of the end', body.length - 2],
  ];

  it.each(cuts)('changes nothing when the client hangs up %s', async (_where, cut) => {
    const before = await snapshot();
    await dropBody(body, cut);
    expect(await snapshot()).toEqual(before);
  });

  it('changes nothing when a chunked upload is dropped half-way through the file', async () => {
    const before = await snapshot();
    await dropBody(body, Math.floor((fileStart + fileEnd) / 2), true);
    expect(await snapshot()).toEqual(before);
  });

  it.each([0.2, 0.6, 0.99])('changes nothing when the client hangs up %s of the way through the HTTP head', async (cut) => {
    const before = await snapshot();
    await dropHead(cut);
    expect(await snapshot()).toEqual(before);
  });

  it('applies all of a complete upload or none of it when the client hangs up before the answer', async () => {
    const lab = stock(300, (i) => 3 * i, 'lab');
    const before = await snapshot();
    await dropBody(multipart(lab, 'merge'), multipart(lab, 'merge').length);
    const after = await snapshot();
    if (after.imports === before.imports) {
      expect(after).toEqual(before);
    } else {
      expect(after.imports).toBe(before.imports + 1);
      const parts = await t.sequelize.query<{ part_number: string; location: string; quantity: number }>("SELECT part_number, location, quantity FROM parts WHERE location = 'lab' ORDER BY part_number", { type: QueryTypes.SELECT });
      expect(parts).toHaveLength(300);
      for (const { part_number, quantity } of parts) expect(quantity, part_number).toBe(3 * Number(part_number.slice(4)));
      expect(after.parts.filter((p) => (p as { location: string }).location === 'main')).toEqual(before.parts);
    }
  });

  it('goes on serving: the next full upload is applied whole, and no error was logged', async () => {
    const before = await snapshot();
    const res = await request(server).post('/api/stock/imports').set('Authorization', `Bearer ${stores.token}`).field('mode', 'replace').attach('file', Buffer.from(csv), 'after.csv');
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    // 1,000 of the 2,000 parts are in the file (all with new quantities except DR-C00000 at 0 -> 0 is
    // a change from 100), the other 1,000 are zeroed by replace mode.
    expect(res.body).toMatchObject({ applied: true, rowsRead: 1000, created: 0, updated: 1000, unchanged: 0, zeroed: 1000, rejected: [] });
    const after = await snapshot();
    expect(after.imports).toBe(before.imports + 1);
    expect(after.changes).toBe(before.changes + 2000);
    const quantities = await t.sequelize.query<{ part_number: string; quantity: number }>("SELECT part_number, quantity FROM parts WHERE location = 'main' ORDER BY part_number", { type: QueryTypes.SELECT });
    expect(quantities).toHaveLength(2000);
    for (const { part_number, quantity } of quantities) {
      const i = Number(part_number.slice(4));
      expect(quantity, part_number).toBe(i < 1000 ? 7 * i : 0);
    }
    const health = await request(server).get('/api/health');
    expect(health.status).toBe(200);
    // A hang-up is no fault of the server's: the error handler logs it at info ("client went away"),
    // so nothing at error level or above may be logged here (a database error, say, fails).
    const errors = logged.filter((entry) => entry.level >= 50);
    expect(errors.map((entry) => entry.err?.message ?? entry.msg)).toEqual([]);
  });
});
