/**
 * Speed and memory benchmark of the drop analysis (prints figures; no pass/fail).
 *
 *   npm run bench:analysis [-- --images 6 --repeats 3 --leak-runs 1000]
 *
 * Per method: median warm time per 1024×768 generated photo; in the same run, the median time of one
 * OpenCV Gaussian blur + Canny pass on the same images as the reference. Then 1 000 analyses in a
 * row with JS heap and wasm heap size before and after, to show that no OpenCV Mat leaks.
 */
import { analyseDropWith, loadOpenCv, FIT_METHODS, type OpenCv } from '../lib/analysis';
import { renderDrop } from '../fixtures/generator/render';
import { fittingHalfWidth } from '../fixtures/generator/render';
import type { GrayImage } from '../lib/analysis/types';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const median = (values: number[]) => {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

function blurCannyPass(cv: OpenCv, image: GrayImage): number {
  const started = performance.now();
  const src = new cv.Mat(image.height, image.width, cv.CV_8UC1);
  const blur = new cv.Mat();
  const edges = new cv.Mat();
  try {
    src.data.set(image.data as Uint8Array);
    cv.GaussianBlur(src, blur, new cv.Size(0, 0), 1, 1, cv.BORDER_REPLICATE);
    cv.Canny(blur, edges, 30, 60, 3, true);
  } finally {
    src.delete();
    blur.delete();
    edges.delete();
  }
  return performance.now() - started;
}

const mb = (bytes: number) => `${(bytes / 1048576).toFixed(1)} MB`;

async function main() {
  const imageCount = arg('images', 6);
  const repeats = arg('repeats', 3);
  const leakRuns = arg('leak-runs', 1000);
  const { cv } = await loadOpenCv();
  const angles = [25, 55, 85, 115, 145, 165].slice(0, imageCount);
  const images = angles.map(
    (contactAngleDeg, k) =>
      renderDrop({
        width: 1024,
        height: 768,
        centerX: 512,
        baselineY: 540,
        contactAngleDeg,
        bond: 0.3,
        halfWidthPx: fittingHalfWidth(contactAngleDeg, 0.3, 1024, 480),
        blurPx: 1.2,
        noise: 0.015,
        seed: 500 + k,
      }).image,
  );
  process.stdout.write(
    `Drop analysis benchmark: ${images.length} generated photos 1024×768, ${repeats} warm runs each, Node ${process.version}\n\n`,
  );

  for (const image of images) blurCannyPass(cv, image);
  const reference = median(
    images.flatMap((image) => Array.from({ length: repeats * 3 }, () => blurCannyPass(cv, image))),
  );
  process.stdout.write(
    `reference: OpenCV Gaussian blur + Canny, median ${reference.toFixed(2)} ms per image\n\n`,
  );
  process.stdout.write(
    `${'method'.padEnd(14)} ${'median ms'.padStart(10)} ${'× reference'.padStart(12)}\n`,
  );
  for (const method of FIT_METHODS) {
    for (const image of images) analyseDropWith(cv, image, { method });
    const times: number[] = [];
    for (let r = 0; r < repeats; r++) {
      for (const image of images) {
        const started = performance.now();
        analyseDropWith(cv, image, { method });
        times.push(performance.now() - started);
      }
    }
    const m = median(times);
    process.stdout.write(
      `${method.padEnd(14)} ${m.toFixed(1).padStart(10)} ${(m / reference).toFixed(1).padStart(12)}\n`,
    );
  }

  if (leakRuns > 0) {
    const image = images[2];
    const gc = (globalThis as { gc?: () => void }).gc;
    gc?.();
    const heapBefore = process.memoryUsage().heapUsed;
    const wasmBefore = cv.HEAPU8.length;
    const started = performance.now();
    for (let i = 0; i < leakRuns; i++) analyseDropWith(cv, image, { method: 'circle' });
    gc?.();
    const heapAfter = process.memoryUsage().heapUsed;
    const wasmAfter = cv.HEAPU8.length;
    process.stdout.write(
      `\nmemory over ${leakRuns} circle analyses (${((performance.now() - started) / 1000).toFixed(1)} s):\n` +
        `  wasm heap   ${mb(wasmBefore)} → ${mb(wasmAfter)}\n` +
        `  JS heap     ${mb(heapBefore)} → ${mb(heapAfter)}${gc ? '' : ' (run with NODE_OPTIONS=--expose-gc for a settled figure)'}\n`,
    );
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
