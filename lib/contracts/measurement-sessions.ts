import { z } from 'zod';
import {
  recordReplies,
  filterId,
  id,
  isoDate,
  isoDateTime,
  listQuerySchema,
  optionalNumber,
  optionalRecordId,
  recordColumns,
  requiredNumber,
  requiredText,
  text,
  timestamp,
  updateSchema,
} from './common';

/** /api/measurement-sessions and /api/measurement-sessions/[id]: sittings at the instrument. */

const measurementSessionShape = {
  operatorName: requiredText(120, 'Enter the operator’s name.'),
  measuredAt: isoDateTime(
    'Enter when the session took place as an ISO date and time, like 2026-03-14T09:30:00Z.',
  ),
  probeLiquidId: optionalRecordId('Choose a probe liquid, or leave it empty.'),
  temperatureC: requiredNumber({
    min: 5,
    max: 60,
    message: 'Enter the room temperature in °C, from 5 to 60.',
  }),
  humidityPct: requiredNumber({
    min: 0,
    max: 100,
    message: 'Enter the relative humidity in %, from 0 to 100.',
  }),
  dropVolumeUl: requiredNumber({
    min: 0.1,
    max: 50,
    message: 'Enter the drop volume in µL, from 0.1 to 50.',
  }),
  // Optional: without a scale, sizes stay in pixels (no µL or mm²).
  scalePxPerMm: optionalNumber({
    min: 0,
    max: 100_000,
    minExclusive: true,
    message:
      'Enter the camera scale in pixels per mm, above 0 (from the calibration target or the needle), or leave it empty.',
  }),
  instrumentNotes: text(4000),
  liquidLot: text(200),
};

export const measurementSessionCreateSchema = z.object({
  ...measurementSessionShape,
  instrumentNotes: measurementSessionShape.instrumentNotes.optional(),
  liquidLot: measurementSessionShape.liquidLot.optional(),
});
export const measurementSessionUpdateSchema = updateSchema(measurementSessionShape);
export type MeasurementSessionCreate = z.output<typeof measurementSessionCreateSchema>;
export type MeasurementSessionUpdate = z.output<typeof measurementSessionUpdateSchema>;

export const measurementSessionListQuerySchema = listQuerySchema({
  sort: ['measuredAt', 'operatorName', 'createdAt'],
  defaultSort: 'measuredAt',
  defaultDir: 'desc',
  filters: {
    probeLiquidId: filterId('probe liquid'),
    measuredFrom: isoDate('Enter the first date as YYYY-MM-DD.').optional(),
    measuredTo: isoDate('Enter the last date as YYYY-MM-DD.').optional(),
  },
});
export type MeasurementSessionListQuery = z.output<typeof measurementSessionListQuerySchema>;

export const measurementSessionSchema = z.object({
  ...recordColumns,
  operatorName: z.string(),
  measuredAt: timestamp,
  probeLiquidId: id.nullable(),
  temperatureC: z.number().nullable(),
  humidityPct: z.number().nullable(),
  dropVolumeUl: z.number().nullable(),
  scalePxPerMm: z.number().nullable(),
  instrumentNotes: z.string(),
  liquidLot: z.string(),
  createdByUserId: id.nullable(),
});
export type MeasurementSession = z.output<typeof measurementSessionSchema>;

/** A session in a list, with its probe liquid's name (null when none was set). */
export const measurementSessionListItemSchema = measurementSessionSchema.extend({
  probeLiquidName: z.string().nullable(),
});
export type MeasurementSessionListItem = z.output<typeof measurementSessionListItemSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const measurementSessionReplies = recordReplies(
  'measurementSession',
  measurementSessionSchema,
  measurementSessionListItemSchema,
);
