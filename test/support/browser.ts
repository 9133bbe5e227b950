/// <reference lib="dom" />
/**
 * Debian's Chromium through playwright-core, set up as this machine needs (no sandbox as root, no
 * background networking), with a guard that records every request that leaves loopback.
 */
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');
/** Screenshots of every run land here (git-ignored), one file per screen. */
export const SCREENSHOT_DIR = join(ROOT, 'tmp', 'screenshots');

/** A browser with one page, and every URL it asked for that was not on loopback. */
export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  offLoopback: string[];
  close(): Promise<void>;
}

/** Opens Chromium with a fresh profile; `offLoopback` collects requests to other hosts. */
export async function openBrowser(): Promise<BrowserSession> {
  mkdirSync(join(ROOT, 'tmp'), { recursive: true });
  const profile = mkdtempSync(join(ROOT, 'tmp', 'chromium-profile-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1360, height: 860 },
    reducedMotion: 'reduce',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const offLoopback: string[] = [];
  context.on('request', (req) => {
    const url = new URL(req.url());
    if (['data:', 'blob:', 'about:'].includes(url.protocol)) return;
    if (!['127.0.0.1', 'localhost', '[::1]'].includes(url.hostname)) offLoopback.push(req.url());
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    offLoopback,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Waits for fonts and a quiet network, then saves a full-page screenshot as `<name>.png`. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.waitForLoadState('networkidle');
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  const file = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Signs in through the sign-in page and waits for the shell. */
export async function signInAs(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('user-label').waitFor();
}
