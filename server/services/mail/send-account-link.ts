/**
 * Admin use case: e-mail a user a single-use link to choose a password, as an invitation or a
 * password reset. Issues the token, sends through `sendMail`, and audits the attempt.
 */
import type { Sequelize } from 'sequelize';
import type { AccountLinkPurpose, AccountLinkSent } from '../../../shared/api/account-links.js';
import type { ServerConfig } from '../../config.js';
import { User } from '../../models/index.js';
import { conflict, notFound } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { issueUserToken, revokeOpenTokens } from '../users/user-tokens.js';
import { accountLinkMessage, setPasswordLink } from '../../mail/account-link-message.js';
import { MailDeliveryError, sendMail } from './send-mail.js';

/** The audit action of each purpose. */
const AUDIT_ACTION: Record<AccountLinkPurpose, string> = {
  invitation: 'user.invite',
  'password-reset': 'user.password_reset',
};

/**
 * Sends user `userId` a link of `purpose`, valid for the configured time
 * (`config.accountLinks`). On success the user's older open links of the same purpose are
 * revoked, so only the newest works. When the mail cannot be sent, the new token is revoked
 * (nobody has it), the Outbox entry says `failed`, the attempt is audited, and the
 * `MailDeliveryError` (503/502) is thrown on. 404 for an unknown user, 409 for a deactivated one.
 */
export async function sendAccountLink(
  sequelize: Sequelize,
  config: Pick<ServerConfig, 'smtp' | 'publicUrl' | 'accountLinks'>,
  actor: User,
  userId: number,
  purpose: AccountLinkPurpose,
): Promise<AccountLinkSent> {
  const user = await User.findByPk(userId);
  if (!user) throw notFound(`User ${userId}`);
  if (!user.active) {
    throw conflict(`${user.email} is deactivated; reactivate the account before sending it a link.`, [{ field: 'id', message: 'user is deactivated' }]);
  }
  const ttlMs = purpose === 'invitation' ? config.accountLinks.invitationTtlMs : config.accountLinks.passwordResetTtlMs;
  const expiresAt = new Date(Date.now() + ttlMs);
  const { token, record } = await issueUserToken({ userId: user.id, purpose, expiresAt, createdBy: actor.id });
  const mail = accountLinkMessage({
    purpose,
    recipient: { email: user.email, name: user.name, role: user.role },
    sender: { name: actor.name, email: actor.email },
    link: setPasswordLink(config.publicUrl, token),
    expiresAt,
  });

  let outboxId: number;
  let failure: MailDeliveryError | undefined;
  try {
    // The token goes to the user only; the Outbox keeps the message with the token hidden.
    outboxId = (await sendMail(config.smtp, mail, { purpose, actorId: actor.id, redact: [token] })).id;
  } catch (error) {
    if (!(error instanceof MailDeliveryError)) {
      // Not sent (e.g. the database went away): the new link must not work later.
      await record.update({ revokedAt: new Date() }).catch(() => undefined);
      throw error;
    }
    failure = error;
    outboxId = error.outboxId;
  }

  await sequelize.transaction(async (transaction) => {
    if (failure) {
      record.revokedAt = new Date();
      await record.save({ transaction });
    } else {
      await revokeOpenTokens(user.id, { purpose, exceptId: record.id }, transaction);
    }
    await recordAudit(
      {
        actorId: actor.id,
        action: AUDIT_ACTION[purpose],
        entityType: 'user',
        entityId: user.id,
        after: { email: user.email, tokenId: Number(record.id), expiresAt: expiresAt.toISOString(), outboxId, mailStatus: failure ? 'failed' : 'sent' },
      },
      transaction,
    );
  });
  if (failure) throw failure;
  return { userId: user.id, email: user.email, purpose, expiresAt: expiresAt.toISOString(), outboxId };
}
