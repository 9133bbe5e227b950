import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import { NewUserForm } from './new-user-form.js';

describe('NewUserForm', () => {
  let fixture: ComponentFixture<NewUserForm>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(NewUserForm);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });
  afterEach(() => backend.verify());

  async function fill(values: Record<string, string>): Promise<void> {
    for (const [testId, value] of Object.entries(values)) {
      await (await loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${testId}"]` }))).setValue(value);
    }
  }
  const submit = async () =>
    (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="new-user-submit"]' }))).click();

  it('refuses a first password shorter than the server accepts, without sending it', async () => {
    await fill({ 'new-user-email': 'tech@tarnwick.example', 'new-user-name': 'Fen Oduya', 'new-user-password': 'nine-char' });
    await submit();
    backend.expectNone('/api/users');
    const password = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /First password/ }));
    expect(await password.getTextErrors()).toEqual(['Use at least 10 characters.']);
  });

  it('shows the field problems a 400 names beside their fields, and emits nothing', async () => {
    const created = vi.fn();
    fixture.componentRef.instance.userCreated.subscribe(created);
    await fill({ 'new-user-email': 'tech@tarnwick.example', 'new-user-name': 'Fen Oduya', 'new-user-password': 'long-enough-pass' });
    await submit();
    backend.expectOne('/api/users').flush(
      {
        error: {
          code: 'invalid_input',
          message: 'The new user is not valid: email: that domain does not take mail',
          details: [{ field: 'email', message: 'that domain does not take mail' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await vi.waitFor(() => {
      const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
      expect(text).toContain('that domain does not take mail');
      expect(text).toContain('The new user is not valid');
    });
    expect(created).not.toHaveBeenCalled();
  });

  it('sends a first password when one is given, and asks for no invitation', async () => {
    const invite = vi.fn();
    fixture.componentRef.instance.inviteRequested.subscribe(invite);
    await fill({ 'new-user-email': 'tech@tarnwick.example', 'new-user-name': 'Fen Oduya', 'new-user-password': 'long-enough-pass' });
    expect(await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="new-user-submit"]' }))).getText()).toBe('Create user');
    await submit();
    const sent = backend.expectOne('/api/users');
    expect(sent.request.body).toEqual({ email: 'tech@tarnwick.example', name: 'Fen Oduya', role: 'designer', password: 'long-enough-pass' });
    sent.flush({ id: 5, email: 'tech@tarnwick.example', name: 'Fen Oduya', role: 'designer', active: true, passwordSet: true });
    await fixture.whenStable();
    expect(invite).not.toHaveBeenCalled();
  });

  it('creates a user without a password and asks for an invitation when the password is left empty', async () => {
    const created = vi.fn();
    const invite = vi.fn();
    fixture.componentRef.instance.userCreated.subscribe(created);
    fixture.componentRef.instance.inviteRequested.subscribe(invite);
    await fill({ 'new-user-email': 'new@tarnwick.example', 'new-user-name': 'Ines Varga' });
    expect(await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="new-user-submit"]' }))).getText()).toBe('Create and invite');
    await submit();
    const sent = backend.expectOne('/api/users');
    // No password field at all: the server then keeps none.
    expect(sent.request.body).toEqual({ email: 'new@tarnwick.example', name: 'Ines Varga', role: 'designer' });
    const user = { id: 6, email: 'new@tarnwick.example', name: 'Ines Varga', role: 'designer', active: true, passwordSet: true };
    sent.flush(user);
    await fixture.whenStable();
    expect(created).toHaveBeenCalledWith(user);
    expect(invite).toHaveBeenCalledWith(user);
  });
});
