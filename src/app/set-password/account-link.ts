import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';

import type { AccountLinkCheck, SetPasswordResponse } from '../../../shared/api/account-links.js';
import { CREDENTIAL_CHECK } from '../auth/credential-check.js';

/**
 * The e-mailed set-password link, through the public `/api/auth/set-password` routes. The token
 * is a credential of its own, so every failure is left to the page (no sign-in redirect, no
 * snack bar from the interceptor).
 */
@Injectable({ providedIn: 'root' })
export class AccountLink {
  private readonly http = inject(HttpClient);

  /** Whom the link is for, without using it (`POST /api/auth/set-password/check`). */
  check(token: string): Promise<AccountLinkCheck> {
    return firstValueFrom(this.http.post<AccountLinkCheck>('/api/auth/set-password/check', { token }, { context: credentialCheck() }));
  }

  /** Sets the password and uses the link up (`POST /api/auth/set-password`). */
  setPassword(token: string, password: string): Promise<SetPasswordResponse> {
    return firstValueFrom(this.http.post<SetPasswordResponse>('/api/auth/set-password', { token, password }, { context: credentialCheck() }));
  }
}

function credentialCheck(): HttpContext {
  return new HttpContext().set(CREDENTIAL_CHECK, true);
}
