import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';

import type { AccountLinkPurpose, AccountLinkSent } from '../../../shared/api/account-links.js';
import type { CreateUserRequest, UpdateUserRequest, User } from '../../../shared/api/auth.js';

/** The users of the organisation, through the admin-only `/api/users` routes (api.md). */
@Injectable({ providedIn: 'root' })
export class UserDirectory {
  private readonly http = inject(HttpClient);

  /**
   * Every user, active or not (`GET /api/users`). api.md does not fix the list's envelope, so
   * both a bare array and the `{items}` envelope of the other list routes are read.
   */
  async listUsers(): Promise<User[]> {
    const answer = await firstValueFrom(this.http.get<User[] | { items: User[] }>('/api/users'));
    if (Array.isArray(answer)) return answer;
    if (answer && Array.isArray(answer.items)) return answer.items;
    throw new Error('UserDirectory: GET /api/users answered neither a list nor {items: [...]}.');
  }

  /** Creates a user with a role and a first password (`POST /api/users`). */
  createUser(request: CreateUserRequest): Promise<User> {
    return firstValueFrom(this.http.post<User>('/api/users', request));
  }

  /**
   * E-mails the user a single-use link to choose a password: an invitation
   * (`POST /api/users/:id/invitation`) or a password reset (`POST /api/users/:id/password-reset`).
   */
  sendAccountLink(id: number, purpose: AccountLinkPurpose): Promise<AccountLinkSent> {
    return firstValueFrom(this.http.post<AccountLinkSent>(`/api/users/${encodeURIComponent(id)}/${purpose}`, {}));
  }

  /** Changes a user's role, name or whether they may sign in (`PATCH /api/users/:id`). */
  updateUser(id: number, change: UpdateUserRequest): Promise<User> {
    return firstValueFrom(this.http.patch<User>(`/api/users/${encodeURIComponent(id)}`, change));
  }
}
