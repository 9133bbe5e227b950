/**
 * E-mailing a shortfall list (api.md `POST /api/builds/:id/shortfall/send`, purchasing): a plain and
 * an HTML body listing every line, the CSV attached, sent through the mail service (which records
 * the attempt in the Outbox); once the mail server took it, the list is marked sent to that address.
 */
import type { Sequelize } from 'sequelize';
import type { SendShortfallResponse, ShortfallLine } from '../../../shared/api/builds.js';
import { formatTolerance } from '../../../shared/engine/tolerance-codes.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import type { SmtpSettings } from '../../mail/mail-transport.js';
import { ShortfallList } from '../../models/index.js';
import { conflict } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { sendMail } from '../mail/send-mail.js';
import { readShortfallList } from './read-shortfall-list.js';
import { shortfallCsv, shortfallCsvFileName } from './shortfall-csv.js';

const quantityOf = (line: ShortfallLine) => (line.kind === 'capacitor' ? 'capacitance' : 'inductance');

/** One line in words: `12 x capacitor 6.8 pF E24, ±0.25 pF (C), SRF >= 1.736 GHz, 0402`. */
export function shortfallLineWords(line: ShortfallLine): string {
  return [
    `${line.quantity} x ${line.kind} ${formatValue(line.buyValue, quantityOf(line))} ${line.series}`,
    `${formatTolerance(line.tolerance, line.kind)} (${line.toleranceCode})`,
    `SRF >= ${formatValue(line.minSrfHz, 'frequency')}`,
    ...(line.package ? [line.package] : []),
  ].join(', ');
}

const HTML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
/** `text` safe inside HTML. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c]);
}

/** The message bodies for a list. */
export function shortfallMessage(buildName: string, lines: readonly ShortfallLine[]): { subject: string; text: string; html: string } {
  const subject = `Shortfall list for build ${buildName}`;
  const text = [
    `Please quote or supply the parts below for build ${buildName}.`,
    'Each line gives the value, E-series, tolerance, lowest self-resonant frequency (SRF) and package needed.',
    '',
    ...lines.map((line, i) => `${i + 1}. ${shortfallLineWords(line)}`),
    '',
    'The same list is attached as CSV.',
  ].join('\n');
  const rows = lines
    .map(
      (line, i) =>
        `<tr><td>${i + 1}</td><td>${line.quantity}</td><td>${escapeHtml(line.kind)}</td><td>${escapeHtml(formatValue(line.buyValue, quantityOf(line)))}</td>` +
        `<td>${escapeHtml(line.series)}</td><td>${escapeHtml(formatTolerance(line.tolerance, line.kind))} (${escapeHtml(line.toleranceCode)})</td>` +
        `<td>${escapeHtml(formatValue(line.minSrfHz, 'frequency'))}</td><td>${escapeHtml(line.package ?? '')}</td></tr>`,
    )
    .join('');
  const html =
    `<p>Please quote or supply the parts below for build <strong>${escapeHtml(buildName)}</strong>.</p>` +
    '<table border="1" cellpadding="4" cellspacing="0"><thead><tr><th>#</th><th>Quantity</th><th>Kind</th><th>Value</th><th>Series</th><th>Tolerance</th><th>Min. SRF</th><th>Package</th></tr></thead>' +
    `<tbody>${rows}</tbody></table><p>The same list is attached as CSV.</p>`;
  return { subject, text, html };
}

/**
 * Sends the list of build `buildId` to `to` (one or more addresses) and marks it sent.
 * @throws 404 unknown build; 409 when nothing is short; the mail service's 502/503 when the mail server failed (nothing marked)
 */
export async function sendShortfallList(sequelize: Sequelize, smtp: SmtpSettings, buildId: number, to: string[], actorId: number | null): Promise<SendShortfallResponse> {
  const { lines, list } = await readShortfallList(buildId);
  if (!list) throw conflict(`Build ${buildId} has no shortfall list: everything it needs is in stock.`);
  const message = shortfallMessage(list.buildName, lines);
  const entry = await sendMail(
    smtp,
    { to, ...message, attachments: [{ filename: shortfallCsvFileName(buildId, list.buildName), content: shortfallCsv(lines), contentType: 'text/csv' }] },
    { purpose: 'shortfall-list', actorId },
  );
  return sequelize.transaction(async (transaction) => {
    const row = await ShortfallList.findByPk(list.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!row) throw conflict(`The shortfall list of build ${buildId} went away while it was being sent.`);
    const before = { status: row.status, sentTo: row.sentTo };
    if (row.status === 'draft') row.status = 'sent';
    row.sentTo = to.join(', ');
    row.sentAt = new Date();
    row.lastMailId = entry.id;
    await row.save({ transaction });
    await recordAudit(
      { actorId, action: 'shortfall.send', entityType: 'shortfall_list', entityId: row.id, before, after: { status: row.status, sentTo: row.sentTo, outboxId: entry.id } },
      transaction,
    );
    return { outboxId: entry.id, to, status: row.status };
  });
}
