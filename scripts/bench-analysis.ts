/**
 * Speed and memory benchmark of the drop analysis (prints figures; no pass/fail).
 *
 *   npm run bench:analysis [-- --repeats 5 --leak-runs 1000 --no-5mp]
 *   node --cpu-prof --cpu-prof-dir=.data/profiles --import tsx scripts/bench-analysis.ts   (profile)
 *
 * Reference pass: one OpenCV Gaussian blur with a 5×5 kernel (σ from the kernel size) followed by
 * Canny with thresholds 50/150 and the L1 gradient, on the same 8-bit photo, Mats created and
 * deleted as the analysis does. It is about the least any edge-based analysis must do, so the
 * ratios say how close each method comes to that floor.
 *
 * Per method and photo set (generated 1024×768 drops, fixtures/generator/bench-set.ts, and a few
 * 5 MP ones): the median warm time of a whole analysis (pixels → angles), its ratio to the median
 * reference time on the same set. Then 1 000 analyses in a row with
 * the JS and wasm heap before and after, to show that no OpenCV Mat leaks.
 */
import { analyseDropWith, loadOpenCv, FIT_METHODS, type OpenCv } from '../lib/analysis';
import { benchmarkPhotos } from '../fixtures/generator/bench-set';
import type { GrayImage } from '../lib/analysis/types';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const median = (values: number[]) => {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** Gaussian blur 5×5 + Canny 50/150 (L1 gradient), the fixed reference. */
function referencePass(cv: OpenCv, image: GrayImage): number {
  const started = performance.now();
  const src = new cv.Mat(image.height, image.width, cv.CV_8UC1);
  const blur = new cv.Mat();
  const edges = new cv.Mat();
  try {
    src.data.set(image.data as Uint8Array);
    cv.GaussianBlur(src, blur, new cv.Size(5, 5), 0, 0, cv.BORDER_DEFAULT);
    cv.Canny(blur, edges, 50, 150, 3, false);
  } finally {
    src.delete();
    blur.delete();
    edges.delete();
  }
  return performance.now() - started;
}

const mb = (bytes: number) => `${(bytes / 1048576).toFixed(1)} MB`;
const ms = (value: number) => value.toFixed(1).padStart(9);
const ratio = (value: number) => value.toFixed(2).padStart(8);

/**
 * Times the reference pass and every method on each photo in turn (interleaved, so a machine
 * busy with other work slows them alike), after one warm-up round.
 */
function timeSet(cv: OpenCv, label: string, images: GrayImage[], repeats: number) {
  const reference: number[] = [];
  const times = new Map<string, number[]>(FIT_METHODS.map((m) => [m, []]));
  for (let round = 0; round <= repeats; round++) {
    for (const image of images) {
      const ref = [referencePass(cv, image), referencePass(cv, image)];
      for (const method of FIT_METHODS) {
        const started = performance.now();
        analyseDropWith(cv, image, { method });
        if (round > 0) times.get(method)!.push(performance.now() - started);
      }
      if (round > 0) reference.push(...ref);
    }
  }
  const ref = median(reference);
  const { width, height } = images[0];
  process.stdout.write(
    `\n${label}: ${images.length} photos ${width}×${height}, ${repeats} warm runs each\n` +
      `reference (blur 5×5 + Canny 50/150 L1): median ${ref.toFixed(2)} ms\n\n` +
      `${'method'.padEnd(14)} ${'median ms'.padStart(9)} ${'× ref'.padStart(8)}\n`,
  );
  for (const method of FIT_METHODS) {
    const m = median(times.get(method)!);
    process.stdout.write(`${method.padEnd(14)} ${ms(m)} ${ratio(m / ref)}\n`);
  }
}

async function main() {
  const repeats = arg('repeats', 3);
  const leakRuns = arg('leak-runs', 1000);
  const { cv } = await loadOpenCv();
  process.stdout.write(`Drop analysis benchmark, Node ${process.version}\n`);
  const small = benchmarkPhotos('1024x768').map((r) => r.image);
  timeSet(cv, '1024×768', small, repeats);
  if (!process.argv.includes('--no-5mp')) {
    const large = benchmarkPhotos('5MP').map((r) => r.image);
    timeSet(cv, '5 MP', large, Math.max(1, Math.ceil(repeats / 2)));
  }

  if (leakRuns > 0) {
    const image = small[3];
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
