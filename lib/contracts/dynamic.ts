import { z } from 'zod';
import {
  DYNAMIC_KINDS,
  type KeptSeriesFrame,
  type MeasurementResult,
} from '@/lib/dynamic/measurement';
import { fitMethodSchema } from './drops';
import { timestamp } from './common';
import { ANALYSIS_REVIEW_STATUSES } from './reviews';

/**
 * /api/dynamic-measurements: a series of frames of one drop (a stored video, or frame photos with
 * a frame rate) saved to a sample. The server decodes and analyses the source itself before it
 * saves, so what is kept is what lib/dynamic computes, never numbers sent by a browser.
 */

export { DYNAMIC_KINDS };
export const MAX_SERIES_FRAMES = 2000;

const seconds = z.number().finite('Times are numbers of seconds.').min(0).max(86_400);
const positiveRate = (what: string) =>
  z
    .number({ error: `Give the ${what} as a number.` })
    .finite()
    .positive(`The ${what} must be above 0.`)
    .max(100_000);

export const phaseWindowSchema = z
  .object({ fromSec: seconds, toSec: seconds })
  .refine((w) => w.toSec >= w.fromSec, 'A window ends after it starts; swap its ends.');

export const dynamicSourceSchema = z.discriminatedUnion(
  'type',
  [
    z.object({
      type: z.literal('video'),
      videoId: z.string().min(1, 'Upload the video first.'),
      /** Overrides the rate the video states (e.g. a high-speed camera's real rate). */
      fps: positiveRate('frame rate').optional(),
    }),
    z.object({
      type: z.literal('frames'),
      photoIds: z
        .array(z.string().min(1))
        .min(3, 'A series needs at least 3 frames.')
        .max(
          MAX_SERIES_FRAMES,
          `At most ${MAX_SERIES_FRAMES} frames; use a video for longer series.`,
        ),
      fps: positiveRate('frame rate'),
    }),
  ],
  {
    error:
      'Give the source: a video ({ type: "video", videoId }) or frames ({ type: "frames", photoIds, fps }).',
  },
);
export type DynamicSource = z.infer<typeof dynamicSourceSchema>;

export const tiltInputSchema = z.union([
  z.object({
    rateDegPerSec: z
      .number()
      .finite()
      .refine((r) => r !== 0, 'The tilt rate must not be 0.'),
    startDeg: z.number().finite().min(-90).max(90).optional(),
  }),
  z.object({
    tiltsDeg: z.array(z.number().finite().min(-90).max(90)).min(3).max(MAX_SERIES_FRAMES),
  }),
]);
export type TiltInput = z.infer<typeof tiltInputSchema>;

export const saveDynamicSchema = z
  .object({
    sampleId: z.string().min(1, 'Choose the sample this drop was placed on.'),
    probeLiquidId: z.string().min(1, 'Choose the probe liquid.'),
    sessionId: z.string().min(1).nullable().optional(),
    /** Saving again to a measurement adds a revision; without it a new measurement is made. */
    measurementId: z.string().min(1).optional(),
    kind: z.enum(DYNAMIC_KINDS, { error: `Choose the kind: ${DYNAMIC_KINDS.join(', ')}.` }),
    method: fitMethodSchema,
    source: dynamicSourceSchema,
    windows: z
      .object({
        advancing: phaseWindowSchema.nullable().optional(),
        receding: phaseWindowSchema.nullable().optional(),
      })
      .optional(),
    tilt: tiltInputSchema.optional(),
    downhillSide: z.enum(['left', 'right']).optional(),
    overTime: z
      .object({
        zeroSec: seconds.optional(),
        initialFrames: z.number().int().min(2).max(100).optional(),
        initialDegree: z.union([z.literal(1), z.literal(2)]).optional(),
        rateWindow: phaseWindowSchema.optional(),
      })
      .optional(),
  })
  .refine((v) => v.kind !== 'tilt' || v.tilt !== undefined, {
    path: ['tilt'],
    message: 'A tilting-plate series needs the tilt: a rate in °/s or the tilt of every frame.',
  });
export type SaveDynamicInput = z.infer<typeof saveDynamicSchema>;

/** What is kept besides the result: how the series was analysed, so it can be reproduced. */
export interface StoredDynamicOptions {
  fps: number;
  windows?: SaveDynamicInput['windows'];
  tilt?: TiltInput;
  downhillSide?: 'left' | 'right';
  overTime?: SaveDynamicInput['overTime'];
}

export type StoredDynamicResult = MeasurementResult;
export type StoredSeries = KeptSeriesFrame[];

const nullableNumber = z.number().nullable();
const windowStatsSchema = z
  .object({
    meanDeg: z.number(),
    leftDeg: z.number(),
    rightDeg: z.number(),
    sdDeg: nullableNumber,
    fromSec: z.number(),
    toSec: z.number(),
    frameCount: z.number(),
  })
  .nullable();

/** The reply's result: the numbers a page shows (the rest of the stored result passes through). */
export const dynamicResultSchema = z.looseObject({
  kind: z.enum(DYNAMIC_KINDS),
  advancing: windowStatsSchema,
  receding: windowStatsSchema,
  hysteresisDeg: nullableNumber,
  rollOff: z
    .looseObject({ tiltDeg: z.number(), downhillDeg: z.number(), uphillDeg: z.number() })
    .nullable(),
  frameCount: z.number(),
  failedFrameCount: z.number(),
  flaggedFrameCount: z.number(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});

export const savedDynamicSchema = z.object({
  measurementId: z.string(),
  analysisId: z.string(),
  revision: z.number(),
  result: dynamicResultSchema,
});
export type SavedDynamic = {
  measurementId: string;
  analysisId: string;
  revision: number;
  result: MeasurementResult;
};

export const dynamicRevisionSchema = z.object({
  id: z.string(),
  revision: z.number(),
  method: z.string(),
  advancingDeg: nullableNumber,
  recedingDeg: nullableNumber,
  hysteresisDeg: nullableNumber,
  rollOffDeg: nullableNumber,
  frameCount: z.number(),
  reviewStatus: z.enum(ANALYSIS_REVIEW_STATUSES),
  createdAt: timestamp,
});

export const dynamicMeasurementSchema = z.object({
  id: z.string(),
  sampleId: z.string(),
  probeLiquidId: z.string(),
  kind: z.enum(DYNAMIC_KINDS),
  sourceType: z.enum(['video', 'frames']),
  fps: z.number(),
  createdAt: timestamp,
  revisions: z.array(dynamicRevisionSchema),
  /** The latest revision's result and per-frame series. */
  result: dynamicResultSchema,
  series: z.array(z.looseObject({ index: z.number(), tSec: z.number(), meanDeg: nullableNumber })),
});
export type DynamicMeasurementReply = z.output<typeof dynamicMeasurementSchema>;

/** The largest video the server fetches back from the upload service for a re-analysis. */
export const MAX_VIDEO_BYTES = 512 * 1024 * 1024;
