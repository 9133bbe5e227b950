import type { Role, User } from '../../../shared/api/auth.js';
import { SESSION_STORAGE_KEY } from '../auth/auth-session.js';

/** An invented user of the demo company for specs, with the given role. */
export function demoUser(role: Role, id = 7): User {
  return { id, email: `${role}@tarnwick.example`, name: `Demo ${role}`, role, active: true, passwordSet: true };
}

/**
 * A JWT-shaped token (header.payload.signature, base64url) whose `exp` claim is `expSeconds`;
 * the signature is not real: the client never checks it, only the server does.
 */
export function tokenExpiringAt(expSeconds: number, subject = '7'): string {
  const encode = (value: object) =>
    btoa(JSON.stringify(value)).replace(/=+$/, '').replace(/\+/g, '-').replace(/\//g, '_');
  return `${encode({ alg: 'HS256', typ: 'JWT' })}.${encode({ sub: subject, exp: expSeconds })}.c2lnbmF0dXJl`;
}

/** A token valid for the next hour. */
export function freshToken(): string {
  return tokenExpiringAt(Math.floor(Date.now() / 1000) + 3600);
}

/**
 * Puts a session into localStorage as an earlier sign-in would have, so an `AuthSession`
 * created afterwards starts signed in as `user`.
 */
export function storeSession(user: User, token = freshToken()): string {
  localStorage.setItem(SESSION_STORAGE_KEY, JSON.stringify({ token, user }));
  return token;
}
