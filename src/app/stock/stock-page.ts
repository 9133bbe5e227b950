import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Stock page. Not built yet: it says so, and what it will hold. */
@Component({
  selector: 'sm-stock-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <h1 class="title"><mat-icon aria-hidden="true">inventory_2</mat-icon>Stock</h1>
    <p class="status" data-testid="stock-status">Not built yet: the stock list is coming with the stock import work.</p>
    <p class="plan">Here everyone will be able to read the stock list, and stores will upload stock-list CSV files, see a row-by-row report of rejected rows, and see what changed since the last import.</p>
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
export class StockPage {}
