import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { WATER_PENDANT, pendantPhotoPng } from '../support/pendant-photo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('tensiometry page', () => {
  it('checks probe water against IAPWS R1-76(2014) at 20 °C', async () => {
    const page = await browser.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Tensiometry' }).click();
    await page.waitForURL(`${BASE_URL}/tensiometry`);
    await page.getByLabel('Measured γ (mN/m)').fill('70.9');
    await page.getByLabel('Temperature (°C)').fill('20');
    await page.getByRole('button', { name: 'Check', exact: true }).click();
    await page.getByTestId('water-check-result').waitFor();
    // IAPWS R1-76(2014), table of values: 72.74 mN/m at 20 °C.
    expect(await page.getByTestId('water-reference').textContent()).toBe('72.74 mN/m');
    expect(await page.getByTestId('water-flag').textContent()).toMatch(/likely contaminated/);
    await page.close();
  });

  it('computes a Wilhelmy surface tension with the buoyancy correction, and keeps bad input with a message', async () => {
    const page = await browser.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/tensiometry`);
    await page.getByLabel('Force (mN)').fill('abc');
    await page.getByRole('button', { name: 'Compute', exact: true }).click();
    await page.getByText('Enter the balance force in mN.').waitFor();
    expect(await page.getByLabel('Force (mN)').inputValue()).toBe('abc');
    // Plate 19.62 × 0.10 mm at 2 mm depth in water (0.998 g/cm³); by hand (Wilhelmy 1863):
    // F = 72.74 · 2(19.72)·1e-3 − 0.998·9.80665·19.62·0.1·2·1e-3 = 2.8689 − 0.0384 = 2.8305 mN.
    await page.getByLabel('Force (mN)').fill('2.8305');
    await page.getByLabel('Immersion depth d (mm)').fill('2');
    await page.getByLabel('Liquid density ρ (g/cm³)').fill('0.998');
    await page.getByRole('button', { name: 'Compute', exact: true }).click();
    await page.getByTestId('wilhelmy-result').waitFor();
    const text = (await page.getByTestId('wilhelmy-result').textContent()) ?? '';
    expect(text).toMatch(/72\.7[34] mN\/m/);
    expect(text).toMatch(/Buoyancy correction.*0\.0384 mN/);
    await page.close();
  });
});

describe('pendant drop', () => {
  it('uploads a hanging-drop photo, fits its surface tension and keeps the photo with the saved result', async () => {
    const page = await browser.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/tensiometry`);
    // Through the page: SDK → local upload service → signed callback → photos row.
    await page.getByLabel('Photo of the hanging drop').setInputFiles({
      name: 'pendant-water.png',
      mimeType: 'image/png',
      buffer: await pendantPhotoPng(WATER_PENDANT),
    });
    await page.getByTestId('pendant-photo-stored').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('pendant-photo-stored').textContent()).toMatch(
      /pendant-water\.png uploaded \(320 × 360 px\)/,
    );
    await page.getByLabel('Needle outer diameter (mm)').fill('1.20');
    await page.getByLabel('Density difference Δρ (kg/m³)').fill('997');
    await page.getByRole('button', { name: 'Fit', exact: true }).click();
    await page.getByTestId('pendant-result').waitFor({ timeout: 60_000 });
    const gammaOf = async () => {
      const text = (await page.getByTestId('pendant-result').textContent()) ?? '';
      return Number(text.match(/Surface tension γ([\d.]+) mN\/m/)?.[1]);
    };
    // Rendered from the Young–Laplace equation (Bashforth & Adams 1883) at 72.0 mN/m
    // (tests/support/pendant-photo.ts): within 0.5 %.
    const gamma = await gammaOf();
    expect(Math.abs(gamma - 72) / 72).toBeLessThan(0.005);
    // The fitted outline is drawn over the uploaded photo.
    await page.getByTestId('pendant-fitted-outline').waitFor();
    expect(
      await page
        .getByRole('img', { name: /Photo of the hanging drop/ })
        .first()
        .getAttribute('src'),
    ).toMatch(/^\/api\/photos\/[\w-]+\/image$/);

    await page.getByRole('button', { name: 'Fit and save' }).click();
    await page.getByText('Saved with its photo.').waitFor({ timeout: 60_000 });
    const savedGamma = await gammaOf();
    await page.reload();
    const item = page
      .getByTestId('saved-result')
      .filter({ hasText: `Pendant drop · γ = ${savedGamma.toFixed(2)} mN/m` })
      .first();
    await item.waitFor();
    const thumbnail = item.getByRole('img', { name: 'Photo of the hanging drop' });
    expect(await thumbnail.getAttribute('src')).toMatch(/^\/api\/photos\/[\w-]+\/thumbnail$/);
    // The thumbnail really loads (same session, same organization).
    await page.waitForFunction(
      (img) => img instanceof HTMLImageElement && img.complete && img.naturalWidth > 0,
      await thumbnail.elementHandle(),
    );
    await page.close();
  });

  it('shows viewers the saved results and who runs pendant-drop fits', async () => {
    const page = await browser.newPage();
    await signIn(page, 'viewer@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/tensiometry`);
    await page.getByText('Pendant-drop fits are run by analysts').waitFor();
    expect(await page.getByLabel('Photo of the hanging drop').count()).toBe(0);
    await page.close();
  });
});
