/**
 * Shapes of the account-link routes: an admin sends a user an invitation or a password reset
 * (`POST /api/users/:id/invitation`, `POST /api/users/:id/password-reset`); the e-mailed link
 * opens `/set-password?token=...`, which checks and then uses the token
 * (`POST /api/auth/set-password/check`, `POST /api/auth/set-password`).
 */

/** What a link is for; both let the user choose a password, once, before it expires. */
export type AccountLinkPurpose = 'invitation' | 'password-reset';

/** Answer of the two admin routes: what was sent, to whom, and until when the link works. */
export interface AccountLinkSent {
  userId: number;
  email: string;
  purpose: AccountLinkPurpose;
  /** ISO 8601 time after which the link no longer works. */
  expiresAt: string;
  /** The Outbox entry of the e-mail. */
  outboxId: number;
}

/** `POST /api/auth/set-password/check` body. */
export interface AccountLinkCheckRequest {
  token: string;
}

/** `POST /api/auth/set-password/check` answer: whom the link is for. */
export interface AccountLinkCheck {
  email: string;
  name: string;
  purpose: AccountLinkPurpose;
  expiresAt: string;
}

/** `POST /api/auth/set-password` body. */
export interface SetPasswordRequest {
  token: string;
  password: string;
}

/** `POST /api/auth/set-password` answer: the password is set; the user signs in next. */
export interface SetPasswordResponse {
  email: string;
}

/** Shortest password the set-password page and route accept, in characters. */
export const MIN_PASSWORD_LENGTH = 10;
