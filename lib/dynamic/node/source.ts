/**
 * Node-only: the frames of a series from files — one video, or frame images in order with a frame
 * rate. What a file is comes from its first bytes, not its name. Frames are read one at a time
 * while the analysis runs.
 */
import { open } from 'node:fs/promises';
import { decodeImageFile } from '../../analysis/node/decode';
import type { SeriesInputFrame } from '../types';
import { decodeVideoFrames, probeVideo } from './ffmpeg';

export type SeriesInputErrorCode =
  'no-input' | 'missing_fps' | 'bad-fps' | 'mixed-input' | 'unreadable_file';

export class SeriesInputError extends Error {
  constructor(
    readonly code: SeriesInputErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'SeriesInputError';
  }
}

export interface SeriesSource {
  kind: 'video' | 'images';
  frames: AsyncIterable<SeriesInputFrame>;
  /** Frame count when known before decoding (always for images; from the container for a video). */
  total: number | null;
  fps: number;
}

/** Still-image formats the frame reader takes (lib/analysis/node/decode.ts). */
export async function isStillImage(path: string): Promise<boolean> {
  let head: Buffer;
  try {
    const file = await open(path, 'r');
    try {
      head = Buffer.alloc(16);
      await file.read(head, 0, 16, 0);
    } finally {
      await file.close();
    }
  } catch (error) {
    throw new SeriesInputError(
      'unreadable_file',
      `Cannot read ${path}: ${(error as Error).message}`,
    );
  }
  const starts = (...bytes: number[]) => bytes.every((b, i) => head[i] === b);
  const ascii = (from: number, text: string) =>
    head.toString('latin1', from, from + text.length) === text;
  return (
    starts(0x89, 0x50, 0x4e, 0x47) || // PNG
    starts(0xff, 0xd8, 0xff) || // JPEG
    starts(0x42, 0x4d) || // BMP
    starts(0x49, 0x49, 0x2a, 0x00) || // TIFF, little-endian
    starts(0x4d, 0x4d, 0x00, 0x2a) || // TIFF, big-endian
    ascii(0, 'GIF8') ||
    (ascii(0, 'RIFF') && ascii(8, 'WEBP'))
  );
}

/** Opens one video or an ordered set of frame images (then `fps` is required). */
export async function openSeries(files: readonly string[], fps?: number): Promise<SeriesSource> {
  if (fps !== undefined && !(Number.isFinite(fps) && fps > 0))
    throw new SeriesInputError('bad-fps', '--fps needs a positive number of frames per second.');
  if (!files.length)
    throw new SeriesInputError(
      'no-input',
      'No input given: name one video, or frame images in order with --fps.',
    );
  const stills = await Promise.all(files.map(isStillImage));
  if (stills.every(Boolean)) {
    if (fps === undefined)
      throw new SeriesInputError(
        'missing_fps',
        'Frame images carry no time; give their frame rate with --fps (frames per second).',
      );
    return { kind: 'images', frames: imageFrames(files, fps), total: files.length, fps };
  }
  if (files.length > 1)
    throw new SeriesInputError(
      'mixed-input',
      'Give one video, or several frame images in order; not several videos or a mix.',
    );
  const info = await probeVideo(files[0]);
  const rate = fps ?? info.fps;
  if (!rate)
    throw new SeriesInputError(
      'missing_fps',
      `${files[0]} does not state its frame rate; give it with --fps.`,
    );
  return {
    kind: 'video',
    frames: decodeVideoFrames(files[0], { fps: rate, info }),
    total: info.frameCount,
    fps: rate,
  };
}

async function* imageFrames(
  files: readonly string[],
  fps: number,
): AsyncGenerator<SeriesInputFrame> {
  for (let i = 0; i < files.length; i++) {
    yield { image: await decodeImageFile(files[i]), tSec: i / fps };
  }
}
