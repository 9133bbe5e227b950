import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router } from '@angular/router';

import { SHORTFALL_STATUSES, type ShortfallListResponse, type ShortfallStatus } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { BuildClient } from '../builds/build-client.js';
import { buildStatusWord, shortfallStatusWord } from '../builds/build-words.js';
import { ListFilters, listFilterState } from '../layout/list-filters.js';
import { fetchedSignal } from '../stock/fetched-signal.js';
import { ShortfallDetail } from './shortfall-detail.js';

/** The Shortfall lists page: every build's list with its status, and the chosen one to review, export, send and receive. */
@Component({
  selector: 'sm-shortfall-page',
  templateUrl: './shortfall-page.html',
  styleUrl: './shortfall-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ListFilters, MatIconModule, MatProgressBarModule, MatTableModule, ShortfallDetail],
})
export class ShortfallPage {
  private readonly client = inject(BuildClient);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** Bumped after every change, so the overview fetches again. */
  private readonly revision = signal(0);
  /** The overview's filters: part of the build's name and a status. */
  protected readonly filters = listFilterState<ShortfallStatus>();
  protected readonly statuses = SHORTFALL_STATUSES;
  protected readonly lists = fetchedSignal(
    () => ({ revision: this.revision(), search: this.filters.search(), status: this.filters.status() }),
    ({ search, status }) => this.client.listShortfallLists({ search, status: status || undefined }),
  );
  protected readonly selectedBuildId = signal<number | null>(null);
  protected readonly selected = signal<ShortfallListResponse | null>(null);
  protected readonly detailError = signal<string | null>(null);
  protected readonly columns = ['build', 'status', 'lines', 'quantity', 'received', 'updated'];
  protected readonly shortfallStatusWord = shortfallStatusWord;
  protected readonly buildStatusWord = buildStatusWord;
  protected readonly listError = computed(() => (this.lists().error ? apiErrorMessage(this.lists().error, 'The shortfall lists could not be loaded.') : null));

  constructor() {
    inject(ActivatedRoute)
      .queryParamMap.pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((params) => {
        const id = Number(params.get('build'));
        if (Number.isInteger(id) && id > 0) this.openList(id);
      });
  }

  protected chooseList(buildId: number): void {
    void this.router.navigate([], { queryParams: { build: buildId } });
  }

  protected noteChange(list: ShortfallListResponse | null): void {
    if (list) this.selected.set(list);
    this.revision.update((n) => n + 1);
  }

  protected dateText(iso: string): string {
    return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
  }

  private openList(buildId: number): void {
    this.selectedBuildId.set(buildId);
    this.detailError.set(null);
    this.client.getShortfall(buildId).subscribe({
      next: (list) => this.selected.set(list),
      error: (error: unknown) => {
        this.selected.set(null);
        this.detailError.set(apiErrorMessage(error, `The shortfall list of build ${buildId} could not be loaded.`));
      },
    });
  }
}
