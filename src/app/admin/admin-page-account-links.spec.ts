import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { provideRouter } from '@angular/router';

import type { User } from '../../../shared/api/auth.js';
import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { AdminPage } from './admin-page.js';

// Invented people of the demo company (product.md: Tarnwick Field Sensors).
const ADMIN: User = { ...demoUser('admin', 1), name: 'Ada Okafor' };
const BRUNO: User = { id: 2, email: 'rf.lead@tarnwick.example', name: 'Bruno Lindqvist', role: 'designer', active: true, passwordSet: true };
const CARMEN: User = { id: 3, email: 'shelves@tarnwick.example', name: 'Carmen Ruiz', role: 'stores', active: false, passwordSet: true };

describe('AdminPage e-mailed links', () => {
  let fixture: ComponentFixture<AdminPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  beforeEach(async () => {
    localStorage.clear();
    storeSession(ADMIN);
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'sign-in', component: BlankPage }]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AdminPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    backend.expectOne('/api/users').flush([ADMIN, BRUNO, CARMEN]);
    await fixture.whenStable();
  });
  afterEach(() => backend.verify());

  const buttonIn = (email: string, testId: string) =>
    loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="user-row-${email}"] [data-testid="${testId}"]` }));
  const snackText = async () => (await TestbedHarnessEnvironment.documentRootLoader(fixture).getHarness(MatSnackBarHarness)).getMessage();

  it('sends an invitation with POST /api/users/:id/invitation and says until when the link works', async () => {
    await (await buttonIn('rf.lead@tarnwick.example', 'send-invitation')).click();
    const request = backend.expectOne('/api/users/2/invitation');
    expect(request.request.method).toBe('POST');
    request.flush({ userId: 2, email: 'rf.lead@tarnwick.example', purpose: 'invitation', expiresAt: '2026-12-09T01:00:00.000Z', outboxId: 7 }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    const said = await snackText();
    expect(said).toContain('Invitation sent to rf.lead@tarnwick.example');
    expect(said).toContain('the link works once');
  });

  it('sends a password reset with POST /api/users/:id/password-reset', async () => {
    await (await buttonIn('rf.lead@tarnwick.example', 'send-password-reset')).click();
    const request = backend.expectOne('/api/users/2/password-reset');
    expect(request.request.method).toBe('POST');
    request.flush({ userId: 2, email: 'rf.lead@tarnwick.example', purpose: 'password-reset', expiresAt: '2026-12-02T02:00:00.000Z', outboxId: 8 }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(await snackText()).toContain('Password reset sent to rf.lead@tarnwick.example');
  });

  it('shows the mail server problem the API reports', async () => {
    await (await buttonIn('rf.lead@tarnwick.example', 'send-invitation')).click();
    backend
      .expectOne('/api/users/2/invitation')
      .flush(
        { error: { code: 'mail_rejected', message: 'The mail server at smtp.tarnwick.example:587 refused the message: 550 mailbox unavailable. Nothing was sent.' } },
        { status: 502, statusText: 'Bad Gateway' },
      );
    await fixture.whenStable();
    expect(await snackText()).toContain('refused the message: 550');
  });

  it('offers no links to a deactivated user or to the admin themself', async () => {
    for (const email of ['shelves@tarnwick.example', 'admin@tarnwick.example']) {
      const found = await loader.getAllHarnesses(MatButtonHarness.with({ selector: `[data-testid="user-row-${email}"] [data-testid^="send-"]` }));
      expect(found).toEqual([]);
    }
  });
});
