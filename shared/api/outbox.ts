/** Shapes of the Outbox routes (admin only): the e-mail Shelfmatch sent or tried to send. */

/** Why a message was sent. */
export type MailPurpose = 'invitation' | 'password-reset' | 'shortfall-list';

/** Every purpose, for validation and filters. */
export const MAIL_PURPOSES: readonly MailPurpose[] = ['invitation', 'password-reset', 'shortfall-list'];

/** `sending` while the SMTP conversation runs; then `sent` (the server accepted it) or `failed`. */
export type MailStatus = 'sending' | 'sent' | 'failed';

/** Every status, for validation and filters. */
export const MAIL_STATUSES: readonly MailStatus[] = ['sending', 'sent', 'failed'];

/** An attachment as the Outbox keeps it: its name, type and size, not its content. */
export interface OutboxAttachment {
  filename: string;
  contentType: string;
  sizeBytes: number;
}

/** One row of `GET /api/outbox`. */
export interface OutboxEntry {
  id: number;
  purpose: MailPurpose;
  from: string;
  to: string[];
  subject: string;
  status: MailStatus;
  /** What went wrong, when `status` is `failed`. */
  error: string | null;
  attachments: OutboxAttachment[];
  messageId: string | null;
  /** Who caused the send (a user id), or null for the system. */
  actorId: number | null;
  /** ISO 8601 time the send was attempted. */
  createdAt: string;
  /** ISO 8601 time the mail server accepted it, or null. */
  sentAt: string | null;
}

/** `GET /api/outbox/:id`: an entry with its bodies. */
export interface OutboxMessage extends OutboxEntry {
  text: string;
  html: string | null;
}

/** `GET /api/outbox?status=&purpose=&page=&pageSize=` answer, newest first. */
export interface OutboxPage {
  items: OutboxEntry[];
  total: number;
}
