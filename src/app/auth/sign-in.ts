import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal, viewChild } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router } from '@angular/router';

import { apiErrorMessage } from '../api/api-error-message.js';
import { AuthSession } from './auth-session.js';
import { homeUrlFor, mayReturnTo } from './role-access.js';

/** Shown for a 401 from sign-in when the server's answer carries no message of its own. */
export const WRONG_CREDENTIALS_MESSAGE = 'That e-mail and password do not match an active account.';

/** The sign-in page: e-mail and password, one message for any wrong credential. */
@Component({
  selector: 'sm-sign-in',
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
})
export class SignIn {
  /** Where to go after signing in (the `returnUrl` query parameter), if the role may go there. */
  readonly returnUrl = input<string>();

  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly formDirective = viewChild.required(FormGroupDirective);

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });

  /** Whether a sign-in request is on its way. */
  protected readonly pending = signal(false);
  /** Why the last attempt failed, or null. */
  protected readonly errorMessage = signal<string | null>(null);
  /** Whether the password is shown in clear. */
  protected readonly passwordVisible = signal(false);

  protected togglePasswordVisibility(): void {
    this.passwordVisible.update((visible) => !visible);
  }

  protected async signIn(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.errorMessage.set(null);
    try {
      const user = await this.session.signIn(this.form.getRawValue());
      const wanted = this.returnUrl();
      await this.router.navigateByUrl(mayReturnTo(user.role, wanted) ? wanted : homeUrlFor(user.role));
    } catch (error: unknown) {
      this.errorMessage.set(signInFailureMessage(error));
      // Clear the password and the submitted state, so "Enter your password" does not show too.
      this.formDirective().resetForm({ email: this.form.controls.email.value, password: '' });
    } finally {
      this.pending.set(false);
    }
  }
}

/** The sentence for a failed sign-in; the server's words first, since it knows the reason. */
function signInFailureMessage(error: unknown): string {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 401) return apiErrorMessage(error, WRONG_CREDENTIALS_MESSAGE);
    if (error.status === 429) {
      return apiErrorMessage(error, 'Too many sign-in attempts. Wait a minute, then try again.');
    }
    if (error.status === 503) {
      return apiErrorMessage(error, 'The Shelfmatch database is unavailable right now. Try again in a minute.');
    }
  }
  return apiErrorMessage(error, 'Sign-in failed for a reason the server did not give. Try again.');
}
