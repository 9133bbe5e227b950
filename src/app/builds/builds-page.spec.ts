import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';

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
});
