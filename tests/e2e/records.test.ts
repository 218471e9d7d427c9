import { randomBytes } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

let browser: Browser;
const suffix = randomBytes(3).toString('hex').toUpperCase();
const coatingCode = `E2E-${suffix}`;
const lotCode = `L-${suffix}`;
const emailOf = (role: string) => DEMO_USERS.find((user) => user.role === role)!.email;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function signedIn(role: 'admin' | 'analyst'): Promise<Page> {
  const context = await browser.newContext({ acceptDownloads: true });
  const page = await context.newPage();
  page.setDefaultTimeout(60_000);
  await signIn(page, emailOf(role), DEMO_PASSWORD);
  return page;
}

describe('lab records pages', () => {
  let coatingUrl = '';
  let batchUrl = '';

  it('an admin adds a coating with a spec', async () => {
    const page = await signedIn('admin');
    await page.goto(`${BASE_URL}/coatings`);
    await page.getByText('Add a coating').click();
    const form = page.getByRole('form', { name: 'New coating' });
    // The shared zod schema answers in the browser before anything is sent.
    await form.getByRole('button', { name: 'Add coating' }).click();
    await form.getByText('Enter a coating code, like HT-200.').waitFor();
    await form.getByLabel('Code').fill(coatingCode);
    await form.getByLabel('Name').fill('End-to-end topcoat');
    await form.getByRole('button', { name: 'Add coating' }).click();
    await page.getByRole('link', { name: coatingCode, exact: true }).click();
    await page.waitForURL(/\/coatings\/[^/?]+$/);
    coatingUrl = page.url();
    await page.getByText('Add a spec').click();
    const spec = page.getByRole('form', { name: 'New spec' });
    await spec.getByLabel('Probe liquid').selectOption({ label: 'Water' });
    await spec.getByLabel('Min angle (°)').fill('95');
    await spec.getByLabel('Max angle (°)').fill('90');
    await spec.getByRole('button', { name: 'Add spec' }).click();
    await spec.getByText('Make the maximum angle at least the minimum angle.').waitFor();
    await spec.getByLabel('Max angle (°)').fill('');
    await spec.getByRole('button', { name: 'Add spec' }).click();
    // The rule reads as written on a drawing: the degree sign on its number (issue 14).
    await page
      .getByTestId('table-specs')
      .getByRole('cell', { name: '≥ 95°', exact: true })
      .waitFor();
    expect(await page.getByTestId('table-specs').getByText('>=').count()).toBe(0);
    await page.context().close();
  });

  it('an analyst adds a batch and a sample, imports two drops from a CSV and sees them on the batch page', async () => {
    const page = await signedIn('analyst');
    await page.goto(coatingUrl);
    await page.getByRole('link', { name: 'Add a batch of this coating' }).click();
    const form = page.getByRole('form', { name: 'New batch' });
    await form.getByLabel('Lot code').fill(lotCode);
    await form.getByLabel('Produced on').fill('2026-03-14');
    await form.getByLabel('Cure temperature (°C)').fill('999');
    await form.getByRole('button', { name: 'Add batch' }).click();
    await form.getByText('Enter the cure temperature in °C, from -40 to 450.').waitFor();
    await form.getByLabel('Cure temperature (°C)').fill('180');
    await form.getByRole('button', { name: 'Add batch' }).click();
    await page.waitForURL(/\/batches\/[^/?]+$/);
    batchUrl = page.url();
    await page.getByRole('heading', { name: `Batch ${lotCode}` }).waitFor();

    await page.getByText('Add a sample').click();
    const sample = page.getByRole('form', { name: 'New sample' });
    await sample.getByLabel('Sample label').fill('P-01');
    await sample.getByLabel('Substrate').fill('Aluminium panel');
    await sample.getByRole('button', { name: 'Add sample' }).click();
    await page.getByTestId('drops-P-01').waitFor();
    expect(await page.getByTestId('drops-P-01').textContent()).toBe('0');
    expect(
      await page.getByRole('link', { name: 'Measure on this sample' }).getAttribute('href'),
    ).toMatch(/^\/measure\?sample=/);

    await page.getByRole('link', { name: 'Import angles from CSV' }).click();
    await page.waitForURL(/\/import$/);
    const csv = page.getByLabel('…or paste the CSV text');
    // A wrong file is refused whole, with the row and column of each problem.
    await csv.fill(
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at\nP-01,Water,104,103,2019-05-14\nP-07,Water,200,103,2019-05-14\n',
    );
    await page.getByRole('button', { name: 'Check and import' }).click();
    await page.getByText(/Nothing was imported/).waitFor();
    const issues = page.getByTestId('import-issue');
    expect(await issues.count()).toBe(1);
    expect(await issues.first().textContent()).toContain('3Left angle (°)');
    await csv.fill(
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note\nP-01,Water,104.0,103.0,2019-05-14 10:30,J. Doe,\nP-01,Water,100.0,99.0,2019-05-14 10:35,J. Doe,\n',
    );
    await page.getByRole('button', { name: 'Check and import' }).click();
    await page.getByText(`Imported 2 drops into batch ${lotCode}.`).waitFor();

    await page.goto(batchUrl);
    expect(await page.getByTestId('drops-P-01').textContent()).toBe('2');
    expect(await page.getByTestId('mean-water-P-01').textContent()).toBe('101.5 (n = 2)');
    const drops = page.getByTestId('table-drops');
    // Angles read by hand are named in words, not by the stored code 'manual' (issue 14).
    expect(await drops.getByRole('cell', { name: 'Read by hand', exact: true }).count()).toBe(2);
    expect(await drops.getByRole('cell', { name: 'manual', exact: true }).count()).toBe(0);
    expect(await drops.getByRole('cell', { name: 'imported', exact: true }).count()).toBe(2);

    // The export downloads the same numbers the page shows.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByTestId('table-samples').getByRole('link', { name: 'Export CSV' }).click(),
    ]);
    const text = await readFile((await download.path())!, 'utf8');
    const [header, row] = text
      .replace(/^\uFEFF/, '')
      .trim()
      .split(/\r?\n/)
      .map((line) => line.split(','));
    expect(row[header.indexOf('Sample label')]).toBe('P-01');
    expect(row[header.indexOf('Drops')]).toBe('2');
    expect(Number(row[header.indexOf('Mean water contact angle (°)')])).toBe(101.5);

    // The compare page judges the new batch against the coating's spec with the rule shown:
    // two imported drops are fewer than the three a verdict needs.
    await page.goto(`${BASE_URL}/compare?coating=${encodeURIComponent(coatingCode)}`);
    const verdict = page.getByTestId(`verdict-liquid-water-${lotCode}`);
    await verdict.waitFor();
    expect(await verdict.textContent()).toMatch(/Not enough data/);
    expect(await page.locator('main svg').count()).toBeGreaterThan(0);
    await page.context().close();
  });

  it('the coatings list sorts and keeps its filter in the URL', async () => {
    const page = await signedIn('analyst');
    await page.goto(`${BASE_URL}/coatings`);
    await page.getByLabel('Search code, name or description').fill(coatingCode);
    await page.getByRole('button', { name: 'Apply filters' }).click();
    await page.waitForURL((url) => url.searchParams.get('q') === coatingCode);
    await page.getByTestId('table-coatings').getByRole('button', { name: /Code/ }).click();
    await page.waitForURL(
      (url) => url.searchParams.get('sort') === 'code' && url.searchParams.get('dir') === 'desc',
    );
    expect(new URL(page.url()).searchParams.get('q')).toBe(coatingCode);
    // The shared link opens the same view.
    const shared = await (await browser.newContext()).newPage();
    await signIn(shared, emailOf('analyst'), DEMO_PASSWORD);
    await shared.goto(page.url());
    expect(await shared.getByLabel('Search code, name or description').inputValue()).toBe(
      coatingCode,
    );
    const rows = shared.getByTestId('table-coatings').locator('tbody tr');
    expect(await rows.count()).toBe(1);
    expect(
      await shared
        .getByTestId('table-coatings')
        .locator('th[aria-sort="descending"]')
        .textContent(),
    ).toContain('Code');
    // Hiding a column is part of the link too.
    await page.getByTestId('table-coatings').getByText('Columns', { exact: true }).click();
    await page.getByRole('checkbox', { name: 'Description' }).click();
    await page.waitForURL((url) => url.searchParams.get('hide') === 'description');
    expect(
      await page
        .getByTestId('table-coatings')
        .getByRole('columnheader', { name: 'Description' })
        .count(),
    ).toBe(0);
    await shared.context().close();
    await page.context().close();
  });
});
