import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { BlankPage } from '../testing/blank-page.js';
import { demoUser, freshToken } from '../testing/signed-in-user.js';
import { authInterceptor } from './auth-interceptor.js';
import { AuthSession } from './auth-session.js';
import { SignIn, WRONG_CREDENTIALS_MESSAGE } from './sign-in.js';

describe('SignIn', () => {
  let harness: RouterTestingHarness;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function openSignIn(url = '/sign-in'): Promise<void> {
    TestBed.configureTestingModule({
      providers: [
        provideRouter(
          [
            { path: 'sign-in', component: SignIn },
            { path: 'matches', component: BlankPage },
            { path: 'stock', component: BlankPage },
            { path: 'builds', component: BlankPage },
            { path: 'admin', component: BlankPage },
          ],
          withComponentInputBinding(),
        ),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create(url);
    loader = TestbedHarnessEnvironment.loader(harness.fixture);
  }

  async function submit(email: string, password: string): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="sign-in-email"]' }))).setValue(email);
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="sign-in-password"]' }))).setValue(password);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="sign-in-submit"]' }))).click();
  }

  function shownError(): string | null {
    const element = harness.routeNativeElement?.querySelector('[data-testid="sign-in-error"]');
    return element?.textContent?.trim() ?? null;
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => backend.verify());

  it('shows the server message of a 401 and stays on sign-in', async () => {
    await openSignIn();
    await submit('designer@tarnwick.example', 'not-the-password');

    const request = backend.expectOne('/api/auth/login');
    expect(request.request.body).toEqual({ email: 'designer@tarnwick.example', password: 'not-the-password' });
    request.flush(
      { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match an active account.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await vi.waitFor(() => expect(shownError()).toBe('That e-mail and password do not match an active account.'));
    expect(TestBed.inject(Router).url).toBe('/sign-in');
    expect(TestBed.inject(AuthSession).isSignedIn()).toBe(false);
  });

  it('falls back to one fixed sentence when a 401 carries no message', async () => {
    await openSignIn();
    await submit('nobody@tarnwick.example', 'whatever');
    backend.expectOne('/api/auth/login').flush('', { status: 401, statusText: 'Unauthorized' });
    await vi.waitFor(() => expect(shownError()).toBe(WRONG_CREDENTIALS_MESSAGE));
  });

  it('sends nothing while the form is incomplete', async () => {
    await openSignIn();
    await submit('', '');
    backend.expectNone('/api/auth/login');
    const text = harness.routeNativeElement?.textContent ?? '';
    expect(text).toContain('Enter your e-mail address.');
    expect(text).toContain('Enter your password.');
  });

  it('takes a stores user to the stock list after sign-in', async () => {
    await openSignIn();
    await submit('stores@tarnwick.example', 'shelfmatch-demo');
    backend.expectOne('/api/auth/login').flush({ token: freshToken(), user: demoUser('stores') });
    await vi.waitFor(() => expect(TestBed.inject(Router).url).toBe('/stock'));
  });

  it('returns to the page asked for when the role may open it', async () => {
    await openSignIn('/sign-in?returnUrl=%2Fbuilds');
    await submit('designer@tarnwick.example', 'shelfmatch-demo');
    backend.expectOne('/api/auth/login').flush({ token: freshToken(), user: demoUser('designer') });
    await vi.waitFor(() => expect(TestBed.inject(Router).url).toBe('/builds'));
  });

  it('ignores a return page the role may not open', async () => {
    await openSignIn('/sign-in?returnUrl=%2Fadmin');
    await submit('designer@tarnwick.example', 'shelfmatch-demo');
    backend.expectOne('/api/auth/login').flush({ token: freshToken(), user: demoUser('designer') });
    await vi.waitFor(() => expect(TestBed.inject(Router).url).toBe('/matches'));
  });
});
