import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Shortfall lists page. Not built yet: it says so, and what it will hold. */
@Component({
  selector: 'sm-shortfall-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <h1 class="title"><mat-icon aria-hidden="true">receipt_long</mat-icon>Shortfall lists</h1>
    <p class="status" data-testid="shortfall-status">Not built yet: shortfall lists are coming with the build planning work.</p>
    <p class="plan">Here purchasing will review what each build still needs, with a buy-to spec for every line, export it as CSV, e-mail it to a supplier and track its status.</p>
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
export class ShortfallPage {}
