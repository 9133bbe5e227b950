import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';

import type { LoginRequest, LoginResponse, User } from '../../../shared/api/auth.js';
import { CREDENTIAL_CHECK } from './credential-check.js';

/** localStorage key under which the signed-in session survives a reload. */
export const SESSION_STORAGE_KEY = 'shelfmatch.session';

/** What is kept in localStorage: the bearer token and the user it was issued to. */
interface StoredSession {
  token: string;
  user: User;
}

/**
 * The signed-in session: the bearer token (kept in localStorage so a reload stays signed in) and
 * the current user as a signal. The HTTP interceptor reads the token; guards and the layout read
 * the user.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly session = signal<StoredSession | null>(readStoredSession());

  /** The bearer token of the session, or null when signed out. */
  readonly token = computed(() => this.session()?.token ?? null);

  /** The signed-in user, or null when signed out. */
  readonly currentUser = computed(() => this.session()?.user ?? null);

  /** Whether someone is signed in. */
  readonly isSignedIn = computed(() => this.session() !== null);

  /**
   * Signs in with `POST /api/auth/login` and keeps the token. Rejects with the
   * `HttpErrorResponse` on failure (401 for any wrong credential), leaving the session signed out.
   */
  async signIn(credentials: LoginRequest): Promise<User> {
    const answer = await firstValueFrom(
      this.http.post<LoginResponse>('/api/auth/login', credentials, {
        context: new HttpContext().set(CREDENTIAL_CHECK, true),
      }),
    );
    this.keep({ token: answer.token, user: answer.user });
    return answer.user;
  }

  /**
   * Asks the server who the token belongs to (`GET /api/auth/me`) and updates the user, so a
   * role changed by an admin shows after a reload. A 401 ends the session; any other failure
   * (server down) keeps the stored user, so the app still opens.
   */
  async refreshCurrentUser(): Promise<void> {
    const token = this.token();
    if (!token) return;
    try {
      const user = await firstValueFrom(this.http.get<User>('/api/auth/me'));
      // The token may have changed while the request was in flight (sign-out, another sign-in).
      if (this.token() === token) this.keep({ token, user });
    } catch (error: unknown) {
      if (error instanceof HttpErrorResponse && error.status === 401 && this.token() === token) {
        this.signOut();
      }
    }
  }

  /** Forgets the token and the user, here and in localStorage. */
  signOut(): void {
    this.session.set(null);
    localStorage.removeItem(SESSION_STORAGE_KEY);
  }

  private keep(session: StoredSession): void {
    this.session.set(session);
    localStorage.setItem(SESSION_STORAGE_KEY, JSON.stringify(session));
  }
}

/** The session stored by an earlier page load, unless it is missing, malformed or expired. */
function readStoredSession(): StoredSession | null {
  let parsed: unknown;
  try {
    parsed = JSON.parse(localStorage.getItem(SESSION_STORAGE_KEY) ?? 'null');
  } catch {
    parsed = null;
  }
  const session = parsed as Partial<StoredSession> | null;
  const valid =
    typeof session?.token === 'string' &&
    typeof session.user?.role === 'string' &&
    !isExpired(session.token, Date.now());
  if (!valid) {
    localStorage.removeItem(SESSION_STORAGE_KEY);
    return null;
  }
  return session as StoredSession;
}

/**
 * Whether a JWT's `exp` claim (seconds since the Unix epoch, RFC 7519 section 4.1.4) lies at or
 * before `nowMs`. A token whose payload cannot be read counts as not expired: the server decides.
 */
export function isExpired(token: string, nowMs: number): boolean {
  const payload = token.split('.')[1];
  if (!payload) return false;
  try {
    const json = atob(payload.replace(/-/g, '+').replace(/_/g, '/'));
    const exp = (JSON.parse(json) as { exp?: unknown }).exp;
    return typeof exp === 'number' && exp * 1000 <= nowMs;
  } catch {
    return false;
  }
}
