import { ChangeDetectionStrategy, Component, inject, output, signal, viewChild } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { ROLES, type Role, type User } from '../../../shared/api/auth.js';
import { apiErrorDetails, apiErrorMessage } from '../api/api-error-message.js';
import { isAnnouncedByInterceptor } from '../auth/auth-interceptor.js';
import { UserDirectory } from './user-directory.js';

/** Shortest first password the form accepts: the server's rule for `POST /api/users`. */
export const MIN_PASSWORD_LENGTH = 10;

/** Form fields the server may name in `details[].field`. */
type NewUserField = 'email' | 'name' | 'role' | 'password';

/** The admin's form to create a user with a role, and either a first password or an e-mailed invitation. */
@Component({
  selector: 'sm-new-user-form',
  templateUrl: './new-user-form.html',
  styleUrl: './new-user-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule],
})
export class NewUserForm {
  /** Emits each user the server has created. */
  readonly userCreated = output<User>();
  /** Emits a user created without a first password, who is to be e-mailed an invitation. */
  readonly inviteRequested = output<User>();

  private readonly directory = inject(UserDirectory);
  private readonly formDirective = viewChild.required(FormGroupDirective);

  protected readonly roles = ROLES;
  protected readonly minPasswordLength = MIN_PASSWORD_LENGTH;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    name: ['', [Validators.required, Validators.maxLength(120)]],
    role: ['designer' as Role, Validators.required],
    // Optional: left empty, the user is invited by e-mail to choose their own.
    password: ['', [Validators.minLength(MIN_PASSWORD_LENGTH)]],
  });
  /** Whether the form will invite rather than set a first password. */
  protected readonly invites = signal(true);

  constructor() {
    this.form.controls.password.valueChanges.subscribe((password) => this.invites.set(password === ''));
  }

  /** Whether the create request is on its way. */
  protected readonly pending = signal(false);
  /** Why the last attempt failed, or null. */
  protected readonly errorMessage = signal<string | null>(null);
  /** Problems the server located in one field, by field. */
  protected readonly fieldProblems = signal<Partial<Record<NewUserField, string>>>({});

  protected async createUser(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.errorMessage.set(null);
    this.fieldProblems.set({});
    try {
      const { password, ...raw } = this.form.getRawValue();
      const user = await this.directory.createUser({ ...raw, email: raw.email.trim(), name: raw.name.trim(), ...(password === '' ? {} : { password }) });
      this.formDirective().resetForm({ email: '', name: '', role: 'designer', password: '' });
      // The invitation first, so the page knows of it when it hears of the new user.
      if (password === '') this.inviteRequested.emit(user);
      this.userCreated.emit(user);
    } catch (error: unknown) {
      this.showFailure(error);
    } finally {
      this.pending.set(false);
    }
  }

  private showFailure(error: unknown): void {
    const problems: Partial<Record<NewUserField, string>> = {};
    for (const detail of apiErrorDetails(error)) {
      if (detail.field && detail.field in this.form.controls) {
        problems[detail.field as NewUserField] = detail.message;
      }
    }
    this.fieldProblems.set(problems);
    this.errorMessage.set(
      isAnnouncedByInterceptor(error)
        ? 'The user was not created.'
        : apiErrorMessage(error, 'The user was not created, and the server did not say why.'),
    );
  }
}
