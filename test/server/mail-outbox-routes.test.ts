/** `GET /api/outbox` and `GET /api/outbox/:id`: what was sent, newest first, with filters and bodies. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startFakeSmtpServer } from '../../server/mail/fake-smtp-server.js';
import { MailDeliveryError, sendMail } from '../../server/services/mail/send-mail.js';
import { startTestApp, type TestApp } from '../support/test-app.js';

let t: TestApp;
let admin: { id: number; token: string };
const sentIds: number[] = [];
let failedId = 0;

beforeAll(async () => {
  t = await startTestApp();
  admin = await t.addUser('admin');
  for (const n of [1, 2, 3]) {
    const entry = await sendMail(
      t.config.smtp,
      { to: `buyer${n}@supplier.example`, subject: `Shortfall list ${n}`, text: `Body ${n}`, html: `<p>Body ${n}</p>`, attachments: [{ filename: `list-${n}.csv`, content: 'a,b\n1,2\n' }] },
      { purpose: 'shortfall-list', actorId: admin.id },
    );
    sentIds.push(entry.id);
  }
  const stopped = await startFakeSmtpServer({ port: 0 });
  await stopped.close();
  const smtp = { ...t.config.smtp, port: stopped.port };
  failedId = await sendMail(smtp, { to: 'someone@tarnwick.example', subject: 'Invitation that failed', text: 'x' }, { purpose: 'invitation', actorId: admin.id }).then(
    () => 0,
    (error: MailDeliveryError) => error.outboxId,
  );
});
afterAll(async () => {
  await t?.close();
});
const get = (path: string) => request(t.app).get(path).set('Authorization', `Bearer ${admin.token}`);

describe('Outbox routes', () => {
  it('lists every attempt newest first, without bodies', async () => {
    const res = await get('/api/outbox');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(4);
    expect(res.body.items.map((i: { id: number }) => i.id)).toEqual([failedId, ...[...sentIds].reverse()]);
    const [failed, newestSent] = res.body.items;
    expect(failed).toMatchObject({ status: 'failed', purpose: 'invitation', to: ['someone@tarnwick.example'], sentAt: null });
    expect(failed.error).toMatch(/cannot be reached/);
    expect(newestSent).toMatchObject({
      status: 'sent',
      purpose: 'shortfall-list',
      subject: 'Shortfall list 3',
      to: ['buyer3@supplier.example'],
      attachments: [{ filename: 'list-3.csv', contentType: 'text/csv', sizeBytes: 8 }],
      actorId: admin.id,
      error: null,
    });
    expect(newestSent.text).toBeUndefined();
    expect(newestSent.html).toBeUndefined();
    expect(Date.parse(newestSent.createdAt)).not.toBeNaN();
  });

  it('filters by status and purpose, and pages', async () => {
    const failed = await get('/api/outbox?status=failed');
    expect(failed.body.items.map((i: { id: number }) => i.id)).toEqual([failedId]);
    const lists = await get('/api/outbox?purpose=shortfall-list&page=2&pageSize=2');
    expect(lists.body.total).toBe(3);
    expect(lists.body.items.map((i: { id: number }) => i.id)).toEqual([sentIds[0]]);
  });

  it('shows one message with its plain and HTML bodies', async () => {
    const res = await get(`/api/outbox/${sentIds[1]}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: sentIds[1], subject: 'Shortfall list 2', text: 'Body 2', html: '<p>Body 2</p>' });
  });

  it('answers 400 naming each bad query field, and 404 for an unknown message', async () => {
    const bad = await get('/api/outbox?status=lost&page=0&pageSize=5000&colour=red');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_input');
    const fields = bad.body.error.details.map((d: { field: string }) => d.field).sort();
    expect(fields).toEqual(['(body)', 'page', 'pageSize', 'status']);
    expect((await get('/api/outbox/abc')).status).toBe(400);
    const missing = await get('/api/outbox/999999');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
  });
});
