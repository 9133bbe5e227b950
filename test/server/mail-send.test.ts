/**
 * The mail service: `sendMail` sends through nodemailer to this file's fake SMTP server on
 * loopback, and records every attempt in `outbound_mail` (sent, or failed with the reason).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { loadConfig } from '../../server/config.js';
import { startFakeSmtpServer } from '../../server/mail/fake-smtp-server.js';
import { MailDeliveryError, sendMail } from '../../server/services/mail/send-mail.js';
import { startTestApp, TEST_JWT_SECRET, type TestApp } from '../support/test-app.js';

let t: TestApp;
let purchaser: { id: number };
beforeAll(async () => {
  t = await startTestApp({ MAIL_FROM: 'Shelfmatch at Tarnwick <shelfmatch@tarnwick.example>' });
  purchaser = await t.addUser('purchasing');
});
afterAll(async () => {
  await t?.close();
});

/** SMTP settings for a server on `port`, read the way the app reads them. */
const smtpOn = (port: number, more: Record<string, string> = {}) =>
  loadConfig({ JWT_SECRET: TEST_JWT_SECRET, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(port), ...more }).smtp;

interface OutboundRow {
  purpose: string;
  from_address: string;
  to_addresses: string[];
  subject: string;
  text_body: string;
  html_body: string | null;
  attachments: unknown;
  status: string;
  error: string | null;
  message_id: string | null;
  actor_id: number | null;
  sent_at: Date | null;
}
const outboundRow = async (id: number) =>
  (await t.sequelize.query<OutboundRow>('SELECT * FROM outbound_mail WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT }))[0];

// An invented shortfall list; 3 lines of CSV, as the shortfall work will attach it.
const CSV = 'kind,buyValue,quantity,minSrfHz\ncapacitor,1.5e-12,53,1.736e9\ninductor,6.8e-9,27,1.83e9\n';

describe('sendMail', () => {
  it('sends plain, HTML and a CSV attachment, and records what it sent', async () => {
    const entry = await sendMail(
      t.config.smtp,
      {
        to: ['orders@parts-supplier.example'],
        subject: 'Shortfall list for build NODE-915',
        text: 'Please quote the attached lines.',
        html: '<p>Please quote the attached lines.</p>',
        attachments: [{ filename: 'shortfall-node-915.csv', content: CSV, contentType: 'text/csv' }],
      },
      { purpose: 'shortfall-list', actorId: purchaser.id },
    );
    expect(entry.status).toBe('sent');

    const [arrived] = t.mail.messagesTo('orders@parts-supplier.example');
    expect(arrived.subject).toBe('Shortfall list for build NODE-915');
    expect(arrived.from).toBe('shelfmatch@tarnwick.example');
    expect(arrived.text?.trim()).toBe('Please quote the attached lines.');
    expect(arrived.html).toContain('<p>Please quote the attached lines.</p>');
    expect(arrived.attachments.map((a) => [a.filename, a.contentType, a.content.toString('utf8')])).toEqual([
      ['shortfall-node-915.csv', 'text/csv', CSV],
    ]);

    const row = await outboundRow(entry.id);
    expect(row).toMatchObject({
      purpose: 'shortfall-list',
      from_address: 'Shelfmatch at Tarnwick <shelfmatch@tarnwick.example>',
      to_addresses: ['orders@parts-supplier.example'],
      subject: 'Shortfall list for build NODE-915',
      text_body: 'Please quote the attached lines.',
      html_body: '<p>Please quote the attached lines.</p>',
      attachments: [{ filename: 'shortfall-node-915.csv', contentType: 'text/csv', sizeBytes: Buffer.byteLength(CSV) }],
      status: 'sent',
      error: null,
      actor_id: purchaser.id,
    });
    expect(row.message_id).toBe(arrived.messageId);
    expect(row.sent_at).toBeInstanceOf(Date);
  });

  it('names an attachment type from its extension when none is given, and counts bytes not characters', async () => {
    const touchstone = Buffer.from('! Shelfmatch fit\n# HZ S RI R 50\n868000000 0.01 0 0.99 0 0.99 0 0.01 0\n', 'utf8');
    const note = 'µH and Ω: two-byte characters';
    const entry = await sendMail(
      t.config.smtp,
      {
        to: 'rf.lead@tarnwick.example',
        subject: 'Fit data',
        text: 'Attached.',
        attachments: [
          { filename: 'fit.s2p', content: touchstone },
          { filename: 'note.txt', content: note },
        ],
      },
      { purpose: 'shortfall-list', actorId: null },
    );
    expect(entry.attachments).toEqual([
      { filename: 'fit.s2p', contentType: 'text/plain', sizeBytes: touchstone.length },
      { filename: 'note.txt', contentType: 'text/plain', sizeBytes: note.length + 2 },
    ]);
    const [arrived] = t.mail.messagesTo('rf.lead@tarnwick.example');
    expect(arrived.attachments.map((a) => a.content.toString('utf8'))).toEqual([touchstone.toString('utf8'), note]);
  });

  it('signs in to the server when SMTP_USER and SMTP_PASSWORD are set, as with a real relay', async () => {
    const entry = await sendMail(
      smtpOn(t.mail.port, { SMTP_USER: 'relay-user', SMTP_PASSWORD: 'relay-secret' }),
      { to: 'stores@tarnwick.example', subject: 'Through a signed-in session', text: 'ok' },
      { purpose: 'shortfall-list', actorId: null },
    );
    expect(entry.status).toBe('sent');
    expect(t.mail.messagesTo('stores@tarnwick.example').map((m) => m.subject)).toContain('Through a signed-in session');
  });

  it('fails with 503 mail_unavailable once the mail server is stopped, and marks the record failed', async () => {
    const server = await startFakeSmtpServer({ port: 0 });
    const smtp = smtpOn(server.port);
    const first = await sendMail(smtp, { to: 'admin@tarnwick.example', subject: 'while up', text: 'a' }, { purpose: 'invitation', actorId: null });
    expect(first.status).toBe('sent');
    await server.close();

    const failure = await sendMail(smtp, { to: 'admin@tarnwick.example', subject: 'while down', text: 'b' }, { purpose: 'invitation', actorId: null }).then(
      () => null,
      (error: unknown) => error,
    );
    expect(failure).toBeInstanceOf(MailDeliveryError);
    const e = failure as MailDeliveryError;
    expect([e.status, e.code]).toEqual([503, 'mail_unavailable']);
    expect(e.message).toContain(`127.0.0.1:${server.port}`);
    const row = await outboundRow(e.outboxId);
    expect(row.status).toBe('failed');
    expect(row.subject).toBe('while down');
    expect(row.error).toMatch(/ECONNREFUSED|cannot be reached/);
    expect(row.sent_at).toBeNull();
    expect(server.messages().map((m) => m.subject)).toEqual(['while up']);
  });

  it('fails with 502 mail_rejected when the server refuses the recipient, and marks the record failed', async () => {
    const server = await startFakeSmtpServer({ port: 0, refuseRecipient: (address) => address === 'gone@supplier.example' });
    try {
      const failure = await sendMail(smtpOn(server.port), { to: 'gone@supplier.example', subject: 'to a closed mailbox', text: 'c' }, { purpose: 'shortfall-list', actorId: null }).then(
        () => null,
        (error: unknown) => error as MailDeliveryError,
      );
      expect([failure?.status, failure?.code]).toEqual([502, 'mail_rejected']);
      const row = await outboundRow(failure!.outboxId);
      expect(row.status).toBe('failed');
      expect(row.error).toContain('550');
      expect(server.messages()).toEqual([]);
    } finally {
      await server.close();
    }
  });

  it('hides the redact secrets in the record but sends them to the recipient', async () => {
    const secret = 'Zq8-not-for-the-outbox_4f1';
    const entry = await sendMail(
      t.config.smtp,
      { to: 'invitee@tarnwick.example', subject: 'Link', text: `Open https://x.example/set-password?token=${secret} now`, html: `<a href="https://x.example/set-password?token=${secret}">open</a>` },
      { purpose: 'invitation', actorId: null, redact: [secret] },
    );
    const row = await outboundRow(entry.id);
    expect(row.text_body).toBe('Open https://x.example/set-password?token=[hidden] now');
    expect(row.html_body).toBe('<a href="https://x.example/set-password?token=[hidden]">open</a>');
    const [arrived] = t.mail.messagesTo('invitee@tarnwick.example');
    expect(arrived.text).toContain(`token=${secret} now`);
  });

  it('refuses to send without a recipient', async () => {
    await expect(sendMail(t.config.smtp, { to: ['  '], subject: 's', text: 't' }, { purpose: 'invitation', actorId: null })).rejects.toThrow(/at least one recipient/);
  });
});
