/**
 * Single-use, expiring link tokens for invitations and password resets. A token is 32 random
 * bytes (256 bits, base64url, 43 characters); only its SHA-256 hash is stored, so a copy of the
 * database cannot be turned into working links. The hash is looked up by equality: with 256-bit
 * random tokens there is nothing to learn from timing.
 */
import { createHash, randomBytes } from 'node:crypto';
import { Op, type Sequelize, type Transaction } from 'sequelize';
import type { AccountLinkCheck, AccountLinkPurpose } from '../../../shared/api/account-links.js';
import { User, UserToken } from '../../models/index.js';
import { HttpError } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { hashPassword } from './password.js';

/** Random bytes in a token. */
const TOKEN_BYTES = 32;
/** What a well-formed token looks like: base64url of `TOKEN_BYTES` bytes, no padding. */
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

/** Lower-case hex SHA-256 of `token`, as stored in `user_tokens.token_hash`. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** What `issueUserToken` needs. */
export interface IssueUserToken {
  userId: number;
  purpose: AccountLinkPurpose;
  expiresAt: Date;
  /** The admin sending the link. */
  createdBy: number | null;
}

/**
 * Creates a token for `input.userId` and returns the token itself (to put in the link; it is not
 * kept anywhere) with its stored record. `expiresAt` may lie in the past (tests use that).
 */
export async function issueUserToken(input: IssueUserToken, transaction?: Transaction): Promise<{ token: string; record: UserToken }> {
  const token = randomBytes(TOKEN_BYTES).toString('base64url');
  const record = await UserToken.create(
    { userId: input.userId, purpose: input.purpose, tokenHash: hashLinkToken(token), expiresAt: input.expiresAt, usedAt: null, revokedAt: null, createdBy: input.createdBy },
    { transaction },
  );
  return { token, record };
}

/**
 * Revokes the user's tokens that could still be used, of `purpose` (or of every purpose when it
 * is left out), except the one with id `exceptId`. Returns how many were revoked.
 */
export async function revokeOpenTokens(
  userId: number,
  options: { purpose?: AccountLinkPurpose; exceptId?: number; now?: Date },
  transaction?: Transaction,
): Promise<number> {
  const [count] = await UserToken.update(
    { revokedAt: options.now ?? new Date() },
    {
      where: {
        userId,
        usedAt: null,
        revokedAt: null,
        ...(options.purpose ? { purpose: options.purpose } : {}),
        ...(options.exceptId !== undefined ? { id: { [Op.ne]: options.exceptId } } : {}),
      },
      transaction,
    },
  );
  return count;
}

/** 400 or 410 or 409 for a link that cannot be used, saying why and what to do. */
const linkErrors = {
  invalid: () => new HttpError(400, 'token_invalid', 'This set-password link is not valid: check that the whole address was copied from the e-mail, or ask an admin for a new one.', [{ field: 'token', message: 'unknown or malformed' }]),
  used: () => new HttpError(410, 'token_used', 'This set-password link has already been used. Sign in with the password you chose, or ask an admin for a new link.', [{ field: 'token', message: 'already used' }]),
  replaced: () => new HttpError(410, 'token_replaced', 'This set-password link was replaced: a newer link was sent or the password was changed since. Use the newest e-mail, or ask an admin for a new link.', [{ field: 'token', message: 'replaced' }]),
  expired: (at: Date) => new HttpError(410, 'token_expired', `This set-password link expired at ${at.toISOString()}. Ask an admin to send a new one.`, [{ field: 'token', message: 'expired' }]),
  deactivated: () => new HttpError(409, 'account_deactivated', 'This account is deactivated, so its password cannot be set. Ask an admin to reactivate it first.', [{ field: 'token', message: 'account deactivated' }]),
};

/** Finds the token's record and its user, or throws why the link cannot be used at `now`. */
async function usableToken(token: string, now: Date, transaction?: Transaction): Promise<{ record: UserToken; user: User }> {
  if (!TOKEN_PATTERN.test(token)) throw linkErrors.invalid();
  const record = await UserToken.findOne({
    where: { tokenHash: hashLinkToken(token) },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!record) throw linkErrors.invalid();
  if (record.usedAt) throw linkErrors.used();
  if (record.revokedAt) throw linkErrors.replaced();
  if (record.expiresAt.getTime() <= now.getTime()) throw linkErrors.expired(record.expiresAt);
  const user = await User.findByPk(record.userId, { transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
  if (!user) throw linkErrors.invalid();
  if (!user.active) throw linkErrors.deactivated();
  return { record, user };
}

/** Whom a link is for, without using it; throws as `setPasswordWithToken` would. */
export async function checkUserToken(token: string, now = new Date()): Promise<AccountLinkCheck> {
  const { record, user } = await usableToken(token, now);
  return { email: user.email, name: user.name, purpose: record.purpose, expiresAt: record.expiresAt.toISOString() };
}

/**
 * Sets the password of the token's user and uses the token up, in one transaction with the token
 * row locked, so two requests with the same link cannot both succeed. Every other open link of
 * the user is revoked with it, and the change is audited with the user as actor.
 */
export async function setPasswordWithToken(sequelize: Sequelize, token: string, password: string): Promise<User> {
  if (!TOKEN_PATTERN.test(token)) throw linkErrors.invalid();
  // argon2id takes a while; hash before taking the row locks.
  const passwordHash = await hashPassword(password);
  return sequelize.transaction(async (transaction) => {
    const now = new Date();
    const { record, user } = await usableToken(token, now, transaction);
    user.passwordHash = passwordHash;
    await user.save({ transaction });
    record.usedAt = now;
    await record.save({ transaction });
    const revoked = await revokeOpenTokens(user.id, { exceptId: record.id, now }, transaction);
    await recordAudit(
      { actorId: user.id, action: 'user.set_password', entityType: 'user', entityId: user.id, after: { purpose: record.purpose, tokenId: Number(record.id), otherLinksRevoked: revoked } },
      transaction,
    );
    return user;
  });
}
