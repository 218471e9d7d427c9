/**
 * Video round trip: the committed needle-in frames (fixtures/series/needle-in, generated from exact
 * Young–Laplace profiles, Bashforth & Adams 1883; REFERENCES.md) are encoded at test time with
 * Debian's ffmpeg as lab cameras store video (MP4/H.264, AVI/MJPEG, WebM/VP9), decoded again through
 * lib/dynamic/node/ffmpeg.ts and analysed. Needs ffmpeg (scripts/ffmpeg.sh installs it).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadOpenCv, type GrayImage, type OpenCv } from '@/lib/analysis';
import { decodeImageFile } from '@/lib/analysis/node/decode';
import { analyseSeries, summariseDynamic } from '@/lib/dynamic';
import { VideoError, decodeVideoFrames, probeVideo } from '@/lib/dynamic/node/ffmpeg';
import { VIDEO_EXTENSION, writeVideo, type VideoFormat } from '@/fixtures/generator/series-video';
import { NEEDLE_IN_PHASES, ROOT, committedSeries } from './committed';

const series = committedSeries('needle-in');
const manifest = series.manifest;
const dir = mkdtempSync(path.join(tmpdir(), 'beadline-video-'));
let cv: OpenCv;
let images: GrayImage[];

beforeAll(async () => {
  ({ cv } = await loadOpenCv());
  images = await series.decodeFrames();
}, 120_000);

const CODECS: Record<string, string> = { mp4: 'h264', 'avi-mjpeg': 'mjpeg', webm: 'vp9' };

describe('video round trip', () => {
  for (const format of ['mp4', 'avi-mjpeg', 'webm'] as VideoFormat[]) {
    it(`${format}: frames survive encoding and decoding, and the series gives the generated angles within 0.5°`, async () => {
      const file = path.join(dir, `needle.${VIDEO_EXTENSION[format]}`);
      await writeVideo(images, file, manifest.fps, format);
      const info = await probeVideo(file);
      expect(info).toMatchObject({
        width: 320,
        height: 240,
        fps: manifest.fps,
        frameCount: images.length,
        codec: CODECS[format],
        bitDepth: 8,
      });
      const decoded = [];
      for await (const frame of decodeVideoFrames(file)) decoded.push(frame);
      expect(decoded.map((f) => f.index)).toEqual(images.map((_, i) => i));
      decoded.forEach((f, i) => expect(f.tSec).toBeCloseTo(i / manifest.fps, 12));
      // High-quality lossy coding: pixels within a few levels, on average well under one.
      let sum = 0;
      let max = 0;
      decoded.forEach((f, i) => {
        for (let k = 0; k < f.image.data.length; k++) {
          const d = Math.abs(f.image.data[k] - images[i].data[k]);
          sum += d;
          max = Math.max(max, d);
        }
      });
      expect(sum / (images.length * 320 * 240)).toBeLessThan(0.2);
      expect(max).toBeLessThan(40);

      const frames = await analyseSeries(cv, decoded, { method: 'young-laplace' });
      const summary = summariseDynamic(frames);
      expect(summary.phases.segments.map((s) => s.kind)).toEqual(NEEDLE_IN_PHASES);
      expect(Math.abs(summary.advancing!.meanDeg - manifest.expected.advancingDeg)).toBeLessThan(
        0.5,
      );
      expect(Math.abs(summary.receding!.meanDeg - manifest.expected.recedingDeg)).toBeLessThan(0.5);
    });
  }

  it('keeps 16-bit sources 16-bit (lossless FFV1 gray16le from a 16-bit photo)', async () => {
    const png = path.join(ROOT, 'fixtures/drops/drop-75-16bit.png');
    const file = path.join(dir, 'deep.mkv');
    execFileSync('ffmpeg', [
      '-v',
      'error',
      '-y',
      '-loop',
      '1',
      '-framerate',
      '2',
      '-t',
      '1.5',
      '-i',
      png,
      '-c:v',
      'ffv1',
      '-pix_fmt',
      'gray16le',
      file,
    ]);
    const info = await probeVideo(file);
    expect(info.bitDepth).toBe(16);
    const still = await decodeImageFile(png);
    const decoded = [];
    for await (const frame of decodeVideoFrames(file)) decoded.push(frame);
    expect(decoded).toHaveLength(3);
    for (const f of decoded) {
      expect(f.image.data).toBeInstanceOf(Uint16Array);
      expect(f.image.data).toEqual(still.data);
    }
  });

  it('stops ffmpeg when the caller stops reading', async () => {
    const file = path.join(dir, 'needle.mp4');
    await writeVideo(images, file, manifest.fps, 'mp4');
    const seen: number[] = [];
    for await (const frame of decodeVideoFrames(file, { fps: 25 })) {
      seen.push(frame.index);
      if (seen.length === 2) break;
    }
    expect(seen).toEqual([0, 1]);
  });

  it('writes Y4M for a fake camera', async () => {
    const file = path.join(dir, 'needle.y4m');
    await writeVideo(images.slice(0, 3), file, 3, 'y4m');
    expect(readFileSync(file).subarray(0, 40).toString('latin1')).toMatch(
      /^YUV4MPEG2 W320 H240 F3:1/,
    );
  });

  it('says what is wrong with a file that is no video, or when ffmpeg is missing', async () => {
    const text = path.join(dir, 'notes.mp4');
    writeFileSync(text, 'not a video at all');
    await expect(probeVideo(text)).rejects.toMatchObject({ code: 'unreadable_video' });
    await expect(probeVideo(text)).rejects.toBeInstanceOf(VideoError);
    const saved = process.env.FFPROBE_PATH;
    process.env.FFPROBE_PATH = path.join(dir, 'no-such-ffprobe');
    try {
      await expect(probeVideo(text)).rejects.toMatchObject({
        code: 'ffmpeg_missing',
        message: expect.stringMatching(/apt-get install ffmpeg/),
      });
    } finally {
      if (saved === undefined) delete process.env.FFPROBE_PATH;
      else process.env.FFPROBE_PATH = saved;
    }
  });
});
