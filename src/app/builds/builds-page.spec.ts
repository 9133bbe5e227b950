import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import type { Role } from '../../../shared/api/auth.js';
import { SAVED_MATCH_SUMMARY } from '../matches/match-fixtures.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { RESERVED_BUILD } from './build-fixtures.js';
import { BuildsPage } from './builds-page.js';

describe('BuildsPage', () => {
  let fixture: ComponentFixture<BuildsPage>;
  let backend: HttpTestingController;

  async function openAs(role: Role): Promise<void> {
    localStorage.clear();
    storeSession(demoUser(role));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([{ path: 'builds', component: BuildsPage }])] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BuildsPage);
    fixture.detectChanges();
    await fixture.whenStable();
  }
  afterEach(() => localStorage.clear());

  it('gives a designer the plan form with the saved matches, and the builds so far', async () => {
    await openAs('designer');
    backend.expectOne('/api/matches').flush({ items: [{ ...SAVED_MATCH_SUMMARY, id: 3, name: '868 MHz antenna' }], total: 1 });
    backend.expectOne((req) => req.url === '/api/builds').flush({ items: [{ id: 5, name: 'NODE-868 rev C', quantity: 50, status: 'reserved', matchCount: 1, shortfallLines: 1, shortfallStatus: 'draft', createdAt: '', updatedAt: '' }], total: 1 });
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelectorAll('[data-testid="build-match-option"]')).toHaveLength(1);
    expect(el.querySelector('[data-testid="build-row"]')?.textContent?.replace(/\s+/g, ' ')).toContain('Stock reserved · 50 × 1 match · 1 short');
    backend.verify();
  });

  it('shows stores the builds without the plan form, and opens the one in the address', async () => {
    await openAs('stores');
    backend.expectNone('/api/matches');
    backend.expectOne((req) => req.url === '/api/builds').flush({ items: [], total: 0 });
    expect(fixture.nativeElement.querySelector('[data-testid="build-create"]')).toBeNull();
    await TestBed.inject(Router).navigate(['/builds'], { queryParams: { build: 5 } });
    backend.expectOne('/api/builds/5').flush(RESERVED_BUILD);
    fixture.detectChanges();
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="build-detail-name"]')?.textContent).toContain('NODE-868 rev C');
    backend.verify();
  });

  it('finds builds by name and status, and says when it lists only the newest', async () => {
    await openAs('stores');
    const row = (id: number, name: string) => ({ id, name, quantity: 1, status: 'reserved', matchCount: 1, shortfallLines: 0, shortfallStatus: null, createdAt: '', updatedAt: '' });
    const first = backend.expectOne((req) => req.url === '/api/builds');
    expect(first.request.params.get('search')).toBeNull();
    first.flush({ items: [row(9, 'Soil node rev C'), row(8, 'Gateway')], total: 140 });
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelector('[data-testid="build-list-more"]')?.textContent).toContain('The newest 2 of 140; find the others by name or status.');

    const loader = TestbedHarnessEnvironment.loader(fixture);
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="build-search"]' }))).setValue('soil');
    const found = await vi.waitFor(() => backend.expectOne((req) => req.url === '/api/builds' && req.params.get('search') === 'soil'));
    found.flush({ items: [row(9, 'Soil node rev C')], total: 1 });
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid="build-row"]')).toHaveLength(1);
    expect(el.querySelector('[data-testid="build-list-more"]')).toBeNull();

    const status = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="build-status-filter"]' }));
    await status.open();
    await status.clickOptions({ text: 'Built' });
    const built = backend.expectOne((req) => req.url === '/api/builds' && req.params.get('status') === 'built');
    expect(built.request.params.get('search')).toBe('soil');
    built.flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="build-list-none"]')?.textContent).toContain('No build matches these filters.');
    backend.verify();
  });
});
