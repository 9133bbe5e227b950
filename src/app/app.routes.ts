import { inject } from '@angular/core';
import { Routes } from '@angular/router';

import { AuthSession } from './auth/auth-session.js';
import { roleGuard, signedInGuard, signedOutGuard } from './auth/role-guard.js';
import { AREAS, type AreaPath, homeUrlFor } from './auth/role-access.js';
import { PageNotFound } from './layout/page-not-found.js';

/** The roles that may open `path`, from the one table the navigation also reads. */
function rolesOf(path: AreaPath) {
  const area = AREAS.find((candidate) => candidate.path === path);
  if (!area) throw new Error(`app.routes: no area "${path}" in AREAS (auth/role-access.ts).`);
  return area.roles;
}

/** The app's routes: sign-in, then the shell with one lazy-loaded page per area, guarded by role. */
export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Shelfmatch',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./auth/sign-in.js').then((m) => m.SignIn),
  },
  {
    // Opened from an invitation or password-reset e-mail; the link token is the credential.
    path: 'set-password',
    title: 'Choose a password · Shelfmatch',
    loadComponent: () => import('./set-password/set-password-page.js').then((m) => m.SetPasswordPage),
  },
  {
    path: '',
    loadComponent: () => import('./layout/shell.js').then((m) => m.Shell),
    canActivate: [signedInGuard],
    children: [
      {
        path: '',
        pathMatch: 'full',
        redirectTo: () => {
          const user = inject(AuthSession).currentUser();
          return user ? homeUrlFor(user.role) : '/sign-in';
        },
      },
      {
        path: 'matches',
        title: 'Matches',
        canActivate: [roleGuard(...rolesOf('matches'))],
        loadComponent: () => import('./matches/matches-page.js').then((m) => m.MatchesPage),
      },
      {
        path: 'stock',
        title: 'Stock',
        canActivate: [roleGuard(...rolesOf('stock'))],
        loadComponent: () => import('./stock/stock-page.js').then((m) => m.StockPage),
      },
      {
        path: 'builds',
        title: 'Builds',
        canActivate: [roleGuard(...rolesOf('builds'))],
        loadComponent: () => import('./builds/builds-page.js').then((m) => m.BuildsPage),
      },
      {
        path: 'shortfall',
        title: 'Shortfall lists',
        canActivate: [roleGuard(...rolesOf('shortfall'))],
        loadComponent: () => import('./shortfall/shortfall-page.js').then((m) => m.ShortfallPage),
      },
      {
        path: 'admin',
        title: 'Admin',
        canActivate: [roleGuard(...rolesOf('admin'))],
        loadComponent: () => import('./admin/admin-page.js').then((m) => m.AdminPage),
      },
      {
        path: 'outbox',
        title: 'Outbox',
        canActivate: [roleGuard(...rolesOf('outbox'))],
        loadComponent: () => import('./outbox/outbox-page.js').then((m) => m.OutboxPage),
      },
      {
        path: 'settings',
        title: 'Organisation settings',
        canActivate: [roleGuard(...rolesOf('settings'))],
        loadComponent: () => import('./settings/settings-page.js').then((m) => m.SettingsPage),
      },
    ],
  },
  { path: '**', title: 'No such page · Shelfmatch', component: PageNotFound },
];
