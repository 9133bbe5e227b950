/// <reference lib="dom" />
/**
 * Every main screen of the app, as the role that works on it sees it, checked with axe-core against
 * the WCAG 2.0/2.1/2.2 level A and AA rules and its best practices: a moderate, serious or critical
 * violation fails the screen and is
 * printed with its rule, the element's selector and what to fix. Each checked screen is kept as a
 * screenshot `a11y-<screen>.png`. Screens are checked with soft assertions, so one run lists the
 * problems of every screen, not only the first.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { accessibilityProblems } from '../support/accessibility.js';
import { waitForMailTo } from '../support/received-mail.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
const mailDir = inject('mailDir');
const stamp = Date.now();
let b: BrowserSession;
let designerToken = '';
let savedMatchName = '';
let buildId = 0;
let invitationLink = '';
/** The window every screen is checked in, as openBrowser sets it. */
const VIEWPORT = { width: 1360, height: 860 };
/** A phone-sized window, in CSS pixels. */
const NARROW_WIDTH = 640;

/** A stock list whose line 3 gives an inductor a value in farads, so the upload is refused. */
const refusedStockList = [
  'part_number,kind,value,tolerance,srf,q,q_freq,quantity,package,location',
  'A11Y-C-1,C,3.3pF,C,8GHz,90,500MHz,10,0402,a11y',
  'A11Y-L-1,L,15pF,J,4GHz,30,250MHz,10,0402,a11y',
].join('\n');

async function api<T>(method: string, path: string, token: string, body?: unknown): Promise<T> {
  const res = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

async function tokenOf(email: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email}: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { token: string }).token;
}

/**
 * Screenshots the screen as `a11y-<name>.png`, then fails it (softly) on every moderate, serious
 * or critical axe violation; axe's full findings land beside the screenshot as `a11y-<name>.json`.
 */
async function checkScreen(page: Page, name: string): Promise<void> {
  // From the top, so the sticky toolbar is drawn where it belongs in the full-page picture.
  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshot(page, `a11y-${name}`);
  expect.soft(await accessibilityProblems(page, name), `axe (WCAG 2 A/AA) on the ${name} screen`).toEqual([]);
  // Text meant for screen readers only is not drawn (a button's "Choose" once showed the whole
  // "fit 1 of Shunt at load · solution 1" after it, squeezing the fit's summary).
  const drawn = await page.evaluate(() =>
    [...document.querySelectorAll('.cdk-visually-hidden, .visually-hidden, .sr-only')]
      .filter((el) => {
        const box = el.getBoundingClientRect();
        return box.width > 1 || box.height > 1;
      })
      .map((el) => el.textContent?.trim() ?? ''),
  );
  expect.soft(drawn, `screen-reader-only text drawn on the ${name} screen`).toEqual([]);
}

/** Narrows the window below the shell's 720 px breakpoint (navigation as icons only) and waits for that layout. */
async function narrowWindow(page: Page): Promise<void> {
  await page.setViewportSize({ width: NARROW_WIDTH, height: VIEWPORT.height });
  await expect.poll(async () => (await page.locator('nav.rail').boundingBox())?.width ?? Infinity).toBeLessThan(100);
}

beforeAll(async () => {
  b = await openBrowser();
  // A saved match and a reserved build with a shortfall, through the API: making them in the
  // browser is what the match and build journeys test.
  designerToken = await tokenOf('designer@tarnwick.example');
  const request = { source: '50', load: '12-j35', frequencyHz: '868MHz', objective: 'nominal' };
  const solved = await api<{ networks: { placement: string; solution: number; fits: { rank: number }[] }[] }>('POST', '/api/matches/solve', designerToken, request);
  const network = solved.networks.find((n) => n.fits.length > 0);
  if (!network) throw new Error('The demo stock gives no fit for the 868 MHz antenna match.');
  savedMatchName = `Accessibility 868 MHz antenna ${stamp}`;
  const saved = await api<{ id: number }>('POST', '/api/matches', designerToken, {
    name: savedMatchName,
    request,
    chosen: { placement: network.placement, solution: network.solution, rank: network.fits[0].rank },
  });
  // More boards than the demo stock covers, so the build has a shortfall list.
  const build = await api<{ id: number }>('POST', '/api/builds', designerToken, { name: `Accessibility board ${stamp}`, quantity: 20_000, matchIds: [saved.id], reserve: true });
  buildId = build.id;

  // An invited user with no password yet (the Admin table marks them), so the set-password page
  // has a live link and the Outbox a message.
  const adminToken = await tokenOf('admin@tarnwick.example');
  const email = `a11y-invited-${stamp}@tarnwick.example`;
  const user = await api<{ id: number }>('POST', '/api/users', adminToken, { email, name: 'Ines Marlow', role: 'designer' });
  await api('POST', `/api/users/${user.id}/invitation`, adminToken, {});
  const mail = await waitForMailTo(mailDir, email, { subject: 'invited' });
  const link = mail.text?.match(/http:\/\/\S+\/set-password\?token=\S+/)?.[0];
  if (!link) throw new Error(`The invitation to ${email} holds no set-password link.`);
  invitationLink = link;
});

// Each role starts signed out in the usual window, also after a test that stopped half-way.
beforeEach(async () => {
  await b.page.setViewportSize(VIEWPORT);
  if (b.page.url().startsWith(baseUrl)) await b.page.evaluate(() => localStorage.clear());
});

afterAll(async () => {
  // Give the reserved parts back, so later journeys see the demo stock as seeded.
  if (buildId) await api('PATCH', `/api/builds/${buildId}`, designerToken, { status: 'cancelled' });
  await b?.close();
});

describe('the accessibility check itself', () => {
  it('names the rule and the element of known violations on a page made to break them', async () => {
    const { page } = b;
    // WCAG 2.2 SC 4.1.2 (a button needs a name) and SC 1.4.3 (text contrast at least 4.5:1; #aaa on
    // white is about 2.3:1): both are serious or critical in axe; two regions of one name break
    // axe's best practice landmark-unique (moderate).
    await page.setContent(
      '<!doctype html><html lang="en"><head><title>Broken on purpose</title></head><body><main><h1>Broken</h1>' +
        '<button id="nameless"><svg width="16" height="16"></svg></button>' +
        '<p id="faint" style="color:#aaa;background:#fff">Hard to read</p>' +
        '<section id="twin-a" aria-label="Twins">a</section><section id="twin-b" aria-label="Twins">b</section></main></body></html>',
    );
    const problems = await accessibilityProblems(page, 'self-check');
    expect(problems.some((line) => line.startsWith('button-name (critical)') && line.includes('#nameless'))).toBe(true);
    expect(problems.some((line) => line.startsWith('color-contrast (serious)') && line.includes('#faint'))).toBe(true);
    expect(problems.some((line) => line.startsWith('landmark-unique (moderate)') && line.includes('#twin-'))).toBe(true);
    expect(problems).toHaveLength(3);
  });
});

describe('accessibility of every main screen (axe-core, WCAG 2 A/AA and best practices, nothing moderate or worse)', () => {
  it('signed out: sign-in, a refused sign-in, set-password and an unknown address', async () => {
    const { page } = b;
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByTestId('sign-in-email').waitFor();
    await checkScreen(page, 'sign-in');

    await page.getByTestId('sign-in-submit').click();
    await page.locator('mat-error').first().waitFor();
    await checkScreen(page, 'sign-in-field-errors');

    await page.getByTestId('sign-in-email').fill('designer@tarnwick.example');
    await page.getByTestId('sign-in-password').fill('not-the-password');
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('sign-in-error').waitFor();
    await checkScreen(page, 'sign-in-refused');

    await page.goto(invitationLink);
    await page.getByTestId('set-password-input').waitFor();
    await checkScreen(page, 'set-password');

    await page.goto(`${baseUrl}/set-password?token=no-such-token`);
    await page.getByTestId('set-password-unusable').waitFor();
    await checkScreen(page, 'set-password-unusable');

    await page.goto(`${baseUrl}/no-such-page`);
    await page.getByRole('heading', { name: 'No such page' }).waitFor();
    await checkScreen(page, 'page-not-found');
  });

  it('designer: the match workspace empty, solved and reopened; builds and a build', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'designer@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('match-source').waitFor();
    await page.getByTestId('saved-match-row').first().waitFor();
    await checkScreen(page, 'matches');

    // Inputs the form cannot read: each field says what is wrong beneath it.
    await page.getByTestId('match-load').fill('twelve ohms');
    await page.getByTestId('match-frequency').fill('fast');
    await page.getByTestId('match-frequency').blur();
    await page.getByTestId('match-load-problem').waitFor();
    await page.getByTestId('match-frequency-problem').waitFor();
    await checkScreen(page, 'match-form-problems');

    await page.getByTestId('match-source').fill('50');
    await page.getByTestId('match-load').fill('12-j35');
    await page.getByTestId('match-frequency').fill('868MHz');
    await page.getByTestId('match-solve').click();
    await expect.poll(() => page.getByTestId('fit-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await page.getByTestId('fit-choose').first().click();
    await page.getByTestId('tpg-plot').waitFor();
    await page.getByTestId('smith-chart').waitFor();
    await checkScreen(page, 'match-solved');

    await page.getByTestId('saved-match-row').filter({ hasText: savedMatchName }).click();
    await page.getByTestId('reopened-match').waitFor();
    await page.getByTestId('tpg-plot').waitFor();
    await checkScreen(page, 'match-saved');

    await page.getByTestId('nav-builds').click();
    await page.getByTestId('build-row').first().waitFor();
    await checkScreen(page, 'builds');

    await page.getByTestId('build-quantity').fill('many');
    await page.locator('sm-build-plan-form mat-hint.problem').waitFor();
    await checkScreen(page, 'build-plan-problem');

    await page.locator(`[data-testid="build-row"][data-id="${buildId}"]`).click();
    await page.getByTestId('build-shortfall').waitFor();
    await checkScreen(page, 'build-detail');
  });

  it('stores: the stock list, a refused upload with its rejected rows, the import history and a diff', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'stores@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-stock').click();
    await page.locator('[data-testid^="stock-row-"]').first().waitFor();
    await checkScreen(page, 'stock-list');

    await narrowWindow(page);
    await checkScreen(page, 'stock-list-narrow');
    // The page does not scroll sideways (the table scrolls inside its own frame).
    await expect.poll(() => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBe(0);
    await page.setViewportSize(VIEWPORT);

    // An open select panel lives in the overlay outside the page; check it too.
    await page.getByTestId('stock-filter-kind').click();
    await page.getByRole('listbox').waitFor();
    await checkScreen(page, 'stock-kind-choice');
    await page.keyboard.press('Escape');
    await page.getByRole('listbox').waitFor({ state: 'detached' });

    await page.getByTestId('stock-tab-upload').click();
    await page.getByTestId('stock-upload-submit').waitFor();
    await checkScreen(page, 'stock-upload');

    await page.getByTestId('stock-upload-input').setInputFiles({ name: `a11y-stock-${stamp}.csv`, mimeType: 'text/csv', buffer: Buffer.from(refusedStockList) });
    await page.getByTestId('stock-upload-submit').click();
    await page.getByTestId('stock-rejected-table').waitFor();
    await checkScreen(page, 'stock-upload-rejected');

    await page.getByTestId('stock-tab-history').click();
    await page.locator('[data-testid^="stock-history-row-"]', { hasText: 'demo-stock.csv' }).click();
    await page.getByTestId('stock-history-changes').waitFor();
    await page.locator('[data-testid^="stock-change-"]').first().waitFor();
    await checkScreen(page, 'stock-history-changes');

    // The history fetches again after applied uploads only, so a reload brings the refused one in.
    await page.reload();
    await page.getByTestId('stock-tab-history').click();
    await page.locator('[data-testid^="stock-history-row-"]', { hasText: `a11y-stock-${stamp}.csv` }).click();
    await page.getByTestId('stock-history-detail').filter({ hasText: 'refused' }).waitFor();
    await checkScreen(page, 'stock-history-refused');
  });

  it('purchasing: shortfall lists, one list, and receiving', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'purchasing@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-shortfall').click();
    await page.getByTestId('shortfall-list-row').first().waitFor();
    await checkScreen(page, 'shortfall-lists');

    await page.locator(`[data-testid="shortfall-list-row"][data-build-id="${buildId}"]`).click();
    await page.getByTestId('shortfall-lines').waitFor();
    await checkScreen(page, 'shortfall-detail');
    // Narrow, the tables scroll sideways inside their frames; the page itself does not.
    await narrowWindow(page);
    await checkScreen(page, 'shortfall-detail-narrow');
    await expect.poll(() => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBe(0);
    await page.setViewportSize(VIEWPORT);

    await page.getByTestId('shortfall-receive').click();
    await page.getByTestId('shortfall-receive-line').first().waitFor();
    await checkScreen(page, 'shortfall-receive');
  });

  it('admin: users with the new-user form and its errors, organisation settings and the Outbox', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'admin@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-admin').click();
    await page.locator('[data-testid^="user-row-"]').first().waitFor();
    await checkScreen(page, 'admin-users');

    await page.getByTestId('new-user-submit').click();
    await page.locator('mat-error').first().waitFor();
    await checkScreen(page, 'admin-new-user-errors');

    await page.getByTestId('nav-settings').click();
    await expect.poll(() => page.getByTestId('settings-srf-fraction').inputValue()).not.toBe('');
    await checkScreen(page, 'settings');

    await page.getByTestId('nav-outbox').click();
    const entry = page.locator('tr.entry-row').first();
    await entry.waitFor();
    await entry.locator('[data-testid^="outbox-open-"]').click();
    await page.getByTestId('outbox-text').waitFor();
    await checkScreen(page, 'outbox');
  });
});
