import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Builds page. Not built yet: it says so, and what it will hold. */
@Component({
  selector: 'sm-builds-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <h1 class="title"><mat-icon aria-hidden="true">developer_board</mat-icon>Builds</h1>
    <p class="status" data-testid="builds-status">Not built yet: builds are coming with the build planning work.</p>
    <p class="plan">Here a designer will plan a build (a board with several saved matches, times a quantity); the stock it needs is reserved, and what stores cannot supply becomes a shortfall list.</p>
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
export class BuildsPage {}
