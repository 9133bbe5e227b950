/**
 * The one way Shelfmatch sends e-mail: through the configured SMTP server with nodemailer, with
 * every attempt recorded in `outbound_mail` for the Outbox page.
 */
import type { MailPurpose, OutboxEntry } from '../../../shared/api/outbox.js';
import { OutboundMail } from '../../models/index.js';
import { HttpError } from '../../errors.js';
import { mailFailure, mailTransportFor, type SmtpSettings } from '../../mail/mail-transport.js';
import { presentOutboxEntry } from './present-outbound-mail.js';

/** A file sent with a message, e.g. a shortfall list as CSV. */
export interface OutgoingAttachment {
  /** File name the recipient sees, e.g. `shortfall-build-12.csv`. */
  filename: string;
  /** The file's bytes; a string is sent as UTF-8. */
  content: string | Buffer;
  /** MIME type, e.g. `text/csv`; guessed from the file name when left out. */
  contentType?: string;
}

/** What to send: one or more recipients, a subject, a plain body and optionally HTML and files. */
export interface OutgoingMail {
  to: string | string[];
  subject: string;
  /** The plain-text body; always sent, so every mail client can read the message. */
  text: string;
  /** An HTML alternative of the same content. */
  html?: string;
  attachments?: OutgoingAttachment[];
}

/** Who sends and why; both go into the Outbox record. */
export interface SendMailContext {
  purpose: MailPurpose;
  /** The signed-in user who caused the send; null for the system. */
  actorId: number | null;
  /**
   * Secrets in the bodies (a link token) that go to the recipient but not into the Outbox record:
   * each is written there as `[hidden]`.
   */
  redact?: readonly string[];
}

/** What a redacted secret reads as in the Outbox. */
export const REDACTED = '[hidden]';

/**
 * A send that did not reach the mail server, or that it refused. Its status and code are those
 * of `mailFailure` (503 or 502 `mail_unavailable`, 502 `mail_rejected`); `outboxId` names the
 * Outbox entry, now marked `failed`.
 */
export class MailDeliveryError extends HttpError {
  constructor(
    failure: HttpError,
    readonly outboxId: number,
  ) {
    super(failure.status, failure.code, failure.message, [{ field: 'outboxId', value: outboxId, message: 'the Outbox entry of this attempt' }]);
    this.name = 'MailDeliveryError';
  }
}

/** MIME types by file extension, for attachments that do not name one. */
const CONTENT_TYPES: Record<string, string> = { csv: 'text/csv', txt: 'text/plain', s2p: 'text/plain', pdf: 'application/pdf', json: 'application/json' };

/**
 * Sends `mail` through the SMTP server in `smtp` and returns its Outbox entry (status `sent`).
 * The record keeps the bodies as sent, minus the `context.redact` secrets.
 *
 * The record is written before the SMTP conversation (status `sending`) in its own statement,
 * outside any caller transaction, so no message ever leaves without a record and a rolled-back
 * caller cannot erase the trace of a message that did leave. The outcome then updates it: `sent`
 * with the Message-ID, or `failed` with the server's or the connection's words, after which this
 * throws a `MailDeliveryError`. When the database is down nothing is sent (the insert fails
 * first, and the caller sees the usual 503 `database_unavailable`).
 */
export async function sendMail(smtp: SmtpSettings, mail: OutgoingMail, context: SendMailContext): Promise<OutboxEntry> {
  const to = (Array.isArray(mail.to) ? mail.to : [mail.to]).map((address) => address.trim()).filter(Boolean);
  if (to.length === 0) throw new Error('sendMail: give at least one recipient.');
  const attachments = (mail.attachments ?? []).map((a) => ({
    filename: a.filename,
    content: a.content,
    contentType: a.contentType ?? CONTENT_TYPES[a.filename.split('.').pop()?.toLowerCase() ?? ''] ?? 'application/octet-stream',
  }));

  const hide = (body: string) => (context.redact ?? []).filter(Boolean).reduce((text, secret) => text.split(secret).join(REDACTED), body);
  const record = await OutboundMail.create({
    purpose: context.purpose,
    fromAddress: smtp.from,
    toAddresses: to,
    subject: mail.subject,
    textBody: hide(mail.text),
    htmlBody: mail.html === undefined ? null : hide(mail.html),
    attachments: attachments.map((a) => ({
      filename: a.filename,
      contentType: a.contentType,
      sizeBytes: typeof a.content === 'string' ? Buffer.byteLength(a.content, 'utf8') : a.content.length,
    })),
    status: 'sending',
    error: null,
    messageId: null,
    actorId: context.actorId,
    sentAt: null,
  });

  let messageId: string;
  try {
    const info = await mailTransportFor(smtp).sendMail({
      from: smtp.from,
      to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      attachments,
    });
    messageId = String(info.messageId ?? '');
  } catch (error) {
    const failure = mailFailure(error, smtp);
    record.status = 'failed';
    record.error = failure.message;
    await record.save();
    throw new MailDeliveryError(failure, Number(record.id));
  }
  record.status = 'sent';
  record.messageId = messageId || null;
  record.sentAt = new Date();
  await record.save();
  return presentOutboxEntry(record);
}
