import 'server-only';

import { createUploadthing, type FileRouter } from 'uploadthing/next';
import { UTApi, UTFile, UploadThingError } from 'uploadthing/server';
import { z } from 'zod';

import { isStoredFileUrl, utapiOptions } from './config';
import type { EnvironmentSource } from './local-service';
import {
  ImageRefusedError,
  MAX_IMAGE_BYTES,
  inspectImage,
  type ImageRefusalCode,
  type InspectImageOptions,
  type InspectedImage,
} from './inspect-image';

/**
 * The upload route for drop photos. Auth and persistence are injected so the route can be
 * tested without the app: the app wires `authorize` to its session and `onStored` to its
 * database; app/api/uploadthing/route.ts serves the router with createRouteHandler.
 */

export const DROP_PHOTO_ROUTE = 'dropPhoto';
/** Videos of a series of one drop (dynamic wetting), kept as `videos` rows. */
export const SERIES_VIDEO_ROUTE = 'seriesVideo';
export const MAX_PHOTOS_PER_UPLOAD = 50;

/**
 * 25 MB per photo, checked by the SDK before upload and again from the bytes afterwards.
 * The SDK's type lists only powers of two, but its parser (fileSizeToBytes) accepts any whole
 * number of MB, so the literal is cast to satisfy the type.
 */
const MAX_PHOTO_SIZE = '25MB' as '32MB';

const photoTypeConfig = {
  maxFileSize: MAX_PHOTO_SIZE,
  maxFileCount: MAX_PHOTOS_PER_UPLOAD,
} as const;

/**
 * Keyed by MIME type so the SDK's file picker accepts exactly these. Browsers report BMP as
 * image/bmp, some Windows setups as image/x-ms-bmp; both are in the SDK's type list. The file's
 * real format is decided later from its bytes, never from this type.
 */
export const DROP_PHOTO_ROUTE_CONFIG = {
  'image/png': photoTypeConfig,
  'image/jpeg': photoTypeConfig,
  'image/tiff': photoTypeConfig,
  'image/bmp': photoTypeConfig,
  'image/x-ms-bmp': photoTypeConfig,
} as const;

/**
 * What the browser sends with an upload (`input: {}` when there is nothing to say). An object,
 * not an optional one: the SDK's client type drops `input` altogether for optional inputs.
 */
export const PHOTO_PURPOSES = ['sessile-drop', 'pendant-drop', 'series-frame'] as const;
export type PhotoPurpose = (typeof PHOTO_PURPOSES)[number];

export const dropPhotoInputSchema = z.object({
  /** The instrument session the photos belong to, when the upload starts from one. */
  sessionId: z.string().min(1).max(128).optional(),
  /**
   * What the photo is for: a sessile drop for the measurement workspace (the default) or a
   * hanging drop for the pendant-drop surface tension, which the workspace does not offer.
   */
  purpose: z.enum(PHOTO_PURPOSES).optional(),
});

export type DropPhotoInput = z.infer<typeof dropPhotoInputSchema>;

export type DropPhotoOwner = {
  userId: string;
  organizationId: string;
};

/**
 * Stored as the upload's metadata; travels through the upload service and back. A type alias
 * (not an interface) so it satisfies the SDK's JSON-object constraint.
 */
export type DropPhotoUploadMetadata = DropPhotoOwner & {
  sessionId: string | null;
  purpose: PhotoPurpose;
};

/** The stored original as the upload service reports it. */
export interface UploadedDropPhotoFile {
  key: string;
  name: string;
  size: number;
  /** MIME type as the browser reported it (informational; `inspected.mime` is authoritative). */
  type: string;
  url: string;
  fileHash: string;
  customId: string | null;
}

export interface DerivedImageFile {
  key: string;
  url: string;
}

export interface DerivedImageFiles {
  thumbnail: DerivedImageFile;
  workerPng: DerivedImageFile | null;
}

export interface StoredDropPhotoContext {
  metadata: DropPhotoUploadMetadata;
  /** Copies kept beside the original in the upload service, when `storeDerivedFiles` is on. */
  derived: DerivedImageFiles | null;
}

export type DropPhotoUploadResult =
  | {
      status: 'stored';
      photoId: string;
      /** This upload's stored file; with `reused` it was deleted again (the photo keeps its own). */
      fileKey: string;
      /** The same file was already kept as `photoId` (the workspace's one photo per file). */
      reused?: true;
      format: string;
      width: number;
      height: number;
      sha256: string;
    }
  | { status: 'refused'; fileKey: string; code: ImageRefusalCode; message: string }
  | { status: 'failed'; fileKey: string; message: string };

/** A series video as the upload service reports it. */
export interface UploadedSeriesVideo {
  key: string;
  name: string;
  size: number;
  url: string;
}

export type SeriesVideoUploadResult =
  | {
      status: 'stored';
      videoId: string;
      fps: number | null;
      frameCount: number | null;
      width: number;
      height: number;
    }
  | { status: 'refused'; fileKey: string; message: string };

/** Minimal slice of UTApi the route uses; a real UTApi fits. */
export type UploadStorage = Pick<UTApi, 'deleteFiles' | 'uploadFiles'>;

export interface DropPhotoRouterOptions {
  /** Who is uploading; throw UploadThingError UNAUTHORIZED / FORBIDDEN to refuse. */
  authorize(req: Request, input: DropPhotoInput): Promise<DropPhotoOwner>;
  /**
   * Records the accepted photo; throwing removes every stored file of this upload. `reused`: the
   * file is a photo already kept (`photoId`), so this upload's stored files are removed again.
   */
  onStored(
    file: UploadedDropPhotoFile,
    inspected: InspectedImage,
    context: StoredDropPhotoContext,
  ): Promise<{ photoId: string; reused?: boolean }>;
  /**
   * Records a stored series video (read by ffprobe on the server); throwing refuses it with the
   * error's message and removes the stored file. Without it the route refuses every video.
   */
  onVideoStored?(
    file: UploadedSeriesVideo,
    owner: DropPhotoOwner,
  ): Promise<Extract<SeriesVideoUploadResult, { status: 'stored' }>>;
  /** Downloads the stored original; default fetch() with the 25 MB limit. */
  fetchFile?(url: string): Promise<Buffer>;
  /** Delete and server-side upload; default a UTApi configured by lib/uploads/config. */
  storage?: UploadStorage;
  inspectOptions?: InspectImageOptions;
  /**
   * Also upload the thumbnail and worker PNG to the upload service (passed to onStored as
   * `derived`). Off by default: the bytes are in `inspected` for the caller to keep.
   */
  storeDerivedFiles?: boolean;
  /** Where refusals and failures are reported; default console.warn. */
  report?(message: string, details: Record<string, unknown>): void;
}

function defaultReport(message: string, details: Record<string, unknown>) {
  console.warn(`[uploads] ${message}`, details);
}

export class ForeignFileUrlError extends Error {
  constructor(url: string) {
    super(`Refused to download ${safeOrigin(url)}: it is not on the configured upload service.`);
    this.name = 'ForeignFileUrlError';
  }
}

function safeOrigin(url: string): string {
  try {
    return new URL(url).origin;
  } catch {
    return 'a malformed URL';
  }
}

const MAX_REDIRECTS = 3;

/**
 * fetch() of a stored file on the configured upload service (isStoredFileUrl: a URL anywhere
 * else, a redirect included, is refused before any request), refusing bodies beyond the limit
 * before buffering them.
 */
export async function fetchStoredFile(
  url: string,
  options: { maxBytes?: number; env?: EnvironmentSource } = {},
): Promise<Buffer> {
  const maxBytes = options.maxBytes ?? MAX_IMAGE_BYTES;
  let current = url;
  let response: Response;
  for (let hop = 0; ; hop++) {
    if (!isStoredFileUrl(current, options.env)) throw new ForeignFileUrlError(current);
    // no-store: Next's patched fetch must never serve a photo from its data cache.
    response = await fetch(current, { cache: 'no-store', redirect: 'manual' });
    const location = response.headers.get('location');
    if (response.status < 300 || response.status >= 400 || !location) break;
    await response.body?.cancel();
    if (hop >= MAX_REDIRECTS) throw new Error('Fetching the stored file was redirected too often');
    current = new URL(location, current).toString();
  }
  if (!response.ok || !response.body) {
    throw new Error(`Fetching the stored file failed with status ${response.status}`);
  }
  const declared = Number(response.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) {
    await response.body.cancel();
    return Buffer.alloc(maxBytes + 1); // inspectImage refuses it as too-large
  }
  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = response.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.length;
    if (total > maxBytes) {
      await reader.cancel();
      return Buffer.alloc(maxBytes + 1);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

function baseName(name: string): string {
  const withoutExtension = name.replace(/\.[^./\\]+$/, '');
  return withoutExtension.replace(/[^\w.-]+/g, '_').slice(0, 80) || 'photo';
}

async function storeDerived(
  storage: UploadStorage,
  file: UploadedDropPhotoFile,
  inspected: InspectedImage,
): Promise<DerivedImageFiles> {
  const stem = baseName(file.name);
  const uploads = [
    new UTFile([new Uint8Array(inspected.thumbnailPng)], `${stem}.thumb.png`, {
      type: 'image/png',
    }),
  ];
  if (inspected.orientedPng) {
    uploads.push(
      new UTFile([new Uint8Array(inspected.orientedPng)], `${stem}.worker.png`, {
        type: 'image/png',
      }),
    );
  }
  const results = await storage.uploadFiles(uploads);
  const stored = results.flatMap((r) => (r.data ? [{ key: r.data.key, url: r.data.ufsUrl }] : []));
  const failure = results.find((r) => r.error);
  if (failure?.error) {
    if (stored.length > 0) await storage.deleteFiles(stored.map((s) => s.key));
    throw new Error(`Storing derived images failed: ${failure.error.message}`);
  }
  return { thumbnail: stored[0], workerPng: stored[1] ?? null };
}

/** Deletes stored files; a failure is reported, never thrown (the upload's answer matters more). */
async function removeQuietly(
  storage: UploadStorage,
  keys: string[],
  report: NonNullable<DropPhotoRouterOptions['report']>,
): Promise<void> {
  try {
    await storage.deleteFiles(keys);
  } catch (error) {
    report('could not delete stored files', { keys, error: String(error) });
  }
}

/**
 * What happens once the service has stored an upload: inspect the bytes; on refusal delete the
 * file and record nothing; on success keep a thumbnail (and worker PNG) beside it and record it.
 * Never throws: the result goes back to the browser as the upload's serverData.
 */
export async function completeDropPhotoUpload(
  file: UploadedDropPhotoFile,
  metadata: DropPhotoUploadMetadata,
  options: DropPhotoRouterOptions & { storage: UploadStorage },
): Promise<DropPhotoUploadResult> {
  const report = options.report ?? defaultReport;
  const fetchFile = options.fetchFile ?? ((url: string) => fetchStoredFile(url));
  const { storage } = options;
  const removeStored = (keys: string[]) => removeQuietly(storage, keys, report);

  let inspected: InspectedImage;
  try {
    inspected = await inspectImage(await fetchFile(file.url), options.inspectOptions);
  } catch (error) {
    await removeStored([file.key]);
    if (error instanceof ImageRefusedError) {
      report('refused upload', { fileKey: file.key, name: file.name, code: error.code });
      return { status: 'refused', fileKey: file.key, code: error.code, message: error.message };
    }
    report('inspecting an upload failed', { fileKey: file.key, error: String(error) });
    return {
      status: 'failed',
      fileKey: file.key,
      message: 'The photo could not be checked after upload. Please upload it again.',
    };
  }

  let derived: DerivedImageFiles | null = null;
  const storedKeys = () => [
    file.key,
    ...(derived
      ? [derived.thumbnail.key, ...(derived.workerPng ? [derived.workerPng.key] : [])]
      : []),
  ];
  try {
    if (options.storeDerivedFiles) derived = await storeDerived(storage, file, inspected);
    const { photoId, reused } = await options.onStored(file, inspected, { metadata, derived });
    // The same file again: the photo already has its stored files, these would be orphans.
    if (reused) await removeStored(storedKeys());
    return {
      status: 'stored',
      photoId,
      fileKey: file.key,
      ...(reused ? { reused: true as const } : {}),
      format: inspected.format,
      width: inspected.width,
      height: inspected.height,
      sha256: inspected.sha256,
    };
  } catch (error) {
    await removeStored(storedKeys());
    report('recording an upload failed', { fileKey: file.key, error: String(error) });
    return {
      status: 'failed',
      fileKey: file.key,
      message: 'The photo was received but could not be saved. Please upload it again.',
    };
  }
}

/**
 * What happens once the service has stored a series video: the app records it (ffprobe reads it
 * on the server); a video it refuses is deleted again and the refusal goes back to the browser.
 */
export async function completeSeriesVideoUpload(
  file: UploadedSeriesVideo,
  owner: DropPhotoOwner,
  options: DropPhotoRouterOptions & { storage: UploadStorage },
): Promise<SeriesVideoUploadResult> {
  const report = options.report ?? defaultReport;
  try {
    if (!options.onVideoStored) throw new Error('Videos are not taken here.');
    return await options.onVideoStored(file, owner);
  } catch (error) {
    await removeQuietly(options.storage, [file.key], report);
    report('refused video', { fileKey: file.key, error: String(error) });
    return {
      status: 'refused',
      fileKey: file.key,
      message:
        error instanceof Error && error.message
          ? error.message
          : 'The video could not be read on the server. Upload it as MP4 (H.264), WebM or AVI (MJPEG).',
    };
  }
}

/** Builds the FileRouter: drop photos (`dropPhoto`) and series videos (`seriesVideo`). */
export function createDropPhotoRouter(options: DropPhotoRouterOptions) {
  const f = createUploadthing();
  let defaultStorage: UTApi | null = null;
  const storage = (): UploadStorage => {
    if (options.storage) return options.storage;
    defaultStorage ??= new UTApi(utapiOptions());
    return defaultStorage;
  };

  const router = {
    [DROP_PHOTO_ROUTE]: f(DROP_PHOTO_ROUTE_CONFIG)
      .input(dropPhotoInputSchema)
      .middleware(async ({ req, input, files }): Promise<DropPhotoUploadMetadata> => {
        if (files.length > MAX_PHOTOS_PER_UPLOAD) {
          throw new UploadThingError({
            code: 'BAD_REQUEST',
            message: `At most ${MAX_PHOTOS_PER_UPLOAD} photos can be uploaded at once; split the upload.`,
          });
        }
        const owner = await options.authorize(req, input);
        return {
          userId: owner.userId,
          organizationId: owner.organizationId,
          sessionId: input.sessionId ?? null,
          purpose: input.purpose ?? 'sessile-drop',
        };
      })
      .onUploadComplete(async ({ metadata, file }) => {
        const uploaded: UploadedDropPhotoFile = {
          key: file.key,
          name: file.name,
          size: file.size,
          type: file.type,
          url: file.ufsUrl,
          fileHash: file.fileHash,
          customId: file.customId,
        };
        try {
          return await completeDropPhotoUpload(uploaded, metadata, {
            ...options,
            storage: storage(),
          });
        } catch (error) {
          // Throwing here would leave the browser waiting: the SDK then reports nothing back.
          (options.report ?? defaultReport)('completing an upload failed', {
            fileKey: file.key,
            error: String(error),
          });
          const result: DropPhotoUploadResult = {
            status: 'failed',
            fileKey: file.key,
            message: 'The photo could not be processed on the server. Please upload it again.',
          };
          return result;
        }
      }),
    [SERIES_VIDEO_ROUTE]: f({ video: { maxFileSize: '512MB', maxFileCount: 1 } })
      .middleware(async ({ req }): Promise<DropPhotoOwner> => {
        const owner = await options.authorize(req, {});
        return { userId: owner.userId, organizationId: owner.organizationId };
      })
      .onUploadComplete(async ({ metadata, file }) =>
        completeSeriesVideoUpload(
          { key: file.key, name: file.name, size: file.size, url: file.ufsUrl },
          metadata,
          { ...options, storage: storage() },
        ),
      ),
  } satisfies FileRouter;

  return router;
}

export type DropPhotoRouter = ReturnType<typeof createDropPhotoRouter>;
