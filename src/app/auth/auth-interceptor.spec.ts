import { HttpClient, HttpContext, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';

import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { authInterceptor } from './auth-interceptor.js';
import { AuthSession } from './auth-session.js';
import { CREDENTIAL_CHECK } from './credential-check.js';

describe('authInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let router: Router;

  function setUp(): void {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'sign-in', component: BlankPage },
          { path: 'stock', component: BlankPage },
        ]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
  }

  /** Sends GET `url`, answers it with `status` and `body`, and returns the caller's error. */
  async function failedGet(url: string, status: number, body: object | string, context?: HttpContext) {
    const answer = firstValueFrom(http.get(url, { context }));
    backend.expectOne(url).flush(body, { status, statusText: 'Failed' });
    return answer.then(
      () => {
        throw new Error(`GET ${url} should have failed with ${status}`);
      },
      (error: unknown) => error,
    );
  }

  async function snackBarText(): Promise<string> {
    const loader = TestbedHarnessEnvironment.documentRootLoader(TestBed.createComponent(BlankPage));
    const snackBar = await loader.getHarness(MatSnackBarHarness);
    return snackBar.getMessage();
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => backend.verify());

  it('adds the bearer token to our own API requests', () => {
    const token = storeSession(demoUser('stores'));
    setUp();
    http.get('/api/parts').subscribe();
    const request = backend.expectOne('/api/parts');
    expect(request.request.headers.get('Authorization')).toBe(`Bearer ${token}`);
    request.flush({ items: [], total: 0 });
  });

  it('never sends the token to another origin', () => {
    storeSession(demoUser('stores'));
    setUp();
    http.get('https://supplier.example/api/parts').subscribe();
    const request = backend.expectOne('https://supplier.example/api/parts');
    expect(request.request.headers.has('Authorization')).toBe(false);
    request.flush({});
  });

  it('sends no Authorization header when signed out', () => {
    setUp();
    http.get('/api/health').subscribe();
    const request = backend.expectOne('/api/health');
    expect(request.request.headers.has('Authorization')).toBe(false);
    request.flush({ status: 'ok', database: 'up' });
  });

  it('on a 401 forgets the session and goes to sign-in, remembering the page', async () => {
    storeSession(demoUser('stores'));
    setUp();
    await router.navigateByUrl('/stock');

    const error = await failedGet('/api/parts', 401, { error: { code: 'unauthorized', message: 'Token expired.' } });

    expect(error).toMatchObject({ status: 401 });
    expect(TestBed.inject(AuthSession).isSignedIn()).toBe(false);
    await vi.waitFor(() => expect(router.url).toBe('/sign-in?returnUrl=%2Fstock'));
    expect(await snackBarText()).toContain('session has ended');
  });

  it('leaves the 401 of a credential check to the sign-in page', async () => {
    setUp();
    await router.navigateByUrl('/sign-in');
    storeSession(demoUser('stores'));
    const error = await failedGet(
      '/api/auth/login',
      401,
      { error: { code: 'invalid_credentials', message: 'No.' } },
      new HttpContext().set(CREDENTIAL_CHECK, true),
    );
    expect(error).toMatchObject({ status: 401 });
    expect(router.url).toBe('/sign-in');
  });

  it('shows the server message of a 403 and keeps the session', async () => {
    storeSession(demoUser('designer'));
    setUp();
    const error = await failedGet('/api/users', 403, {
      error: { code: 'forbidden', message: 'Only an admin may list users.' },
    });
    expect(error).toMatchObject({ status: 403 });
    expect(TestBed.inject(AuthSession).isSignedIn()).toBe(true);
    expect(await snackBarText()).toBe('Only an admin may list users.');
  });

  it('says the database is unavailable on a 503 without a message', async () => {
    storeSession(demoUser('designer'));
    setUp();
    await failedGet('/api/parts', 503, 'Service Unavailable');
    expect(await snackBarText()).toContain('database is unavailable');
  });
});
