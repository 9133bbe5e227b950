/**
 * Sign-in tokens: HS256 JWTs carrying the user id. The role and the active flag are read from the
 * database on every request, so a role change or a deactivation takes effect at once.
 */
import jwt from 'jsonwebtoken';

/** Signs a token for `userId` that lives `ttl` (jsonwebtoken's format: `8h`, `30m`). */
export function signToken(userId: number, secret: string, ttl: string): string {
  return jwt.sign({}, secret, { subject: String(userId), expiresIn: ttl as jwt.SignOptions['expiresIn'], algorithm: 'HS256' });
}
