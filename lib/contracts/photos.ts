import { z } from 'zod';

/** POST /api/photos/remove: take the user's unsaved photos out of the measurement workspace. */
export const removePhotosSchema = z.object({
  photoIds: z
    .array(z.string().min(1))
    .min(1, 'Choose the photos to remove.')
    .max(200, 'Remove at most 200 photos at once.'),
});
export type RemovePhotosInput = z.infer<typeof removePhotosSchema>;

export const removePhotosReplySchema = z.object({ removed: z.array(z.string()) });
export type RemovePhotosReply = z.output<typeof removePhotosReplySchema>;

/** A photo as the measurement workspace opens it, with what is saved of it (null: not saved). */
export type WorkspacePhotoSeed = {
  id: string;
  name: string;
  width: number;
  height: number;
  saved: {
    dropId: string;
    sampleId: string;
    probeLiquidId: string;
    sessionId: string | null;
    revision: number;
    method: string;
    baseline: { x1: number; y1: number; x2: number; y2: number } | null;
  } | null;
};

/** The conditions of the session a reopened drop was measured in, as the workspace starts. */
export type WorkspaceSessionSeed = {
  id: string;
  operatorName: string;
  probeLiquidId: string | null;
  temperatureC: number | null;
  humidityPct: number | null;
  dropVolumeUl: number | null;
  scalePxPerMm: number | null;
  liquidLot: string;
};
