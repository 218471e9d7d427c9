import 'server-only';
import { createHash } from 'node:crypto';
import { recordAudit } from '@/db/queries/audit';
import { insertVideo } from '@/db/queries/dynamic';
import { newId } from '@/db/queries/ids';
import { inTransaction } from '@/db/queries/transaction';
import { AppError } from '@/lib/app-error';
import { MAX_VIDEO_BYTES } from '@/lib/contracts/dynamic';
import { VideoError, probeVideo, type VideoInfo } from '@/lib/dynamic/node/ffmpeg';
import { fetchStoredFile } from '@/lib/uploads/file-router';
import { withTempFile } from './temp-file';

export interface StoredVideoFile {
  key: string;
  url: string;
  name: string;
  size: number;
}

/** ffprobe's reading of a video's bytes (size, rate, frame count, codec). */
export async function probeVideoBytes(bytes: Uint8Array): Promise<VideoInfo> {
  try {
    return await withTempFile(bytes, probeVideo);
  } catch (error) {
    if (error instanceof VideoError && error.code === 'unreadable_video')
      throw new AppError(
        'unreadable_video',
        `${error.message} Upload the video as MP4 (H.264), WebM or AVI (MJPEG).`,
      );
    throw error;
  }
}

/**
 * Keeps a video stored by the upload service as a `videos` row with its audit row: the bytes are
 * fetched back from the service and read by ffprobe on the server, never taken from the browser's
 * word.
 */
export async function recordUploadedVideo(
  owner: { organizationId: string; userId: string },
  file: StoredVideoFile,
): Promise<{ videoId: string; info: VideoInfo }> {
  const bytes = await fetchStoredFile(file.url, { maxBytes: MAX_VIDEO_BYTES });
  if (bytes.length > MAX_VIDEO_BYTES)
    throw new AppError('payload_too_large', 'Videos up to 512 MB are taken; shorten the video.');
  const info = await probeVideoBytes(bytes);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const videoId = newId();
  const facts = {
    codec: info.codec,
    width: info.width,
    height: info.height,
    fps: info.fps,
    frameCount: info.frameCount,
    sha256,
  };
  await inTransaction(async (tx) => {
    await insertVideo(tx, {
      id: videoId,
      organizationId: owner.organizationId,
      uploadedByUserId: owner.userId,
      fileKey: file.key,
      url: file.url,
      originalName: file.name,
      sizeBytes: bytes.length,
      ...facts,
    });
    await recordAudit(tx, {
      actorUserId: owner.userId,
      organizationId: owner.organizationId,
      action: 'video.upload',
      entityType: 'video',
      entityId: videoId,
      after: { name: file.name, ...facts },
    });
  });
  return { videoId, info };
}
