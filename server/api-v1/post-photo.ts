import 'server-only';
import { AppError, invalidField } from '@/lib/app-error';
import type { V1PhotoFields } from '@/lib/contracts/api-v1';
import {
  ImageRefusedError,
  MAX_IMAGE_BYTES,
  inspectImage,
  type InspectedImage,
} from '@/lib/uploads/inspect-image';
import { deleteStoredFiles, storeServerFile } from '@/lib/uploads/server-upload';
import type { Actor } from '../actor';
import { saveDropAnalysis } from '../drops/save-analysis';
import { inspectedPhotoRow, recordUploadedPhoto } from '../photos/record-upload';

/**
 * A drop photo posted to the API by an instrument: checked from its bytes as browser uploads
 * are (lib/uploads/inspect-image.ts), stored through the upload service, recorded as a photo and
 * analysed by the same engine and save as the measurement workspace (saveDropAnalysis). A photo
 * whose analysis finds no drop stays stored and waits in the workspace, as an upload does.
 */
export async function postDropPhoto(actor: Actor, fields: V1PhotoFields, file: File | undefined) {
  if (!file) {
    throw invalidField('photo', 'Attach the drop photo as the file part named "photo".');
  }
  if (file.size > MAX_IMAGE_BYTES) {
    throw new AppError(
      'payload_too_large',
      `The photo is larger than ${MAX_IMAGE_BYTES / (1024 * 1024)} MB. Save it smaller (PNG or JPEG) and post it again.`,
      { fields: { photo: 'The photo is too large.' } },
    );
  }
  const bytes = Buffer.from(await file.arrayBuffer());
  let inspected: InspectedImage;
  try {
    inspected = await inspectImage(bytes);
  } catch (error) {
    if (error instanceof ImageRefusedError) throw invalidField('photo', error.message);
    throw error;
  }
  const name = file.name || `photo.${inspected.format}`;
  const stored = await storeServerFile(bytes, name, inspected.mime);
  let photoId: string;
  try {
    ({ photoId } = await recordUploadedPhoto(
      inspectedPhotoRow(
        actor,
        { key: stored.key, url: stored.url, name, size: bytes.length },
        inspected,
        'sessile-drop',
      ),
    ));
  } catch (error) {
    await deleteStoredFiles([stored.key]);
    throw error;
  }
  const saved = await saveDropAnalysis(actor, photoId, {
    sampleId: fields.sampleId,
    probeLiquidId: fields.probeLiquidId,
    sessionId: fields.sessionId ?? null,
    method: fields.method,
    baseline: fields.baseline ?? null,
    // A photo stored just now has no drop yet: this is its first save.
    expectedRevision: 0,
  });
  return { photoId, ...saved };
}
