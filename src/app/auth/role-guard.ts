import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { CanActivateFn, Router } from '@angular/router';

import type { Role } from '../../../shared/api/auth.js';
import { AuthSession } from './auth-session.js';
import { homeUrlFor } from './role-access.js';

/** How long the "not open to your role" notice stays, in milliseconds. */
const REFUSAL_NOTICE_MS = 6000;

/** Lets a signed-in user through; sends anyone else to sign-in, remembering where they were going. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const session = inject(AuthSession);
  if (session.isSignedIn()) return true;
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
};

/** Keeps a signed-in user off the sign-in page: sends them to their role's first page. */
export const signedOutGuard: CanActivateFn = () => {
  const user = inject(AuthSession).currentUser();
  return user ? inject(Router).parseUrl(homeUrlFor(user.role)) : true;
};

/**
 * Lets through only users whose role is one of `roles`. Someone signed out goes to sign-in;
 * someone with another role goes to their own first page and is told why.
 */
export function roleGuard(...roles: Role[]): CanActivateFn {
  if (roles.length === 0) throw new Error('roleGuard: name at least one role that may enter.');
  return (route, state) => {
    const user = inject(AuthSession).currentUser();
    const router = inject(Router);
    if (!user) return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
    if (roles.includes(user.role)) return true;
    const title = route.routeConfig?.title;
    const area = typeof title === 'string' ? title : 'That page';
    inject(MatSnackBar).open(`${area} is not open to the ${user.role} role.`, 'Close', {
      duration: REFUSAL_NOTICE_MS,
    });
    return router.parseUrl(homeUrlFor(user.role));
  };
}
