import { Injectable, inject } from '@angular/core';
import { Title } from '@angular/platform-browser';
import { RouterStateSnapshot, TitleStrategy } from '@angular/router';

/** Suffix every page title carries, so tabs and history read "Stock · Shelfmatch". */
const PRODUCT_SUFFIX = ' · Shelfmatch';

/** Sets the document title from the route's `title`, adding the product name once. */
@Injectable()
export class ShelfmatchTitle extends TitleStrategy {
  private readonly title = inject(Title);

  override updateTitle(snapshot: RouterStateSnapshot): void {
    const pageTitle = this.buildTitle(snapshot);
    if (!pageTitle) {
      this.title.setTitle('Shelfmatch');
    } else {
      this.title.setTitle(pageTitle.endsWith(PRODUCT_SUFFIX) ? pageTitle : pageTitle + PRODUCT_SUFFIX);
    }
  }
}
