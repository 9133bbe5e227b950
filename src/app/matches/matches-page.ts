import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';

import type { SolveRequest, SolveResponse } from '../../../shared/api/matches.js';
import { type SolveInput, isEngineInputError, parseSolveRequest } from '../../../shared/engine/index.js';
import { apiErrorDetails, apiErrorMessage } from '../api/api-error-message.js';
import { isAnnouncedByInterceptor } from '../auth/auth-interceptor.js';
import { AuthSession } from '../auth/auth-session.js';
import { type MatchFormField, controlOfRequestField } from './field-reading.js';
import { MatchClient } from './match-client.js';
import { MatchForm } from './match-form.js';
import { MatchResults } from './match-results.js';
import { answerOf, failureOf, latestAnswer } from './request-state.js';
import type { ChosenFit, SavedMatch } from './saved-match.js';
import { savedMatchView } from './saved-match-view.js';
import { SavedMatchList } from './saved-match-list.js';
import { searchSavedMatches } from './saved-match-search.js';
import { saveBlob } from '../builds/build-client.js';

/** How long a confirmation stays, in milliseconds. */
const NOTICE_MS = 5000;
/** Longest match name the form accepts. */
export const MAX_MATCH_NAME_LENGTH = 120;

/** The fit chosen by default: `preferred` when the answer has it, else the best fit of the first network that has one. */
export function defaultChoice(solution: SolveResponse | undefined, preferred: ChosenFit | null): ChosenFit | null {
  if (!solution) return null;
  const has = (choice: ChosenFit) =>
    solution.networks.some((n) => n.placement === choice.placement && n.solution === choice.solution && n.fits.some((f) => f.rank === choice.rank));
  if (preferred && has(preferred)) return preferred;
  const network = solution.networks.find((n) => n.fits.length > 0);
  return network ? { placement: network.placement, solution: network.solution, rank: network.fits[0].rank } : null;
}

/**
 * The Match workspace: the form, what a solve found (ideal networks, stocked fits, plot, Smith chart,
 * cautions), saving the chosen fit under a name, and the saved matches, which reopen with their
 * results (`?saved=<id>`).
 */
@Component({
  selector: 'sm-matches-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatchForm,
    MatchResults,
    SavedMatchList,
  ],
  templateUrl: './matches-page.html',
  styleUrl: './matches-page.scss',
})
export class MatchesPage {
  /** Id of the saved match to reopen, from the `saved` query parameter. */
  readonly saved = input<string | undefined>(undefined);

  private readonly client = inject(MatchClient);
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly maxNameLength = MAX_MATCH_NAME_LENGTH;
  /** Whether the signed-in role may save matches (designer and admin; every role may read them). */
  protected readonly maySave = computed(() => {
    const role = this.session.currentUser()?.role;
    return role === 'designer' || role === 'admin';
  });

  /** The request last sent to solve. */
  private readonly submitted = signal<SolveRequest | null>(null);
  protected readonly solved = latestAnswer(
    computed(() => this.submitted() ?? undefined),
    (request) => this.client.solve(request),
  );

  /** The saved match being reopened. */
  protected readonly savedMatch = latestAnswer(
    computed(() => this.saved() || undefined),
    (id) => this.client.open(id),
  );
  /** Bumped to fetch the saved matches again. */
  private readonly listVersion = signal(0);
  /** The saved-match search box and its answer: the newest matches whose name holds its text. */
  private readonly savedSearch = searchSavedMatches(this.client, this.listVersion);
  protected readonly savedSearchText = this.savedSearch.text;
  protected readonly savedList = this.savedSearch.answer;
  protected readonly savedMatches = this.savedSearch.items;
  protected readonly savedTotal = this.savedSearch.total;
  protected readonly savedSearchActive = this.savedSearch.active;
  /** Why the saved match could not be opened. */
  protected readonly savedMatchFailure = computed(() =>
    apiErrorMessage(failureOf(this.savedMatch()), 'The saved match could not be opened, and the server did not say why.'),
  );

  /** The request that the results on screen answer. */
  protected readonly shownRequest = computed<SolveRequest | null>(() => {
    return this.reopened()?.request ?? this.submitted();
  });
  /** The saved match on screen, when one is reopened. */
  protected readonly reopened = computed<SavedMatch | null>(() =>
    this.saved() ? (answerOf(this.savedMatch()) ?? null) : null,
  );
  /** The answer on screen: a reopened match as saved, else the last solve's. */
  protected readonly solution = computed<SolveResponse | undefined>(() => {
    const detail = this.reopened();
    if (detail) return savedMatchView(detail);
    return answerOf(this.solved());
  });
  /** The request as numbers, for the plots. */
  protected readonly solveInput = computed<SolveInput | null>(() => {
    const request = this.shownRequest();
    if (!request) return null;
    try {
      return parseSolveRequest(request);
    } catch (error: unknown) {
      if (isEngineInputError(error)) return null;
      throw error;
    }
  });

  /** The fit the designer has chosen. */
  protected readonly chosen = linkedSignal<SolveResponse | undefined, ChosenFit | null>({
    source: this.solution,
    computation: (solution) => defaultChoice(solution, this.reopened()?.chosen ?? null),
  });
  /** A reopened match's sweep, while its own fit is the chosen one. */
  protected readonly savedSweep = computed(() => {
    const detail = this.reopened();
    const chosen = this.chosen();
    if (!detail?.sweep || !chosen) return null;
    const same = detail.chosen.placement === chosen.placement && detail.chosen.solution === chosen.solution && detail.chosen.rank === chosen.rank;
    return same ? detail.sweep : null;
  });

  /** Problems the server found in the last request, by form field. */
  protected readonly serverProblems = computed<Partial<Record<MatchFormField, string>>>(() => {
    const error = failureOf(this.solved());
    const problems: Partial<Record<MatchFormField, string>> = {};
    for (const detail of apiErrorDetails(error)) {
      const control = controlOfRequestField(detail.field);
      if (control && problems[control] === undefined) problems[control] = detail.message.replace(/^[A-Za-z][\w.]*: /, '');
    }
    return problems;
  });
  /** A failure to show above the results, when it is not tied to a field. */
  protected readonly solveFailure = computed(() => {
    const error = failureOf(this.solved());
    if (!error) return null;
    if (error instanceof HttpErrorResponse && error.status === 400 && Object.keys(this.serverProblems()).length > 0) {
      return 'The server could not read some inputs; see the fields marked above.';
    }
    return apiErrorMessage(error, 'The match could not be solved, and the server did not say why.');
  });

  /** The name to save the chosen fit under. */
  protected readonly matchName = signal('');
  /** Whether a save is on its way. */
  protected readonly saving = signal(false);
  /** Why the last save failed, or null. */
  protected readonly saveFailure = signal<string | null>(null);
  /** Form preset: a reopened match's inputs. */
  protected readonly preset = computed(() => this.reopened()?.request ?? null);

  constructor() {
    // A reopened match lends its name to the save form, for saving a variant.
    effect(() => {
      const detail = this.reopened();
      if (detail) this.matchName.set(detail.name);
    });
  }

  protected async solveRequest(request: SolveRequest): Promise<void> {
    this.saveFailure.set(null);
    if (this.saved()) await this.router.navigate([], { queryParams: { saved: null } });
    // A new object each time, so solving the same inputs again asks the server again.
    this.submitted.set({ ...request });
  }

  /**
   * Stops the solve on its way: the request is cancelled, and the server, seeing the connection
   * close, takes the solve off its queue or ends it, so a long combination search asked by mistake
   * costs nobody else a thread.
   */
  protected stopSolve(): void {
    if (this.solved().status !== 'loading') return;
    this.submitted.set(null);
    this.snackBar.open('Solve stopped; nothing was solved.', 'Close', { duration: NOTICE_MS });
  }

  protected chooseFit(choice: ChosenFit): void {
    this.chosen.set(choice);
  }

  protected async saveChosenFit(): Promise<void> {
    const request = this.shownRequest();
    const chosen = this.chosen();
    const name = this.matchName().trim();
    if (!request || !chosen || name === '' || this.saving()) return;
    this.saving.set(true);
    this.saveFailure.set(null);
    try {
      const saved = await firstValueFrom(this.client.save(name, request, chosen));
      this.reloadSavedMatches();
      this.snackBar.open(`Saved “${saved.name ?? name}”.`, 'Close', { duration: NOTICE_MS });
    } catch (error: unknown) {
      this.saveFailure.set(
        isAnnouncedByInterceptor(error) ? 'The match was not saved.' : apiErrorMessage(error, 'The match was not saved, and the server did not say why.'),
      );
    } finally {
      this.saving.set(false);
    }
  }

  /** Whether the signed-in user may delete the open saved match: the designer who saved it, or an admin. */
  protected readonly mayDelete = computed(() => {
    const user = this.session.currentUser();
    const detail = this.reopened();
    if (!user || !detail) return false;
    return user.role === 'admin' || (user.role === 'designer' && detail.createdBy?.id === user.id);
  });
  /** Whether the delete button has been pressed once and waits to be confirmed (reset when another match opens). */
  protected readonly confirmingDelete = linkedSignal({ source: this.saved, computation: () => false });
  protected readonly deleting = signal(false);
  protected readonly deleteFailure = linkedSignal<string | undefined, string | null>({ source: this.saved, computation: () => null });

  /** Deletes the open saved match, once confirmed, and closes it. */
  protected async deleteSaved(): Promise<void> {
    const id = this.openId();
    const name = this.reopened()?.name ?? 'the saved match';
    if (id === null || this.deleting()) return;
    this.deleting.set(true);
    this.deleteFailure.set(null);
    try {
      await firstValueFrom(this.client.delete(id));
      this.reloadSavedMatches();
      this.snackBar.open(`Deleted “${name}”.`, 'Close', { duration: NOTICE_MS });
      await this.router.navigate([], { queryParams: { saved: null }, queryParamsHandling: 'merge' });
    } catch (error: unknown) {
      this.deleteFailure.set(
        isAnnouncedByInterceptor(error) ? 'The match was not deleted.' : apiErrorMessage(error, 'The match was not deleted, and the server did not say why.'),
      );
    } finally {
      this.deleting.set(false);
    }
  }

  protected reloadSavedMatches(): void {
    this.listVersion.update((version) => version + 1);
  }

  /** Whether a solve or a reopen is on its way. */
  protected readonly busy = computed(() => this.solved().status === 'loading' || this.savedMatch().status === 'loading');

  /** `" on 30 Nov 2026 by Dev Okafor"`, from what the server says. */
  protected savedWhen(detail: SavedMatch): string {
    const at = new Date(detail.createdAt);
    const date = Number.isNaN(at.getTime()) ? '' : ` on ${at.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' })}`;
    return `${date}${detail.createdBy ? ` by ${detail.createdBy.name}` : ''}`;
  }

  /** Which Touchstone download is on its way, or null. */
  protected readonly downloading = signal<'fit' | 'ideal' | null>(null);
  /** Why the last download failed, or null. */
  protected readonly downloadFailure = signal<string | null>(null);

  /** Downloads the reopened match's fitted or ideal network as a Touchstone 2-port file. */
  protected async downloadTouchstone(network: 'fit' | 'ideal'): Promise<void> {
    const id = this.openId();
    if (id === null || this.downloading()) return;
    this.downloading.set(network);
    this.downloadFailure.set(null);
    try {
      const { blob, fileName } = await this.client.touchstone(id, network);
      saveBlob(blob, fileName);
    } catch (error: unknown) {
      this.downloadFailure.set(
        isAnnouncedByInterceptor(error) ? 'The file was not downloaded.' : apiErrorMessage(error, 'The Touchstone file could not be made, and the server did not say why.'),
      );
    } finally {
      this.downloading.set(null);
    }
  }

  protected openId(): number | null {
    const id = Number(this.saved());
    return this.saved() && Number.isFinite(id) ? id : null;
  }
}
