/**
 * The e-mail server down when a shortfall list is sent (handbook quality.md "Bad input, faults and
 * intruders"; api.md `POST /api/builds/:id/shortfall/send`): this file's own fake SMTP server
 * (server/mail/fake-smtp-server.ts, the real one the tests use) is stopped, or replaced by a
 * loopback server that hangs up on every connection or greets with "421 service not available"
 * (RFC 5321 section 3.8: a server that must shut down answers 421). Each time the API answers
 * with a clear message that names the mail server and says nothing was sent (not a bare 500); the
 * list stays a draft, never sent, in PostgreSQL; the Outbox records the failed attempt; and once
 * the server is back on the same port, sending again works.
 */
import { createServer as createTcpServer, type Server as TcpServer, type Socket } from 'node:net';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import type { Express } from 'express';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { startFakeSmtpServer, type FakeSmtpServer } from '../../server/mail/fake-smtp-server.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { createBuild } from '../../server/services/builds/create-build.js';
import { stockFile, stockRow, subGhzDesign } from './builds-scenario.js';

let t: TestApp;
let purchasing: { id: number; token: string };
let buildId: number;

interface ListRow {
  status: string;
  sent_to: string | null;
  sent_at: Date | null;
  last_mail_id: number | null;
}

async function listRow(): Promise<ListRow> {
  const [row] = await t.sequelize.query<ListRow>('SELECT status, sent_to, sent_at, last_mail_id::int AS last_mail_id FROM shortfall_lists WHERE build_id = :buildId', {
    replacements: { buildId },
    type: QueryTypes.SELECT,
  });
  return row;
}

async function outbox(id: number): Promise<{ status: string; error: string | null; purpose: string }> {
  const [row] = await t.sequelize.query<{ status: string; error: string | null; purpose: string }>('SELECT status, error, purpose FROM outbound_mail WHERE id = :id', {
    replacements: { id },
    type: QueryTypes.SELECT,
  });
  return row;
}

async function sendAudits(): Promise<number> {
  const [{ n }] = await t.sequelize.query<{ n: string }>("SELECT count(*) AS n FROM audit_entries WHERE action = 'shortfall.send'", { type: QueryTypes.SELECT });
  return Number(n);
}

const send = (app: Express, to: string) => request(app).post(`/api/builds/${buildId}/shortfall/send`).set('Authorization', `Bearer ${purchasing.token}`).send({ to });

/** A loopback TCP server that does `onConnection` to every client (a broken mail server). */
async function brokenServer(port: number, onConnection: (socket: Socket) => void): Promise<TcpServer> {
  const server = createTcpServer(onConnection);
  await new Promise<void>((ready, failed) => {
    server.once('error', failed);
    server.listen(port, '127.0.0.1', () => ready());
  });
  return server;
}

const closeTcp = (server: TcpServer) => new Promise<void>((done) => server.close(() => done()));

/** The checks every refused send must pass: a clear answer, the list untouched, a failed Outbox entry. */
async function expectRefusedAndUnsent(res: request.Response, port: number, before: ListRow, auditsBefore: number): Promise<void> {
  // Every one of these is the mail server being unavailable (421 is "service not available"): a 503.
  expect(res.status, JSON.stringify(res.body)).toBe(503);
  expect(res.body.error.code).toBe('mail_unavailable');
  // Names the mail server, says what happened and that nothing went out.
  expect(res.body.error.message).toContain(`127.0.0.1:${port}`);
  expect(res.body.error.message).toMatch(/cannot be reached/);
  expect(res.body.error.message).toMatch(/Nothing was sent/);
  const outboxId = res.body.error.details.find((d: { field: string }) => d.field === 'outboxId')?.value;
  expect(outboxId).toEqual(expect.any(Number));
  const entry = await outbox(outboxId);
  expect(entry).toMatchObject({ status: 'failed', purpose: 'shortfall-list' });
  expect(entry.error).toBeTruthy();
  expect(await listRow()).toEqual(before);
  expect(await sendAudits()).toBe(auditsBefore);
}

beforeAll(async () => {
  t = await startTestApp();
  purchasing = await t.addUser('purchasing');
  const stores = await t.addUser('stores');
  const designer = await t.addUser('designer');
  // Two 6.8 pF on hand for ten boards: the build is short of its shunt capacitor.
  const upload = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 2), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 1000)));
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
  buildId = await createBuild(t.sequelize, { name: 'NODE-868 rev C', quantity: 10, reserve: true, plans: [{ matchId: 31, matchName: '868 MHz antenna', design: subGhzDesign() }] }, designer.id);
});
afterAll(async () => {
  await t?.close();
});

describe('the mail server down when a shortfall list is sent', () => {
  let smtp: FakeSmtpServer | undefined;
  afterAll(async () => {
    await smtp?.close();
  });

  it('says so clearly, keeps the list unsent, and sends it once the server is back', async () => {
    smtp = await startFakeSmtpServer({ port: 0 });
    const port = smtp.port;
    const { app } = t.appWith({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port) });
    const initial = await listRow();
    expect(initial).toEqual({ status: 'draft', sent_to: null, sent_at: null, last_mail_id: null });

    // Down: nothing listens on the port any more.
    await smtp.close();
    smtp = undefined;
    const down = await send(app, 'orders@parts-supplier.example');
    expect(down.body.error.message).toMatch(/ECONNREFUSED/);
    await expectRefusedAndUnsent(down, port, initial, 0);

    // A server that accepts the connection and hangs up at once.
    const hangUp = await brokenServer(port, (socket) => socket.destroy());
    try {
      await expectRefusedAndUnsent(await send(app, 'orders@parts-supplier.example'), port, initial, 0);
    } finally {
      await closeTcp(hangUp);
    }

    // A server that is shutting down: "421" on connect (RFC 5321 section 3.8), then closes.
    const closing = await brokenServer(port, (socket) => socket.end('421 mail.tarnwick.example Service not available, closing transmission channel\r\n'));
    try {
      const res = await send(app, 'orders@parts-supplier.example');
      // The server's own words are passed on.
      expect(res.body.error.message).toMatch(/421 .*Service not available/);
      await expectRefusedAndUnsent(res, port, initial, 0);
    } finally {
      await closeTcp(closing);
    }

    // Back on the same port: the same request now sends, and the list is marked sent to that address.
    smtp = await startFakeSmtpServer({ port });
    const again = await send(app, 'orders@parts-supplier.example');
    expect(again.status, JSON.stringify(again.body)).toBe(200);
    expect(again.body).toMatchObject({ to: ['orders@parts-supplier.example'], status: 'sent', outboxId: expect.any(Number) });
    const [mail] = smtp.messagesTo('orders@parts-supplier.example');
    expect(mail.subject).toBe('Shortfall list for build NODE-868 rev C');
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0].contentType).toBe('text/csv');
    const sent = await listRow();
    expect(sent).toMatchObject({ status: 'sent', sent_to: 'orders@parts-supplier.example', last_mail_id: again.body.outboxId });
    expect(sent.sent_at).toBeInstanceOf(Date);
    expect((await outbox(again.body.outboxId)).status).toBe('sent');
    expect(await sendAudits()).toBe(1);
    // Only the one successful attempt reached a mail server.
    expect(smtp.messages()).toHaveLength(1);
  });

  it('keeps a sent list as it was when a resend fails', async () => {
    const before = await listRow();
    expect(before.status).toBe('sent');
    // A port that was free a moment ago and that nothing listens on now.
    const probe = await brokenServer(0, (socket) => socket.destroy());
    const port = (probe.address() as AddressInfo).port;
    await closeTcp(probe);
    const { app } = t.appWith({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port) });
    const res = await send(app, 'other@parts-supplier.example');
    await expectRefusedAndUnsent(res, port, before, 1);
  });
});
