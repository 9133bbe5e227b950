/// <reference lib="dom" />
/**
 * Journey 3 of product.md in Chromium: a designer plans and reserves a build from a saved match,
 * purchasing exports its shortfall list and sends it by e-mail (it arrives at the fake SMTP server
 * with the CSV attached), receives the parts, and the stock shows the new quantity.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
const mailDir = inject('mailDir');
let b: BrowserSession;
let matchId = 0;
let matchName = '';
const buildName = `Weather node WN-1, boards for the field trial ${Date.now()}`;
const supplier = `orders-${Date.now()}@supplier.example`;

async function api<T>(path: string, token: string, body?: unknown): Promise<T> {
  const res = await fetch(`${baseUrl}${path}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

beforeAll(async () => {
  b = await openBrowser();
  // The match itself is saved through the API here; saving one in the browser is the match journey.
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'designer@tarnwick.example', password: DEMO_PASSWORD }),
  });
  const { token } = (await login.json()) as { token: string };
  const request = { source: '50', load: '12-j35', frequencyHz: '868MHz', objective: 'nominal' };
  const solved = await api<{ networks: { placement: string; solution: number; fits: { rank: number }[] }[] }>('/api/matches/solve', token, request);
  const network = solved.networks.find((n) => n.fits.length > 0);
  if (!network) throw new Error('The demo stock gives no fit for the 868 MHz antenna match.');
  matchName = `868 MHz antenna ${Date.now()}`;
  const saved = await api<{ id: number }>('/api/matches', token, {
    name: matchName,
    request,
    chosen: { placement: network.placement, solution: network.solution, rank: network.fits[0].rank },
  });
  matchId = saved.id;
});
afterAll(async () => {
  await b?.close();
});

describe('a build and its shortfall list', () => {
  it('is planned and reserved by a designer, with what is short listed', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'designer@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-builds').click();
    await page.getByTestId('build-name').fill(buildName);
    // More boards than the demo stock can cover, so the list cannot be empty.
    await page.getByTestId('build-quantity').fill('20000');
    // Found by name among all saved matches (other journeys save theirs too), then put on the board.
    await page.getByTestId('build-match-search').fill(matchName.slice(-9));
    await expect.poll(() => page.getByTestId('build-match-option').count()).toBe(1);
    await page.locator(`[data-testid="build-match-option"][data-id="${matchId}"] input`).check();
    await expect.poll(() => page.getByTestId('build-chosen-match').locator('.chosen-name').allTextContents()).toEqual([matchName]);
    const reserveNow = page.locator('[data-testid="build-reserve-now"] input');
    if (!(await reserveNow.isChecked())) await reserveNow.check();
    await screenshot(page, 'build-plan-chosen');
    await page.getByTestId('build-create').click();
    await page.getByTestId('build-lines').waitFor();
    await expect.poll(() => page.getByTestId('build-line').count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByTestId('build-shortfall-line').count()).toBeGreaterThan(0);
    await screenshot(page, 'build-reserved');
    // The list beside it shows the whole name (wrapped, not cut off with an ellipsis).
    const nameBox = await page.getByTestId('build-row').filter({ hasText: buildName }).locator('.name').evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth, text: el.textContent?.trim() }));
    expect(nameBox.text).toBe(buildName);
    expect(nameBox.scroll).toBeLessThanOrEqual(nameBox.client);
    // The list finds it by part of its name, in another case, among all builds.
    await page.getByTestId('build-search').fill(buildName.slice(-13).toUpperCase());
    await expect.poll(() => page.getByTestId('build-row').allTextContents()).toEqual([expect.stringContaining(buildName)]);
    await screenshot(page, 'build-list-found');
    await page.getByTestId('sign-out').click();
  });

  it('is exported, e-mailed and received by purchasing, and stock shows the new quantity', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'purchasing@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-shortfall').click();
    // Purchasing narrows the overview to drafts of this build, as one would among many.
    await page.getByTestId('shortfall-search').fill(buildName.slice(-13));
    await page.getByTestId('shortfall-status-filter').click();
    await page.getByRole('option', { name: 'Draft' }).click();
    await expect.poll(() => page.getByTestId('shortfall-list-row').allTextContents()).toEqual([expect.stringContaining(buildName)]);
    await page.getByTestId('shortfall-list-row').filter({ hasText: buildName }).click();
    await page.getByTestId('shortfall-lines').waitFor();
    // Back to any status, so the row stays in view as the list moves on from draft.
    await page.getByTestId('shortfall-status-filter').click();
    await page.getByRole('option', { name: 'Any' }).click();

    const download = page.waitForEvent('download');
    await page.getByTestId('shortfall-export').click();
    const csvPath = await (await download).path();
    const csv = readFileSync(csvPath!, 'utf8');
    expect(csv.split(/\r?\n/)[0]).toMatch(/kind/i);

    const before = new Set(readdirSync(mailDir));
    await page.getByTestId('shortfall-send-to').fill(supplier);
    await page.getByTestId('shortfall-send').click();
    await expect.poll(() => readdirSync(mailDir).filter((f) => !before.has(f)).length, { timeout: 15_000 }).toBe(1);
    const eml = readFileSync(join(mailDir, readdirSync(mailDir).find((f) => !before.has(f))!), 'utf8');
    expect(eml).toContain(supplier);
    expect(eml).toMatch(/filename="?[^"\n]*\.csv/);
    // The overview above says so too, without a reload.
    await expect
      .poll(async () => (await page.getByTestId('shortfall-list-row').filter({ hasText: buildName }).textContent()) ?? '', { timeout: 10_000 })
      .toMatch(/Sent/);
    await screenshot(page, 'shortfall-sent');

    // Receive 500 of the first line under the part number the form proposes.
    await page.getByTestId('shortfall-receive').click();
    const partNumber = (await page.getByTestId('shortfall-receive-part').first().inputValue()).trim();
    expect(partNumber).not.toBe('');
    await page.getByTestId('shortfall-receive-quantity').first().fill('500');
    const quantityBefore = await stockQuantity(partNumber);
    await page.getByTestId('shortfall-receive-submit').click();
    await expect.poll(async () => (await page.getByTestId('shortfall-message').textContent()) ?? '', { timeout: 15_000 }).not.toBe('');
    await screenshot(page, 'shortfall-received');

    await page.getByTestId('nav-stock').click();
    await page.getByTestId('stock-search').fill(partNumber);
    const row = page.locator(`[data-testid^="stock-row-${partNumber}@"]`).first();
    await row.waitFor();
    await expect.poll(() => stockQuantity(partNumber)).toBe(quantityBefore + 500);
    await screenshot(page, 'stock-after-receiving');
  });
});

/** Quantity on hand of `partNumber` summed over locations, read through the API as purchasing. */
async function stockQuantity(partNumber: string): Promise<number> {
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'purchasing@tarnwick.example', password: DEMO_PASSWORD }),
  });
  const { token } = (await login.json()) as { token: string };
  const parts = await api<{ items: { partNumber: string; quantity: number }[] }>(`/api/parts?search=${encodeURIComponent(partNumber)}&pageSize=100`, token);
  return parts.items.filter((p) => p.partNumber === partNumber).reduce((sum, p) => sum + p.quantity, 0);
}
