import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';

import type { User } from '../../../shared/api/auth.js';
import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { AdminPage } from './admin-page.js';

// Invented people of the demo company (product.md: Tarnwick Field Sensors).
const ADMIN: User = { ...demoUser('admin', 1), name: 'Ada Okafor' };
const PEOPLE: User[] = [
  ADMIN,
  { id: 2, email: 'rf.lead@tarnwick.example', name: 'Bruno Lindqvist', role: 'designer', active: true, passwordSet: true },
  { id: 3, email: 'shelves@tarnwick.example', name: 'Carmen Ruiz', role: 'stores', active: false, passwordSet: true },
];

describe('AdminPage', () => {
  let fixture: ComponentFixture<AdminPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function openWithUsers(answer: unknown, status = 200): Promise<void> {
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
    const request = backend.expectOne('/api/users');
    expect(request.request.method).toBe('GET');
    request.flush(answer as User[], { status, statusText: status === 200 ? 'OK' : 'Failed' });
    await fixture.whenStable();
  }

  async function tableRows(): Promise<Record<string, string>[]> {
    const table = await loader.getHarness(MatTableHarness);
    const rows = await table.getRows();
    return Promise.all(rows.map((row) => row.getCellTextByColumnName()));
  }

  afterEach(() => backend.verify());

  it('lists the users from GET /api/users, ordered by name', async () => {
    await openWithUsers([PEOPLE[2], PEOPLE[0], PEOPLE[1]]);
    const rows = await tableRows();
    expect(rows.map((row) => [row['name'], row['email'], row['status']])).toEqual([
      ['Ada Okafor', 'admin@tarnwick.example', 'Active'],
      ['Bruno Lindqvist', 'rf.lead@tarnwick.example', 'Active'],
      ['Carmen Ruiz', 'shelves@tarnwick.example', 'Deactivated'],
    ]);
  });

  it('marks a user who has not chosen a password yet as invited', async () => {
    await openWithUsers([...PEOPLE, { id: 4, email: 'new.hire@tarnwick.example', name: 'Dara Finch', role: 'stores', active: true, passwordSet: false }]);
    const rows = await tableRows();
    expect(rows.find((row) => row['name'] === 'Dara Finch')?.['status']).toBe('Invited');
    expect(rows.find((row) => row['name'] === 'Bruno Lindqvist')?.['status']).toBe('Active');
  });

  it('also reads a list in the {items} envelope', async () => {
    await openWithUsers({ items: PEOPLE, total: PEOPLE.length });
    expect((await tableRows()).length).toBe(3);
  });

  it('says so when the list cannot be loaded', async () => {
    await openWithUsers({ error: { code: 'internal_error', message: 'Something broke on the server.' } }, 500);
    const shown = fixture.nativeElement.querySelector('[data-testid="users-load-error"]');
    expect(shown?.textContent).toContain('Something broke on the server.');
    expect(await tableRows()).toEqual([]);
  });

  it('refuses a list answer of an unknown shape rather than showing no users', async () => {
    await openWithUsers({ users: PEOPLE });
    const shown = fixture.nativeElement.querySelector('[data-testid="users-load-error"]');
    expect(shown?.textContent).toContain('could not be loaded');
  });

  it('changes a role with PATCH /api/users/:id', async () => {
    await openWithUsers(PEOPLE);
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="user-role-rf.lead@tarnwick.example"]' }));
    await select.open();
    await select.clickOptions({ text: 'purchasing' });

    const request = backend.expectOne('/api/users/2');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ role: 'purchasing' });
    request.flush({ ...PEOPLE[1], role: 'purchasing' });
    await fixture.whenStable();
    expect(await select.getValueText()).toBe('purchasing');
  });

  it('does not let the admin change their own role or deactivate themselves', async () => {
    await openWithUsers(PEOPLE);
    const ownSelect = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="user-role-admin@tarnwick.example"]' }));
    expect(await ownSelect.isDisabled()).toBe(true);
    const toggles = await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[data-testid="user-active-toggle-admin@tarnwick.example"]' }));
    expect(toggles.length).toBe(0);
  });

  it('deactivates and reactivates users', async () => {
    await openWithUsers(PEOPLE);
    const deactivate = await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="user-active-toggle-rf.lead@tarnwick.example"]' }));
    expect(await deactivate.getText()).toBe('Deactivate');
    await deactivate.click();
    const off = backend.expectOne('/api/users/2');
    expect(off.request.body).toEqual({ active: false });
    off.flush({ ...PEOPLE[1], active: false });
    await fixture.whenStable();

    const reactivate = await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="user-active-toggle-shelves@tarnwick.example"]' }));
    expect(await reactivate.getText()).toBe('Reactivate');
    await reactivate.click();
    const on = backend.expectOne('/api/users/3');
    expect(on.request.body).toEqual({ active: true });
    on.flush({ ...PEOPLE[2], active: true });
    await fixture.whenStable();

    const statuses = (await tableRows()).map((row) => row['status']);
    expect(statuses).toEqual(['Active', 'Deactivated', 'Active']);
  });

  it('creates a user with POST /api/users and adds it to the table', async () => {
    await openWithUsers(PEOPLE);
    const field = (id: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
    await (await field('new-user-email')).setValue('buyer@tarnwick.example');
    await (await field('new-user-name')).setValue('Dana Whitcombe');
    const role = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="new-user-role"]' }));
    await role.open();
    await role.clickOptions({ text: 'purchasing' });
    await (await field('new-user-password')).setValue('first-pass-2026');
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="new-user-submit"]' }))).click();

    const request = backend.expectOne('/api/users');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      email: 'buyer@tarnwick.example',
      name: 'Dana Whitcombe',
      role: 'purchasing',
      password: 'first-pass-2026',
    });
    request.flush({ id: 4, email: 'buyer@tarnwick.example', name: 'Dana Whitcombe', role: 'purchasing', active: true, passwordSet: true });
    await vi.waitFor(async () => expect((await tableRows()).map((row) => row['name'])).toContain('Dana Whitcombe'));
    expect(await (await field('new-user-email')).getValue()).toBe('');
  });

  it('shows the reason the server refused a new user', async () => {
    await openWithUsers(PEOPLE);
    const field = (id: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
    await (await field('new-user-email')).setValue('rf.lead@tarnwick.example');
    await (await field('new-user-name')).setValue('Bruno again');
    await (await field('new-user-password')).setValue('first-pass-2026');
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="new-user-submit"]' }))).click();

    backend.expectOne('/api/users').flush(
      { error: { code: 'email_taken', message: 'A user with the e-mail rf.lead@tarnwick.example exists.' } },
      { status: 409, statusText: 'Conflict' },
    );
    await vi.waitFor(() =>
      expect(fixture.nativeElement.querySelector('[data-testid="new-user-error"]')?.textContent).toContain(
        'A user with the e-mail rf.lead@tarnwick.example exists.',
      ),
    );
    expect((await tableRows()).length).toBe(3);
  });
});
