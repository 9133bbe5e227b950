import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { debounceTime, distinctUntilChanged, skip } from 'rxjs';

import { PART_SORT_FIELDS, type PartItem, type PartKind, type PartListQuery, type PartSortField } from '../../../shared/api/stock.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { frequencyText, lossText, partValueText, ratingText, toleranceText, unitCostText } from './part-notation.js';
import { fetchedSignal } from './fetched-signal.js';
import { StockClient } from './stock-client.js';

/** Rows per page offered; the first is the default. */
export const PAGE_SIZES = [25, 50, 100];

/** How long typing pauses before the search is sent, in milliseconds. */
export const SEARCH_DEBOUNCE_MS = 300;

/** The stock list: filters, a server-side sorted and paged table, and the CSV export. */
@Component({
  selector: 'sm-part-table',
  templateUrl: './part-table.html',
  styleUrl: './part-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    MatTooltipModule,
  ],
})
export class PartTable {
  /** Bumped by the page after an import, so the list and the locations are fetched again. */
  readonly revision = input(0);

  private readonly client = inject(StockClient);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['partNumber', 'kind', 'value', 'tolerance', 'srfHz', 'loss', 'available', 'package', 'rating', 'location', 'unitCost'];
  protected readonly pageSizes = PAGE_SIZES;

  protected readonly kind = signal<PartKind | ''>('');
  protected readonly location = signal('');
  /** The search box as typed; `search` follows it after a pause. */
  protected readonly searchDraft = signal('');
  private readonly search = signal('');
  protected readonly sort = signal<{ field: PartSortField; order: 'asc' | 'desc' }>({ field: 'partNumber', order: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(PAGE_SIZES[0]);
  /** Whether the export is being fetched. */
  protected readonly exporting = signal(false);

  private readonly query = computed<PartListQuery & { revision: number }>(() => ({
    revision: this.revision(),
    kind: this.kind() || undefined,
    location: this.location() || undefined,
    search: this.search() || undefined,
    sort: this.sort().field,
    order: this.sort().order,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
  }));

  /** Bumped by "Try again" and `reload()`. */
  private readonly reloads = signal(0);
  protected readonly parts = fetchedSignal(
    () => ({ query: this.query(), reloads: this.reloads() }),
    ({ query: { revision: _revision, ...query } }) => this.client.listParts(query),
  );
  protected readonly locations = fetchedSignal(
    () => ({ revision: this.revision(), reloads: this.reloads() }),
    () => this.client.listLocations(),
  );

  protected readonly rows = computed<PartItem[]>(() => this.parts().value?.items ?? []);
  protected readonly total = computed(() => this.parts().value?.total ?? 0);
  protected readonly locationNames = computed(() => this.locations().value ?? []);
  /** Why the list could not be loaded, or null. */
  protected readonly loadError = computed(() => {
    const error = this.parts().error;
    return error ? apiErrorMessage(error, 'The stock list could not be loaded.') : null;
  });

  constructor() {
    toObservable(this.searchDraft)
      .pipe(skip(1), debounceTime(SEARCH_DEBOUNCE_MS), distinctUntilChanged(), takeUntilDestroyed())
      .subscribe((text) => {
        this.search.set(text.trim());
        this.pageIndex.set(0);
      });
  }

  /** Fetches the list and the locations again (after an import). */
  reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected filterByKind(kind: PartKind | ''): void {
    this.kind.set(kind);
    this.pageIndex.set(0);
  }

  protected filterByLocation(location: string): void {
    this.location.set(location);
    this.pageIndex.set(0);
  }

  protected sortBy(sort: Sort): void {
    const field = (PART_SORT_FIELDS as readonly string[]).includes(sort.active) ? (sort.active as PartSortField) : 'partNumber';
    this.sort.set(sort.direction === '' ? { field: 'partNumber', order: 'asc' } : { field, order: sort.direction });
    this.pageIndex.set(0);
  }

  protected turnPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected async exportStockList(): Promise<void> {
    if (this.exporting()) return;
    this.exporting.set(true);
    try {
      const location = this.location() || undefined;
      const blob = await this.client.exportStockList(location);
      const url = URL.createObjectURL(blob);
      const link = document.createElement('a');
      link.href = url;
      link.download = `shelfmatch-stock${location ? `-${location}` : ''}.csv`;
      link.click();
      setTimeout(() => URL.revokeObjectURL(url), 0);
    } catch (error: unknown) {
      this.snackBar.open(apiErrorMessage(error, 'The export could not be made.'), 'Close', { duration: 5000 });
    } finally {
      this.exporting.set(false);
    }
  }

  protected readonly valueText = (part: PartItem) => partValueText(part.kind, part.value);
  protected readonly toleranceText = (part: PartItem) => toleranceText(part.kind, part.tolerance);
  protected readonly srfText = (part: PartItem) => frequencyText(part.srfHz);
  protected readonly lossText = lossText;

  /** The loss text in pieces that never break inside ("Q 773", "@ 1 GHz"), so a narrow table wraps it between them. */
  protected lossPieces(part: PartItem): string[] {
    const [loss, at] = lossText(part).split(' @ ');
    return at === undefined ? [loss] : [loss, `@ ${at}`];
  }
  protected readonly ratingText = ratingText;
  protected readonly unitCostText = unitCostText;
}
