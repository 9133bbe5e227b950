/**
 * A local SMTP server for the embedded mode and the tests, built on smtp-server (the SMTP server
 * library of the nodemailer project) and mailparser. It listens on loopback only, accepts every
 * message, keeps the parsed messages in memory (and, when asked, writes each as an `.eml` file),
 * and delivers nothing anywhere. Real SMTP settings in the environment replace it (README.md).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';

/** The loopback address the fake server binds; it never listens on another interface. */
export const FAKE_SMTP_HOST = '127.0.0.1';
/** The port `npm start` gives it when `SMTP_PORT` does not say otherwise. */
export const FAKE_SMTP_DEFAULT_PORT = 2525;
/** How many messages stay in memory; older ones are dropped first. */
const MAX_KEPT_MESSAGES = 500;
/** Largest message accepted, in bytes (a shortfall list with its CSV is a few kilobytes). */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;
/** SMTP reply code for a refused recipient (RFC 5321 section 4.2.3: mailbox unavailable). */
const MAILBOX_UNAVAILABLE = 550;

/** One attachment of a received message, content included. */
export interface ReceivedAttachment {
  filename: string | undefined;
  contentType: string;
  sizeBytes: number;
  content: Buffer;
}

/** One message as it arrived: the SMTP envelope, and the parsed headers, bodies and attachments. */
export interface ReceivedMessage {
  /** 1, 2, 3, ... in the order messages arrived at this server. */
  seq: number;
  receivedAt: Date;
  envelope: { from: string | null; to: string[] };
  /** The bare address of the `From` header. */
  from: string | undefined;
  /** The bare addresses of the `To` header(s). */
  to: string[];
  subject: string | undefined;
  text: string | undefined;
  html: string | undefined;
  messageId: string | undefined;
  attachments: ReceivedAttachment[];
  /** The message exactly as it came over the wire. */
  raw: Buffer;
}

/** Options of `startFakeSmtpServer`. */
export interface FakeSmtpOptions {
  /** TCP port; 0 (the default) lets the system pick a free one, as tests do. */
  port?: number;
  /** When set, every message is also written to `<emlDir>/<time>-<seq>.eml`. */
  emlDir?: string;
  /** Recipients for which this returns true are refused with 550, as a real server might. */
  refuseRecipient?: (address: string) => boolean;
}

/** A running fake SMTP server. */
export interface FakeSmtpServer {
  readonly host: string;
  readonly port: number;
  /** Every message received so far (up to the last 500), oldest first. */
  messages(): readonly ReceivedMessage[];
  /** The messages whose envelope or `To` names `address` (case-insensitive), oldest first. */
  messagesTo(address: string): ReceivedMessage[];
  /**
   * Resolves with the first message (already here or still to come) that `matches`; rejects after
   * `timeoutMs` naming what it waited for. For browser tests, where sending happens elsewhere.
   */
  waitForMessage(matches: (message: ReceivedMessage) => boolean, timeoutMs?: number): Promise<ReceivedMessage>;
  /** Forgets the messages received so far. */
  clear(): void;
  /** Stops listening and drops open connections. */
  close(): Promise<void>;
}

/** Starts the fake SMTP server on 127.0.0.1 and resolves once it listens. */
export async function startFakeSmtpServer(options: FakeSmtpOptions = {}): Promise<FakeSmtpServer> {
  const received: ReceivedMessage[] = [];
  const waiters = new Set<{ matches: (m: ReceivedMessage) => boolean; resolve: (m: ReceivedMessage) => void }>();
  let seq = 0;
  if (options.emlDir) mkdirSync(options.emlDir, { recursive: true });

  const keep = (message: ReceivedMessage) => {
    received.push(message);
    if (received.length > MAX_KEPT_MESSAGES) received.splice(0, received.length - MAX_KEPT_MESSAGES);
    if (options.emlDir) {
      const stamp = message.receivedAt.toISOString().replace(/[:.]/g, '-');
      writeFileSync(join(options.emlDir, `${stamp}-${message.seq}.eml`), message.raw);
    }
    for (const waiter of waiters) {
      if (waiter.matches(message)) {
        waiters.delete(waiter);
        waiter.resolve(message);
      }
    }
  };

  const server = new SMTPServer({
    name: 'shelfmatch-fake-smtp',
    banner: 'Shelfmatch local fake SMTP server: messages stay on this machine',
    // Loopback only, so no TLS; sign-in is accepted (and ignored) so real-server settings with a
    // user and password still work against it.
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anonymous' }),
    size: MAX_MESSAGE_BYTES,
    rejectOversized: true,
    logger: false,
    disableReverseLookup: true,
    // Closing waits at most this long for open sessions before it drops them.
    closeTimeout: 1_000,
    onRcptTo: (address, _session, callback) => {
      if (options.refuseRecipient?.(address.address)) {
        const error = Object.assign(new Error(`Mailbox ${address.address} is not accepted here`), { responseCode: MAILBOX_UNAVAILABLE });
        return callback(error);
      }
      callback();
    },
    onData: (stream: SMTPServerDataStream, session: SMTPServerSession, callback) => {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', (error) => callback(error));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(null); // rejectOversized answers 552 itself
        const raw = Buffer.concat(chunks);
        seq += 1;
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          to: session.envelope.rcptTo.map((r) => r.address),
        };
        // The reply waits for the parse, so when the sender hears 250 the message is readable here.
        simpleParser(raw).then(
          (parsed) => {
            keep({
              seq,
              receivedAt: new Date(),
              envelope,
              from: addressList(parsed.from)[0],
              to: addressList(parsed.to),
              subject: parsed.subject,
              text: parsed.text,
              html: typeof parsed.html === 'string' ? parsed.html : undefined,
              messageId: parsed.messageId,
              attachments: parsed.attachments.map((a) => ({
                filename: a.filename,
                contentType: a.contentType,
                sizeBytes: a.size,
                content: a.content,
              })),
              raw,
            });
            callback(null);
          },
          (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
        );
      });
    },
  });

  const port = await new Promise<number>((resolve, reject) => {
    const onError = (error: Error) => reject(new Error(`The fake SMTP server could not listen on ${FAKE_SMTP_HOST}:${options.port ?? 0}: ${error.message}`));
    server.once('error', onError);
    server.listen(options.port ?? 0, FAKE_SMTP_HOST, () => {
      server.off('error', onError);
      resolve((server.server.address() as AddressInfo).port);
    });
  });
  // A failing client connection must not take the process down.
  server.on('error', () => undefined);

  return {
    host: FAKE_SMTP_HOST,
    port,
    messages: () => received,
    messagesTo: (address) => {
      const wanted = address.toLowerCase();
      return received.filter((m) => [...m.envelope.to, ...m.to].some((a) => a.toLowerCase() === wanted));
    },
    waitForMessage(matches, timeoutMs = 10_000) {
      const already = received.find(matches);
      if (already) return Promise.resolve(already);
      return new Promise((resolve, reject) => {
        const waiter = { matches, resolve: (m: ReceivedMessage) => (clearTimeout(timer), resolve(m)) };
        const timer = setTimeout(() => {
          waiters.delete(waiter);
          reject(new Error(`fake SMTP server: no matching message arrived within ${timeoutMs} ms (${received.length} received in all)`));
        }, timeoutMs);
        waiters.add(waiter);
      });
    },
    clear: () => {
      received.length = 0;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** The bare addresses of a parsed address header (one header or several). */
function addressList(header: AddressObject | AddressObject[] | undefined): string[] {
  if (!header) return [];
  const objects = Array.isArray(header) ? header : [header];
  return objects.flatMap((o) => o.value.map((a) => a.address ?? '').filter(Boolean));
}
