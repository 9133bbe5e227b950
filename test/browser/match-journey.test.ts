/// <reference lib="dom" />
/**
 * Journey 2 of product.md in Chromium: a designer solves the demo scenario's 868 MHz chip-antenna
 * match (12 - j35 ohm, invented in seeds/) against the demo stock, sees the ideal networks with their
 * ranked fits, losses and flags, the TPG plot and the Smith chart with the cautions, saves a fit,
 * and reopens it from the saved matches; and stops a solve on its way.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { join } from 'node:path';
import { SCREENSHOT_DIR, openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { accessibilityProblems } from '../support/accessibility.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
let b: BrowserSession;
const name = `Soil node 868 MHz antenna ${Date.now()}`;

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('the match workspace', () => {
  it('solves, shows fits, plot, Smith chart and cautions, saves and reopens', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'designer@tarnwick.example', DEMO_PASSWORD);
    expect(new URL(page.url()).pathname).toBe('/matches');
    await page.getByTestId('match-source').fill('50');
    await page.getByTestId('match-load').fill('12-j35');
    // Live parsing feedback reads the complex string back in ohms.
    await expect.poll(async () => (await page.getByTestId('match-load-reading').textContent()) ?? '').toMatch(/12/);
    await page.getByTestId('match-frequency').fill('868MHz');
    await page.getByTestId('match-solve').click();

    await expect.poll(() => page.getByTestId('network-card').count(), { timeout: 20_000 }).toBeGreaterThan(0);
    // 12 - j35 to 50 ohm: Rs*GL = 50 * 12/(12^2+35^2) = 0.438 <= 1 and RL*Gs = 12/50 < 1, so both
    // placements are feasible and each gives two solutions: four ideal networks.
    expect(await page.getByTestId('network-card').count()).toBe(4);
    await expect.poll(() => page.getByTestId('fit-row').count()).toBeGreaterThan(0);
    const fitText = (await page.getByTestId('fit-row').first().textContent()) ?? '';
    expect(fitText).toMatch(/dB/);
    expect(fitText).toMatch(/TW-/);
    await page.getByTestId('fit-choose').first().click();
    await page.getByTestId('tpg-plot').waitFor();
    await page.getByTestId('smith-chart').waitFor();
    expect(await page.getByTestId('smith-fit-arc').count()).toBeGreaterThan(0);
    expect(((await page.getByTestId('match-cautions').textContent()) ?? '').toLowerCase()).toMatch(/network analy[sz]er/);
    await screenshot(page, 'match-solved');
    await page.getByTestId('match-name').fill(name);
    const saved = page.waitForResponse((r) => r.url().endsWith('/api/matches') && r.request().method() === 'POST');
    await page.getByTestId('match-save').click();
    expect((await saved).status()).toBe(201);
    const row = page.getByTestId('saved-match-row').filter({ hasText: name });
    await row.waitFor();
    // The name is shown whole in the narrow panel (wrapped, not cut off with an ellipsis).
    const nameBox = await row.locator('.name').evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth, text: el.textContent?.trim() }));
    expect(nameBox.text).toBe(name);
    expect(nameBox.scroll).toBeLessThanOrEqual(nameBox.client);

    // Reopen from a fresh page load: the saved match comes back with its fit and plot.
    await page.goto(`${baseUrl}/matches`);
    // Found by part of its name, in another case.
    await page.getByTestId('saved-search').fill(name.slice(0, 12).toUpperCase());
    await expect.poll(() => page.getByTestId('saved-match-row').filter({ hasText: name }).count()).toBe(1);
    await page.getByTestId('saved-match-row').filter({ hasText: name }).click();
    await page.getByTestId('reopened-match').waitFor();
    expect((await page.getByTestId('reopened-match').textContent()) ?? '').toContain(name);
    await page.getByTestId('tpg-plot').waitFor();
    await page.getByTestId('smith-chart').waitFor();
    await screenshot(page, 'match-reopened');

    // Its designer deletes it, confirming once; it leaves the list and the workspace.
    await page.getByTestId('match-delete').click();
    await page.getByTestId('match-delete-confirm').waitFor();
    await screenshot(page, 'match-delete-confirm');
    const deleted = page.waitForResponse((r) => r.url().includes('/api/matches/') && r.request().method() === 'DELETE');
    await page.getByTestId('match-delete-confirm').click();
    expect((await deleted).status()).toBe(204);
    await expect.poll(() => page.getByTestId('saved-match-row').filter({ hasText: name }).count()).toBe(0);
    await expect.poll(() => page.getByTestId('reopened-match').count()).toBe(0);
    expect(new URL(page.url()).searchParams.get('saved')).toBeNull();
  });

  it('says in words what every flag on the fits means', async () => {
    const { page } = b;
    await page.goto(`${baseUrl}/matches`);
    await page.getByTestId('match-source').fill('50');
    await page.getByTestId('match-load').fill('12-j35');
    await page.getByTestId('match-frequency').fill('868MHz');
    // Far more RF power than 0402 parts are rated for, so the fits are flagged over rating.
    await page.getByTestId('match-power').fill('50W');
    await page.getByTestId('match-solve').click();
    await expect.poll(() => page.getByTestId('fit-row').count(), { timeout: 20_000 }).toBeGreaterThan(0);
    const legend = page.getByTestId('flag-legend');
    const chipFlags = new Set(await page.locator('mat-chip[data-flag]').evaluateAll((chips) => chips.map((c) => c.getAttribute('data-flag'))));
    const legendFlags = await legend.locator('[data-flag]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-flag')));
    expect(chipFlags.has('over-rating')).toBe(true);
    expect([...legendFlags].sort()).toEqual([...chipFlags].sort());
    expect(await legend.locator('[data-flag="over-rating"] dd').textContent()).toContain('more voltage or current than its (DC) rating');
    await legend.screenshot({ path: join(SCREENSHOT_DIR, 'match-flag-legend.png') });
    await page.locator('[data-testid="fit-row"]:has(mat-chip[data-flag])').first().screenshot({ path: join(SCREENSHOT_DIR, 'match-flagged-fit.png') });
    expect(await accessibilityProblems(page, 'match-flag-legend')).toEqual([]);
  });

  it('stops a solve on its way: the browser drops the request and the form can solve again', async () => {
    const { page } = b;
    await page.goto(`${baseUrl}/matches`);
    // Held a moment on its way, so there is time to press Stop (the demo stock solves in milliseconds).
    await page.route('**/api/matches/solve', async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 3000));
      await route.continue().catch(() => undefined);
    });
    try {
      await page.getByTestId('match-source').fill('50');
      await page.getByTestId('match-load').fill('28-j16');
      await page.getByTestId('match-frequency').fill('2.45GHz');
      const dropped = page.waitForEvent('requestfailed', (r) => r.url().endsWith('/api/matches/solve'));
      await page.getByTestId('match-solve').click();
      await page.getByTestId('match-stop').click();
      expect((await dropped).failure()?.errorText).toMatch(/abort/i);
      expect(await page.getByTestId('match-stop').count()).toBe(0);
      expect(await page.getByTestId('match-solve').isEnabled()).toBe(true);
      expect(await page.getByTestId('network-card').count()).toBe(0);
    } finally {
      await page.unroute('**/api/matches/solve');
    }
    await page.getByTestId('match-solve').click();
    await expect.poll(() => page.getByTestId('network-card').count(), { timeout: 20_000 }).toBeGreaterThan(0);
  });
});
