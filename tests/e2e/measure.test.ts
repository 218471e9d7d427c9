import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const FIXTURES = path.resolve(__dirname, '../../fixtures/drops');
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

const angle = async (page: Page, side: 'left' | 'right') =>
  Number.parseFloat((await page.getByTestId(`angle-${side}`).textContent()) ?? 'NaN');

/** Drags the left end of the baseline by (dx, dy) image pixels with the mouse. */
async function dragBaselineStart(page: Page, dx: number, dy: number) {
  const canvas = page.getByTestId('drop-canvas');
  const box = await canvas.boundingBox();
  // The handles are drawn at the contact points (automatic baseline) or the ends set by hand.
  const handles = (await canvas.getAttribute('data-handles'))!.split(',').map(Number);
  const scale = Number(await canvas.getAttribute('data-scale'));
  if (!box) throw new Error('canvas not visible');
  const grabX = box.x + handles[0] * scale;
  const grabY = box.y + handles[1] * scale;
  await page.mouse.move(grabX, grabY);
  await page.mouse.down();
  await page.mouse.move(grabX + dx * scale, grabY + dy * scale, { steps: 8 });
  await page.mouse.up();
}

/** Waits until the left angle has stopped changing (the last drag position's result is in). */
async function settledLeftAngle(page: Page): Promise<number> {
  let previous = await angle(page, 'left');
  for (let i = 0; i < 40; i++) {
    await page.waitForTimeout(400);
    const current = await angle(page, 'left');
    if (current === previous) return current;
    previous = current;
  }
  throw new Error('the left angle did not settle');
}

async function waitForAngleChange(page: Page, before: number) {
  await page.waitForFunction(
    (previous) => {
      const text = document.querySelector('[data-testid="angle-left"]')?.textContent ?? '';
      const value = Number.parseFloat(text);
      return Number.isFinite(value) && Math.abs(value - previous) > 0.05;
    },
    before,
    { timeout: 30_000 },
  );
}

describe('measurement workspace', () => {
  it('analyst uploads two photos, drags the baseline, saves revisions to a sample', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/measure`);

    // Upload through the page: SDK → local upload service → signed callback → database row.
    await page
      .getByTestId('photo-input')
      .setInputFiles([path.join(FIXTURES, 'cap-60-noisy.png'), path.join(FIXTURES, 'drop-105-needle.png')]);
    const table = page.getByRole('table', { name: 'Photos' });
    await table.getByRole('button', { name: 'drop-105-needle.png', exact: true }).waitFor({ timeout: 60_000 });
    await table.getByRole('button', { name: 'cap-60-noisy.png', exact: true }).click();
    await page.getByTestId('angle-left').waitFor({ timeout: 60_000 });
    const automaticLeft = await angle(page, 'left');
    // The fixture was rendered at 60° (fixtures/drops/manifest.json).
    expect(automaticLeft).toBeGreaterThan(58);
    expect(automaticLeft).toBeLessThan(62);

    // Lift the left end of the baseline: the left angle changes while the right one stays near.
    await dragBaselineStart(page, 0, -6);
    await waitForAngleChange(page, automaticLeft);
    const draggedLeft = await settledLeftAngle(page);
    expect(Math.abs(draggedLeft - automaticLeft)).toBeGreaterThan(0.3);
    expect(await page.getByText('adjusted by hand').count()).toBe(1);

    await page.getByLabel('Sample', { exact: true }).selectOption({ label: 'B-0412 / P1' });
    await page.getByRole('button', { name: 'Save this drop' }).click();
    await page.getByText('Saved as revision 1.').waitFor({ timeout: 30_000 });
    const revisions = page.getByTestId('revisions');
    expect(await revisions.getByRole('row').count()).toBe(1);
    // What was saved is what the server's engine computed for the same photo and baseline.
    const savedLeft = Number.parseFloat((await revisions.getByRole('row').first().getByRole('cell').nth(2).textContent()) ?? '');
    expect(Math.abs(savedLeft - draggedLeft)).toBeLessThan(0.15);

    // Reload: the same photo comes back with its saved revision.
    await page.reload();
    await page.getByRole('table', { name: 'Photos' }).getByRole('button', { name: 'cap-60-noisy.png', exact: true }).click();
    await page.getByTestId('revisions').getByRole('row').first().waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('revisions').getByRole('row').count()).toBe(1);

    // Change the baseline again and save: a second revision, the first one kept.
    await page.getByTestId('angle-left').waitFor({ timeout: 60_000 });
    const beforeSecondDrag = await angle(page, 'left');
    await dragBaselineStart(page, 0, 4);
    await waitForAngleChange(page, beforeSecondDrag);
    // A saved drop analysed again says why.
    await page.getByLabel('Reason for the re-analysis').fill('Baseline lowered onto the contact points');
    await page.getByRole('button', { name: 'Save this drop' }).click();
    await page.getByText('Saved as revision 2.').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('revisions').getByRole('row').count()).toBe(2);
    await context.close();
  });

  it('viewer has no upload control, and the upload route refuses them', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, 'viewer@kestrel.example', DEMO_PASSWORD);
    expect(await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Measure' }).count()).toBe(0);
    const response = await page.goto(`${BASE_URL}/measure`);
    expect(response?.status()).toBe(403);
    expect(await page.getByTestId('photo-input').count()).toBe(0);
    const status = await page.evaluate(async () => {
      const res = await fetch('/api/uploadthing?actionType=upload&slug=dropPhoto', {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-uploadthing-package': 'beadline-e2e' },
        body: JSON.stringify({ files: [{ name: 'drop.png', size: 1000, type: 'image/png', lastModified: 0 }], input: {} }),
      });
      return res.status;
    });
    expect(status).toBe(403);
    await context.close();
  });
});
