import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router } from '@angular/router';

import type { Role } from '../../../shared/api/auth.js';
import { BUILD_STATUSES, type BuildResponse, type BuildStatus } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { AuthSession } from '../auth/auth-session.js';
import { ListFilters, listFilterState } from '../layout/list-filters.js';
import { fetchedSignal } from '../stock/fetched-signal.js';
import { BuildClient } from './build-client.js';
import { BUILD_PLANNING_ROLES, BuildDetail } from './build-detail.js';
import { BuildPlanForm } from './build-plan-form.js';
import { BUILD_STATUS_WORDS } from './build-words.js';

/** The Builds page: plan a build from saved matches, the builds so far, and the one chosen with its lines and shortfall. */
@Component({
  selector: 'sm-builds-page',
  templateUrl: './builds-page.html',
  styleUrl: './builds-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ListFilters, MatIconModule, MatListModule, MatProgressBarModule, BuildDetail, BuildPlanForm],
})
export class BuildsPage {
  private readonly builds = inject(BuildClient);
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** Whether the signed-in role may plan builds. */
  protected readonly mayPlan = computed(() => BUILD_PLANNING_ROLES.includes(this.session.currentUser()?.role as Role));
  /** Bumped after every change, so the list fetches again. */
  private readonly revision = signal(0);
  /** The list's filters: part of the name and a status. */
  protected readonly filters = listFilterState<BuildStatus>();
  protected readonly statuses = BUILD_STATUSES;
  protected readonly statusWord = (status: BuildStatus) => BUILD_STATUS_WORDS[status];
  protected readonly list = fetchedSignal(
    () => ({ revision: this.revision(), search: this.filters.search(), status: this.filters.status() }),
    ({ search, status }) => this.builds.listBuilds({ search, status: status || undefined }),
  );
  protected readonly selectedId = signal<number | null>(null);
  protected readonly selected = signal<BuildResponse | null>(null);
  protected readonly detailError = signal<string | null>(null);
  protected readonly statusWords = BUILD_STATUS_WORDS;

  protected readonly listError = computed(() => (this.list().error ? apiErrorMessage(this.list().error, 'The builds could not be loaded.') : null));

  constructor() {
    inject(ActivatedRoute)
      .queryParamMap.pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((params) => {
        const id = Number(params.get('build'));
        if (Number.isInteger(id) && id > 0 && id !== this.selectedId()) this.openBuild(id);
      });
  }

  protected chooseBuild(id: number): void {
    void this.router.navigate([], { queryParams: { build: id }, queryParamsHandling: 'merge' });
  }

  protected showBuild(build: BuildResponse): void {
    this.selectedId.set(build.id);
    this.selected.set(build);
    this.revision.update((n) => n + 1);
    this.chooseBuild(build.id);
  }

  private openBuild(id: number): void {
    this.selectedId.set(id);
    this.detailError.set(null);
    this.builds.getBuild(id).subscribe({
      next: (build) => this.selected.set(build),
      error: (error: unknown) => {
        this.selected.set(null);
        this.detailError.set(apiErrorMessage(error, `Build ${id} could not be loaded.`));
      },
    });
  }
}
