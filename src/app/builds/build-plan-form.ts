import { ChangeDetectionStrategy, Component, computed, inject, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import { MAX_MATCHES_PER_BUILD, type BuildResponse } from '../../../shared/api/builds.js';
import { MAX_BUILD_QUANTITY } from '../../../shared/engine/solve-request.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { MatchClient } from '../matches/match-client.js';
import type { SavedMatchSummary } from '../matches/saved-match.js';
import { searchSavedMatches } from '../matches/saved-match-search.js';
import { BuildClient } from './build-client.js';

/**
 * Plans a build: a name, a board quantity and the saved matches one board carries, found by name
 * among all saved matches and kept in the order they were picked (a match higher in the list gets
 * a scarce part first); reserving is the default.
 */
@Component({
  selector: 'sm-build-plan-form',
  templateUrl: './build-plan-form.html',
  styleUrl: './build-plan-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule],
})
export class BuildPlanForm {
  private readonly client = inject(BuildClient);

  /** The saved matches a board may carry: the newest ones whose name holds the search box's text. */
  protected readonly search = searchSavedMatches(inject(MatchClient));
  protected readonly matchesError = computed(() => {
    const answer = this.search.answer();
    return answer.status === 'failed' ? apiErrorMessage(answer.error, 'The saved matches could not be loaded.') : null;
  });
  /** Emits the build once it is planned (and reserved). */
  readonly planned = output<BuildResponse>();

  protected readonly name = signal('');
  protected readonly quantityText = signal('1');
  /** The saved matches on one board, in the order the build lists them. */
  protected readonly chosen = signal<readonly SavedMatchSummary[]>([]);
  protected readonly chosenIds = computed(() => new Set(this.chosen().map((m) => m.id)));
  /** Whether the board carries as many matches as a build may (the rest of the list cannot be ticked). */
  protected readonly boardFull = computed(() => this.chosen().length >= MAX_MATCHES_PER_BUILD);
  protected readonly maxMatches = MAX_MATCHES_PER_BUILD;
  protected readonly reserveNow = signal(true);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  /** The board quantity, or null when the field does not hold a whole number from 1 up. */
  protected readonly quantity = computed(() => {
    const text = this.quantityText().trim();
    if (!/^\d+$/.test(text)) return null;
    const n = Number(text);
    return n >= 1 && n <= MAX_BUILD_QUANTITY ? n : null;
  });
  protected readonly quantityProblem = computed(() => (this.quantity() === null ? `Boards must be a whole number from 1 to ${MAX_BUILD_QUANTITY.toLocaleString('en')}.` : null));
  /** Whether the form may be sent. */
  protected readonly ready = computed(() => this.name().trim() !== '' && this.quantity() !== null && this.chosen().length > 0 && !this.busy());

  protected toggleMatch(match: SavedMatchSummary, on: boolean): void {
    const rest = this.chosen().filter((m) => m.id !== match.id);
    if (on && rest.length >= MAX_MATCHES_PER_BUILD) return;
    this.chosen.set(on ? [...rest, match] : rest);
  }

  /** Moves the chosen match at `index` one place up the list (ahead for scarce parts). */
  protected moveUp(index: number): void {
    if (index <= 0) return;
    const next = [...this.chosen()];
    [next[index - 1], next[index]] = [next[index], next[index - 1]];
    this.chosen.set(next);
  }

  /** "868 MHz · Dev Okafor": what tells two saved matches of a similar name apart. */
  protected matchDetail(match: SavedMatchSummary): string {
    const parts = [formatValue(match.frequencyHz, 'frequency')];
    if (match.createdBy) parts.push(match.createdBy.name);
    return parts.join(' · ');
  }

  protected planBuild(): void {
    const quantity = this.quantity();
    if (!this.ready() || quantity === null) return;
    this.busy.set(true);
    this.error.set(null);
    // The server shares a scarce part out in this order: the first listed keep it.
    const matchIds = this.chosen().map((m) => m.id);
    this.client.createBuild({ name: this.name().trim(), quantity, matchIds, reserve: this.reserveNow() }).subscribe({
      next: (build) => {
        this.busy.set(false);
        this.name.set('');
        this.chosen.set([]);
        this.planned.emit(build);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(error, 'The build could not be planned.'));
      },
    });
  }
}
