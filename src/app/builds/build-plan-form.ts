import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import type { BuildResponse } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import type { SavedMatchSummary } from '../matches/saved-match.js';
import { BuildClient } from './build-client.js';

/** Most boards one build may plan (the server's own limit). */
const MAX_BOARDS = 1_000_000;

/** Plans a build: a name, a board quantity and the saved matches one board carries; reserving is the default. */
@Component({
  selector: 'sm-build-plan-form',
  templateUrl: './build-plan-form.html',
  styleUrl: './build-plan-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule],
})
export class BuildPlanForm {
  private readonly client = inject(BuildClient);

  /** The saved matches a board may carry. */
  readonly matches = input.required<readonly SavedMatchSummary[]>();
  /** Whether the saved matches are still loading. */
  readonly loadingMatches = input(false);
  /** Emits the build once it is planned (and reserved). */
  readonly planned = output<BuildResponse>();

  protected readonly name = signal('');
  protected readonly quantityText = signal('1');
  protected readonly chosen = signal<ReadonlySet<number>>(new Set());
  protected readonly reserveNow = signal(true);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  /** The board quantity, or null when the field does not hold a whole number from 1 up. */
  protected readonly quantity = computed(() => {
    const text = this.quantityText().trim();
    if (!/^\d+$/.test(text)) return null;
    const n = Number(text);
    return n >= 1 && n <= MAX_BOARDS ? n : null;
  });
  protected readonly quantityProblem = computed(() => (this.quantity() === null ? `Boards must be a whole number from 1 to ${MAX_BOARDS.toLocaleString('en')}.` : null));
  /** Whether the form may be sent. */
  protected readonly ready = computed(() => this.name().trim() !== '' && this.quantity() !== null && this.chosen().size > 0 && !this.busy());

  protected toggleMatch(id: number, on: boolean): void {
    const next = new Set(this.chosen());
    if (on) next.add(id);
    else next.delete(id);
    this.chosen.set(next);
  }

  protected planBuild(): void {
    const quantity = this.quantity();
    if (!this.ready() || quantity === null) return;
    this.busy.set(true);
    this.error.set(null);
    // Matches go in the order the list shows them: the first listed keep a scarce part.
    const matchIds = this.matches().map((m) => m.id).filter((id) => this.chosen().has(id));
    this.client.createBuild({ name: this.name().trim(), quantity, matchIds, reserve: this.reserveNow() }).subscribe({
      next: (build) => {
        this.busy.set(false);
        this.name.set('');
        this.chosen.set(new Set());
        this.planned.emit(build);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(error, 'The build could not be planned.'));
      },
    });
  }
}
