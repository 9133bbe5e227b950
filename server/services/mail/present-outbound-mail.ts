import type { OutboxEntry, OutboxMessage } from '../../../shared/api/outbox.js';
import type { OutboundMail } from '../../models/index.js';

/** An Outbox row as the API lists it (no bodies). */
export function presentOutboxEntry(mail: OutboundMail): OutboxEntry {
  return {
    id: Number(mail.id),
    purpose: mail.purpose,
    from: mail.fromAddress,
    to: mail.toAddresses,
    subject: mail.subject,
    status: mail.status,
    error: mail.error,
    attachments: mail.attachments,
    messageId: mail.messageId,
    actorId: mail.actorId,
    createdAt: mail.createdAt.toISOString(),
    sentAt: mail.sentAt ? mail.sentAt.toISOString() : null,
  };
}

/** One Outbox message with its plain and HTML bodies. */
export function presentOutboxMessage(mail: OutboundMail): OutboxMessage {
  return { ...presentOutboxEntry(mail), text: mail.textBody, html: mail.htmlBody };
}
