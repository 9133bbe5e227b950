/** Request and response shapes of the sign-in and user routes (handbook api.md, "Sign-in"). */

/** The four roles; each may change only what product.md gives it. */
export type Role = 'admin' | 'designer' | 'stores' | 'purchasing';

/** Every role, in the order screens list them. */
export const ROLES: readonly Role[] = ['admin', 'designer', 'stores', 'purchasing'];

/** A user as the API shows it (never the hash). */
export interface User {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** Whether the user may sign in; a deactivated user's tokens stop working. */
  active: boolean;
  /** Extension: whether the user has a password; false until an invited user chooses one. */
  passwordSet: boolean;
}

/** `POST /api/auth/login` body. */
export interface LoginRequest {
  email: string;
  password: string;
}

/** `POST /api/auth/login` answer. */
export interface LoginResponse {
  token: string;
  user: User;
}

/** `POST /api/users` body (admin only). */
export interface CreateUserRequest {
  email: string;
  name: string;
  role: Role;
  /**
   * A first password (10+ characters). Extension: leave it out to create the user without one;
   * they cannot sign in until they set one from an invitation (`POST /api/users/:id/invitation`).
   */
  password?: string;
}

/** `PATCH /api/users/:id` body (admin only). */
export interface UpdateUserRequest {
  role?: Role;
  active?: boolean;
  name?: string;
}

/** `GET /api/health` answer: `busy` when PostgreSQL answers but every connection is in use. */
export interface HealthResponse {
  status: 'ok' | 'degraded' | 'busy';
  database: 'up' | 'down' | 'busy';
}
