import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import { BlankPage } from '../testing/blank-page.js';
import { demoUser, freshToken, storeSession, tokenExpiringAt } from '../testing/signed-in-user.js';
import { authInterceptor } from './auth-interceptor.js';
import { AuthSession, SESSION_STORAGE_KEY, isExpired } from './auth-session.js';

describe('AuthSession', () => {
  let http: HttpTestingController;

  function createSession(): AuthSession {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'sign-in', component: BlankPage }]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    return TestBed.inject(AuthSession);
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => http.verify());

  it('signs in through POST /api/auth/login and keeps the token in localStorage', async () => {
    const session = createSession();
    const token = freshToken();
    const user = demoUser('stores');

    const signedIn = session.signIn({ email: user.email, password: 'shelfmatch-demo' });
    const request = http.expectOne('/api/auth/login');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ email: user.email, password: 'shelfmatch-demo' });
    request.flush({ token, user });

    await expect(signedIn).resolves.toEqual(user);
    expect(session.token()).toBe(token);
    expect(session.currentUser()).toEqual(user);
    expect(session.isSignedIn()).toBe(true);
    expect(JSON.parse(localStorage.getItem(SESSION_STORAGE_KEY)!)).toEqual({ token, user });
  });

  it('stays signed out when sign-in is refused', async () => {
    const session = createSession();
    const signedIn = session.signIn({ email: 'nobody@tarnwick.example', password: 'wrong' });
    http.expectOne('/api/auth/login').flush(
      { error: { code: 'invalid_credentials', message: 'No.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await expect(signedIn).rejects.toMatchObject({ status: 401 });
    expect(session.isSignedIn()).toBe(false);
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull();
  });

  it('clears the token and the user on sign-out', () => {
    storeSession(demoUser('designer'));
    const session = createSession();
    expect(session.isSignedIn()).toBe(true);

    session.signOut();

    expect(session.token()).toBeNull();
    expect(session.currentUser()).toBeNull();
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull();
  });

  it('drops a stored session whose token has expired', () => {
    storeSession(demoUser('admin'), tokenExpiringAt(Math.floor(Date.now() / 1000) - 60));
    const session = createSession();
    expect(session.isSignedIn()).toBe(false);
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull();
  });

  it('drops a stored session that is not valid JSON', () => {
    localStorage.setItem(SESSION_STORAGE_KEY, '{not json');
    expect(createSession().isSignedIn()).toBe(false);
  });

  it('takes the role the server reports now from GET /api/auth/me', async () => {
    storeSession(demoUser('designer'));
    const session = createSession();
    const refreshed = session.refreshCurrentUser();
    http.expectOne('/api/auth/me').flush(demoUser('purchasing'));
    await refreshed;
    expect(session.currentUser()?.role).toBe('purchasing');
  });

  it('signs out when GET /api/auth/me answers 401 (e.g. the user was deactivated)', async () => {
    storeSession(demoUser('designer'));
    const session = createSession();
    const refreshed = session.refreshCurrentUser();
    http.expectOne('/api/auth/me').flush(
      { error: { code: 'unauthorized', message: 'Sign in again.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await refreshed;
    expect(session.isSignedIn()).toBe(false);
  });

  it('keeps the stored user when the server cannot be reached', async () => {
    const user = demoUser('stores');
    storeSession(user);
    const session = createSession();
    const refreshed = session.refreshCurrentUser();
    http.expectOne('/api/auth/me').error(new ProgressEvent('error'), { status: 0 });
    await refreshed;
    expect(session.currentUser()).toEqual(user);
  });
});

describe('isExpired', () => {
  // RFC 7519 section 4.1.4: `exp` is in seconds since the epoch; at or after it the token is void.
  it('reads exp in seconds', () => {
    const exp = 1_800_000_000;
    expect(isExpired(tokenExpiringAt(exp), exp * 1000 - 1)).toBe(false);
    expect(isExpired(tokenExpiringAt(exp), exp * 1000)).toBe(true);
  });

  it('leaves an unreadable token to the server', () => {
    expect(isExpired('opaque-token', Date.now())).toBe(false);
    expect(isExpired('a.%%%.c', Date.now())).toBe(false);
  });
});
