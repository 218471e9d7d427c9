/**
 * A morning's photos in the measurement workspace's table (upload twelve, remove two, put ten on
 * a sample after the confirmation), and a saved drop reopened from its batch page, re-saved with
 * a reason, its session's conditions kept.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const FIXTURES = path.resolve(__dirname, '../../fixtures/drops');
const PNGS = [
  'cap-20-clean.png',
  'cap-60-noisy.png',
  'drop-105-needle.png',
  'drop-110-needle-gap.png',
  'drop-120-reflection.png',
  'drop-150-lens-spot.png',
  'drop-170-small.png',
  'drop-75-16bit.png',
  'drop-90-tilted.png',
  'puddle-45-bond1.png',
  'cap-60-noisy.png',
  'drop-90-tilted.png',
];
const RUN = Date.now().toString(36);
/**
 * The batch these tests save to, review and approve: their own (coating, batch, sample P1), so
 * the demo batches stay as the demo scenario and other tests expect them (not reviewed).
 */
const LOT = `L-WS${RUN.toUpperCase()}`;
let browser: Browser;
let files: string[];

/** The fixture with a text chunk naming this run, so each file is new to the server (own SHA-256). */
function taggedPng(source: string, tag: string, target: string) {
  const png = readFileSync(source);
  const data = Buffer.from(`Comment\0${tag}`, 'latin1');
  const chunk = Buffer.alloc(12 + data.length);
  chunk.writeUInt32BE(data.length, 0);
  chunk.write('tEXt', 4, 'latin1');
  data.copy(chunk, 8);
  chunk.writeUInt32BE(crc32(chunk.subarray(4, 8 + data.length)), 8 + data.length);
  // After the 8-byte signature and the 25-byte IHDR chunk.
  writeFileSync(target, Buffer.concat([png.subarray(0, 33), chunk, png.subarray(33)]));
}

beforeAll(async () => {
  browser = await launchBrowser();
  // Coatings are added by admins; the analyst then measures on the batch.
  const context = await browser.newContext();
  await signIn(await context.newPage(), 'admin@kestrel.example', DEMO_PASSWORD);
  const post = async (route: string, data: unknown) => {
    const response = await context.request.post(`${BASE_URL}${route}`, {
      data,
      headers: { origin: BASE_URL },
    });
    const body = (await response.json()) as Record<string, { id: string }>;
    expect(response.status(), JSON.stringify(body)).toBeLessThan(300);
    return Object.values(body)[0]!;
  };
  const coating = await post('/api/coatings', {
    code: `WS-${RUN.toUpperCase()}`,
    name: 'Workspace test topcoat',
  });
  const batch = await post('/api/batches', {
    coatingId: coating.id,
    lotCode: LOT,
    producedOn: '2026-12-01',
  });
  await post('/api/samples', { batchId: batch.id, label: 'P1' });
  await context.close();
  const dir = mkdtempSync(path.join(tmpdir(), 'beadline-ws-'));
  files = PNGS.map((name, i) => {
    const target = path.join(dir, `ws-${RUN}-${String(i + 1).padStart(2, '0')}-${name}`);
    taggedPng(path.join(FIXTURES, name), `${RUN}-${i}`, target);
    return target;
  });
});

afterAll(async () => {
  await browser?.close();
});

const table = (page: Page) => page.getByRole('table', { name: 'Photos' });
const rowOf = (page: Page, file: string) =>
  table(page)
    .getByRole('row')
    .filter({ has: page.getByRole('button', { name: file, exact: true }) });
const mine = (page: Page) =>
  table(page)
    .getByRole('row')
    .filter({ hasText: `ws-${RUN}-` });

async function statesOf(page: Page): Promise<string[]> {
  return mine(page).getByTestId('photo-state').allTextContents();
}

describe('a morning of photos in the workspace table', () => {
  it('uploads 12 photos → all analysed → removes 2 → assigns and saves 10 after the confirmation', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/measure`);
    await page.getByTestId('photo-input').setInputFiles(files);
    const names = files.map((f) => path.basename(f));

    // Every upload is listed, ticked, and analysed in the browser.
    await expect.poll(() => mine(page).count(), { timeout: 180_000, interval: 1000 }).toBe(12);
    await expect
      .poll(async () => (await statesOf(page)).filter((s) => s === 'Analysing').length, {
        timeout: 300_000,
        interval: 2000,
      })
      .toBe(0);
    expect(await statesOf(page)).not.toContain('No result');
    expect(await page.getByText('12 ticked', { exact: true }).count()).toBe(1);
    // Each row shows its angles.
    const means = await mine(page).locator('[data-cell="mean"]').allTextContents();
    expect(means.every((m) => /^\d+\.\d°$/.test(m))).toBe(true);

    // Keyboard: ↓ in the table shows the next photo (rows are in the order the uploads arrived).
    const listed = await mine(page)
      .locator('td:nth-child(2) button')
      .evaluateAll((buttons) => buttons.map((b) => b.getAttribute('title')!));
    expect([...listed].sort()).toEqual([...names].sort());
    await rowOf(page, listed[0]).getByRole('button', { name: listed[0], exact: true }).click();
    await page.getByRole('region', { name: /Photos table/ }).focus();
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => page.getByTestId('shown-photo').textContent()).toContain(listed[1]);

    // Remove two (the row's own button); the ten others stay ticked.
    for (const name of [names[6], names[9]]) {
      await page.getByRole('button', { name: `Remove ${name}` }).click();
      await rowOf(page, name).waitFor({ state: 'detached', timeout: 30_000 });
    }
    expect(await mine(page).count()).toBe(10);
    expect(await page.getByText('10 ticked', { exact: true }).count()).toBe(1);

    // The session's conditions, kept with the drops (checked when a drop is reopened).
    await page.getByLabel('Temp.').fill('21.5');
    await page.getByLabel('RH').fill('41');

    // Put the ticked ten on a sample and a liquid.
    await page.getByLabel('Put ticked on sample').selectOption({ label: `${LOT} / P1` });
    await page.getByLabel('Probe liquid of ticked').selectOption({ label: 'Water' });
    await page.getByRole('button', { name: 'Assign to 10 ticked' }).click();
    const samples = await mine(page).locator('td:nth-child(3)').allTextContents();
    expect(samples).toEqual(Array(10).fill(`${LOT} / P1`));

    // Save after a confirmation that says what goes where.
    await page.getByRole('button', { name: 'Save 10 ticked…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Save 10 drops?' });
    await dialog.waitFor();
    const where = dialog.getByRole('table', { name: 'What goes where' }).getByRole('row');
    expect(await where.count()).toBe(11);
    for (const name of names.filter((_, i) => i !== 6 && i !== 9)) {
      const row = where.filter({ hasText: name });
      expect(await row.textContent()).toContain(`${LOT} / P1`);
      expect(await row.textContent()).toContain('Water');
      expect(await row.textContent()).toContain('new drop');
    }
    await dialog.getByRole('button', { name: 'Save 10 drops' }).click();
    await page.getByText('Saved 10 drops.').waitFor({ timeout: 480_000 });
    expect(await statesOf(page)).toEqual(Array(10).fill('Saved r1'));

    // The server kept each on the sample it was given.
    const ids = await mine(page).evaluateAll((rows) =>
      rows.map((r) => r.getAttribute('data-photo-id')),
    );
    const placed = await page.evaluate(async (photoIds) => {
      const out = [];
      for (const id of photoIds) {
        const reply = await fetch(`/api/photos/${id}/drop`);
        const { drop } = (await reply.json()) as { drop: { lotCode: string; sampleLabel: string } };
        out.push(`${drop.lotCode}/${drop.sampleLabel}`);
      }
      return out;
    }, ids);
    expect(placed).toEqual(Array(10).fill(`${LOT}/P1`));

    // A reload shows the same ten, badged saved at once, and not the removed two.
    await page.reload();
    await expect.poll(() => mine(page).count(), { timeout: 60_000 }).toBe(10);
    expect(await statesOf(page)).toEqual(Array(10).fill('Saved r1'));
    expect(await rowOf(page, names[6]).count()).toBe(0);
    await context.close();
  }, 900_000);

  it('opens a saved drop from its batch page, re-saves it with a reason, conditions kept', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    const name = path.basename(files[0]);
    // The batch page lists the drop with a link to its page.
    await page.goto(`${BASE_URL}/batches`);
    await page.getByRole('link', { name: LOT, exact: true }).first().click();
    await page.waitForURL(/\/batches\/[^/]+$/);
    const links = page.locator('a[href^="/drops/"]');
    await links.first().waitFor();
    // Each drop link's page names its photo; open the one of the first photo.
    const hrefs = await links.evaluateAll((as) => as.map((a) => a.getAttribute('href')!));
    let found: string | null = null;
    for (const href of hrefs) {
      const html = await page.evaluate(async (url) => (await fetch(url)).text(), href);
      if (html.includes(name)) {
        found = href;
        break;
      }
    }
    expect(found).toBeTruthy();
    await page.locator(`a[href="${found}"]`).first().click();
    await page.waitForURL(`${BASE_URL}${found}`);
    const revisions = page.getByTestId('drop-revisions').getByRole('row');
    expect(await revisions.count()).toBe(1);
    const firstConditions = await revisions
      .first()
      .locator('[data-cell="conditions"]')
      .textContent();
    expect(firstConditions).toContain('21.5 °C');
    expect(firstConditions).toContain('41 % RH');

    // Open it in the workspace: the drop's session conditions are there and kept.
    await page.getByRole('link', { name: 'Open in the workspace' }).click();
    await page.waitForURL(/\/measure\?photos=/);
    await rowOf(page, name).waitFor({ timeout: 60_000 });
    expect(await rowOf(page, name).getByTestId('photo-state').textContent()).toMatch(
      /Saved r1|Analysing/,
    );
    expect(await page.getByLabel('Temp.').inputValue()).toBe('21.5');
    expect(await page.getByLabel('RH').inputValue()).toBe('41');
    await page.getByTestId('session-kept').waitFor();
    await page.getByTestId('angle-left').waitFor({ timeout: 120_000 });
    await expect
      .poll(() => rowOf(page, name).getByTestId('photo-state').textContent(), { timeout: 120_000 })
      .toBe('Saved r1');

    const photoId = (await rowOf(page, name).getAttribute('data-photo-id'))!;
    const sessionOf = () =>
      page.evaluate(
        async (id) =>
          (
            (await (await fetch(`/api/photos/${id}/drop`)).json()) as {
              drop: { sessionId: string };
            }
          ).drop.sessionId,
        photoId,
      );
    const sessionBefore = await sessionOf();
    expect(sessionBefore).toBeTruthy();

    // Re-save with a reason.
    await page
      .getByLabel('Reason for the re-analysis')
      .fill('Checked the baseline against the contact points');
    await page.getByRole('button', { name: 'Save this drop' }).click();
    await page.getByText('Saved as revision 2.').waitFor({ timeout: 60_000 });
    // No new session was made behind the user's back.
    expect(await sessionOf()).toBe(sessionBefore);

    // The drop page shows both revisions: the reason, and the same conditions (same session).
    await page.goto(`${BASE_URL}${found}`);
    expect(await revisions.count()).toBe(2);
    expect(await revisions.first().locator('[data-cell="reason"]').textContent()).toBe(
      'Checked the baseline against the contact points',
    );
    expect(await revisions.first().locator('[data-cell="conditions"]').textContent()).toBe(
      firstConditions,
    );
    await context.close();
  }, 600_000);

  it('the reviewer opens a drop from the review page (its drop page) and approves; a viewer then sees that drop', async () => {
    const analystContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const analyst = await analystContext.newPage();
    await signIn(analyst, 'analyst@kestrel.example', DEMO_PASSWORD);
    await analyst.goto(`${BASE_URL}/reviews`);
    const batch = analyst.getByLabel('Batch');
    const option = (await batch.locator('option', { hasText: LOT }).first().textContent())!;
    await batch.selectOption({ label: option.trim() });
    await analyst.getByLabel(/Note for the reviewer/).fill('Ten drops from the workspace table');
    await analyst.getByRole('button', { name: 'Submit for review' }).click();
    await analyst.getByText(/Submitted \d+ results? for review/).waitFor({ timeout: 60_000 });
    await analystContext.close();

    const reviewerContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const reviewer = await reviewerContext.newPage();
    await signIn(reviewer, 'reviewer@kestrel.example', DEMO_PASSWORD);
    await reviewer.goto(`${BASE_URL}/reviews`);
    await reviewer
      .getByRole('table', { name: 'Waiting for review' })
      .getByRole('link', { name: new RegExp(LOT) })
      .first()
      .click();
    await reviewer.getByRole('heading', { name: new RegExp(`Review of .*${LOT}`) }).waitFor();
    const reviewUrl = reviewer.url();

    // A drop of the review opens its page: the photo's fit and every revision.
    const first = reviewer.getByTestId('review-drop').first();
    const href = (await first.getByRole('link').first().getAttribute('href'))!;
    expect(href).toMatch(/^\/drops\/[^/]+$/);
    await first.getByRole('link').first().click();
    await reviewer.waitForURL(`${BASE_URL}${href}`);
    await reviewer.getByRole('heading', { name: new RegExp(`Drop on .*${LOT}`) }).waitFor();
    expect(await reviewer.getByTestId('drop-revisions').getByRole('row').count()).toBeGreaterThan(
      0,
    );
    expect(await reviewer.getByTestId('latest-revision').textContent()).toMatch(/^r\d+$/);

    // Back on the review: approve and sign.
    await reviewer.goto(reviewUrl);
    await reviewer.getByLabel(/Your password/).fill(DEMO_PASSWORD);
    await reviewer.getByRole('button', { name: 'Approve and sign' }).click();
    await reviewer
      .getByRole('heading', { name: 'Approved and signed' })
      .waitFor({ timeout: 60_000 });
    await reviewerContext.close();

    // Approved, the drop's page is open to a viewer too (without the photo).
    const viewerContext = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const viewer = await viewerContext.newPage();
    await signIn(viewer, 'viewer@kestrel.example', DEMO_PASSWORD);
    await viewer.goto(`${BASE_URL}${href}`);
    await viewer.getByRole('heading', { name: new RegExp(`Drop on .*${LOT}`) }).waitFor();
    expect(await viewer.getByTestId('latest-revision').textContent()).toMatch(/^r\d+$/);
    await viewerContext.close();
  }, 300_000);
});
