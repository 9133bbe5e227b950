import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import type { Role } from '../../../shared/api/auth.js';
import { AuthSession } from '../auth/auth-session.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { Shell } from './shell.js';

describe('Shell', () => {
  async function openShellAs(role: Role): Promise<RouterTestingHarness> {
    localStorage.clear();
    storeSession(demoUser(role));
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'sign-in', component: BlankPage },
          { path: '', component: Shell, children: [{ path: 'stock', component: BlankPage }] },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    return RouterTestingHarness.create('/stock');
  }

  function navTestIds(harness: RouterTestingHarness): string[] {
    const links = harness.fixture.nativeElement.querySelectorAll('nav a[data-testid]') as NodeListOf<HTMLElement>;
    return Array.from(links, (link) => link.dataset['testid'] ?? '');
  }

  // Expected navigation from the brief's role table (product.md: every role reads stock and matches).
  it('shows stores Matches, Stock and Builds only', async () => {
    const harness = await openShellAs('stores');
    expect(navTestIds(harness)).toEqual(['nav-matches', 'nav-stock', 'nav-builds']);
  });

  it('shows purchasing and designers the shortfall lists but not Admin', async () => {
    expect(navTestIds(await openShellAs('purchasing'))).toEqual(['nav-matches', 'nav-stock', 'nav-builds', 'nav-shortfall']);
    TestBed.resetTestingModule();
    expect(navTestIds(await openShellAs('designer'))).toEqual(['nav-matches', 'nav-stock', 'nav-builds', 'nav-shortfall']);
  });

  it('shows an admin every area', async () => {
    const harness = await openShellAs('admin');
    expect(navTestIds(harness)).toEqual(['nav-matches', 'nav-stock', 'nav-builds', 'nav-shortfall', 'nav-admin', 'nav-outbox', 'nav-settings']);
  });

  it('shows the product, the user with role, and marks the current page', async () => {
    const harness = await openShellAs('stores');
    const root = harness.fixture.nativeElement as HTMLElement;
    expect(root.querySelector('mat-toolbar')?.textContent).toContain('Shelfmatch');
    const label = root.querySelector('[data-testid="user-label"]')?.textContent ?? '';
    expect(label).toContain('Demo stores');
    expect(label).toContain('stores');
    expect(root.querySelector('[data-testid="nav-stock"]')?.getAttribute('aria-current')).toBe('page');
    expect(root.querySelector('[data-testid="nav-matches"]')?.getAttribute('aria-current')).toBeNull();
  });

  it('signs out and goes to sign-in', async () => {
    const harness = await openShellAs('designer');
    (harness.fixture.nativeElement.querySelector('[data-testid="sign-out"]') as HTMLButtonElement).click();
    await vi.waitFor(() => expect(TestBed.inject(Router).url).toBe('/sign-in'));
    expect(TestBed.inject(AuthSession).isSignedIn()).toBe(false);
    expect(localStorage.length).toBe(0);
  });
});
