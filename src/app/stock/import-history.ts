import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, model, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { of } from 'rxjs';

import type { PartChange, PartChangeKind, StockImportSummary } from '../../../shared/api/stock.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { FIELD_LABELS, changedFieldText } from './part-notation.js';
import { fetchedSignal } from './fetched-signal.js';
import { StockClient } from './stock-client.js';

/** Imports per history page. */
export const HISTORY_PAGE_SIZE = 10;
/** Changes per page of one import. */
export const CHANGES_PAGE_SIZE = 50;

/** How each kind of change reads. */
const CHANGE_LABELS: Readonly<Record<PartChangeKind, string>> = { created: 'New', updated: 'Changed', zeroed: 'Set to 0' };

/** The import history: every upload, newest first; pick one to see what it changed, part by part. */
@Component({
  selector: 'sm-import-history',
  templateUrl: './import-history.html',
  styleUrl: './import-history.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, MatButtonToggleModule, MatIconModule, MatPaginatorModule, MatProgressBarModule, MatTableModule],
})
export class ImportHistory {
  /** The import whose changes are shown, or null for none. */
  readonly selectedId = model<number | null>(null);
  /** Bumped by the page after an upload, so the history is fetched again. */
  readonly revision = input(0);

  private readonly client = inject(StockClient);

  protected readonly importColumns = ['when', 'who', 'file', 'mode', 'result'];
  protected readonly changeColumns = ['part', 'change', 'quantity', 'fields'];
  protected readonly historyPageSize = HISTORY_PAGE_SIZE;
  protected readonly changesPageSize = CHANGES_PAGE_SIZE;

  protected readonly historyPage = signal(0);
  protected readonly changesPage = signal(0);
  protected readonly changeFilter = signal<PartChangeKind | ''>('');

  private readonly reloads = signal(0);
  protected readonly imports = fetchedSignal(
    () => ({ page: this.historyPage() + 1, revision: this.revision(), reloads: this.reloads() }),
    ({ page }) => this.client.listImports(page, HISTORY_PAGE_SIZE),
  );
  protected readonly detail = fetchedSignal(
    () => ({ id: this.selectedId(), page: this.changesPage() + 1, change: this.changeFilter() || undefined, revision: this.revision(), reloads: this.reloads() }),
    ({ id, page, change }) => (id === null ? of(null) : this.client.getImport(id, page, CHANGES_PAGE_SIZE, change)),
  );

  protected readonly importRows = computed<StockImportSummary[]>(() => this.imports().value?.items ?? []);
  protected readonly importTotal = computed(() => this.imports().value?.total ?? 0);
  protected readonly opened = computed(() => {
    const detail = this.detail().value ?? null;
    return detail && detail.id === this.selectedId() ? detail : null;
  });
  /** Why the history or an import could not be loaded, or null. */
  protected readonly loadError = computed(() => {
    const error = this.imports().error ?? this.detail().error;
    return error ? apiErrorMessage(error, 'The import history could not be loaded.') : null;
  });

  /** Fetches the history again (after an upload). */
  reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected openImport(id: number): void {
    this.changesPage.set(0);
    this.changeFilter.set('');
    this.selectedId.set(id);
  }

  protected filterChanges(change: PartChangeKind | ''): void {
    this.changeFilter.set(change);
    this.changesPage.set(0);
  }

  protected turnHistoryPage(event: PageEvent): void {
    this.historyPage.set(event.pageIndex);
  }

  protected turnChangesPage(event: PageEvent): void {
    this.changesPage.set(event.pageIndex);
  }

  protected resultText(entry: StockImportSummary): string {
    if (entry.status === 'rejected') return `Refused: ${entry.rejectedCount} row(s) rejected`;
    const parts = [`${entry.created} created`, `${entry.updated} updated`, `${entry.zeroed} set to 0`, `${entry.unchanged} unchanged`];
    return entry.rejectedCount > 0 ? `${parts.join(', ')}; ${entry.rejectedCount} skipped` : parts.join(', ');
  }

  protected quantityText(change: PartChange): string {
    if (change.quantityBefore === null) return `new: ${change.quantityAfter}`;
    const delta = change.quantityAfter - change.quantityBefore;
    return `${change.quantityBefore} → ${change.quantityAfter}${delta === 0 ? '' : ` (${delta > 0 ? '+' : ''}${delta})`}`;
  }

  protected fieldTexts(change: PartChange): string[] {
    return change.fields.map(
      (f) => `${FIELD_LABELS[f.field] ?? f.field}: ${changedFieldText(change.kind, f.field, f.before)} → ${changedFieldText(change.kind, f.field, f.after)}`,
    );
  }

  protected changeLabel(change: PartChange): string {
    return CHANGE_LABELS[change.change];
  }
}
