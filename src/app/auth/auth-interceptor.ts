import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';

import { apiErrorMessage } from '../api/api-error-message.js';
import { AuthSession } from './auth-session.js';
import { CREDENTIAL_CHECK } from './credential-check.js';

/** How long the snack bar for a refused or failed request stays, in milliseconds. */
const NOTICE_DURATION_MS = 8000;

/**
 * Adds `Authorization: Bearer <token>` to requests for our own API (`/api/...`), and reacts to
 * what the API answers for every request but a credential check:
 * - 401: the session ended (expired, or the user was deactivated); forget it and go to sign-in,
 *   keeping the page to come back to;
 * - 403: the role may not do this; say so;
 * - 503: the database is unavailable; say so;
 * - status 0: the server could not be reached; say so.
 * The error still reaches the caller, which may show more (e.g. field errors).
 */
export const authInterceptor: HttpInterceptorFn = (request, next) => {
  const session = inject(AuthSession);
  const router = inject(Router);
  const snackBar = inject(MatSnackBar);

  const token = session.token();
  const outgoing =
    token && isOwnApi(request.url)
      ? request.clone({ setHeaders: { Authorization: `Bearer ${token}` } })
      : request;

  return next(outgoing).pipe(
    catchError((error: unknown) => {
      if (error instanceof HttpErrorResponse && !request.context.get(CREDENTIAL_CHECK)) {
        if (error.status === 401) {
          const hadSession = session.isSignedIn();
          session.signOut();
          if (hadSession) {
            snackBar.open('Your session has ended. Please sign in again.', 'Close', {
              duration: NOTICE_DURATION_MS,
            });
          }
          // Before the first navigation (a stored session checked at start-up) the guards send
          // the initial navigation to sign-in themselves, with the right page to return to.
          if (router.navigated) {
            const returnUrl = router.url.startsWith('/sign-in') ? undefined : router.url;
            void router.navigate(['/sign-in'], { queryParams: returnUrl ? { returnUrl } : {} });
          }
        } else if (error.status === 403) {
          snackBar.open(
            apiErrorMessage(error, 'Your role may not do that.'),
            'Close',
            { duration: NOTICE_DURATION_MS, panelClass: 'sm-snack-refused' },
          );
        } else if (error.status === 503 || error.status === 0) {
          snackBar.open(
            apiErrorMessage(error, 'The Shelfmatch database is unavailable right now. Try again in a minute.'),
            'Close',
            { duration: NOTICE_DURATION_MS, panelClass: 'sm-snack-unavailable' },
          );
        }
      }
      return throwError(() => error);
    }),
  );
};

/**
 * Whether the interceptor has already told the person about this failure (401, 403, 503, or no
 * answer), so a page need not say it again.
 */
export function isAnnouncedByInterceptor(error: unknown): boolean {
  return error instanceof HttpErrorResponse && [0, 401, 403, 503].includes(error.status);
}

/** Whether `url` addresses our own API on this origin; the token is never sent elsewhere. */
function isOwnApi(url: string): boolean {
  return url.startsWith('/api/') || url === '/api';
}
