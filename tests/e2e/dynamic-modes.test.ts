/**
 * The dynamic-wetting page's other two kinds in Chromium, on committed generated series
 * (fixtures/generator/series-catalog.ts; every drop half an exact Young–Laplace profile,
 * Bashforth & Adams 1883; REFERENCES.md), given as frame images:
 *
 * - Tilting plate (fixtures/series/tilting-plate): 31 frames at 1 frame/s while the stage tilts at
 *   1°/s (the tilt of each frame also in its tilt.csv); the downhill front creeps from 11.6°, the
 *   whole contact line moves from the roll-off tilt 21.3° on, with the downhill (advancing) angle
 *   108° and the uphill (receding) angle 80° there. Per-side angles: the polynomial tangent.
 * - Angle over time (fixtures/series/absorption): 20 frames at 5 frames/s of a drop spreading while
 *   absorbed, θ(t) = 40° + 45° e^(−t/8 s), the first frame 0.2 s after the drop landed. The page's
 *   clock starts at the first frame (it has no landing time), so its "initial angle at t = 0" is
 *   the angle of the first frame, whose exact value the manifest gives.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { fitLine } from '@/lib/dynamic/regression';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const SERIES = path.resolve(__dirname, '../../fixtures/series');

interface Manifest {
  fps: number;
  frames: { file: string; tSec: number; contactAngleDeg?: number }[];
  expected: Record<string, number>;
}

function committed(name: string) {
  const dir = path.join(SERIES, name);
  const manifest = JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as Manifest;
  return { dir, manifest, files: manifest.frames.map((f) => path.join(dir, f.file)) };
}

const began = Date.now();
const step = (what: string) =>
  console.log(`[dynamic modes e2e] ${what} after ${((Date.now() - began) / 1000).toFixed(1)} s`);

/** A number shown in a result (its unit and sign kept). */
const numberIn = async (page: Page, testId: string) =>
  Number(((await page.getByTestId(testId).textContent()) ?? '').replace(/[^\d.−-]/g, '').replace('−', '-'));

async function openPage(browser: Browser): Promise<Page> {
  const page = await browser.newPage();
  await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
  await page.getByRole('link', { name: 'Dynamic wetting' }).click();
  await page.waitForURL(`${BASE_URL}/dynamic-wetting`);
  return page;
}

async function analyseFrames(page: Page, files: string[], fps: number): Promise<void> {
  await page.getByRole('radio', { name: 'Frame images' }).check();
  await page.getByLabel(/^Frame images in order/).setInputFiles(files);
  await page.getByLabel('Frame rate (frames/s)').fill(String(fps));
  await page.getByRole('button', { name: 'Analyse the series' }).click();
  await page
    .getByRole('status')
    .filter({ hasText: /frames — done/ })
    .waitFor({ timeout: 240_000 });
  expect(Number(await page.getByTestId('series-plot').getAttribute('data-points'))).toBe(
    files.length,
  );
}

/** Indices of the frames the page lists as flagged (none listed: the section is absent). */
async function pageFlagged(page: Page): Promise<number[]> {
  if ((await page.getByTestId('flagged-frames').count()) === 0) return [];
  return (
    await page.getByTestId('flagged-frames').locator('tbody tr td:first-child').allTextContents()
  ).map(Number);
}

describe('dynamic wetting, tilting plate and angle over time', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('tilting plate from frame images: roll-off, downhill and uphill angles from the CSV column and from a typed rate; saved, with the server flagging the frames the page flags, and shown on the compare page', async () => {
    const { dir, manifest, files } = committed('tilting-plate');
    const truth = manifest.expected;
    // The committed series tilts 1° per frame: the roll-off tilt is asked within a quarter of that
    // step. The polynomial tangent's own accuracy on one side of a drop between 80° and 110° is
    // about 2° (docs/analysis-accuracy.md; tests/unit/dynamic/tilt.test.ts), so the downhill and
    // uphill angles at roll-off are asked within 2° of the advancing and receding angles.
    const ROLL_OFF_TOLERANCE_DEG = 0.25;
    const ANGLE_TOLERANCE_DEG = 2;

    const page = await openPage(browser);
    await page.getByLabel('What the series shows').selectOption('tilt');
    await page.getByLabel('Profile fit').selectOption('polynomial');
    await page.getByRole('radio', { name: 'Frame images' }).check();
    // Before anything is analysed the save says what frame images are sent as.
    await expect
      .poll(async () => page.getByTestId('series-upload-note').textContent())
      .toMatch(/upload service as frame photos, one per frame image;/);
    await page.getByLabel("A column of the stage's CSV log").check();
    await page.getByLabel('Stage log (CSV)').setInputFiles(path.join(dir, 'tilt.csv'));
    expect(await page.getByLabel('Tilt column (°)').inputValue()).toBe('tilt_deg');
    await analyseFrames(page, files, manifest.fps);
    step('tilting plate analysed');

    const fromCsv = {
      rollOff: await numberIn(page, 'roll-off-result'),
      downhill: await numberIn(page, 'downhill-result'),
      uphill: await numberIn(page, 'uphill-result'),
      hysteresis: await numberIn(page, 'hysteresis-result'),
    };
    console.log(
      `[dynamic modes e2e] tilt from the CSV column: roll-off ${fromCsv.rollOff}°, downhill ${fromCsv.downhill}°, uphill ${fromCsv.uphill}°, hysteresis ${fromCsv.hysteresis}° (truth ${truth.rollOffTiltDeg}°, ${truth.downhillAtRollOffDeg}°, ${truth.uphillAtRollOffDeg}°)`,
    );
    expect(Math.abs(fromCsv.rollOff - truth.rollOffTiltDeg)).toBeLessThan(ROLL_OFF_TOLERANCE_DEG);
    expect(Math.abs(fromCsv.downhill - truth.downhillAtRollOffDeg)).toBeLessThan(
      ANGLE_TOLERANCE_DEG,
    );
    expect(Math.abs(fromCsv.uphill - truth.uphillAtRollOffDeg)).toBeLessThan(ANGLE_TOLERANCE_DEG);
    expect(fromCsv.hysteresis).toBeCloseTo(fromCsv.downhill - fromCsv.uphill, 1);
    // The generated drop slides to the right of the image.
    await expect
      .poll(async () => page.getByText(/^Downhill angle \(/).textContent())
      .toBe('Downhill angle (right side)');

    // The same tilts typed as a rate: the same numbers.
    await page.getByLabel('A constant rate').check();
    await page.getByLabel('Tilt rate (°/s)').fill(String(truth.tiltRateDegPerSec));
    await page.getByLabel('Tilt at the first frame (°)').fill('0');
    await expect.poll(async () => numberIn(page, 'roll-off-result')).toBe(fromCsv.rollOff);
    expect(await numberIn(page, 'downhill-result')).toBe(fromCsv.downhill);
    expect(await numberIn(page, 'uphill-result')).toBe(fromCsv.uphill);
    // A rate twice as fast puts the roll-off at twice the tilt: the typed rate is what counts.
    await page.getByLabel('Tilt rate (°/s)').fill(String(2 * truth.tiltRateDegPerSec));
    await expect
      .poll(async () => numberIn(page, 'roll-off-result'))
      .toBeCloseTo(2 * fromCsv.rollOff, 0);
    await page.getByLabel('Tilt rate (°/s)').fill(String(truth.tiltRateDegPerSec));
    await expect.poll(async () => numberIn(page, 'roll-off-result')).toBe(fromCsv.rollOff);

    const flaggedOnPage = await pageFlagged(page);
    await expect
      .poll(async () => page.getByTestId('series-upload-note').textContent())
      .toMatch(new RegExp(`upload service as ${files.length} frame photos, one per frame image;`));

    // Save to an HT-200 sample of a batch no other test saves a series to (the last one listed).
    const sample = page.locator('#series-sample');
    const options = sample.locator('optgroup[label^="HT-200"] option');
    const label = (await options.last().textContent()) ?? '';
    expect(label.split('/')[0].trim()).not.toBe(
      ((await options.first().textContent()) ?? '').split('/')[0].trim(),
    );
    await sample.selectOption({ label });
    const posted = page.waitForResponse(
      (r) => r.url().endsWith('/api/dynamic-measurements') && r.request().method() === 'POST',
      { timeout: 240_000 },
    );
    await page.getByRole('button', { name: 'Save the measurement' }).click();
    const reply = (await (await posted).json()) as {
      measurementId: string;
      result: { flaggedFrameCount: number; failedFrameCount: number; rollOff: { tiltDeg: number } | null };
    };
    const saved = page.getByTestId('series-saved');
    await saved.waitFor({ timeout: 240_000 });
    step('tilting plate saved');
    const text = (await saved.textContent()) ?? '';
    console.log(`[dynamic modes e2e] server re-analysis of the tilt: ${text}`);
    const serverRollOff = Number(text.match(/roll-off at ([\d.]+)° tilt/)?.[1]);
    expect(Math.abs(serverRollOff - truth.rollOffTiltDeg)).toBeLessThan(ROLL_OFF_TOLERANCE_DEG);

    // The browser and the server decode the same frame images to the same pixels and analyse them
    // with the same code, so they flag the same frames: the count the save reports, and frame by
    // frame in the stored series.
    const serverCount = Number(text.match(/(\d+) frames, (\d+) flagged/)?.[2]);
    console.log(
      `[dynamic modes e2e] flagged frames: page ${flaggedOnPage.length} of ${files.length}, server ${serverCount}`,
    );
    expect(serverCount).toBe(flaggedOnPage.length);
    expect(reply.result.flaggedFrameCount + reply.result.failedFrameCount).toBe(
      flaggedOnPage.length,
    );
    const stored = await page.request.get(`${BASE_URL}/api/dynamic-measurements/${reply.measurementId}`);
    expect(stored.ok()).toBe(true);
    const body = (await stored.json()) as {
      series: { index: number; meanDeg: number | null; warnings: { code: string }[] }[];
    };
    expect(body.series).toHaveLength(files.length);
    // On a tilting plate, differing left and right angles are the measurement, not a flag.
    const expected = new Set(['needle_in_contact', 'left_right_disagree']);
    const storedFlagged = body.series
      .filter((f) => f.meanDeg === null || f.warnings.some((w) => !expected.has(w.code)))
      .map((f) => f.index);
    // Not every frame: a flag that marks them all tells the user nothing.
    expect(storedFlagged.length).toBeLessThan(files.length);
    expect(storedFlagged).toEqual(flaggedOnPage);

    // The roll-off angle of the batch on the compare page is this measurement's.
    const lotCode = label.split('/')[0].trim();
    await page.getByRole('link', { name: 'Compare this batch' }).click();
    await page.waitForURL(/\/compare\?/, { timeout: 120_000 });
    const row = page.locator(`[data-testid="batch-row-liquid-water-rollOff-${lotCode}"]`);
    await row.waitFor({ timeout: 60_000 });
    expect(Number(await row.getByTestId('n').textContent())).toBe(1);
    const mean = Number((await row.getByTestId('mean').textContent())?.replace(/[^\d.]/g, ''));
    expect(Math.abs(mean - truth.rollOffTiltDeg)).toBeLessThan(ROLL_OFF_TOLERANCE_DEG);
    await page.close();
  }, 600_000);

  it('angle over time from frame images: the initial angle at t = 0 and the rate over a chosen window', async () => {
    const { manifest, files } = committed('absorption');
    const angles = manifest.frames.map((f) => f.contactAngleDeg as number);
    // Page time of frame i: i / fps (its clock starts at the first frame).
    const pageTimes = manifest.frames.map((_, i) => i / manifest.fps);
    // Issue 16 asks every frame within 0.3°; the straight line through the first 5 frames misses
    // the exact law at the first frame by under 0.03° (Δθ/(2τ²)·(mean t² − 2 mean(t)²)).
    const INITIAL_TOLERANCE_DEG = 0.3;
    // The exact law's least-squares slope over the window's frames, against the page's: within
    // 0.1 °/s (the page's standard error over 11 frames is about 0.05 °/s).
    const RATE_TOLERANCE = 0.1;
    const window = { fromSec: 1, toSec: 3 };

    const page = await openPage(browser);
    await page.getByLabel('What the series shows').selectOption('over-time');
    await page.getByLabel('Profile fit').selectOption('young-laplace');
    await analyseFrames(page, files, manifest.fps);
    step('absorption analysed');

    const initial = await numberIn(page, 'initial-angle-result');
    console.log(
      `[dynamic modes e2e] initial angle ${initial}° (the first frame's exact angle ${angles[0].toFixed(3)}°; the law's ${manifest.expected.initialAngleDeg}° at landing, ${manifest.expected.firstFrameSec} s before it)`,
    );
    expect(Math.abs(initial - angles[0])).toBeLessThan(INITIAL_TOLERANCE_DEG);
    expect(await page.getByTestId('initial-angle-result').locator('xpath=..').textContent()).toMatch(
      /degree 1 fit of the first 5 frames/,
    );

    // Choose the rate window: from 1 s to 3 s of the page's clock.
    await page.locator('#window-rate-from').fill(String(window.fromSec));
    await page.locator('#window-rate-from').press('Enter');
    await page.locator('#window-rate-to').fill(String(window.toSec));
    await page.locator('#window-rate-to').press('Enter');
    const inside = pageTimes
      .map((t, i) => ({ t, angle: angles[i] }))
      .filter((p) => p.t >= window.fromSec - 1e-9 && p.t <= window.toSec + 1e-9);
    const detail = page.getByTestId('rate-result').locator('xpath=..');
    await expect
      .poll(async () => Number((await detail.textContent())?.match(/over (\d+) frames/)?.[1]))
      .toBe(inside.length);
    const exactRate = fitLine(
      inside.map((p) => p.t),
      inside.map((p) => p.angle),
    ).slope;
    const rate = await numberIn(page, 'rate-result');
    console.log(
      `[dynamic modes e2e] rate over ${window.fromSec}–${window.toSec} s: ${rate} °/s (the exact angles' least-squares slope ${exactRate.toFixed(4)} °/s over ${inside.length} frames)`,
    );
    expect(Math.abs(rate - exactRate)).toBeLessThan(RATE_TOLERANCE);
    // Moving the window moves the rate: the angle falls more slowly later on.
    await page.locator('#window-rate-from').fill('2');
    await page.locator('#window-rate-from').press('Enter');
    await page.locator('#window-rate-to').fill('3.8');
    await page.locator('#window-rate-to').press('Enter');
    const later = pageTimes
      .map((t, i) => ({ t, angle: angles[i] }))
      .filter((p) => p.t >= 2 - 1e-9);
    const exactLater = fitLine(
      later.map((p) => p.t),
      later.map((p) => p.angle),
    ).slope;
    await expect
      .poll(async () => Number((await detail.textContent())?.match(/over (\d+) frames/)?.[1]))
      .toBe(later.length);
    const rateLater = await numberIn(page, 'rate-result');
    console.log(
      `[dynamic modes e2e] rate over 2–3.8 s: ${rateLater} °/s (exact ${exactLater.toFixed(4)} °/s)`,
    );
    expect(Math.abs(rateLater - exactLater)).toBeLessThan(RATE_TOLERANCE);
    expect(rateLater).toBeGreaterThan(rate);
    await page.close();
  }, 600_000);
});
