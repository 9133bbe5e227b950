import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';

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
});
