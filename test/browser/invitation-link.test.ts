/// <reference lib="dom" />
/**
 * An invitation in the real browser: the admin creates a user with no first password, which sends
 * the invitation at once (an existing user gets one from the Send invitation button), the e-mail arrives at the suite's fake SMTP server, the link opens the set-password page, the new
 * password works for sign-in, the link then refuses a second use, and the Outbox shows the mail
 * with its token hidden.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { waitForMailTo } from '../support/received-mail.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
const mailDir = inject('mailDir');
let b: BrowserSession;
const email = `invited-${Date.now()}@tarnwick.example`;
const chosenPassword = 'chip-antenna-915';

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('an invitation link', () => {
  it('is e-mailed from the Admin page, sets a password once, and shows in the Outbox', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'admin@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-admin').click();
    await page.getByTestId('new-user-email').fill(email);
    await page.getByTestId('new-user-name').fill('Noor Halvorsen');
    // No first password: the button says it invites, and pressing it creates and invites.
    expect(await page.getByTestId('new-user-submit').textContent()).toContain('Create and invite');
    const created = page.waitForResponse((r) => r.url().endsWith('/api/users') && r.request().method() === 'POST');
    const sent = page.waitForResponse((r) => r.url().endsWith('/invitation') && r.request().method() === 'POST');
    await page.getByTestId('new-user-submit').click();
    expect((await created).status()).toBe(201);
    expect((await sent).status()).toBe(201);
    await page.getByTestId(`user-row-${email}`).waitFor();
    await page.getByText(`Invitation sent to ${email}`).waitFor();
    expect(await page.getByTestId(`user-status-${email}`).textContent()).toContain('Invited');
    await screenshot(page, 'admin-created-and-invited');

    const mail = await waitForMailTo(mailDir, email, { subject: 'invited' });
    const link = mail.text?.match(/http:\/\/\S+\/set-password\?token=\S+/)?.[0];
    expect(link?.startsWith(`${baseUrl}/set-password?token=`)).toBe(true);
    expect(mail.html).toContain(`href="${link}"`);

    // The invitee, in their own signed-out tab, follows the link.
    await page.getByTestId('sign-out').click();
    await page.goto(link!);
    await page.getByTestId('set-password-input').fill(chosenPassword);
    await page.getByTestId('set-password-repeat').fill(chosenPassword);
    await screenshot(page, 'set-password');
    await page.getByTestId('set-password-submit').click();
    await page.getByTestId('set-password-done').waitFor();
    expect(await page.getByTestId('set-password-done').textContent()).toContain(email);

    await signInAs(page, baseUrl, email, chosenPassword);
    expect(new URL(page.url()).pathname).toBe('/matches');
    await page.getByTestId('sign-out').click();

    // A second use of the same link is refused.
    await page.goto(link!);
    await page.getByTestId('set-password-unusable').waitFor();
    expect(await page.getByTestId('set-password-unusable').textContent()).toContain('already been used');

    // The admin sees the message in the Outbox, without the token.
    await signInAs(page, baseUrl, 'admin@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-outbox').click();
    const entry = page.locator('tr.entry-row', { hasText: email }).first();
    await entry.waitFor();
    expect(await entry.textContent()).toContain('Sent');
    await entry.locator('[data-testid^="outbox-open-"]').click();
    const text = (await page.getByTestId('outbox-text').textContent()) ?? '';
    expect(text).toContain('/set-password?token=[hidden]');
    expect(text).not.toContain(new URL(link!).searchParams.get('token')!);
    await screenshot(page, 'outbox');
    expect(b.offLoopback).toEqual([]);
  });
});
