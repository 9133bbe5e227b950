import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Matches page. Not built yet: it says so, and what it will hold. */
@Component({
  selector: 'sm-matches-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <h1 class="title"><mat-icon aria-hidden="true">cable</mat-icon>Matches</h1>
    <p class="status" data-testid="matches-status">Not built yet: matches are coming with the snapping work.</p>
    <p class="plan">Here a designer will enter a source and a load impedance and a frequency, see the ideal L networks, the best fits from the parts in stock with what the snapping costs, a response plot and a Smith chart, and save the chosen fit.</p>
  `,
  styles: `
    :host {
      display: block;
      max-width: 48em;
    }
    .title {
      display: flex;
      align-items: center;
      gap: 12px;
      margin: 0 0 16px;
      font: var(--mat-sys-headline-small);
    }
    .title mat-icon {
      color: var(--mat-sys-tertiary);
    }
    .status {
      display: inline-block;
      margin: 0 0 12px;
      padding: 6px 14px;
      border-radius: var(--mat-sys-corner-full);
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
      font: var(--mat-sys-label-large);
    }
    .plan {
      font: var(--mat-sys-body-large);
      line-height: 1.6;
    }
  `,
})
export class MatchesPage {}
