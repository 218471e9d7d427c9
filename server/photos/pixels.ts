import 'server-only';
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import { getPhotoSource, getPhotoThumbnail } from '@/db/queries/photos';
import { encodeGrayPixels } from '@/lib/analysis/gray-pixels';
import { DecodeError, decodeImageBytes } from '@/lib/analysis/node/decode';
import type { GrayImage } from '@/lib/analysis/types';
import { AppError, notFound } from '@/lib/app-error';
import { fetchStoredFile } from '@/lib/uploads/file-router';

const gzipAsync = promisify(gzip);

/** The bytes a browser can decode: the kept PNG when there is one, else the stored original. */
export async function loadPhotoBytes(
  organizationId: string,
  photoId: string,
): Promise<{ bytes: Buffer; contentType: string }> {
  const source = await getPhotoSource(organizationId, photoId);
  if (!source) throw notFound('That photo');
  if (source.workingPng) return { bytes: source.workingPng, contentType: 'image/png' };
  const contentType = source.format === 'jpeg' ? 'image/jpeg' : `image/${source.format}`;
  return { bytes: await fetchStoredFile(source.url), contentType };
}

/**
 * Grayscale pixels of a photo as lib/analysis reads them everywhere in Node (the CLI too): the
 * oriented copy when the upload check made one, else the original; 16-bit sources stay 16-bit.
 * A photo that cannot be decoded (or has more pixels than the analysis takes) is 422
 * unreadable_photo naming `photoId`.
 */
export async function loadPhotoGray(organizationId: string, photoId: string): Promise<GrayImage> {
  const { bytes } = await loadPhotoBytes(organizationId, photoId);
  try {
    return await decodeImageBytes(bytes);
  } catch (error) {
    if (!(error instanceof DecodeError)) throw error;
    const message = `The stored photo cannot be analysed: ${error.message} Upload it again as PNG or JPEG.`;
    throw new AppError('unreadable_photo', message, { fields: { photoId: message } });
  }
}

/** The small PNG of the workspace strip and the saved-results lists. */
export async function loadPhotoThumbnail(organizationId: string, photoId: string): Promise<Buffer> {
  const thumbnail = await getPhotoThumbnail(organizationId, photoId);
  if (!thumbnail) throw notFound('That photo');
  return thumbnail.thumbnailPng;
}

/**
 * The same gray pixels for the browser's analysis worker (lib/analysis/gray-pixels.ts layout),
 * gzip-compressed: the worker analyses exactly what the server analyses when a result is saved.
 */
export async function loadPhotoGrayPixels(
  organizationId: string,
  photoId: string,
): Promise<Uint8Array> {
  return gzipAsync(encodeGrayPixels(await loadPhotoGray(organizationId, photoId)), { level: 3 });
}
