/**
 * The analysis worker's memory of recent photos: each photo's gray pixels (fetched once) and its
 * edge detection per region of interest and settings, so a new baseline or method only re-fits.
 * The least recently used photo is forgotten beyond `capacity`.
 */
import { detectDrop, type DropDetection } from './analyse';
import type { OpenCv } from './opencv';
import type { AnalyseOptions, GrayImage } from './types';

interface Entry {
  url: string;
  pixels: Promise<GrayImage>;
  detections: Map<string, DropDetection>;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

export class DetectionCache {
  private readonly entries = new Map<string, Entry>();

  constructor(
    private readonly loadPixels: (url: string) => Promise<GrayImage>,
    private readonly capacity = 4,
  ) {}

  /** The detection for this photo, ROI and settings, with how long what had to be done took. */
  async detection(
    cv: OpenCv,
    dropId: string,
    pixelsUrl: string,
    options: Pick<AnalyseOptions, 'roi' | 'settings'>,
  ): Promise<{ detection: DropDetection; pixelsMs: number | null; detectMs: number | null }> {
    let entry = this.entries.get(dropId);
    let pixelsMs: number | null = null;
    if (!entry || entry.url !== pixelsUrl) {
      const started = now();
      entry = { url: pixelsUrl, pixels: this.loadPixels(pixelsUrl), detections: new Map() };
      this.entries.set(dropId, entry);
      try {
        await entry.pixels;
      } catch (error) {
        this.entries.delete(dropId);
        throw error;
      }
      pixelsMs = now() - started;
    }
    // Most recently used last.
    this.entries.delete(dropId);
    this.entries.set(dropId, entry);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value as string;
      this.entries.delete(oldest);
    }
    const image = await entry.pixels;
    const key = JSON.stringify({ roi: options.roi ?? null, settings: options.settings ?? null });
    let detection = entry.detections.get(key);
    let detectMs: number | null = null;
    if (!detection) {
      const started = now();
      detection = detectDrop(cv, image, options);
      detectMs = now() - started;
      entry.detections.set(key, detection);
    }
    return { detection, pixelsMs, detectMs };
  }

  forget(dropId: string): void {
    this.entries.delete(dropId);
  }

  get size(): number {
    return this.entries.size;
  }
}
