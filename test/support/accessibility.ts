/// <reference lib="dom" />
/**
 * An accessibility check of the page as it stands, with axe-core (Deque's rule engine for WCAG 2)
 * run inside Chromium. The app's content security policy forbids injected script tags, so axe's
 * source goes in through playwright's `page.evaluate`, which the policy does not govern.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import type { AxeResults, ImpactValue, Result } from 'axe-core';
import { SCREENSHOT_DIR } from './browser.js';

const require = createRequire(import.meta.url);
/** axe-core's browser build, read once per test file. */
const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** The axe tags of the WCAG 2.0, 2.1 and 2.2 success criteria at levels A and AA. */
export const WCAG2_A_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] as const;

/** The impacts that fail a screen, under a WCAG A/AA rule or a best practice; "minor" findings are left to review. */
const FAILING_IMPACTS: readonly ImpactValue[] = ['moderate', 'serious', 'critical'];
/** Characters of an element's HTML printed beside its selector. */
const SNIPPET_LENGTH = 160;
/**
 * Material's empty, absolutely placed layers over text: a focus ring's box (drawn only while
 * focused), a ripple's box (drawn only while pressed), the paginator's touch target and an outlined
 * field's border. axe takes them for covers and leaves the contrast of the text beneath undecided,
 * so they are set aside while axe runs (the field's floating label, which sits in the border, stays
 * visible) and put back after. Each entry: selector, CSS property, value.
 */
const CLEAR_LAYERS: readonly (readonly [string, string, string])[] = [
  ['.mat-focus-indicator:empty', 'display', 'none'],
  ['.mat-ripple:empty', 'display', 'none'],
  ['.mat-mdc-paginator-touch-target', 'display', 'none'],
  ['.mdc-notched-outline', 'visibility', 'hidden'],
  ['.mdc-notched-outline .mdc-floating-label', 'visibility', 'visible'],
];
/** The tallest viewport the check opens, in CSS pixels; Chromium draws up to 16,384. */
const MAX_VIEWPORT_HEIGHT = 16_000;

/**
 * Runs axe on the whole document with the WCAG 2 A/AA rules (and axe's best-practice rules, for the
 * review file only) and returns one line per failing element of every moderate, serious or
 * critical violation (WCAG A/AA rules and axe's best practices): rule id, impact, what axe asks for, the element's CSS selector and the start of its
 * HTML, and axe's summary of what is wrong with it. An empty list means the screen passes.
 * Everything axe found, failing or not (minor impacts too, and checks it could not decide such as contrast over an image), goes to `tmp/screenshots/a11y-<name>.json`.
 */
export async function accessibilityProblems(page: Page, name: string): Promise<string[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe === 'object');
  // A trailing expression keeps playwright from treating the source as a function to call.
  if (!loaded) await page.evaluate(`${AXE_SOURCE}\n;true`);
  // axe judges contrast from what is drawn in the viewport; with the whole page in view and at the
  // top, the sticky toolbar covers nothing and every text has a background axe can read.
  const viewport = page.viewportSize();
  const height = await page.evaluate(() => document.documentElement.scrollHeight);
  if (viewport && height > viewport.height) await page.setViewportSize({ width: viewport.width, height: Math.min(height, MAX_VIEWPORT_HEIGHT) });
  await page.evaluate(() => window.scrollTo(0, 0));
  const results = await page.evaluate(
    async ({ tags, layers }) => {
      const before: [HTMLElement, string, string][] = [];
      for (const [selector, property, value] of layers) {
        for (const el of document.querySelectorAll<HTMLElement>(selector)) {
          before.push([el, property, el.style.getPropertyValue(property)]);
          el.style.setProperty(property, value);
        }
      }
      try {
        return await (window as unknown as { axe: { run(context: Document, options: object): Promise<AxeResults> } }).axe.run(document, {
          runOnly: { type: 'tag', values: tags },
          resultTypes: ['violations', 'incomplete'],
        });
      } finally {
        for (const [el, property, value] of before.reverse()) el.style.setProperty(property, value);
      }
    },
    { tags: [...WCAG2_A_AA_TAGS, 'best-practice'], layers: CLEAR_LAYERS.map((layer) => [...layer]) },
  );
  if (viewport) await page.setViewportSize(viewport);
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const review = { url: results.url, violations: results.violations.map(summary), incomplete: results.incomplete.map(summary) };
  writeFileSync(join(SCREENSHOT_DIR, `a11y-${name}.json`), `${JSON.stringify(review, null, 2)}\n`);

  const problems: string[] = [];
  for (const violation of results.violations) {
    if (!FAILING_IMPACTS.includes(violation.impact ?? null)) continue;
    for (const node of violation.nodes) {
      const why = node.failureSummary?.replace(/\s+/g, ' ').trim() ?? '';
      problems.push(`${violation.id} (${violation.impact}): ${violation.help} at ${targetOf(node)} ${snippet(node.html)}${why ? ` — ${why}` : ''} [${violation.helpUrl}]`);
    }
  }
  return problems;
}

/** One rule's result as the review file keeps it. */
function summary(result: Result) {
  return {
    id: result.id,
    impact: result.impact,
    tags: result.tags,
    help: result.help,
    nodes: result.nodes.map((node) => ({ target: targetOf(node), html: snippet(node.html), summary: node.failureSummary?.replace(/\s+/g, ' ').trim() })),
  };
}

/** axe's selector of a node; parts inside shadow roots are joined with `>>>`. */
function targetOf(node: Result['nodes'][number]): string {
  return node.target.map((part) => (Array.isArray(part) ? part.join(' >>> ') : part)).join(' | ');
}

/** The start of an element's HTML on one line, enough to find it when its selector is a state class. */
function snippet(html: string): string {
  const line = html.replace(/\s+/g, ' ').trim();
  return line.length > SNIPPET_LENGTH ? `${line.slice(0, SNIPPET_LENGTH)}…` : line;
}
