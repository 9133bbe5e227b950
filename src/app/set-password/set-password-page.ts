import { ChangeDetectionStrategy, Component, OnInit, inject, input, signal } from '@angular/core';
import { AbstractControl, NonNullableFormBuilder, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { MIN_PASSWORD_LENGTH, type AccountLinkCheck } from '../../../shared/api/account-links.js';
import { apiErrorCode, apiErrorDetails, apiErrorMessage } from '../api/api-error-message.js';
import { AccountLink } from './account-link.js';

/** Error codes after which the link can no longer be used, whatever the password. */
const UNUSABLE_LINK_CODES = ['token_invalid', 'token_used', 'token_replaced', 'token_expired', 'account_deactivated'];

/** Where the page is: checking the link, asking for the password, done, or the link cannot be used. */
type PageState =
  | { step: 'checking' }
  | { step: 'choose'; link: AccountLinkCheck }
  | { step: 'done'; email: string }
  | { step: 'unusable'; message: string };

/** The two password fields must hold the same text. */
function sameTwice(group: AbstractControl): ValidationErrors | null {
  const { password, repeat } = group.value as { password: string; repeat: string };
  return repeat && password !== repeat ? { mismatch: true } : null;
}

/**
 * The page an invitation or password-reset e-mail links to (`/set-password?token=...`): it
 * checks the link, lets the person choose a password once, then sends them to sign in.
 */
@Component({
  selector: 'sm-set-password-page',
  templateUrl: './set-password-page.html',
  styleUrl: './set-password-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule],
})
export class SetPasswordPage implements OnInit {
  /** The link token, from the `token` query parameter. */
  readonly token = input<string>();

  private readonly accountLink = inject(AccountLink);

  protected readonly minPasswordLength = MIN_PASSWORD_LENGTH;
  protected readonly state = signal<PageState>({ step: 'checking' });
  /** Whether the new password is on its way. */
  protected readonly pending = signal(false);
  /** Why the last attempt failed while the link still works, or null. */
  protected readonly errorMessage = signal<string | null>(null);
  /** Whether the passwords are shown in clear. */
  protected readonly passwordVisible = signal(false);
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH), Validators.maxLength(1024)]],
      repeat: ['', Validators.required],
    },
    { validators: sameTwice },
  );

  ngOnInit(): void {
    void this.checkLink();
  }

  protected togglePasswordVisibility(): void {
    this.passwordVisible.update((visible) => !visible);
  }

  protected async savePassword(): Promise<void> {
    const token = this.token();
    if (this.pending() || !token || this.state().step !== 'choose') return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.errorMessage.set(null);
    try {
      const answer = await this.accountLink.setPassword(token, this.form.getRawValue().password);
      this.state.set({ step: 'done', email: answer.email });
    } catch (error: unknown) {
      if (UNUSABLE_LINK_CODES.includes(apiErrorCode(error) ?? '')) {
        this.state.set({ step: 'unusable', message: apiErrorMessage(error, 'This link can no longer be used.') });
      } else {
        const passwordProblem = apiErrorDetails(error).find((detail) => detail.field === 'password');
        this.errorMessage.set(passwordProblem?.message ?? apiErrorMessage(error, 'The password was not saved, and the server did not say why. Try again.'));
      }
    } finally {
      this.pending.set(false);
    }
  }

  private async checkLink(): Promise<void> {
    const token = this.token()?.trim();
    if (!token) {
      this.state.set({ step: 'unusable', message: 'This address has no link token. Open the link from your e-mail again, or ask an admin for a new one.' });
      return;
    }
    try {
      this.state.set({ step: 'choose', link: await this.accountLink.check(token) });
    } catch (error: unknown) {
      this.state.set({ step: 'unusable', message: apiErrorMessage(error, 'This link could not be checked. Try again in a minute.') });
    }
  }
}
