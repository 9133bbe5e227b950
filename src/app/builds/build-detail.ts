import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { type Observable } from 'rxjs';

import type { Role } from '../../../shared/api/auth.js';
import type { BuildLine, BuildResponse } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { AuthSession } from '../auth/auth-session.js';
import { BuildClient } from './build-client.js';
import { BUILD_STATUS_WORDS, SHORTFALL_STATUS_WORDS, buySpecText, lossDbText, reasonWord } from './build-words.js';

/** Roles that plan, reserve and cancel builds (product.md: designers; admin may do everything). */
export const BUILD_PLANNING_ROLES: readonly Role[] = ['designer', 'admin'];
/** Roles that mark a build built (stores hand the parts out). */
export const BUILD_BUILDING_ROLES: readonly Role[] = ['stores', 'admin'];

/** One build: what each match's elements need and hold, what was moved, what is short, and its next step. */
@Component({
  selector: 'sm-build-detail',
  templateUrl: './build-detail.html',
  styleUrl: './build-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatTableModule, RouterLink],
})
export class BuildDetail {
  private readonly client = inject(BuildClient);
  private readonly session = inject(AuthSession);

  /** The build shown. */
  readonly build = input.required<BuildResponse>();
  /** Emits the build after a status change. */
  readonly changed = output<BuildResponse>();

  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly lineColumns = ['match', 'position', 'partNumber', 'needed', 'reserved'];
  protected readonly shortfallColumns = ['kind', 'spec', 'quantity', 'package', 'reason'];
  protected readonly statusWords = BUILD_STATUS_WORDS;
  protected readonly shortfallStatusWords = SHORTFALL_STATUS_WORDS;
  protected readonly reasonWord = reasonWord;
  protected readonly buySpec = buySpecText;
  protected readonly lossDb = lossDbText;

  private readonly role = computed(() => this.session.currentUser()?.role);
  /** Whether the signed-in role may reserve or cancel. */
  protected readonly mayPlan = computed(() => BUILD_PLANNING_ROLES.includes(this.role() as Role));
  /** Whether the signed-in role may mark the build built. */
  protected readonly mayBuild = computed(() => BUILD_BUILDING_ROLES.includes(this.role() as Role));
  /** Match names by id. */
  private readonly matchNames = computed(() => new Map(this.build().matches.map((m) => [m.matchId, m.name])));
  /** Whether some element holds fewer than it needs. */
  protected readonly anyShort = computed(() => this.build().lines.some((l) => l.reserved < l.needed));

  protected matchName(line: BuildLine): string {
    return this.matchNames().get(line.matchId) ?? `Match ${line.matchId}`;
  }

  protected reserveStock(): void {
    this.run(this.client.reserveBuild(this.build().id));
  }

  protected markBuilt(): void {
    this.run(this.client.changeBuildStatus(this.build().id, 'built'));
  }

  protected cancelBuild(): void {
    this.run(this.client.changeBuildStatus(this.build().id, 'cancelled'));
  }

  private run(request: Observable<BuildResponse>): void {
    this.busy.set(true);
    this.error.set(null);
    request.subscribe({
      next: (build) => {
        this.busy.set(false);
        this.changed.emit(build);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(error, 'The build could not be changed.'));
      },
    });
  }
}
