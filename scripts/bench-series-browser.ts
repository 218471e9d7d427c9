/**
 * Speed of the series analysis in the browser (prints figures; no pass/fail).
 *
 *   E2E_BASE_URL=http://127.0.0.1:3000 npm run bench:series-browser [-- --frames 300]
 *
 * Needs a running Beadline (npm start) with the demo. A generated needle-in series at 1024×768
 * (the drop grown and withdrawn, 160 px/mm, 0.8 % noise; fixtures/generator/series.ts) is given
 * to the dynamic-wetting page as frame images in headless Chromium, once per method. The page
 * decodes each frame, sends it to the series worker and plots it; the figures are the page's own:
 * wall time per frame (decoding, transfer, analysis and plotting) and the worker's fit time per
 * frame (median). Targets (issue 16): ≤ 30 ms/frame polynomial, ≤ 60 ms/frame Young–Laplace.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { DEMO_PASSWORD } from '../db/demo';
import { NEEDLE_SERIES, renderNeedleFrame, rescaled } from '../fixtures/generator/series';
import { launchBrowser, signIn } from '../tests/e2e/support/browser';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

async function main() {
  const frameCount = arg('frames', 300);
  const fps = frameCount / 10;
  const spec = rescaled(NEEDLE_SERIES, 1.6, { fps });
  const load = () => loadavg().map((v) => v.toFixed(1)).join(' ');
  process.stdout.write(
    `Browser series benchmark: ${frameCount} frames ${spec.layout.width}×${spec.layout.height} as PNG frame images, headless Chromium\n` +
      `load average at start: ${load()} (other work on the machine slows every figure)\n`,
  );
  // Written to files: Playwright hands large sets to the page by path.
  const dir = mkdtempSync(path.join(tmpdir(), 'beadline-bench-series-'));
  const files: string[] = [];
  for (let i = 0; i < frameCount; i++) {
    const { image } = renderNeedleFrame(spec, i);
    const file = path.join(dir, `frame-${String(i).padStart(4, '0')}.png`);
    await sharp(Buffer.from(image.data as Uint8Array), {
      raw: { width: image.width, height: image.height, channels: 1 },
    })
      .png({ compressionLevel: 1 })
      .toFile(file);
    files.push(file);
  }
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${process.env.E2E_BASE_URL ?? 'http://127.0.0.1:3100'}/dynamic-wetting`);
    await page.getByLabel('Frame images').check();
    await page.getByLabel(/^Frame images in order/).setInputFiles(files);
    await page.getByLabel('Frame rate (frames/s)').fill(String(fps));
    process.stdout.write('\nmethod          frames  wall ms/frame  fit ms/frame (median)  flagged\n');
    for (const method of ['polynomial', 'young-laplace'] as const) {
      await page.getByLabel('Profile fit').selectOption(method);
      await page.getByRole('button', { name: 'Analyse the series' }).click();
      await page.getByRole('status').filter({ hasText: /frames — done/ }).waitFor({ state: 'detached' });
      const status = page.getByRole('status').filter({ hasText: /frames — done/ });
      await status.waitFor({ timeout: 30 * 60_000 });
      const text = (await status.textContent()) ?? '';
      const wall = Number(text.match(/\((\d+) ms per frame in all/)?.[1]);
      const fit = Number(text.match(/the fit (\d+) ms median/)?.[1]);
      const flagged = Number(
        ((await page.getByTestId('series-plot').textContent()) ?? '').match(/(\d+) flagged/)?.[1] ?? 0,
      );
      process.stdout.write(
        `${method.padEnd(14)}  ${String(frameCount).padStart(6)}  ${String(wall).padStart(13)}  ${String(fit).padStart(21)}  ${String(flagged).padStart(7)}\n`,
      );
    }
    process.stdout.write(`load average at the end: ${load()}\n`);
  } finally {
    await browser.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
