/** Checks an e-mail and password; unknown e-mail and wrong password fail alike. */
import { User } from '../../models/index.js';
import { unauthorized } from '../../errors.js';
import { dummyPasswordHash, verifyPassword } from './password.js';

/** The one message for every failed sign-in, so it never tells which part was wrong. */
export const SIGN_IN_FAILED = 'That e-mail and password do not match an active account.';

/** Returns the active user with `email` and `password`, or throws the same 401 for any mismatch. */
export async function signIn(email: string, password: string): Promise<User> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = await verifyPassword(user?.passwordHash ?? (await dummyPasswordHash()), password);
  if (!user || !user.passwordHash || !ok || !user.active) throw unauthorized(SIGN_IN_FAILED);
  return user;
}
