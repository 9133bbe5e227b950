/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
/**
 * Each demo role signs in in the real browser and sees its own navigation; a wrong password and an
 * unknown e-mail show one and the same message; the built app asks nothing of any host but ours.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seeds/demo-accounts.js';
import type { Role } from '../../shared/api/auth.js';

const baseUrl = inject('baseUrl');
let b: BrowserSession;

/** What product.md lets each role open, written out here rather than read from the app's code. */
const NAV_BY_ROLE: Record<Role, string[]> = {
  admin: ['matches', 'stock', 'builds', 'shortfall', 'admin', 'outbox', 'settings'],
  designer: ['matches', 'stock', 'builds', 'shortfall'],
  stores: ['matches', 'stock', 'builds'],
  purchasing: ['matches', 'stock', 'builds', 'shortfall'],
};

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('sign-in in Chromium', () => {
  it('shows one message for a wrong password and for an unknown e-mail', async () => {
    const { page } = b;
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').fill('designer@tarnwick.example');
    await page.getByTestId('sign-in-password').fill('wrong password');
    await page.getByTestId('sign-in-submit').click();
    const wrongPassword = (await page.getByTestId('sign-in-error').textContent())?.trim();
    await page.getByTestId('sign-in-email').fill('nobody@tarnwick.example');
    await page.getByTestId('sign-in-password').fill('wrong password');
    await page.getByTestId('sign-in-submit').click();
    await page.waitForLoadState('networkidle');
    const unknownEmail = (await page.getByTestId('sign-in-error').textContent())?.trim();
    expect(wrongPassword).toBeTruthy();
    expect(wrongPassword).toMatch(/do not match/);
    expect(unknownEmail).toBe(wrongPassword);
    await screenshot(page, 'sign-in-error');
  });

  for (const account of DEMO_ACCOUNTS) {
    it(`signs in ${account.role} and shows exactly that role's navigation`, async () => {
      const { page } = b;
      await signInAs(page, baseUrl, account.email, DEMO_PASSWORD);
      await expect.poll(() => page.getByTestId('user-label').textContent()).toContain(account.name);
      const links = await page.locator('[data-testid^="nav-"]').evaluateAll((els) => els.map((e) => e.getAttribute('data-testid')!.slice(4)));
      expect(links).toEqual(NAV_BY_ROLE[account.role]);
      await screenshot(page, `shell-${account.role}`);
      // Fonts really loaded (the CSP would block a deferred stylesheet): Inter for text, and the
      // self-hosted icon font drawing each icon's ligature as one square glyph, not as its name.
      const fonts = await page.evaluate(async () => {
        await document.fonts.ready;
        const loaded = [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/"/g, ''));
        const icon = document.querySelector('mat-icon');
        const box = icon?.getBoundingClientRect();
        return { inter: loaded.includes('Inter'), icons: loaded.includes('Material Symbols Outlined'), iconWidth: box?.width ?? 0, iconHeight: box?.height ?? 0 };
      });
      expect(fonts.inter).toBe(true);
      expect(fonts.icons).toBe(true);
      expect(fonts.iconWidth).toBeGreaterThan(0);
      expect(fonts.iconWidth).toBeLessThanOrEqual(fonts.iconHeight * 1.2);
      await page.getByTestId('sign-out').click();
      await page.getByTestId('sign-in-email').waitFor();
    });
  }

  it('sends a direct visit to a page without sign-in back to the sign-in page', async () => {
    const { page } = b;
    await page.goto(`${baseUrl}/admin`);
    await page.getByTestId('sign-in-email').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await screenshot(page, 'sign-in');
  });

  it('made no request off loopback in the whole run', () => {
    expect(b.offLoopback).toEqual([]);
  });
});
