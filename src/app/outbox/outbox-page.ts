import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';

import type { MailPurpose, MailStatus, OutboxEntry, OutboxMessage } from '../../../shared/api/outbox.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { OutboxLog } from './outbox-log.js';

/** Entries per page. */
const PAGE_SIZE = 25;

/** How each purpose reads in the table. */
const PURPOSE_LABELS: Readonly<Record<MailPurpose, string>> = {
  invitation: 'Invitation',
  'password-reset': 'Password reset',
  'shortfall-list': 'Shortfall list',
};

/** How each status reads, and its icon. */
const STATUS_LOOK: Readonly<Record<MailStatus, { label: string; icon: string }>> = {
  sent: { label: 'Sent', icon: 'check_circle' },
  failed: { label: 'Failed', icon: 'error' },
  sending: { label: 'Sending', icon: 'schedule' },
};

/** What the body panel of an opened entry shows. */
type BodyState = { state: 'loading' } | { state: 'ready'; message: OutboxMessage } | { state: 'failed'; reason: string };

/**
 * The Outbox (admins): every e-mail Shelfmatch sent or tried to send, newest first, with its
 * status; opening an entry shows its bodies and attachments.
 */
@Component({
  selector: 'sm-outbox-page',
  templateUrl: './outbox-page.html',
  styleUrl: './outbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, MatButtonToggleModule, MatIconModule, MatPaginatorModule, MatProgressBarModule, MatTableModule],
})
export class OutboxPage {
  private readonly log = inject(OutboxLog);

  protected readonly columns = ['status', 'to', 'subject', 'purpose', 'time', 'open'];
  protected readonly pageSize = PAGE_SIZE;
  protected readonly entries = signal<OutboxEntry[]>([]);
  protected readonly total = signal(0);
  /** Zero-based page index, as the paginator counts. */
  protected readonly pageIndex = signal(0);
  /** The status filter, or '' for every status. */
  protected readonly statusFilter = signal<MailStatus | ''>('');
  /** Whether a page is being fetched. */
  protected readonly loading = signal(true);
  /** Why the list could not be fetched, or null. */
  protected readonly loadError = signal<string | null>(null);
  /** Id of the opened entry, or null. */
  protected readonly openId = signal<number | null>(null);
  /** Bodies fetched so far, by entry id. */
  protected readonly bodies = signal<ReadonlyMap<number, BodyState>>(new Map());

  constructor() {
    void this.loadPage();
  }

  protected async loadPage(): Promise<void> {
    this.loading.set(true);
    this.loadError.set(null);
    try {
      const status = this.statusFilter();
      const page = await this.log.list({ page: this.pageIndex() + 1, pageSize: PAGE_SIZE, ...(status ? { status } : {}) });
      this.entries.set(page.items);
      this.total.set(page.total);
    } catch (error: unknown) {
      this.loadError.set(apiErrorMessage(error, 'The Outbox could not be loaded.'));
    } finally {
      this.loading.set(false);
    }
  }

  protected filterByStatus(status: MailStatus | ''): Promise<void> {
    this.statusFilter.set(status);
    this.pageIndex.set(0);
    this.openId.set(null);
    return this.loadPage();
  }

  protected turnPage(event: PageEvent): Promise<void> {
    this.pageIndex.set(event.pageIndex);
    this.openId.set(null);
    return this.loadPage();
  }

  /** Opens `entry` (fetching its bodies the first time), or closes it when it is open. */
  protected async toggleEntry(entry: OutboxEntry): Promise<void> {
    if (this.openId() === entry.id) {
      this.openId.set(null);
      return;
    }
    this.openId.set(entry.id);
    const known = this.bodies().get(entry.id);
    if (known && known.state !== 'failed') return;
    this.setBody(entry.id, { state: 'loading' });
    try {
      this.setBody(entry.id, { state: 'ready', message: await this.log.read(entry.id) });
    } catch (error: unknown) {
      this.setBody(entry.id, { state: 'failed', reason: apiErrorMessage(error, 'This message could not be loaded.') });
    }
  }

  protected bodyOf(id: number): BodyState | undefined {
    return this.bodies().get(id);
  }

  protected purposeLabel(purpose: MailPurpose): string {
    return PURPOSE_LABELS[purpose] ?? purpose;
  }

  protected statusLook(status: MailStatus): { label: string; icon: string } {
    return STATUS_LOOK[status] ?? { label: status, icon: 'help' };
  }

  protected sizeLabel(bytes: number): string {
    return byteSize(bytes);
  }

  private setBody(id: number, state: BodyState): void {
    this.bodies.update((map) => new Map(map).set(id, state));
  }
}

/** `bytes` as people read file sizes: `812 B`, `4.3 kB`, `1.2 MB` (powers of 1000, SI prefixes). */
export function byteSize(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}
