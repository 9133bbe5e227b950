import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import type { ShortfallListSummary } from '../../../shared/api/builds.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { SHORTFALL } from '../builds/build-fixtures.js';
import { ShortfallPage } from './shortfall-page.js';

const SUMMARY: ShortfallListSummary = {
  id: 9,
  buildId: 5,
  buildName: 'NODE-868 rev C',
  buildStatus: 'reserved',
  status: 'draft',
  lineCount: 1,
  quantity: 42,
  receivedQuantity: 0,
  sentTo: null,
  createdAt: '2026-12-01T10:00:00.000Z',
  updatedAt: '2026-12-01T10:00:00.000Z',
};

describe('ShortfallPage', () => {
  let fixture: ComponentFixture<ShortfallPage>;
  let backend: HttpTestingController;

  beforeEach(async () => {
    localStorage.clear();
    storeSession(demoUser('purchasing'));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([{ path: 'shortfall', component: ShortfallPage }])] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ShortfallPage);
    fixture.detectChanges();
    await fixture.whenStable();
    backend.expectOne((req) => req.url === '/api/shortfall').flush({ items: [SUMMARY], total: 1 });
    await fixture.whenStable();
  });
  afterEach(() => localStorage.clear());

  it('lists the lists and opens the one chosen', async () => {
    const rows: HTMLElement[] = Array.from(fixture.nativeElement.querySelectorAll('[data-testid="shortfall-list-row"]'));
    expect(rows).toHaveLength(1);
    expect(rows[0].textContent).toContain('NODE-868 rev C');
    expect(rows[0].textContent).toContain('Draft');
    expect(rows[0].textContent).toContain('42');
    const router = TestBed.inject(Router);
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    rows[0].click();
    expect(navigate).toHaveBeenCalledWith([], { queryParams: { build: 5 } });
    backend.verify();
  });

  it('shows the list named in the address', async () => {
    await TestBed.inject(Router).navigate(['/shortfall'], { queryParams: { build: 5 } });
    fixture.detectChanges();
    backend.expectOne('/api/builds/5/shortfall').flush(SHORTFALL);
    fixture.detectChanges();
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="shortfall-detail-name"]')?.textContent).toContain('NODE-868 rev C');
    backend.verify();
  });

  it('finds lists by build name and status, and says when it shows only those changed last', async () => {
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelector('[data-testid="shortfall-more"]')).toBeNull();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-testid="shortfall-search"]' }))).setValue('node');
    const found = await vi.waitFor(() => backend.expectOne((req) => req.url === '/api/shortfall' && req.params.get('search') === 'node'));
    found.flush({ items: [SUMMARY], total: 130 });
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="shortfall-more"]')?.textContent).toContain('The 1 changed last of 130; find the others by build name or status.');

    const status = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="shortfall-status-filter"]' }));
    await status.open();
    await status.clickOptions({ text: 'Ordered' });
    const ordered = backend.expectOne((req) => req.url === '/api/shortfall' && req.params.get('status') === 'ordered');
    expect(ordered.request.params.get('search')).toBe('node');
    ordered.flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="shortfall-none"]')?.textContent).toContain('No shortfall list matches these filters.');
    backend.verify();
  });
});
