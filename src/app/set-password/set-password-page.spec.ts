import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { SetPasswordPage } from './set-password-page.js';

// A well-formed link token (base64url of 32 bytes), invented for the spec.
const TOKEN = 'q3Vb7XkP0sN9yRj2LmZt8WcAeHf4UdGi1oBn6KxYpQw';
const BRUNO = { email: 'bruno.lindqvist@tarnwick.example', name: 'Bruno Lindqvist', purpose: 'invitation', expiresAt: '2026-12-09T01:00:00.000Z' };

describe('SetPasswordPage', () => {
  let harness: RouterTestingHarness;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function openLink(url = `/set-password?token=${TOKEN}`): Promise<void> {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideRouter(
          [
            { path: 'set-password', component: SetPasswordPage },
            { path: 'sign-in', component: BlankPage },
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

  function answerCheck(body: object, status = 200): void {
    const request = backend.expectOne('/api/auth/set-password/check');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ token: TOKEN });
    request.flush(body, { status, statusText: status === 200 ? 'OK' : 'Refused' });
  }

  async function choose(password: string, repeat = password): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="set-password-input"]' }))).setValue(password);
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="set-password-repeat"]' }))).setValue(repeat);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="set-password-submit"]' }))).click();
  }

  const text = (testId: string) => harness.routeNativeElement?.querySelector(`[data-testid="${testId}"]`)?.textContent?.trim() ?? null;

  /** Lets the answered request's promise callbacks run, then waits for the rendering they scheduled. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await harness.fixture.whenStable();
  }

  afterEach(() => backend.verify());

  it('checks the link, then sets the password once and points to sign-in', async () => {
    await openLink();
    answerCheck(BRUNO);
    await settle();
    expect(harness.routeNativeElement?.textContent).toContain('invited to Shelfmatch as bruno.lindqvist@tarnwick.example');

    await choose('smith-chart-868');
    const request = backend.expectOne('/api/auth/set-password');
    expect(request.request.body).toEqual({ token: TOKEN, password: 'smith-chart-868' });
    expect(request.request.headers.has('Authorization')).toBe(false);
    request.flush({ email: BRUNO.email });
    await settle();

    expect(text('set-password-done')).toContain(BRUNO.email);
    expect(harness.routeNativeElement?.querySelector('[data-testid="set-password-input"]')).toBeNull();
    const signIn = harness.routeNativeElement?.querySelector('[data-testid="set-password-sign-in"]');
    expect(signIn?.getAttribute('href')).toBe('/sign-in');
  });

  it('sends nothing while the password is too short or the two differ', async () => {
    await openLink();
    answerCheck(BRUNO);
    await settle();
    await choose('short');
    await choose('long-enough-one', 'long-enough-two');
    expect(text('set-password-mismatch')).toBe('The two passwords differ.');
    // backend.verify() in afterEach: no set-password request went out.
  });

  it('says the link cannot be used when it was used, expired or replaced', async () => {
    await openLink();
    answerCheck(
      { error: { code: 'token_expired', message: 'This set-password link expired at 2026-11-30T10:00:00.000Z. Ask an admin to send a new one.' } },
      410,
    );
    await settle();
    expect(text('set-password-unusable')).toContain('expired at 2026-11-30');
    expect(harness.routeNativeElement?.querySelector('[data-testid="set-password-input"]')).toBeNull();
  });

  it('turns to "cannot be used" when the link is used up between check and save', async () => {
    await openLink();
    answerCheck(BRUNO);
    await settle();
    await choose('smith-chart-868');
    backend
      .expectOne('/api/auth/set-password')
      .flush({ error: { code: 'token_used', message: 'This set-password link has already been used.' } }, { status: 410, statusText: 'Gone' });
    await settle();
    expect(text('set-password-unusable')).toContain('already been used');
  });

  it('keeps the form and shows the server reason for a refused password', async () => {
    await openLink();
    answerCheck({ ...BRUNO, purpose: 'password-reset' });
    await settle();
    expect(harness.routeNativeElement?.textContent).toContain('A new password for bruno.lindqvist@tarnwick.example');
    await choose('0123456789');
    backend.expectOne('/api/auth/set-password').flush(
      { error: { code: 'invalid_input', message: 'The new password is not valid.', details: [{ field: 'password', message: 'too common a password' }] } },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(text('set-password-error')).toBe('too common a password');
    expect(harness.routeNativeElement?.querySelector('[data-testid="set-password-input"]')).not.toBeNull();
  });

  it('asks for nothing when the address has no token', async () => {
    await openLink('/set-password');
    await settle();
    expect(text('set-password-unusable')).toContain('has no link token');
  });
});
