import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for an address no route knows. */
@Component({
  selector: 'sm-page-not-found',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    <main class="not-found">
      <h1>No such page</h1>
      <p>Shelfmatch has nothing at this address.</p>
      <a mat-flat-button routerLink="/">Go to my first page</a>
    </main>
  `,
  styles: `
    .not-found {
      max-width: 36em;
      margin: 15vh auto;
      padding: 0 24px;
    }
    h1 {
      font: var(--mat-sys-headline-medium);
    }
  `,
})
export class PageNotFound {}
