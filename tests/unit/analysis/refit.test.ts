/**
 * Re-fit without re-detecting: the edges detected once per photo serve every later baseline and
 * method with exactly the result a fresh analysis gives, and the worker's cache loads each
 * photo's pixels once. (Equality with a fresh analysis is the reference: no outside source needed.)
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseDropWith, loadOpenCv, type OpenCv } from '@/lib/analysis';
import { detectDrop, measureDrop } from '@/lib/analysis/analyse';
import { DetectionCache } from '@/lib/analysis/detection-cache';
import { decodeGrayPixels, encodeGrayPixels } from '@/lib/analysis/gray-pixels';
import { decodeImageBytes } from '@/lib/analysis/node/decode';
import { AnalysisError, type Baseline, type GrayImage } from '@/lib/analysis/types';
import { renderDrop } from '@/fixtures/generator/render';

let cv: OpenCv;
beforeAll(async () => {
  ({ cv } = await loadOpenCv());
});

describe('re-fit on detected edges', () => {
  it('gives, baseline after baseline and method after method, what a fresh analysis gives', () => {
    const { image, truth } = renderDrop({ contactAngleDeg: 95, bond: 0.3, seed: 31 });
    const detection = detectDrop(cv, image);
    const t = truth.baseline;
    const baselines: Array<Baseline | undefined> = [
      undefined,
      { ...t, y2: t.y2 + 2.5 },
      { ...t, y1: t.y1 - 4, y2: t.y2 + 9 },
      { ...t, y1: t.y1 + 1.25 },
      undefined,
    ];
    for (const method of ['young-laplace', 'circle', 'polynomial'] as const) {
      for (const baseline of baselines) {
        const reused = measureDrop(detection, { method, baseline });
        const fresh = analyseDropWith(cv, image, { method, baseline });
        expect(reused.leftDeg).toBe(fresh.leftDeg);
        expect(reused.rightDeg).toBe(fresh.rightDeg);
        expect(reused.warnings).toEqual(fresh.warnings);
        expect(reused.edgePoints).toEqual(fresh.edgePoints);
      }
    }
  });

  it('a draft is quick and close; it says it is provisional', () => {
    const { image } = renderDrop({ contactAngleDeg: 120, bond: 0.4, seed: 32 });
    const detection = detectDrop(cv, image);
    const draft = measureDrop(detection, { method: 'young-laplace', draft: true });
    const full = measureDrop(detection, { method: 'young-laplace' });
    expect(draft.provisional).toBe(true);
    expect(full.provisional).toBe(false);
    expect(Math.abs(draft.leftDeg - full.leftDeg)).toBeLessThan(0.3);
    expect(Math.abs(draft.rightDeg - full.rightDeg)).toBeLessThan(0.3);
  });
});

describe('the worker’s detection cache', () => {
  it('loads a photo’s pixels once, detects once per region and settings, forgets the oldest photo', async () => {
    const images = new Map<string, GrayImage>([
      ['/a', renderDrop({ contactAngleDeg: 70, seed: 33 }).image],
      ['/b', renderDrop({ contactAngleDeg: 110, seed: 34 }).image],
    ]);
    const loads: string[] = [];
    const cache = new DetectionCache(async (url) => {
      loads.push(url);
      return images.get(url) as GrayImage;
    }, 1);
    const first = await cache.detection(cv, 'a', '/a', {});
    expect(first.pixelsMs).not.toBeNull();
    expect(first.detectMs).not.toBeNull();
    const again = await cache.detection(cv, 'a', '/a', {});
    expect(again.detection).toBe(first.detection);
    expect(again.pixelsMs).toBeNull();
    expect(again.detectMs).toBeNull();
    const roi = await cache.detection(cv, 'a', '/a', { roi: { x: 50, y: 40, width: 540, height: 400 } });
    expect(roi.detection).not.toBe(first.detection);
    expect(roi.pixelsMs).toBeNull();
    await cache.detection(cv, 'b', '/b', {});
    expect(cache.size).toBe(1);
    await cache.detection(cv, 'a', '/a', {});
    expect(loads).toEqual(['/a', '/b', '/a']);
  });

  it('a failed load is not kept: the next request tries again', async () => {
    let fail = true;
    const image = renderDrop({ contactAngleDeg: 70, seed: 35 }).image;
    const cache = new DetectionCache(async () => {
      if (fail) throw new AnalysisError('bad_input', 'not yet');
      return image;
    });
    await expect(cache.detection(cv, 'a', '/a', {})).rejects.toThrow('not yet');
    fail = false;
    await expect(cache.detection(cv, 'a', '/a', {})).resolves.toBeDefined();
  });
});

describe('canonical gray pixels (server → worker)', () => {
  it('round-trips 8-bit and 16-bit photos sample for sample', async () => {
    for (const file of ['drop-75-16bit.png', 'drop-80-colour.jpg', 'cap-60-noisy.png']) {
      const bytes = await readFile(path.resolve(__dirname, '../../../fixtures/drops', file));
      const image = await decodeImageBytes(bytes);
      const back = decodeGrayPixels(encodeGrayPixels(image));
      expect(back.width).toBe(image.width);
      expect(back.height).toBe(image.height);
      expect(back.data.constructor).toBe(image.data.constructor);
      expect(Buffer.from(back.data.buffer, back.data.byteOffset, back.data.byteLength).equals(
        Buffer.from(image.data.buffer, image.data.byteOffset, image.data.byteLength),
      )).toBe(true);
    }
  });

  it('refuses truncated or foreign bytes with a coded error', () => {
    const encoded = encodeGrayPixels({ width: 20, height: 20, data: new Uint8Array(400) });
    expect(() => decodeGrayPixels(encoded.slice(0, 100))).toThrow(AnalysisError);
    expect(() => decodeGrayPixels(new TextEncoder().encode('not pixels at all, sorry'))).toThrow(AnalysisError);
  });
});

describe('canonical gray pixels on the wire', () => {
  it('the server’s gzip body inflates to the same samples', async () => {
    const { gzipSync } = await import('node:zlib');
    const { readGzipGrayPixels } = await import('@/lib/analysis/gray-pixels');
    const image = await decodeImageBytes(
      await readFile(path.resolve(__dirname, '../../../fixtures/drops/drop-75-16bit.png')),
    );
    const body = new Response(gzipSync(encodeGrayPixels(image))).body as ReadableStream<BufferSource>;
    const back = await readGzipGrayPixels(body);
    expect(Array.from(back.data.slice(0, 1000))).toEqual(Array.from(image.data.slice(0, 1000)));
    expect(back.data.length).toBe(image.data.length);
  });
});
