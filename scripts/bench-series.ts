/**
 * Speed of the series analysis (prints figures; no pass/fail).
 *
 *   npm run bench:series [-- --frames 300 --whole-every 10 --no-video]
 *
 * A generated needle-in series at 1024×768 (the drop grown and withdrawn, 160 px/mm, 30 fps,
 * 300 frames, 0.8 % noise) is analysed frame by frame as the CLI and the worker do: one OpenCV
 * instance, one tracker (region of interest around the last outline, baseline kept while it
 * fits). Per method: ms per frame (median, mean, 90th percentile), the share of frames analysed in
 * a region, with a kept baseline and with the fit started from the previous frame's (warm start),
 * and for comparison the whole-frame analysis on every n-th frame. Then the cost of decoding the same series from an MP4 with ffmpeg.
 * Targets (issue 16): ≤ 30 ms/frame polynomial, ≤ 60 ms/frame Young–Laplace.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { analyseDropWith, loadOpenCv, type FitMethod, type GrayImage } from '../lib/analysis';
import { analyseSeries } from '../lib/dynamic';
import { decodeVideoFrames } from '../lib/dynamic/node/ffmpeg';
import { NEEDLE_SERIES, renderNeedleFrame, rescaled } from '../fixtures/generator/series';
import { writeVideo } from '../fixtures/generator/series-video';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const quantile = (values: number[], p: number) => {
  const s = [...values].sort((a, b) => a - b);
  const k = (s.length - 1) * p;
  const lo = Math.floor(k);
  return s[lo] + (s[Math.min(lo + 1, s.length - 1)] - s[lo]) * (k - lo);
};
const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
const ms = (v: number) => v.toFixed(1).padStart(7);

async function main() {
  const frameCount = arg('frames', 300);
  const wholeEvery = arg('whole-every', 10);
  const withVideo = !process.argv.includes('--no-video');
  // 640×480 at 100 px/mm scaled by 1.6: 1024×768 at 160 px/mm; 10 s at 30 fps = 300 frames.
  const spec = rescaled(NEEDLE_SERIES, 1.6, { fps: frameCount / 10 });
  const load = () =>
    loadavg()
      .map((v) => v.toFixed(1))
      .join(' ');
  process.stdout.write(
    `Series analysis benchmark: ${frameCount} generated frames ${spec.layout.width}×${spec.layout.height}, Node ${process.version}\n` +
      `load average at start: ${load()} (other work on the machine slows every figure)\n`,
  );
  let started = performance.now();
  const frames: GrayImage[] = [];
  for (let i = 0; i < frameCount; i++) frames.push(renderNeedleFrame(spec, i).image);
  process.stdout.write(
    `rendering the frames: ${((performance.now() - started) / 1000).toFixed(1)} s (not part of the figures)\n\n`,
  );
  const { cv } = await loadOpenCv();
  const input = frames.map((image, i) => ({ image, tSec: i / spec.fps }));

  process.stdout.write(
    'ms per frame; "CPU" is this process\'s CPU time per frame, which other work on the machine slows far less than the wall-clock figures\n\n' +
      `${'method'.padEnd(14)} ${'tracked: median'.padStart(15)} ${'mean'.padStart(7)} ${'p90'.padStart(7)} ${'CPU'.padStart(7)} ${'loop'.padStart(6)}   ${'whole frame: median'.padStart(19)} ${'CPU'.padStart(7)}   region  kept baseline  retried  warm start\n`,
  );
  const cpuMs = (from: NodeJS.CpuUsage) => {
    const used = process.cpuUsage(from);
    return (used.user + used.system) / 1000;
  };
  for (const method of ['polynomial', 'young-laplace'] as FitMethod[]) {
    // Warm up the JIT and the wasm heap on a few frames first.
    await analyseSeries(cv, input.slice(0, 5), { method });
    const times: number[] = [];
    const overhead: number[] = [];
    let cpu = process.cpuUsage();
    const results = await analyseSeries(cv, input, {
      method,
      onFrame: (f) => {
        times.push(f.timeMs);
        if (f.analysis) overhead.push(f.timeMs - f.analysis.timeMs);
      },
    });
    const trackedCpu = cpuMs(cpu) / frameCount;
    const whole: number[] = [];
    cpu = process.cpuUsage();
    for (let i = 0; i < frameCount; i += wholeEvery) {
      const t = performance.now();
      analyseDropWith(cv, frames[i], { method });
      whole.push(performance.now() - t);
    }
    const wholeCpu = cpuMs(cpu) / whole.length;
    const share = (n: number) => `${((100 * n) / frameCount).toFixed(0)} %`.padStart(6);
    process.stdout.write(
      `${method.padEnd(14)} ${ms(quantile(times, 0.5)).padStart(15)} ${ms(mean(times))} ${ms(quantile(times, 0.9))} ${ms(trackedCpu)} ${quantile(overhead, 0.5).toFixed(2).padStart(6)}   ${ms(quantile(whole, 0.5)).padStart(19)} ${ms(wholeCpu)}   ${share(results.filter((r) => r.tracking.roi).length)}  ${share(results.filter((r) => r.tracking.baseline === 'kept').length).padStart(13)}  ${share(results.filter((r) => r.tracking.retried).length).padStart(7)}  ${share(results.filter((r) => r.tracking.warmStart).length).padStart(10)}\n`,
    );
  }
  process.stdout.write(
    "(loop: the tracker's own cost per frame on top of the engine, median ms; whole frame: every " +
      `${wholeEvery}th frame analysed without region or kept baseline)\n`,
  );

  if (withVideo) {
    const dir = mkdtempSync(path.join(tmpdir(), 'beadline-bench-'));
    try {
      const file = path.join(dir, 'series.mp4');
      started = performance.now();
      await writeVideo(frames, file, spec.fps, 'mp4');
      const encode = (performance.now() - started) / 1000;
      started = performance.now();
      let decoded = 0;
      for await (const frame of decodeVideoFrames(file)) if (frame.image.width) decoded++;
      const perFrame = (performance.now() - started) / decoded;
      process.stdout.write(
        `\nMP4 (H.264) through ffmpeg: encoding ${encode.toFixed(1)} s (not part of the figures), decoding ${perFrame.toFixed(1)} ms/frame (${decoded} frames)\n`,
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  process.stdout.write(`load average at the end: ${load()}\n`);
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exitCode = 1;
});
