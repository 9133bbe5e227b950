import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { RouterLink } from '@angular/router';

import { formatValue, isEngineInputError, parseComplex, parseValue, formatImpedance } from '../../../shared/engine/index.js';
import { placementName } from './network-card.js';
import type { SavedMatchSummary } from './saved-match.js';

/** The saved matches, newest first as the server lists them; each reopens with its results. */
@Component({
  selector: 'sm-saved-match-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatListModule, RouterLink],
  template: `
    @if (matches().length === 0) {
      <p class="empty">{{ loading() ? 'Loading saved matches…' : 'No saved matches yet. Solve one, choose a fit and save it.' }}</p>
    } @else {
      <mat-nav-list aria-label="Saved matches">
        @for (match of matches(); track match.id) {
          <a
            mat-list-item
            class="sm-wrap-item"
            data-testid="saved-match-row"
            [attr.title]="match.name + ': ' + describe(match)"
            [attr.data-id]="match.id"
            [routerLink]="[]"
            [queryParams]="{ saved: match.id }"
            [activated]="match.id === openId()"
            [attr.aria-current]="match.id === openId() ? 'true' : null"
          >
            <mat-icon matListItemIcon aria-hidden="true">bookmark</mat-icon>
            <span matListItemTitle class="name">{{ match.name }}</span>
            <span matListItemLine class="line sm-wrap-line">{{ describe(match) }}</span>
            @if (match.partNumbers.length > 0) {
              <span matListItemLine class="line parts">{{ match.partNumbers.join(', ') }}</span>
            }
          </a>
        }
      </mat-nav-list>
    }
  `,
  styles: `
    :host { display: block; }
    .empty { margin: 0; color: var(--mat-sys-on-surface-variant); }
    .line { font-variant-numeric: tabular-nums; }
    .parts { font-family: ui-monospace, 'DejaVu Sans Mono', monospace; font-size: 12px; }
  `,
})
export class SavedMatchList {
  /** The saved matches. */
  readonly matches = input.required<readonly SavedMatchSummary[]>();
  /** Whether the list is being fetched. */
  readonly loading = input(false);
  /** Id of the match open in the workspace, or null. */
  readonly openId = input<number | null>(null);

  /** One line about a saved match: its load, frequency, chosen network and when it was saved. */
  protected describe(match: SavedMatchSummary): string {
    const parts: string[] = [];
    const request = match.request;
    if (request) {
      try {
        if (request.loadTouchstone) parts.push(`measured load ${request.loadTouchstone.fileName ?? 'file'}`);
        else {
          const load = parseComplex(request.load, 'load');
          parts.push(`load ${formatImpedance(load.re, load.im, 3)}`);
        }
        parts.push(formatValue(parseValue(request.frequencyHz, 'frequency'), 'frequency'));
      } catch (error: unknown) {
        if (!isEngineInputError(error)) throw error;
      }
    }
    if (match.chosen) parts.push(`${placementName(match.chosen.placement)} ${match.chosen.solution}, fit ${match.chosen.rank}`);
    if (Number.isFinite(match.worstCaseDb)) parts.push(`worst case ${match.worstCaseDb.toFixed(2)} dB`);
    const saved = new Date(match.createdAt);
    if (!Number.isNaN(saved.getTime())) parts.push(saved.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' }));
    if (match.createdBy) parts.push(match.createdBy.name);
    return parts.join(' · ');
  }
}
