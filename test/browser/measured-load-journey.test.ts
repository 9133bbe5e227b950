/// <reference lib="dom" />
/**
 * Journey 2 of product.md with a measured load, in Chromium: a designer uploads the demo scenario's
 * measured 868 MHz chip antenna (seeds/measured/, invented), sees the file read back (points, range,
 * impedance at f0), solves with a band, sees the band response and the measured trace on the Smith
 * chart, saves the fit, reopens it and downloads the fitted network as a Touchstone 2-port file,
 * which reads back with the project's reader and holds f0 as a point.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { accessibilityProblems } from '../support/accessibility.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';
import { DEMO_ANTENNA_FILE } from '../../seeds/make-demo-antenna.js';
import { readOnePortTouchstone, readTwoPortTouchstone } from '../../shared/touchstone/index.js';

const baseUrl = inject('baseUrl');
let b: BrowserSession;
const name = `Soil node antenna, measured ${Date.now()}`;

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('a measured antenna as the load', () => {
  it('uploads the file, solves across the band, shows the trace, saves and downloads the 2-port file', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'designer@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('match-frequency').fill('868MHz');
    await page.getByTestId('match-band').fill('10MHz');
    await page.getByTestId('match-load-file-input').setInputFiles(DEMO_ANTENNA_FILE);
    await page.getByTestId('match-load-file-name').waitFor();
    expect(await page.getByTestId('match-load-file-name').inputValue()).toBe('tarnwick-868-chip-antenna.s1p');
    // The file holds 868 MHz as a point: the form shows the file's own impedance there.
    const data = readOnePortTouchstone(readFileSync(DEMO_ANTENNA_FILE, 'utf8'));
    const i = Array.from(data.frequencyHz).indexOf(868e6);
    await expect.poll(async () => (await page.getByTestId('match-load-reading').textContent()) ?? '').toMatch(/181 points, 780 MHz to 960 MHz; .* at 868 MHz/);
    const reading = (await page.getByTestId('match-load-reading').textContent()) ?? '';
    expect(reading).toContain(data.resistanceOhm[i].toPrecision(4));

    await page.getByTestId('match-objective').click();
    await page.getByRole('option', { name: 'Across the band' }).click();
    await page.getByTestId('match-solve').click();
    await expect.poll(() => page.getByTestId('fit-row').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await page.getByTestId('fit-choose').first().click();
    await page.getByTestId('tpg-plot').waitFor();
    await page.getByTestId('smith-measured-load').waitFor();
    const legend = (await page.getByTestId('smith-chart').textContent()) ?? '';
    expect(legend).toMatch(/Measured load \(tarnwick-868-chip-antenna\.s1p\), 780 MHz to 960 MHz/);
    // The measured-file field, its trace and legend pass the same axe check as every main screen.
    expect(await accessibilityProblems(page, 'match-measured-load'), 'axe (WCAG 2 A/AA) on the measured-load workspace').toEqual([]);
    await page.getByTestId('smith-chart').screenshot({ path: (await screenshot(page, 'match-measured-load')).replace(/\.png$/, '-smith.png') });
    await page.locator('sm-match-form').screenshot({ path: (await screenshot(page, 'match-measured-load')).replace(/\.png$/, '-form.png') });

    await page.getByTestId('match-name').fill(name);
    const saved = page.waitForResponse((r) => r.url().endsWith('/api/matches') && r.request().method() === 'POST');
    await page.getByTestId('match-save').click();
    expect((await saved).status()).toBe(201);
    await page.getByTestId('saved-match-row').filter({ hasText: name }).click();
    await page.getByTestId('reopened-match').waitFor();
    await page.getByTestId('smith-measured-load').waitFor();

    const download = page.waitForEvent('download');
    await page.getByTestId('match-download-fit').click();
    const file = await download;
    expect(file.suggestedFilename()).toMatch(/^soil-node-antenna-measured-\d+-fit\.s2p$/);
    const path = await file.path();
    const twoPort = readTwoPortTouchstone(readFileSync(path, 'utf8'));
    expect(Array.from(twoPort.frequencyHz)).toContain(868e6);
    expect(twoPort.referenceOhm).toEqual([50, 50]);
    await screenshot(page, 'match-measured-reopened');
  });
});
