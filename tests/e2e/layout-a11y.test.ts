/**
 * The main pages at laptop widths (1,280 and 1,440 px) have no horizontal scroll, and an axe-core
 * scan finds no WCAG 2 A/AA violation on them (axe-core is pinned in package.json; it is injected
 * into each page, with the page's Content-Security-Policy bypassed for the injected script only).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const AXE_SOURCE = readFileSync(
  createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
  'utf8',
);

const MAIN_PAGES = [
  '/dashboard',
  '/coatings',
  '/batches',
  '/sessions',
  '/probe-liquids',
  '/compare?coating=HT-200',
  '/surface-energy',
  '/tensiometry',
  '/reviews',
  '/team',
  '/team/api',
  '/team/webhooks',
  '/api-reference',
  '/measure',
  '/dynamic-wetting',
  '/audit',
];

let browser: Browser;
let page: Page;
let pages: string[];

beforeAll(async () => {
  browser = await launchBrowser();
  const context = await browser.newContext({ bypassCSP: true });
  page = await context.newPage();
  await signIn(page, 'admin@kestrel.example', DEMO_PASSWORD);
  // A coating, a batch (with its import page), a drop and a review page too, found from their lists.
  await page.goto(`${BASE_URL}/coatings`);
  const coating = await page
    .getByRole('link', { name: 'HT-200', exact: true })
    .first()
    .getAttribute('href');
  await page.goto(`${BASE_URL}/batches`);
  const batch = await page.getByRole('link', { name: 'B-0412' }).first().getAttribute('href');
  await page.goto(`${BASE_URL}/reviews`);
  const review = await page.locator('a[href^="/reviews/"]').first().getAttribute('href');
  await page.goto(`${BASE_URL}${batch}`);
  const drop = await page.locator('a[href^="/drops/"]').first().getAttribute('href');
  const found = [coating, batch, batch && `${batch}/import`, review, drop];
  expect(found.every(Boolean), JSON.stringify(found)).toBe(true);
  pages = [...MAIN_PAGES, ...(found as string[])];
});

afterAll(async () => {
  await browser?.close();
});

/**
 * Opens a page and waits until it is loaded and its fonts are in (layout is final). Not
 * 'networkidle': pages that poll or keep a connection open never reach it.
 */
async function open(path: string) {
  await page.goto(`${BASE_URL}${path}`, { waitUntil: 'load' });
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

describe('layout at laptop widths', () => {
  for (const width of [1280, 1440]) {
    it(`no main page scrolls sideways at ${width} px`, async () => {
      await page.setViewportSize({ width, height: 900 });
      const overflowing: string[] = [];
      for (const path of pages) {
        await open(path);
        const { scrollWidth, clientWidth } = await page.evaluate(() => ({
          scrollWidth: document.documentElement.scrollWidth,
          clientWidth: document.documentElement.clientWidth,
        }));
        if (scrollWidth > clientWidth)
          overflowing.push(`${path}: ${scrollWidth} px > ${clientWidth} px`);
      }
      expect(overflowing).toEqual([]);
    });
  }
});

/** axe-core's WCAG 2 A/AA violations on one page, as "path: rule (help) at targets". */
async function axeViolations(path: string): Promise<string[]> {
  await page.setViewportSize({ width: 1440, height: 900 });
  await open(path);
  await page.addScriptTag({ content: AXE_SOURCE });
  const violations = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            options: unknown,
          ) => Promise<{
            violations: { id: string; help: string; nodes: { target: unknown[] }[] }[];
          }>;
        };
      }
    ).axe;
    const result = await axe.run(document, {
      runOnly: {
        type: 'tag',
        values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'],
      },
    });
    return result.violations.map((v) => ({
      id: v.id,
      help: v.help,
      targets: v.nodes.map((n) => JSON.stringify(n.target)),
    }));
  });
  return violations.map(
    (v) => `${path}: ${v.id} (${v.help}) at ${v.targets.slice(0, 5).join(', ')}`,
  );
}

// One test per page: a scan takes seconds on a busy machine, and a failure names its page.
describe('accessibility (axe-core, WCAG 2 A and AA)', () => {
  for (const path of MAIN_PAGES) {
    it(`finds no violation on ${path}`, async () => {
      expect(await axeViolations(path)).toEqual([]);
    });
  }

  it('finds no violation on a coating, a batch, its import page and a review', async () => {
    const found: string[] = [];
    for (const path of pages.slice(MAIN_PAGES.length)) found.push(...(await axeViolations(path)));
    expect(found).toEqual([]);
  });
});
