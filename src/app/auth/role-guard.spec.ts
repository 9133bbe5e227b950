import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import type { Role } from '../../../shared/api/auth.js';
import { routes } from '../app.routes.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';

/** Signs in as `role` (from storage, as after a reload), opens `url`, and returns where it ends. */
async function landingUrl(role: Role | null, url: string): Promise<string> {
  localStorage.clear();
  if (role) storeSession(demoUser(role));
  TestBed.configureTestingModule({
    providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return TestBed.inject(Router).url;
}

// Expected pages come from the role table of the brief and product.md: every role reads matches
// and stock; builds for all four; shortfall lists for purchasing, designer and admin; admin only.
describe('route guards by role', () => {
  it('sends someone signed out to sign-in, remembering the page', async () => {
    expect(await landingUrl(null, '/admin')).toBe('/sign-in?returnUrl=%2Fadmin');
  });

  it('turns stores away from the Admin page to the stock list', async () => {
    expect(await landingUrl('stores', '/admin')).toBe('/stock');
  });

  it('turns stores away from shortfall lists', async () => {
    expect(await landingUrl('stores', '/shortfall')).toBe('/stock');
  });

  it('turns a designer away from the Admin page to matches', async () => {
    expect(await landingUrl('designer', '/admin')).toBe('/matches');
  });

  it('lets an admin into the Admin page', async () => {
    expect(await landingUrl('admin', '/admin')).toBe('/admin');
  });

  it('lets purchasing into shortfall lists and builds', async () => {
    expect(await landingUrl('purchasing', '/shortfall')).toBe('/shortfall');
    TestBed.resetTestingModule();
    expect(await landingUrl('purchasing', '/builds')).toBe('/builds');
  });

  it('lets every role read stock and matches', async () => {
    for (const role of ['designer', 'stores', 'purchasing', 'admin'] as const) {
      TestBed.resetTestingModule();
      expect(await landingUrl(role, '/stock')).toBe('/stock');
      TestBed.resetTestingModule();
      expect(await landingUrl(role, '/matches')).toBe('/matches');
    }
  });

  it('sends each role from / to its first page', async () => {
    const firstPage: Record<Role, string> = {
      designer: '/matches',
      stores: '/stock',
      purchasing: '/shortfall',
      admin: '/admin',
    };
    for (const role of Object.keys(firstPage) as Role[]) {
      TestBed.resetTestingModule();
      expect(await landingUrl(role, '/')).toBe(firstPage[role]);
    }
  });

  it('keeps a signed-in user off the sign-in page', async () => {
    expect(await landingUrl('purchasing', '/sign-in')).toBe('/shortfall');
  });
});
