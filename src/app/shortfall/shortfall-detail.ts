import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';

import type { Role } from '../../../shared/api/auth.js';
import { SHORTFALL_STATUSES, type ShortfallListResponse, type ShortfallStatus } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { AuthSession } from '../auth/auth-session.js';
import { BuildClient, saveBlob } from '../builds/build-client.js';
import { SHORTFALL_STATUS_WORDS, lossDbText, reasonWord } from '../builds/build-words.js';
import { partValueText, toleranceText } from '../stock/part-notation.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { ShortfallReceiveForm } from './shortfall-receive-form.js';

/** Roles that send lists and set their status (product.md: purchasing; admin may do everything). */
export const SHORTFALL_PURCHASING_ROLES: readonly Role[] = ['purchasing', 'admin'];
/** Roles that receive bought parts into stock. */
export const SHORTFALL_RECEIVING_ROLES: readonly Role[] = ['purchasing', 'stores', 'admin'];

/** One shortfall list: its lines to buy, status, CSV export, sending by e-mail and receiving into stock. */
@Component({
  selector: 'sm-shortfall-detail',
  templateUrl: './shortfall-detail.html',
  styleUrl: './shortfall-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatTableModule, ShortfallReceiveForm],
})
export class ShortfallDetail {
  private readonly client = inject(BuildClient);
  private readonly session = inject(AuthSession);

  /** The build whose list this is. */
  readonly buildId = input.required<number>();
  /** The list as the server sent it. */
  readonly shortfall = input.required<ShortfallListResponse>();
  /** Emits the list after it changed (status, sent, received). */
  readonly changed = output<ShortfallListResponse | null>();

  protected readonly statuses = SHORTFALL_STATUSES;
  protected readonly statusWords = SHORTFALL_STATUS_WORDS;
  protected readonly reasonWord = reasonWord;
  protected readonly columns = ['line', 'quantity', 'kind', 'value', 'tolerance', 'srf', 'package', 'reason', 'received'];
  protected readonly valueText = partValueText;
  protected readonly toleranceWords = toleranceText;
  protected readonly lossDb = lossDbText;
  protected readonly sendTo = signal('');
  protected readonly receiving = signal(false);
  protected readonly busy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);

  private readonly role = computed(() => this.session.currentUser()?.role as Role);
  /** Whether the signed-in role may send and set the status. */
  protected readonly mayPurchase = computed(() => SHORTFALL_PURCHASING_ROLES.includes(this.role()));
  /** Whether the signed-in role may receive parts. */
  protected readonly mayReceive = computed(() => SHORTFALL_RECEIVING_ROLES.includes(this.role()));

  protected frequencyText(hz: number): string {
    return formatValue(hz, 'frequency', { significantDigits: 4 });
  }

  protected changeStatus(status: ShortfallStatus): void {
    this.busy.set(true);
    this.error.set(null);
    this.client.changeShortfallStatus(this.buildId(), status).subscribe({
      next: (list) => this.done(list, `Marked ${SHORTFALL_STATUS_WORDS[status].toLowerCase()}.`),
      error: (error: unknown) => this.fail(error, 'The status could not be changed.'),
    });
  }

  protected async exportList(): Promise<void> {
    this.error.set(null);
    try {
      const name = this.shortfall().list?.buildName ?? '';
      const safe = name.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
      saveBlob(await this.client.exportShortfall(this.buildId()), `shortfall-${safe ? `${safe}-` : ''}${this.buildId()}.csv`);
    } catch (error) {
      this.error.set(apiErrorMessage(error, 'The CSV could not be exported.'));
    }
  }

  protected sendList(): void {
    const to = this.sendTo().trim();
    if (!to) {
      this.error.set('Type the address to send the list to.');
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.client.sendShortfall(this.buildId(), to).subscribe({
      next: (answer) => {
        this.sendTo.set('');
        this.client.getShortfall(this.buildId()).subscribe({
          next: (list) => this.done(list, `Sent to ${answer.to.join(', ')} with the CSV attached.`),
          error: (error: unknown) => this.fail(error, 'The list was sent but could not be read again.'),
        });
      },
      error: (error: unknown) => this.fail(error, 'The list could not be sent.'),
    });
  }

  protected noteReceipt(list: ShortfallListResponse, importId: number): void {
    this.receiving.set(false);
    this.done(list, `Received into stock as stock import ${importId}.`);
  }

  private done(list: ShortfallListResponse, note: string): void {
    this.busy.set(false);
    this.message.set(note);
    this.changed.emit(list);
  }

  private fail(error: unknown, fallback: string): void {
    this.busy.set(false);
    this.error.set(apiErrorMessage(error, fallback));
  }
}
