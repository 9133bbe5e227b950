import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTabsModule } from '@angular/material/tabs';

import type { Role } from '../../../shared/api/auth.js';
import type { StockImportReport } from '../../../shared/api/stock.js';
import { AuthSession } from '../auth/auth-session.js';
import { ImportHistory } from './import-history.js';
import { PartTable } from './part-table.js';
import { StockUpload } from './stock-upload.js';

/** Roles that may upload stock lists (product.md: stores; admin may do everything). */
export const STOCK_UPLOAD_ROLES: readonly Role[] = ['stores', 'admin'];

/** The Stock page: the stock list for everyone; uploads for stores and admin; the import history. */
@Component({
  selector: 'sm-stock-page',
  templateUrl: './stock-page.html',
  styleUrl: './stock-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatTabsModule, ImportHistory, PartTable, StockUpload],
})
export class StockPage {
  private readonly session = inject(AuthSession);

  /** Whether the signed-in role may upload stock lists. */
  protected readonly mayUpload = computed(() => {
    const role = this.session.currentUser()?.role;
    return role !== undefined && STOCK_UPLOAD_ROLES.includes(role);
  });
  protected readonly tabIndex = signal(0);
  /** Bumped after each applied import, so the list and the history fetch again. */
  protected readonly revision = signal(0);
  /** Bumped after each import the history keeps (a refused one too), so the history fetches again. */
  protected readonly historyRevision = signal(0);
  /** The import whose changes the history shows. */
  protected readonly selectedImportId = signal<number | null>(null);

  /** Index of the history tab (after the upload tab when there is one). */
  private readonly historyTab = computed(() => (this.mayUpload() ? 2 : 1));

  protected noteImport(report: StockImportReport): void {
    this.revision.update((n) => n + 1);
    if (report.importId !== null) this.selectedImportId.set(report.importId);
  }

  protected noteRecorded(): void {
    this.historyRevision.update((n) => n + 1);
  }

  protected showChanges(importId: number): void {
    this.selectedImportId.set(importId);
    this.tabIndex.set(this.historyTab());
  }
}
