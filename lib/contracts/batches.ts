import { z } from 'zod';
import {
  codeText,
  recordReplies,
  filterId,
  id,
  isoDate,
  listQuerySchema,
  rangedNumber,
  recordColumns,
  recordId,
  text,
  toNumber,
  updateSchema,
} from './common';

/** /api/batches and /api/batches/[id]: production or trial lots of a coating. */

/** Typed process parameters of a batch (db/schema.ts ProcessParameters), with units and ranges. */
export const PROCESS_PARAMETERS = {
  cureTemperatureC: { label: 'Cure temperature', unit: '°C', min: -40, max: 450 },
  cureTimeMin: { label: 'Cure time', unit: 'min', min: 0, max: 10_080 },
  lineSpeedMPerMin: { label: 'Line speed', unit: 'm/min', min: 0, max: 2_000 },
  plasmaDoseWMinPerM2: { label: 'Plasma dose', unit: 'W·min/m²', min: 0, max: 10_000 },
  coatWeightGPerM2: { label: 'Coat weight', unit: 'g/m²', min: 0, max: 2_000 },
} as const;
export type ProcessParameterKey = keyof typeof PROCESS_PARAMETERS;

function processParameter(key: ProcessParameterKey) {
  const { label, unit, min, max } = PROCESS_PARAMETERS[key];
  // An empty box ('' → undefined) means the parameter was not recorded.
  return z
    .preprocess(
      toNumber,
      rangedNumber({
        min,
        max,
        message: `Enter the ${label.toLowerCase()} in ${unit}, from ${min} to ${max}.`,
      }).optional(),
    )
    .optional();
}

export const processParametersSchema = z.strictObject(
  {
    cureTemperatureC: processParameter('cureTemperatureC'),
    cureTimeMin: processParameter('cureTimeMin'),
    lineSpeedMPerMin: processParameter('lineSpeedMPerMin'),
    plasmaDoseWMinPerM2: processParameter('plasmaDoseWMinPerM2'),
    coatWeightGPerM2: processParameter('coatWeightGPerM2'),
  },
  {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? `Use only these process parameters: ${Object.keys(PROCESS_PARAMETERS).join(', ')}.`
        : 'Enter the process parameters as named numbers.',
  },
);
export type ProcessParameters = Partial<Record<ProcessParameterKey, number>>;

const batchShape = {
  coatingId: recordId('Choose the coating this batch was made of.'),
  lotCode: codeText(
    40,
    'Enter a lot code, like B-0412.',
    'Keep the lot code to 40 characters or fewer.',
    'Use letters, digits, spaces and . _ / - in the lot code, like B-0412.',
  ),
  producedOn: isoDate('Enter the production date as YYYY-MM-DD, like 2026-03-14.'),
  process: processParametersSchema,
  notes: text(4000),
};

export const batchCreateSchema = z.object({
  ...batchShape,
  process: batchShape.process.optional(),
  notes: batchShape.notes.optional(),
});
export const batchUpdateSchema = updateSchema(batchShape);
export type BatchCreate = z.output<typeof batchCreateSchema>;
export type BatchUpdate = z.output<typeof batchUpdateSchema>;

export const batchListQuerySchema = listQuerySchema({
  sort: ['producedOn', 'lotCode', 'createdAt', 'updatedAt'],
  defaultSort: 'producedOn',
  defaultDir: 'desc',
  filters: {
    coatingId: filterId('coating'),
    producedFrom: isoDate('Enter the first production date as YYYY-MM-DD.').optional(),
    producedTo: isoDate('Enter the last production date as YYYY-MM-DD.').optional(),
  },
});
export type BatchListQuery = z.output<typeof batchListQuerySchema>;

export const batchSchema = z.object({
  ...recordColumns,
  coatingId: id,
  lotCode: z.string(),
  /** YYYY-MM-DD. */
  producedOn: z.string(),
  process: z.object({
    cureTemperatureC: z.number().optional(),
    cureTimeMin: z.number().optional(),
    lineSpeedMPerMin: z.number().optional(),
    plasmaDoseWMinPerM2: z.number().optional(),
    coatWeightGPerM2: z.number().optional(),
  }),
  notes: z.string(),
  createdByUserId: id.nullable(),
});
export type Batch = z.output<typeof batchSchema>;

/** A batch in a list, with its coating's code and name. */
export const batchListItemSchema = batchSchema.extend({
  coatingCode: z.string(),
  coatingName: z.string(),
});
export type BatchListItem = z.output<typeof batchListItemSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const batchReplies = recordReplies('batch', batchSchema, batchListItemSchema);
