/** What the Outbox page reads: the recorded e-mail, newest first. */
import type { WhereOptions } from 'sequelize';
import type { MailPurpose, MailStatus, OutboxMessage, OutboxPage } from '../../../shared/api/outbox.js';
import { OutboundMail } from '../../models/index.js';
import { notFound } from '../../errors.js';
import { presentOutboxEntry, presentOutboxMessage } from './present-outbound-mail.js';

/** Filters and paging of `listOutbox`; `page` counts from 1. */
export interface OutboxQuery {
  status?: MailStatus;
  purpose?: MailPurpose;
  page: number;
  pageSize: number;
}

/** One page of Outbox entries matching `query`, newest first, with the total that match. */
export async function listOutbox(query: OutboxQuery): Promise<OutboxPage> {
  const where: WhereOptions<OutboundMail> = {};
  if (query.status) where.status = query.status;
  if (query.purpose) where.purpose = query.purpose;
  const { rows, count } = await OutboundMail.findAndCountAll({
    where,
    attributes: { exclude: ['textBody', 'htmlBody'] },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { items: rows.map(presentOutboxEntry), total: count };
}

/** One Outbox message with its bodies; 404 when there is none with `id`. */
export async function readOutboxMessage(id: number): Promise<OutboxMessage> {
  const mail = await OutboundMail.findByPk(id);
  if (!mail) throw notFound(`Outbox message ${id}`);
  return presentOutboxMessage(mail);
}
