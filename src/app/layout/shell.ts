import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';

import { AuthSession } from '../auth/auth-session.js';
import { areasFor } from '../auth/role-access.js';

/** The signed-in frame: toolbar with the product and the user, navigation by role, the page. */
@Component({
  selector: 'sm-shell',
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatToolbarModule,
  ],
})
export class Shell {
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly user = this.session.currentUser;
  /** The areas the signed-in role may open, in navigation order. */
  protected readonly areas = computed(() => {
    const user = this.user();
    return user ? areasFor(user.role) : [];
  });

  private readonly main = viewChild.required<ElementRef<HTMLElement>>('main');

  /** Moves focus to the page content; the base href would turn `#main` into a new page load. */
  protected skipToContent(event: Event): void {
    event.preventDefault();
    this.main().nativeElement.focus();
  }

  protected async signOut(): Promise<void> {
    this.session.signOut();
    this.snackBar.dismiss();
    await this.router.navigateByUrl('/sign-in');
  }
}
