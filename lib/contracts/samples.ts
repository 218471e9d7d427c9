import { z } from 'zod';
import {
  recordReplies,
  emptyToNull,
  filterId,
  id,
  isoDateTime,
  listQuerySchema,
  recordColumns,
  recordId,
  requiredText,
  text,
  timestamp,
  updateSchema,
} from './common';

/** /api/samples and /api/samples/[id]: coated panels, coupons or film pieces of a batch. */

const sampleShape = {
  batchId: recordId('Choose the batch this sample comes from.'),
  label: requiredText(60, 'Enter a sample label, like P-01.'),
  substrate: text(120),
  position: text(120),
  treatedAt: z
    .preprocess(
      emptyToNull,
      isoDateTime(
        'Enter the treatment time as an ISO date and time, like 2026-03-14T09:30:00Z.',
      ).nullable(),
    )
    .optional(),
  notes: text(4000),
};

export const sampleCreateSchema = z.object({
  ...sampleShape,
  substrate: sampleShape.substrate.optional(),
  position: sampleShape.position.optional(),
  notes: sampleShape.notes.optional(),
});
export const sampleUpdateSchema = updateSchema(sampleShape);
export type SampleCreate = z.output<typeof sampleCreateSchema>;
export type SampleUpdate = z.output<typeof sampleUpdateSchema>;

export const sampleListQuerySchema = listQuerySchema({
  sort: ['label', 'treatedAt', 'createdAt', 'updatedAt'],
  defaultSort: 'label',
  defaultDir: 'asc',
  filters: { batchId: filterId('batch'), coatingId: filterId('coating') },
});
export type SampleListQuery = z.output<typeof sampleListQuerySchema>;

export const sampleSchema = z.object({
  ...recordColumns,
  batchId: id,
  label: z.string(),
  substrate: z.string(),
  position: z.string(),
  treatedAt: timestamp.nullable(),
  notes: z.string(),
  createdByUserId: id.nullable(),
});
export type Sample = z.output<typeof sampleSchema>;

/** A sample in a list, with its batch's lot code and coating. */
export const sampleListItemSchema = sampleSchema.extend({
  batchLotCode: z.string(),
  coatingId: id,
});
export type SampleListItem = z.output<typeof sampleListItemSchema>;

/** Drop counts and the mean water angle of a sample (latest revision per drop). */
export const sampleResultsSchema = z.object({
  dropCount: z.number().int(),
  waterDropCount: z.number().int(),
  /** Mean of the latest analysis of each water drop, degrees; null without water drops. */
  meanWaterDeg: z.number().nullable(),
});
export type SampleResults = z.output<typeof sampleResultsSchema>;

/** A sample in the batch page's list and the samples CSV, with its results. */
export const sampleWithResultsSchema = sampleListItemSchema.extend(sampleResultsSchema.shape);
export type SampleWithResults = z.output<typeof sampleWithResultsSchema>;

/** A drop of a batch with its latest analysis, newest measurement first (batch page). */
export const batchDropSchema = z.object({
  dropId: id,
  sampleId: id,
  sampleLabel: z.string(),
  probeLiquidName: z.string(),
  source: z.enum(['photo', 'import']),
  measuredAt: timestamp,
  method: z.string().nullable(),
  leftDeg: z.number().nullable(),
  rightDeg: z.number().nullable(),
  meanDeg: z.number().nullable(),
  revision: z.number().int().nullable(),
});
export type BatchDrop = z.output<typeof batchDropSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const sampleReplies = recordReplies('sample', sampleSchema, sampleListItemSchema);
