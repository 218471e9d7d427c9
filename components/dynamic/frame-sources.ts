'use client';

/*
 * Frames of a series decoded in the browser, as 8-bit gray pixels with their time: a video file
 * through the video element (seek to each frame's middle, draw it to a canvas), frame images
 * through createImageBitmap, or frames captured from the live camera. Frames are produced one at
 * a time, so a long video holds one frame in memory while the worker is busy.
 */
import type { GrayImage } from '@/lib/analysis/types';
import type { SeriesInputFrame } from '@/lib/dynamic/types';

/** A file or a source the browser cannot read; the message says what to do. */
export class FrameSourceError extends Error {
  constructor(
    message: string,
    /** The browser cannot decode this video; the server can (ffmpeg). */
    readonly serverCanDecode = false,
  ) {
    super(message);
    this.name = 'FrameSourceError';
  }
}

export const VIDEO_ACCEPT = 'video/mp4,video/webm,video/x-msvideo,video/avi,.mp4,.webm,.avi,.m4v';
export const IMAGE_ACCEPT = 'image/png,image/jpeg,image/bmp,.png,.jpg,.jpeg,.bmp';

/** Gray from RGBA with the ITU-R BT.601 luma weights (the weights of a gray camera's sensor). */
export function grayFromRgba(rgba: Uint8ClampedArray, width: number, height: number): GrayImage {
  const data = new Uint8Array(width * height);
  for (let i = 0, j = 0; i < data.length; i++, j += 4)
    data[i] = Math.round(0.299 * rgba[j] + 0.587 * rgba[j + 1] + 0.114 * rgba[j + 2]);
  return { width, height, data };
}

/** A canvas sized for the frames, read back often (the browser keeps it in memory). */
export function frameCanvas(width: number, height: number) {
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const context = canvas.getContext('2d', { willReadFrequently: true });
  if (!context) throw new FrameSourceError('This browser cannot draw frames; use a current Chromium, Firefox or Safari.');
  return {
    canvas,
    grab(source: CanvasImageSource): GrayImage {
      context.drawImage(source, 0, 0, width, height);
      return grayFromRgba(context.getImageData(0, 0, width, height).data, width, height);
    },
  };
}

function once(target: EventTarget, ok: string, fail = 'error'): Promise<void> {
  return new Promise((resolve, reject) => {
    const done = () => {
      target.removeEventListener(ok, done);
      target.removeEventListener(fail, failed);
      resolve();
    };
    const failed = () => {
      target.removeEventListener(ok, done);
      target.removeEventListener(fail, failed);
      reject(new Error(fail));
    };
    target.addEventListener(ok, done);
    target.addEventListener(fail, failed);
  });
}

export interface OpenedVideo {
  width: number;
  height: number;
  durationSec: number;
  frameCount: number;
  frames: AsyncGenerator<SeriesInputFrame>;
  close(): void;
}

/**
 * Opens a video file in a video element. The frame rate is the camera's, as typed (a video file
 * does not tell the page its rate); frame i is read at its middle, (i + ½) / fps.
 */
export async function openVideo(file: File, fps: number): Promise<OpenedVideo> {
  if (!(fps > 0)) throw new FrameSourceError('Type the frame rate the video was recorded at.');
  const url = URL.createObjectURL(file);
  const video = document.createElement('video');
  video.muted = true;
  video.preload = 'auto';
  video.playsInline = true;
  video.src = url;
  const close = () => {
    video.removeAttribute('src');
    video.load();
    URL.revokeObjectURL(url);
  };
  try {
    await once(video, 'loadeddata');
  } catch {
    close();
    throw new FrameSourceError(
      `This browser cannot decode ${file.name} (AVI with MJPEG often is one such file). Upload it and let the server decode it, or convert it to MP4 (H.264) or WebM.`,
      true,
    );
  }
  const { videoWidth: width, videoHeight: height, duration } = video;
  if (!width || !height || !Number.isFinite(duration) || duration <= 0) {
    close();
    throw new FrameSourceError(`${file.name} has no picture the browser can read; check the file and try again.`, true);
  }
  const frameCount = Math.max(1, Math.round(duration * fps));
  async function* frames(): AsyncGenerator<SeriesInputFrame> {
    const canvas = frameCanvas(width, height);
    try {
      for (let i = 0; i < frameCount; i++) {
        const at = Math.min((i + 0.5) / fps, duration - 1e-3);
        if (Math.abs(video.currentTime - at) > 1e-6) {
          const seeked = once(video, 'seeked');
          video.currentTime = at;
          await seeked;
        }
        yield { image: canvas.grab(video), tSec: i / fps };
      }
    } finally {
      close();
    }
  }
  return { width, height, durationSec: duration, frameCount, frames: frames(), close };
}

/** Frame images in the order given (sorted by name by the caller), at `fps` frames per second. */
export async function* imageFrames(files: readonly File[], fps: number): AsyncGenerator<SeriesInputFrame> {
  let size: { width: number; height: number } | null = null;
  let canvas: ReturnType<typeof frameCanvas> | null = null;
  for (let i = 0; i < files.length; i++) {
    let bitmap: ImageBitmap;
    try {
      bitmap = await createImageBitmap(files[i]);
    } catch {
      throw new FrameSourceError(
        `${files[i].name} is not an image this browser can read; export the frames as PNG or JPEG.`,
      );
    }
    if (!size) {
      size = { width: bitmap.width, height: bitmap.height };
      canvas = frameCanvas(size.width, size.height);
    } else if (bitmap.width !== size.width || bitmap.height !== size.height) {
      bitmap.close();
      throw new FrameSourceError(
        `${files[i].name} is ${bitmap.width} × ${bitmap.height} px, the first frame ${size.width} × ${size.height} px; every frame of a series has one size.`,
      );
    }
    const image = canvas!.grab(bitmap);
    bitmap.close();
    yield { image, tSec: i / fps };
  }
}

/** Frame images sorted by name the way people number them (frame-2 before frame-10). */
export function inFrameOrder(files: readonly File[]): File[] {
  const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });
  return [...files].sort((a, b) => collator.compare(a.name, b.name));
}

/** A gray frame as a PNG file (camera frames are saved as frame photos). */
export async function grayToPng(image: GrayImage, name: string): Promise<File> {
  const canvas = document.createElement('canvas');
  canvas.width = image.width;
  canvas.height = image.height;
  const context = canvas.getContext('2d');
  if (!context) throw new FrameSourceError('This browser cannot draw frames.');
  const rgba = new ImageData(image.width, image.height);
  for (let i = 0, j = 0; i < image.data.length; i++, j += 4) {
    const v = image.data[i];
    rgba.data[j] = v;
    rgba.data[j + 1] = v;
    rgba.data[j + 2] = v;
    rgba.data[j + 3] = 255;
  }
  context.putImageData(rgba, 0, 0);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
  if (!blob) throw new FrameSourceError('A frame could not be turned into a PNG.');
  return new File([blob], name, { type: 'image/png' });
}
