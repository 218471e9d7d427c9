import type { Browser } from 'playwright-core';
import sharp from 'sharp';
import { integrateYoungLaplace } from '@/lib/analysis/young-laplace';
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

/**
 * PNG of a backlit hanging water drop rendered from the Young–Laplace equation at
 * γ = 72.0 mN/m (Δρ = 997 kg/m³, b = 1.35 mm, 60 px/mm) under a 1.20 mm needle, 4 × 4 supersampled.
 */
async function pendantPhoto(): Promise<Buffer> {
  const beta = (997 * 9.80665 * 1.35e-3 ** 2) / 0.072;
  const profile = integrateYoungLaplace(-beta, { maxZ: 6, step: 0.0005 });
  const bPx = 1.35 * 60;
  const needleRadius = 0.6 * 60;
  const radius: { h: number; r: number }[] = [];
  let past = false;
  for (let k = 0; k < profile.n; k++) {
    const r = profile.x[k] * bPx;
    if (profile.phi[k] > Math.PI / 2) past = true;
    if (past && r <= needleRadius) break;
    radius.push({ h: profile.z[k] * bPx, r });
  }
  const top = radius[radius.length - 1].h;
  const [width, height, cx, apexY] = [320, 360, 160.3, 330.6];
  const inside = (x: number, y: number) => {
    const h = apexY - y;
    if (h < 0) return false;
    if (h > top) return Math.abs(x - cx) <= needleRadius;
    const i = radius.findIndex((p) => p.h > h);
    const [a, b] = [radius[Math.max(0, i - 1)], radius[i]];
    const t = (h - a.h) / (b.h - a.h || 1);
    return Math.abs(x - cx) <= a.r + t * (b.r - a.r);
  };
  const data = Buffer.alloc(width * height);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      let covered = 0;
      for (let sy = 0; sy < 4; sy++)
        for (let sx = 0; sx < 4; sx++)
          if (inside(x + (sx + 0.5) / 4, y + (sy + 0.5) / 4)) covered++;
      data[y * width + x] = Math.round(230 - (covered / 16) * 200);
    }
  return sharp(data, { raw: { width, height, channels: 1 } })
    .png()
    .toBuffer();
}

describe('pendant drop', () => {
  it('fits the surface tension of a hanging-drop photo', async () => {
    const page = await browser.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/tensiometry`);
    await page.getByLabel('Photo of the hanging drop').setInputFiles({
      name: 'pendant-water.png',
      mimeType: 'image/png',
      buffer: await pendantPhoto(),
    });
    await page.getByTestId('pendant-outline').waitFor();
    await page.getByLabel('Needle outer diameter (mm)').fill('1.20');
    await page.getByLabel('Density difference Δρ (kg/m³)').fill('997');
    await page.getByRole('button', { name: 'Fit', exact: true }).click();
    await page.getByTestId('pendant-result').waitFor();
    const text = (await page.getByTestId('pendant-result').textContent()) ?? '';
    const gamma = Number(text.match(/Surface tension γ([\d.]+) mN\/m/)?.[1]);
    // Rendered at 72.0 mN/m from the Young–Laplace equation: within 0.5 %.
    expect(Math.abs(gamma - 72) / 72).toBeLessThan(0.005);
    await page.close();
  });
});
