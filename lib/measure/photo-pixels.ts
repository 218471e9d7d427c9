import 'server-only';
import { gzipSync } from 'node:zlib';
import { encodeGrayPixels } from '@/lib/analysis/gray-pixels';
import { decodeImageBytes } from '@/lib/analysis/node/decode';
import type { GrayImage } from '@/lib/analysis/types';
import { getPhotoSource } from '@/db/queries/photos';
import { notFound } from '@/lib/api/errors';

/** The bytes a browser can decode: the kept PNG when there is one, else the stored original. */
export async function loadPhotoBytes(organizationId: string, photoId: string): Promise<{ bytes: Buffer; contentType: string }> {
  const source = await getPhotoSource(organizationId, photoId);
  if (!source) throw notFound('That photo');
  if (source.workingPng) return { bytes: source.workingPng, contentType: 'image/png' };
  const response = await fetch(source.url);
  if (!response.ok) {
    throw new Error(`The stored photo could not be read from the upload service (HTTP ${response.status}).`);
  }
  const contentType = source.format === 'jpeg' ? 'image/jpeg' : `image/${source.format}`;
  return { bytes: Buffer.from(await response.arrayBuffer()), contentType };
}

/**
 * Grayscale pixels of a photo as lib/analysis reads them everywhere in Node (the CLI too): the
 * oriented copy when the upload check made one, else the original; 16-bit sources stay 16-bit.
 */
export async function loadPhotoGray(organizationId: string, photoId: string): Promise<GrayImage> {
  const { bytes } = await loadPhotoBytes(organizationId, photoId);
  return decodeImageBytes(bytes);
}

/**
 * The same gray pixels for the browser's analysis worker (lib/analysis/gray-pixels.ts layout),
 * gzip-compressed: the worker analyses exactly what the server analyses when a result is saved.
 */
export async function loadPhotoGrayPixels(organizationId: string, photoId: string): Promise<Uint8Array> {
  return gzipSync(encodeGrayPixels(await loadPhotoGray(organizationId, photoId)), { level: 3 });
}
