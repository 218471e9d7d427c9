/**
 * The dynamic-wetting page in Chromium. The series is the committed needle-in fixture
 * (fixtures/series/needle-in): every frame an exact Young–Laplace profile rendered by
 * fixtures/generator (Bashforth & Adams 1883; REFERENCES.md), grown through the needle at a known
 * advancing angle of 108° and withdrawn at a receding angle of 83°. It is encoded here as a WebM
 * (VP9) with Debian's ffmpeg for the video test, and as a Y4M for Chromium's fake camera.
 * Issue 16 asks for advancing and receding within 0.5° of the generator's truth.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { decodeImageFile } from '@/lib/analysis/node/decode';
import { writeVideo } from '@/fixtures/generator/series-video';
import { wcagViolations } from './support/axe';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const SERIES = path.resolve(__dirname, '../../fixtures/series/needle-in');
const manifest = JSON.parse(readFileSync(path.join(SERIES, 'manifest.json'), 'utf8')) as {
  fps: number;
  frames: { file: string; contactAngleDeg: number }[];
  expected: { advancingDeg: number; recedingDeg: number; hysteresisDeg: number };
};
const { expected } = manifest;
const work = mkdtempSync(path.join(tmpdir(), 'beadline-dynamic-e2e-'));

async function* fixtureFrames() {
  for (const frame of manifest.frames) yield decodeImageFile(path.join(SERIES, frame.file));
}

const began = Date.now();
const step = (what: string) =>
  console.log(`[dynamic e2e] ${what} after ${((Date.now() - began) / 1000).toFixed(1)} s`);

const degreesIn = async (page: Page, testId: string) =>
  Number(((await page.getByTestId(testId).textContent()) ?? '').replace('°', ''));

async function openPage(browser: Browser): Promise<Page> {
  const page = await browser.newPage();
  await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
  await page.getByRole('link', { name: 'Dynamic wetting' }).click();
  await page.waitForURL(`${BASE_URL}/dynamic-wetting`);
  return page;
}

async function waitForAnalysis(page: Page, frames: number | null): Promise<void> {
  await page
    .getByRole('status')
    .filter({ hasText: /frames — done/ })
    .waitFor({ timeout: 240_000 });
  if (frames !== null)
    expect(Number(await page.getByTestId('series-plot').getAttribute('data-points'))).toBe(frames);
}

describe('dynamic wetting from a video', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('analyses a drop grown and withdrawn through the needle, lets the windows move, saves it and shows it on the compare page', async () => {
    const video = path.join(work, 'needle-in.webm');
    await writeVideo(fixtureFrames(), video, manifest.fps, 'webm');
    const page = await openPage(browser);
    await page.getByLabel('Video file').check();
    // Before a video is analysed the save already says the video goes as it is, not as frames.
    expect(await page.getByTestId('series-upload-note').textContent()).toMatch(
      /upload service as the video file; the server/,
    );
    await page.getByLabel(/^Video \(MP4/).setInputFiles(video);
    await page.getByLabel('Frame rate (frames/s)').fill(String(manifest.fps));
    await page.getByLabel('Profile fit').selectOption('young-laplace');
    await page.getByRole('button', { name: 'Analyse the series' }).click();
    // The plot fills in while frames finish.
    await page.getByTestId('series-plot').waitFor({ timeout: 120_000 });
    step('first frames plotted');
    await waitForAnalysis(page, manifest.frames.length);
    step('series analysed');

    const advancing = await degreesIn(page, 'advancing-result');
    const receding = await degreesIn(page, 'receding-result');
    const hysteresis = await degreesIn(page, 'hysteresis-result');
    console.log(
      `[dynamic e2e] browser, WebM VP9: advancing ${advancing}°, receding ${receding}°, hysteresis ${hysteresis}° (truth ${expected.advancingDeg}/${expected.recedingDeg}/${expected.hysteresisDeg})`,
    );
    expect(Math.abs(advancing - expected.advancingDeg)).toBeLessThan(0.5);
    expect(Math.abs(receding - expected.recedingDeg)).toBeLessThan(0.5);
    expect(Math.abs(hysteresis - expected.hysteresisDeg)).toBeLessThan(1);
    expect(await page.getByTestId('series-upload-note').textContent()).toMatch(
      /upload service as the video file needle-in\.webm; the server/,
    );
    const flaggedOnPage = await page.getByTestId('flagged-frames').locator('tbody tr').count();
    // The page with its plot, results and frame lists: no WCAG 2 A/AA violation (axe-core).
    expect(await wcagViolations(page)).toEqual([]);

    // Moving the advancing window: the numbers follow (fewer frames counted, same angle).
    const detail = page.getByTestId('advancing-result').locator('xpath=..');
    const framesBefore = Number((await detail.textContent())?.match(/(\d+) frames/)?.[1]);
    const from = Number(await page.locator('#window-advancing-from').inputValue());
    // The field shows the start rounded; 1.5 frames after it takes the first two frames.
    await page.locator('#window-advancing-to').fill(String(from + 1.5 / manifest.fps));
    await page.locator('#window-advancing-to').press('Enter');
    await expect
      .poll(async () => Number((await detail.textContent())?.match(/(\d+) frames/)?.[1]))
      .toBe(2);
    expect(framesBefore).toBeGreaterThan(2);
    expect(Math.abs((await degreesIn(page, 'advancing-result')) - expected.advancingDeg)).toBeLessThan(0.5);
    await page.getByRole('button', { name: 'Shift the advancing window one frame later' }).click();
    await expect
      .poll(async () => Number(await page.locator('#window-advancing-from').inputValue()))
      .toBeCloseTo(from + 1 / manifest.fps, 1);

    // Save to an HT-200 sample: the video goes through the upload service and the server
    // analyses it again with the moved window.
    const sample = page.locator('#series-sample');
    const option = sample.locator('optgroup[label^="HT-200"] option').first();
    const label = (await option.textContent()) ?? '';
    await sample.selectOption({ label });
    await page.getByRole('button', { name: 'Save the measurement' }).click();
    const saved = page.getByTestId('series-saved');
    await saved.waitFor({ timeout: 240_000 });
    step('saved');
    const text = (await saved.textContent()) ?? '';
    const savedAdvancing = Number(text.match(/advancing ([\d.]+)°/)?.[1]);
    const savedReceding = Number(text.match(/receding ([\d.]+)°/)?.[1]);
    console.log(`[dynamic e2e] server re-analysis: ${text}`);
    // A figure, not a check: the server decodes the video with ffmpeg, the page with Chromium's
    // video element; their pixels differ by a gray level here and there (lossy VP9 decoded twice).
    console.log(
      `[dynamic e2e] flagged frames of the video: page ${flaggedOnPage}, server ${text.match(/(\d+) flagged/)?.[1]}`,
    );
    expect(Math.abs(savedAdvancing - expected.advancingDeg)).toBeLessThan(0.5);
    expect(Math.abs(savedReceding - expected.recedingDeg)).toBeLessThan(0.5);

    const lotCode = label.split('/')[0].trim();
    await page.getByRole('link', { name: 'Compare this batch' }).click();
    await page.waitForURL(/\/compare\?/, { timeout: 120_000 });
    const row = page.locator(`[data-testid="batch-row-liquid-water-advancing-${lotCode}"]`);
    await row.waitFor({ timeout: 60_000 });
    const mean = Number((await row.getByTestId('mean').textContent())?.replace(/[^\d.]/g, ''));
    expect(Math.abs(mean - expected.advancingDeg)).toBeLessThan(0.5);
    await page.close();
  }, 600_000);
});

describe('dynamic wetting from the live camera', () => {
  let browser: Browser;
  const fakeFps = 6;
  beforeAll(async () => {
    // Chromium's fake camera plays this file in a loop, as a camera would deliver frames.
    const y4m = path.join(work, 'needle-in.y4m');
    await writeVideo(fixtureFrames(), y4m, fakeFps, 'y4m');
    browser = await launchBrowser([
      '--use-fake-device-for-media-stream',
      '--use-fake-ui-for-media-stream',
      `--use-file-for-fake-video-capture=${y4m}`,
    ]);
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('records from the camera, captures frames and analyses them like a video', async () => {
    const page = await openPage(browser);
    await page.getByLabel('Live camera').check();
    await page.getByRole('button', { name: 'Start the camera' }).click();
    await page.getByText(/Camera on: 320 × 240 px/).waitFor({ timeout: 60_000 });
    await page.getByLabel('Capture rate (frames/s)').fill(String(fakeFps));
    await page.getByLabel('Profile fit').selectOption('young-laplace');
    await page.getByRole('button', { name: 'Record' }).click();
    await expect
      .poll(
        async () => Number(((await page.getByTestId('captured-count').textContent()) ?? '').match(/(\d+) frame/)?.[1] ?? 0),
        { timeout: 60_000, interval: 250 },
      )
      .toBeGreaterThanOrEqual(12);
    await page.getByRole('button', { name: 'Stop recording' }).click();
    await waitForAnalysis(page, null);
    const points = Number(await page.getByTestId('series-plot').getAttribute('data-points'));
    expect(points).toBeGreaterThanOrEqual(12);

    // Every captured frame is one of the fixture's drops: its angle lies within the angles the
    // generator rendered (83°–108° and the pinned frames between), within 0.5°.
    const truths = manifest.frames.map((f) => f.contactAngleDeg);
    const [lo, hi] = [Math.min(...truths), Math.max(...truths)];
    await page.getByText(/^Every frame/).click();
    const means = (await page.getByTestId('frame-mean').allTextContents()).map(Number);
    expect(means.length).toBe(points);
    const analysed = means.filter((m) => Number.isFinite(m));
    console.log(`[dynamic e2e] camera: ${points} frames captured, ${analysed.length} analysed, angles ${Math.min(...analysed).toFixed(2)}–${Math.max(...analysed).toFixed(2)}° (truth ${lo}–${hi}°)`);
    expect(analysed.length).toBeGreaterThanOrEqual(points - 1);
    // Camera frames are saved as PNG photos of the frames captured.
    expect(await page.getByTestId('series-upload-note').textContent()).toMatch(
      new RegExp(`upload service as ${points} frame photos \\(PNG\\), one per captured frame;`),
    );
    for (const m of analysed) {
      expect(m).toBeGreaterThan(lo - 0.5);
      expect(m).toBeLessThan(hi + 0.5);
    }
    await page.close();
  }, 600_000);
});
