/**
 * The local fake SMTP server on its own: messages sent by nodemailer over real SMTP on loopback
 * arrive parsed (bodies, attachments, envelope), can be written as .eml files, and a stopped
 * server refuses connections.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createConnection } from 'node:net';
import { networkInterfaces, tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { simpleParser } from 'mailparser';
import { startFakeSmtpServer, type FakeSmtpServer } from '../../server/mail/fake-smtp-server.js';

const transportTo = (server: FakeSmtpServer) => nodemailer.createTransport({ host: server.host, port: server.port, secure: false });

// An invented shortfall list of the demo company, as purchasing would send it.
const CSV = 'kind,idealValue,buyValue,quantity\ncapacitor,1.2e-12,1.2e-12,21\ninductor,8.2e-9,8.2e-9,11\n';

let server: FakeSmtpServer;
let emlDir: string;
beforeAll(async () => {
  emlDir = mkdtempSync(join(tmpdir(), 'shelfmatch-eml-'));
  server = await startFakeSmtpServer({ port: 0, emlDir, refuseRecipient: (address) => address.startsWith('nobody@') });
});
afterAll(async () => {
  await server?.close();
  rmSync(emlDir, { recursive: true, force: true });
});

describe('fake SMTP server', () => {
  it('listens on loopback on the port the system gave it', () => {
    expect(server.host).toBe('127.0.0.1');
    expect(server.port).toBeGreaterThan(0);
  });

  it('receives a message with plain and HTML bodies and a CSV attachment, parsed', async () => {
    const info = await transportTo(server).sendMail({
      from: 'Shelfmatch <shelfmatch@tarnwick.example>',
      to: ['Zoë Marsh <buyer@supplier.example>', 'purchasing@tarnwick.example'],
      subject: 'Shortfall list — board NODE-868 × 50',
      text: 'Two lines to buy; the CSV is attached.',
      html: '<p>Two lines to buy; the <b>CSV</b> is attached.</p>',
      attachments: [{ filename: 'shortfall-node-868.csv', content: CSV, contentType: 'text/csv' }],
    });
    const got = server.messagesTo('buyer@supplier.example');
    expect(got).toHaveLength(1);
    const [message] = got;
    expect(message.envelope).toEqual({ from: 'shelfmatch@tarnwick.example', to: ['buyer@supplier.example', 'purchasing@tarnwick.example'] });
    expect(message.subject).toBe('Shortfall list — board NODE-868 × 50');
    expect(message.from).toBe('shelfmatch@tarnwick.example');
    expect(message.to).toEqual(['buyer@supplier.example', 'purchasing@tarnwick.example']);
    expect(message.text?.trim()).toBe('Two lines to buy; the CSV is attached.');
    expect(message.html).toContain('<b>CSV</b>');
    expect(message.messageId).toBe(info.messageId);
    expect(message.attachments).toHaveLength(1);
    const [csv] = message.attachments;
    expect(csv.filename).toBe('shortfall-node-868.csv');
    expect(csv.contentType).toBe('text/csv');
    expect(csv.content.toString('utf8')).toBe(CSV);
    expect(csv.sizeBytes).toBe(Buffer.byteLength(CSV));
  });

  it('writes each message as an .eml file that parses back to the same message', async () => {
    const before = new Set(readdirSync(emlDir));
    await transportTo(server).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'stores@tarnwick.example', subject: 'Kept on disk', text: 'eml body' });
    const added = readdirSync(emlDir).filter((name) => !before.has(name));
    expect(added).toHaveLength(1);
    expect(added[0]).toMatch(/\.eml$/);
    const parsed = await simpleParser(readFileSync(join(emlDir, added[0])));
    expect(parsed.subject).toBe('Kept on disk');
    expect(parsed.text?.trim()).toBe('eml body');
  });

  it('refuses a recipient it is told to refuse with SMTP 550, and keeps nothing', async () => {
    const count = server.messages().length;
    const sending = transportTo(server).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'nobody@supplier.example', subject: 'x', text: 'x' });
    await expect(sending).rejects.toMatchObject({ code: 'EENVELOPE', responseCode: 550 });
    expect(server.messages().length).toBe(count);
  });

  it('waitForMessage resolves with a message that arrives later, and names what it waited for on time-out', async () => {
    const waiting = server.waitForMessage((m) => m.subject === 'Later one');
    await transportTo(server).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'admin@tarnwick.example', subject: 'Later one', text: 'y' });
    expect((await waiting).envelope.to).toEqual(['admin@tarnwick.example']);
    await expect(server.waitForMessage((m) => m.subject === 'never sent', 50)).rejects.toThrow(/no matching message arrived/);
  });

  it('clear() forgets what arrived', async () => {
    await transportTo(server).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'admin@tarnwick.example', subject: 'z', text: 'z' });
    expect(server.messages().length).toBeGreaterThan(0);
    server.clear();
    expect(server.messages()).toEqual([]);
  });

  const outside = Object.values(networkInterfaces())
    .flat()
    .find((a) => a && a.family === 'IPv4' && !a.internal)?.address;
  it.skipIf(!outside)(`is not reachable on a non-loopback address of this machine (${outside ?? 'none here'})`, async () => {
    const result = await new Promise<string>((resolve) => {
      const socket = createConnection({ host: outside!, port: server.port });
      socket.once('connect', () => (socket.destroy(), resolve('connected')));
      socket.once('error', (error: NodeJS.ErrnoException) => resolve(error.code ?? 'error'));
    });
    expect(result).toBe('ECONNREFUSED');
  });

  it('refuses connections once stopped', async () => {
    const other = await startFakeSmtpServer({ port: 0 });
    await transportTo(other).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'admin@tarnwick.example', subject: 'before', text: 'a' });
    expect(other.messages()).toHaveLength(1);
    await other.close();
    await expect(
      transportTo(other).sendMail({ from: 'shelfmatch@tarnwick.example', to: 'admin@tarnwick.example', subject: 'after', text: 'b' }),
    ).rejects.toMatchObject({ code: expect.stringMatching(/^(ESOCKET|ECONNECTION)$/) });
  });
});
