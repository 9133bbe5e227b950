/// <reference lib="dom" />
/**
 * An admin manages users in the real browser: creates one with a role and a first password, the new
 * user signs in, the admin changes the role and deactivates the user, who then cannot sign in.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
let b: BrowserSession;
const email = `new-stores-${Date.now()}@tarnwick.example`;
const firstPassword = 'first-password-for-test';

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('the Admin page', () => {
  it('creates a user, changes the role and deactivates the user', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'admin@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-admin').click();
    await page.getByTestId('users-table').waitFor();
    await page.getByTestId('new-user-email').fill(email);
    await page.getByTestId('new-user-name').fill('Robin Quay');
    await page.getByTestId('new-user-role').click();
    await page.getByRole('option', { name: 'stores' }).click();
    await page.getByTestId('new-user-password').fill(firstPassword);
    await page.getByTestId('new-user-submit').click();
    await page.getByTestId(`user-row-${email}`).waitFor();

    // The new user signs in with the first password and lands on Stock.
    await page.getByTestId('sign-out').click();
    await signInAs(page, baseUrl, email, firstPassword);
    expect(new URL(page.url()).pathname).toBe('/stock');
    await page.getByTestId('sign-out').click();

    // The admin makes the user a purchaser, then deactivates them.
    await signInAs(page, baseUrl, 'admin@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-admin').click();
    await page.getByTestId(`user-role-${email}`).click();
    const patched = page.waitForResponse((r) => r.url().includes('/api/users/') && r.request().method() === 'PATCH');
    await page.getByRole('option', { name: 'purchasing' }).click();
    expect((await patched).status()).toBe(200);
    const deactivated = page.waitForResponse((r) => r.url().includes('/api/users/') && r.request().method() === 'PATCH');
    await page.getByTestId(`user-active-toggle-${email}`).click();
    expect((await deactivated).status()).toBe(200);
    await expect.poll(async () => (await page.getByTestId(`user-status-${email}`).textContent())?.trim()).toMatch(/Deactivated|Inactive/i);
    await screenshot(page, 'admin-users');

    // The deactivated user gets the one sign-in failure message.
    await page.getByTestId('sign-out').click();
    await page.getByTestId('sign-in-email').fill(email);
    await page.getByTestId('sign-in-password').fill(firstPassword);
    await page.getByTestId('sign-in-submit').click();
    await expect.poll(async () => (await page.getByTestId('sign-in-error').textContent())?.trim()).toMatch(/do not match/);

  });
});
