import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';

import type { AccountLinkPurpose } from '../../../shared/api/account-links.js';
import { ROLES, type Role, type UpdateUserRequest, type User } from '../../../shared/api/auth.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { isAnnouncedByInterceptor } from '../auth/auth-interceptor.js';
import { AuthSession } from '../auth/auth-session.js';
import { NewUserForm } from './new-user-form.js';
import { UserDirectory } from './user-directory.js';

/** How long a confirmation or failure notice stays, in milliseconds. */
const NOTICE_MS = 5000;

/** The Admin page: every user with their role and state, and a form to add one. */
@Component({
  selector: 'sm-admin-page',
  templateUrl: './admin-page.html',
  styleUrl: './admin-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatCardModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    MatTooltipModule,
    NewUserForm,
  ],
})
export class AdminPage {
  private readonly directory = inject(UserDirectory);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(AuthSession);

  protected readonly roles = ROLES;
  protected readonly columns = ['name', 'email', 'role', 'status', 'actions'];
  protected readonly users = signal<User[]>([]);
  /** Whether the user list is being fetched. */
  protected readonly loading = signal(true);
  /** Why the user list could not be fetched, or null. */
  protected readonly loadError = signal<string | null>(null);
  /** Ids of users with a change on its way. */
  protected readonly busyIds = signal<ReadonlySet<number>>(new Set());
  /** Users created this moment to be invited (their invitation is on its way). */
  private readonly invitedNow = new Set<number>();
  /** The signed-in admin's id: they may not demote or deactivate themselves here. */
  protected readonly ownId = computed(() => this.session.currentUser()?.id ?? null);

  constructor() {
    void this.loadUsers();
  }

  protected async loadUsers(): Promise<void> {
    this.loading.set(true);
    this.loadError.set(null);
    try {
      this.users.set(sortByName(await this.directory.listUsers()));
    } catch (error: unknown) {
      this.loadError.set(apiErrorMessage(error, 'The user list could not be loaded.'));
    } finally {
      this.loading.set(false);
    }
  }

  protected addCreatedUser(user: User): void {
    this.users.update((list) => sortByName([...list.filter((other) => other.id !== user.id), user]));
    // A user created to be invited cannot sign in yet; the invitation's own notice follows.
    if (this.invitedNow.has(user.id)) this.snackBar.open(`${user.name} was added as ${user.role}; sending the invitation…`, 'Close', { duration: NOTICE_MS });
    else this.snackBar.open(`${user.name} can now sign in as ${user.role}.`, 'Close', { duration: NOTICE_MS });
  }

  /** Invites a user just created without a password. */
  protected inviteCreatedUser(user: User): void {
    this.invitedNow.add(user.id);
    void this.sendLink(user, 'invitation').finally(() => this.invitedNow.delete(user.id));
  }

  protected changeRole(user: User, role: Role): Promise<void> {
    return this.applyChange(user, { role }, `${user.name} is now ${role}.`);
  }

  protected setActive(user: User, active: boolean): Promise<void> {
    const done = active ? `${user.name} may sign in again.` : `${user.name} can no longer sign in.`;
    return this.applyChange(user, { active }, done);
  }

  /** E-mails `user` a single-use link to choose a password, and says until when it works. */
  protected async sendLink(user: User, purpose: AccountLinkPurpose): Promise<void> {
    const what = purpose === 'invitation' ? 'invitation' : 'password reset';
    this.busyIds.update((ids) => new Set(ids).add(user.id));
    try {
      const sent = await this.directory.sendAccountLink(user.id, purpose);
      const until = new Date(sent.expiresAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
      this.snackBar.open(`${capitalise(what)} sent to ${sent.email}; the link works once, until ${until}.`, 'Close', { duration: NOTICE_MS });
    } catch (error: unknown) {
      if (!isAnnouncedByInterceptor(error)) {
        this.snackBar.open(apiErrorMessage(error, `The ${what} to ${user.email} was not sent.`), 'Close', { duration: NOTICE_MS });
      }
    } finally {
      this.busyIds.update((ids) => {
        const next = new Set(ids);
        next.delete(user.id);
        return next;
      });
    }
  }

  protected isBusy(id: number): boolean {
    return this.busyIds().has(id);
  }

  private async applyChange(user: User, change: UpdateUserRequest, done: string): Promise<void> {
    this.busyIds.update((ids) => new Set(ids).add(user.id));
    try {
      const updated = await this.directory.updateUser(user.id, change);
      this.replaceUser(updated);
      this.snackBar.open(done, 'Close', { duration: NOTICE_MS });
    } catch (error: unknown) {
      // A fresh copy makes the table redraw the row, so a role picker shows the old role again.
      this.replaceUser({ ...user });
      if (!isAnnouncedByInterceptor(error)) {
        this.snackBar.open(apiErrorMessage(error, `The change to ${user.name} was not saved.`), 'Close', {
          duration: NOTICE_MS,
        });
      }
    } finally {
      this.busyIds.update((ids) => {
        const next = new Set(ids);
        next.delete(user.id);
        return next;
      });
    }
  }

  private replaceUser(user: User): void {
    this.users.update((list) => list.map((other) => (other.id === user.id ? user : other)));
  }
}

/** Users ordered by name as people read them, then by e-mail. */
function sortByName(users: User[]): User[] {
  return [...users].sort((a, b) => a.name.localeCompare(b.name) || a.email.localeCompare(b.email));
}

/** `text` with its first letter in capitals. */
function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
