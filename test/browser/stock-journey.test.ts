/// <reference lib="dom" />
/**
 * Journey 1 of product.md in Chromium: stores uploads a stock list with a bad row, sees the row
 * named by line, column and reason, uploads the fixed file and sees what changed; a designer sees
 * the stock but no upload.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, signInAs, type BrowserSession } from '../support/browser.js';
import { DEMO_PASSWORD } from '../../seeds/demo-accounts.js';

const baseUrl = inject('baseUrl');
let b: BrowserSession;

const header = 'part_number,kind,value,tolerance,srf,q,q_freq,quantity,package,location';
// Line 3 gives an inductor a value in farads: the importer must reject it, naming line 3 and "value".
const withError = [header, 'BRW-C-1,C,4.7pF,J,6GHz,80,500MHz,40,0402,browser', 'BRW-L-1,L,12pF,J,4GHz,30,250MHz,25,0402,browser', 'BRW-L-2,L,22nH,J,2.5GHz,35,250MHz,10,0402,browser'].join('\n');
const fixed = withError.replace('BRW-L-1,L,12pF', 'BRW-L-1,L,12nH');

beforeAll(async () => {
  b = await openBrowser();
});
afterAll(async () => {
  await b?.close();
});

describe('stock-list upload', () => {
  it('reports a bad row, applies the fixed file and shows what changed', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'stores@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-stock').click();
    await page.getByTestId('stock-table').waitFor();
    await screenshot(page, 'stock-list');
    await page.getByTestId('stock-tab-upload').click();
    await page.getByTestId('stock-upload-input').setInputFiles({ name: 'browser-stock.csv', mimeType: 'text/csv', buffer: Buffer.from(withError) });
    await page.getByTestId('stock-upload-submit').click();
    const rejected = page.getByTestId('stock-rejected-table');
    await rejected.waitFor();
    const text = (await rejected.textContent()) ?? '';
    expect(text).toContain('3');
    expect(text).toContain('value');
    expect(text).toContain('12pF');
    await screenshot(page, 'stock-upload-rejected');

    await page.getByTestId('stock-upload-input').setInputFiles({ name: 'browser-stock-fixed.csv', mimeType: 'text/csv', buffer: Buffer.from(fixed) });
    await page.getByTestId('stock-upload-submit').click();
    await expect.poll(async () => (await page.getByTestId('stock-report-headline').textContent()) ?? '').toMatch(/3/);
    await page.getByTestId('stock-report-show-changes').click();
    await page.getByTestId('stock-history-changes').waitFor();
    for (const pn of ['BRW-C-1', 'BRW-L-1', 'BRW-L-2']) await page.getByTestId(`stock-change-${pn}@browser`).waitFor();
    await screenshot(page, 'stock-history-changes');
    await page.getByTestId('sign-out').click();
  });

  it('lets a designer read the stock with no upload', async () => {
    const { page } = b;
    await signInAs(page, baseUrl, 'designer@tarnwick.example', DEMO_PASSWORD);
    await page.getByTestId('nav-stock').click();
    await page.getByTestId('stock-table').waitFor();
    await page.locator('[data-testid="stock-table"] td.loss').first().waitFor();
    // Every column in view at this window's width (1360 px): the table needs no sideways scroll.
    const fit = await page.getByTestId('stock-table').evaluate((table) => ({ table: table.scrollWidth, frame: table.parentElement!.clientWidth }));
    expect(fit.table).toBeLessThanOrEqual(fit.frame);
    await page.getByTestId('stock-search').fill('BRW-L-1');
    await page.getByTestId('stock-row-BRW-L-1@browser').waitFor();
    expect(await page.getByTestId('stock-tab-upload').count()).toBe(0);
    await page.getByTestId('sign-out').click();
  });
});
