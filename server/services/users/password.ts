/** Password hashing with argon2id (OWASP's first choice for password storage). */
import argon2 from 'argon2';

/** Hashes `password` with argon2id and the library's default cost (m=64 MiB, t=3, p=4). */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

/** Whether `password` matches `hash`; false (never a throw) for a malformed hash. */
export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;
/** A hash to verify against when the e-mail is unknown, so both failures take the same time. */
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword('not-a-real-password-but-same-cost');
  return dummyHash;
}
