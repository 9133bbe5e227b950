import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { provideRouter } from '@angular/router';

import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import type { OrganisationSettings, OrganisationSettingsResponse } from './organisation-settings.js';
import { SettingsPage } from './settings-page.js';

const STORED: OrganisationSettingsResponse = {
  usableSrfFraction: 0.5,
  excludeAboveLimit: false,
  defaultObjective: 'worst-case',
  lossBudgetDb: 0.5,
  preferredSeries: { capacitor: 'E24', inductor: 'E12' },
  attritionPercent: 5,
  updatedAt: null,
  updatedBy: null,
};

describe('SettingsPage', () => {
  let fixture: ComponentFixture<SettingsPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function open(answer: unknown = STORED, status = 200): Promise<void> {
    localStorage.clear();
    storeSession(demoUser('admin', 1));
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'sign-in', component: BlankPage }]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SettingsPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    backend.expectOne({ method: 'GET', url: '/api/settings' }).flush(answer as object, { status, statusText: status === 200 ? 'OK' : 'Failed' });
    await fixture.whenStable();
  }

  const input = (id: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
  const select = (id: string) => loader.getHarness(MatSelectHarness.with({ selector: `[data-testid="${id}"]` }));
  const save = async () => (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="settings-save"]' }))).click();

  afterEach(() => backend.verify());

  it('shows the stored settings, the SRF share in percent', async () => {
    await open({ ...STORED, usableSrfFraction: 0.6, preferredSeries: { capacitor: 'E48', inductor: 'E6' } });
    expect(await (await input('settings-srf-fraction')).getValue()).toBe('60');
    expect(await (await input('settings-loss-budget')).getValue()).toBe('0.5');
    expect(await (await input('settings-attrition')).getValue()).toBe('5');
    expect(await (await select('settings-capacitor-series')).getValueText()).toBe('E48');
    expect(await (await select('settings-inductor-series')).getValueText()).toBe('E6');
    expect(await (await select('settings-default-objective')).getValueText()).toBe('Worst case over tolerances');
    expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="settings-last-change"]')?.textContent).toContain('defaults stand');
  });

  it('puts every setting, the SRF share as a fraction', async () => {
    await open();
    await (await input('settings-srf-fraction')).setValue('40');
    await (await loader.getHarness(MatSlideToggleHarness.with({ selector: '[data-testid="settings-exclude-above-limit"]' }))).check();
    const objective = await select('settings-default-objective');
    await objective.open();
    await objective.clickOptions({ text: 'Nominal values at f0' });
    await (await input('settings-loss-budget')).setValue('0.8');
    const inductors = await select('settings-inductor-series');
    await inductors.open();
    await inductors.clickOptions({ text: 'E24' });
    await (await input('settings-attrition')).setValue('7.5');
    await save();

    const put = backend.expectOne({ method: 'PUT', url: '/api/settings' });
    const expected: OrganisationSettings = {
      usableSrfFraction: 0.4,
      excludeAboveLimit: true,
      defaultObjective: 'nominal',
      lossBudgetDb: 0.8,
      preferredSeries: { capacitor: 'E24', inductor: 'E24' },
      attritionPercent: 7.5,
    };
    expect(put.request.body).toEqual(expected);
    put.flush({ ...expected, updatedAt: '2026-12-02T10:30:00Z', updatedBy: { id: 1, name: 'Ada Marsh', email: 'admin@tarnwick.example' } });
    await vi.waitFor(() =>
      expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="settings-last-change"]')?.textContent).toContain('by Ada Marsh'),
    );
    expect(await (await input('settings-srf-fraction')).getValue()).toBe('40');
  });

  it('does not send a share of SRF above 100 %', async () => {
    await open();
    await (await input('settings-srf-fraction')).setValue('150');
    await save();
    backend.expectNone('/api/settings');
  });

  it('shows a refused setting next to its field', async () => {
    await open();
    await save();
    backend.expectOne({ method: 'PUT', url: '/api/settings' }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'lossBudgetDb: 0.5 is below the smallest budget the organisation allows',
          details: [{ field: 'lossBudgetDb', message: 'lossBudgetDb: 0.5 is below the smallest budget the organisation allows' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    const element: HTMLElement = fixture.nativeElement;
    await vi.waitFor(() =>
      expect(element.querySelector('[data-testid="settings-problem-lossBudgetDb"]')?.textContent).toContain('below the smallest budget'),
    );
    expect(element.querySelector('[data-testid="settings-save-error"]')?.textContent).toContain('below the smallest budget');
  });

  it('says so when the settings cannot be loaded, and keeps Save off', async () => {
    await open({ error: { code: 'internal_error', message: 'Something broke on the server.' } }, 500);
    const element: HTMLElement = fixture.nativeElement;
    expect(element.querySelector('[data-testid="settings-load-error"]')?.textContent).toContain('Something broke on the server.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="settings-save"]' }))).isDisabled()).toBe(true);
  });
});
