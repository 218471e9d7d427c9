import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** The page for one sample of PP-Print F-2611, as the demo analyst. */
async function openPpPrintSample(label: string) {
  const page = await browser.newPage();
  await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
  await page.goto(`${BASE_URL}/surface-energy`);
  await page
    .getByLabel('Coating', { exact: true })
    .selectOption({ label: 'PP-Print — Plasma-treated polypropylene film' });
  await page.getByLabel('Batch', { exact: true }).selectOption({ label: 'F-2611' });
  await page.getByLabel('Sample', { exact: true }).selectOption({ label });
  await page.waitForURL(/\/surface-energy\?sample=/);
  return page;
}

describe('surface energy page (demo seed)', () => {
  it('shows the OWRK result of PP-Print F-2611 / D1 with its uncertainty and plot, saves it and lists it', async () => {
    const page = await openPpPrintSample('D1');

    await expect.poll(() => page.getByTestId('liquid-liquid-water').count()).toBe(1);
    await expect.poll(() => page.getByTestId('liquid-liquid-diiodomethane').count()).toBe(1);
    // Diiodomethane is harmful: its caution is shown where it is used.
    expect(await page.getByTestId('hazard-notes').textContent()).toMatch(/Diiodomethane:.*Harmful/);

    const total = (await page.getByTestId('owrk-gammaTotal').textContent()) ?? '';
    const match = total.match(/([\d.]+)\s*±\s*([\d.]+)\s*mN\/m/);
    expect(match, total).not.toBeNull();
    expect(Number(match![1])).toBeGreaterThan(30);
    expect(Number(match![2])).toBeGreaterThan(0);
    expect(await page.getByTestId('result-owrk').textContent()).toMatch(/Liquids used: .*Water/);

    // The OWRK regression and the wetting envelope are drawn as SVG.
    await page.getByTestId('owrk-plot').locator('svg.recharts-surface').first().waitFor();
    await page.getByTestId('envelope-plot').locator('svg.recharts-surface').first().waitFor();
    expect(await page.getByTestId('owrk-plot').locator('.recharts-scatter-symbol').count()).toBe(2);
    // PP-Print has a surface-energy spec (≥ 38 mN/m).
    expect(await page.getByTestId('spec-verdict').textContent()).toMatch(
      /Meets the spec surface free energy ≥ 38 mN\/m/,
    );
    // Its 7-day window is named with the drops it counts, by the compare page’s rule.
    expect(await page.getByTestId('spec-window').textContent()).toMatch(/within 7 days of\s+treatment/);

    const before = await page.getByTestId('saved-result').count();
    await page.getByRole('button', { name: 'Save with the sample' }).click();
    await page.getByText('Saved with the sample.').waitFor();
    expect(await page.getByTestId('saved-result').count()).toBe(before + 1);
    // Still listed after a reload, i.e. stored with the sample.
    await page.reload();
    await page.getByTestId('saved-results').waitFor();
    expect(await page.getByTestId('saved-result').count()).toBe(before + 1);
    expect(await page.getByTestId('saved-result').first().textContent()).toContain(match![1]);
    await page.close();
  });

  it('explains why a method is unavailable with only water and diiodomethane', async () => {
    const page = await openPpPrintSample('D4');
    const acidBase = page.getByLabel(/van Oss–Chaudhury–Good/);
    expect(await acidBase.isDisabled()).toBe(true);
    expect(await page.getByText(/needs three liquids with known γLW/).count()).toBe(1);
    await page.getByLabel('Wu harmonic mean').check();
    await page.getByTestId('result-wu').waitFor();
    expect(await page.getByTestId('wu-gammaTotal').textContent()).toMatch(/±/);
    await page.close();
  });
});
