import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  ApplicationConfig,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { TitleStrategy, provideRouter, withComponentInputBinding } from '@angular/router';

import { routes } from './app.routes.js';
import { authInterceptor } from './auth/auth-interceptor.js';
import { AuthSession } from './auth/auth-session.js';
import { ShelfmatchTitle } from './layout/shelfmatch-title.js';

/** Providers of the running app (specs build their own, smaller sets). */
export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    provideHttpClient(withInterceptors([authInterceptor])),
    { provide: TitleStrategy, useClass: ShelfmatchTitle },
    provideAppInitializer(() => {
      // Icons come from the self-hosted Material Symbols font (angular.json `styles`).
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined', 'mat-ligature-font');
    }),
    // A stored session is checked with the server before the first page, so guards see the
    // user's current role; a 401 there signs out.
    provideAppInitializer(() => inject(AuthSession).refreshCurrentUser()),
  ],
};
