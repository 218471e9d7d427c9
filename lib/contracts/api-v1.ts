import { z } from 'zod';
import { batchListItemSchema, batchListQuerySchema, batchSchema } from './batches';
import { coatingListQuerySchema, coatingSchema } from './coatings';
import { filterId, MAX_PAGE_SIZE, toNumber } from './common';
import { analysisRevisionSchema, baselineSchema, fitMethodSchema } from './drops';
import {
  measurementSessionListItemSchema,
  measurementSessionListQuerySchema,
  measurementSessionSchema,
} from './measurement-sessions';
import { probeLiquidListQuerySchema, probeLiquidSchema } from './probe-liquids';
import { reviewListItemSchema, signatureSchema } from './reviews';
import { sampleListItemSchema, sampleListQuerySchema, sampleSchema } from './samples';

/*
 * The contracts of the versioned API (/api/v1): the routes parse with these, and the OpenAPI
 * document (server/api-v1/openapi.ts) is generated from the same schemas.
 */

// ---------------------------------------------------------------------------------------------
// Cursor pagination: `limit` items per page; each page answers `nextCursor` (null on the last),
// sent back as `cursor` for the next page. The cursor is opaque to clients.
// ---------------------------------------------------------------------------------------------

export const DEFAULT_API_LIMIT = 50;
type Position = { offset: number; limit: number };

export function encodeCursor(position: Position): string {
  return Buffer.from(JSON.stringify({ o: position.offset, l: position.limit })).toString(
    'base64url',
  );
}

const BAD_CURSOR = 'The cursor is not valid: send the nextCursor of the previous page unchanged.';

function decodeCursor(cursor: string): Position | null {
  try {
    const value = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')) as unknown;
    const { o, l } = value as { o?: unknown; l?: unknown };
    if (!Number.isInteger(o) || !Number.isInteger(l)) return null;
    if ((o as number) < 0 || (l as number) < 1 || (l as number) > MAX_PAGE_SIZE) return null;
    return { offset: o as number, limit: l as number };
  } catch {
    return null;
  }
}

const limitMessage = `Use a limit from 1 to ${MAX_PAGE_SIZE}.`;

/** `cursor` and `limit`; the page's position (from the cursor when one is sent). */
export const cursorQueryShape = {
  cursor: z.string().max(200, BAD_CURSOR).optional().meta({
    description: 'The nextCursor of the previous page; leave out for the first page.',
  }),
  limit: z
    .preprocess(
      toNumber,
      z
        .number({ error: limitMessage })
        .int(limitMessage)
        .min(1, limitMessage)
        .max(MAX_PAGE_SIZE, limitMessage),
    )
    .optional()
    .meta({ description: `Items per page, 1 to ${MAX_PAGE_SIZE} (default ${DEFAULT_API_LIMIT}).` }),
};

/** Where a page starts, from `cursor` and `limit` (the cursor's limit wins). */
export function pagePosition(query: { cursor?: string; limit?: number }): Position {
  if (query.cursor === undefined) return { offset: 0, limit: query.limit ?? DEFAULT_API_LIMIT };
  const position = decodeCursor(query.cursor);
  if (!position) {
    throw new z.ZodError([
      { code: 'custom', message: BAD_CURSOR, path: ['cursor'], input: query.cursor },
    ]);
  }
  return position;
}

/** A list query of the web API without its page numbers, with a cursor instead. */
function recordListQuery<S extends z.ZodObject>(schema: S) {
  return schema.omit({ page: true, pageSize: true } as never).extend(cursorQueryShape);
}

export function cursorPageSchema<Item extends z.ZodType>(item: Item) {
  return z.object({
    items: z.array(item),
    nextCursor: z
      .string()
      .nullable()
      .meta({ description: 'Send as cursor for the next page; null on the last page.' }),
  });
}
export type CursorPage<T> = { items: T[]; nextCursor: string | null };

// ---------------------------------------------------------------------------------------------
// Lab records: coatings, batches, samples, probe liquids, measurement sessions.
// ---------------------------------------------------------------------------------------------

export const v1CoatingListQuerySchema = recordListQuery(coatingListQuerySchema);
export const v1BatchListQuerySchema = recordListQuery(batchListQuerySchema);
export const v1SampleListQuerySchema = recordListQuery(sampleListQuerySchema);
export const v1ProbeLiquidListQuerySchema = recordListQuery(probeLiquidListQuerySchema);
export const v1SessionListQuerySchema = recordListQuery(measurementSessionListQuerySchema);

export const v1Records = {
  coating: { one: coatingSchema, item: coatingSchema },
  batch: { one: batchSchema, item: batchListItemSchema },
  sample: { one: sampleSchema, item: sampleListItemSchema },
  probeLiquid: { one: probeLiquidSchema, item: probeLiquidSchema },
  measurementSession: { one: measurementSessionSchema, item: measurementSessionListItemSchema },
};

// ---------------------------------------------------------------------------------------------
// Drops with their analyses, reviews, verdicts.
// ---------------------------------------------------------------------------------------------

export const v1DropListQuerySchema = z.object({
  sampleId: filterId('sample'),
  batchId: filterId('batch'),
  probeLiquidId: filterId('probe liquid'),
  sessionId: filterId('session'),
  ...cursorQueryShape,
});
export type V1DropListQuery = z.output<typeof v1DropListQuerySchema>;

export const v1DropSchema = z.object({
  id: z.string(),
  sampleId: z.string(),
  probeLiquidId: z.string(),
  sessionId: z.string().nullable(),
  photoId: z.string().nullable(),
  source: z.string(),
  sampleLabel: z.string(),
  batchId: z.string(),
  lotCode: z.string(),
  coatingCode: z.string(),
  createdAt: z.coerce.date(),
  /** The latest revision; null when it was not saved yet. */
  latestAnalysis: analysisRevisionSchema.omit({ result: true }).nullable(),
});
export type V1Drop = z.output<typeof v1DropSchema>;

export const v1DropDetailSchema = v1DropSchema.extend({
  revisions: z.array(analysisRevisionSchema.extend({ result: z.record(z.string(), z.unknown()) })),
});

export const v1ReviewListQuerySchema = z.object({
  status: z.enum(['submitted', 'decided']).optional(),
  ...cursorQueryShape,
});

export const v1ReviewSchema = reviewListItemSchema.extend({
  batchId: z.string(),
  sampleId: z.string().nullable(),
  signature: signatureSchema.nullable(),
});

export const BATCH_OUTCOMES = ['pass', 'fail', 'not-enough-data', 'no-spec'] as const;
export const v1VerdictSchema = z.object({
  batchId: z.string(),
  /** null when the batch has not been judged yet (no result saved since verdicts were kept). */
  outcome: z.enum(BATCH_OUTCOMES).nullable(),
});

// ---------------------------------------------------------------------------------------------
// Posting a photo: multipart with the file in `photo` and these text fields.
// ---------------------------------------------------------------------------------------------

/** A text field holding JSON (a multipart part), parsed and then checked by `schema`. */
const jsonText = <S extends z.ZodType>(schema: S, message: string) =>
  z
    .string({ error: message })
    .transform((value, ctx) => {
      try {
        return JSON.parse(value) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message });
        return z.NEVER;
      }
    })
    .pipe(schema);

export const v1PhotoFieldsSchema = z.object({
  sampleId: z.string().trim().min(1, 'Name the sample the drop was placed on (sampleId).'),
  probeLiquidId: z.string().trim().min(1, 'Name the probe liquid (probeLiquidId).'),
  sessionId: z.string().trim().min(1).optional(),
  method: fitMethodSchema,
  baseline: jsonText(
    baselineSchema,
    'The baseline is JSON {"x1":…,"y1":…,"x2":…,"y2":…} in image pixels; leave it out for the automatic baseline.',
  )
    .optional()
    .meta({ description: 'JSON {"x1","y1","x2","y2"} in image pixels; automatic when left out.' }),
});
export type V1PhotoFields = z.output<typeof v1PhotoFieldsSchema>;

export const v1PhotoResultSchema = z.object({
  photoId: z.string(),
  dropId: z.string(),
  analysisId: z.string(),
  revision: z.number().int(),
  result: z.record(z.string(), z.unknown()).meta({
    description: 'The engine’s result: leftDeg, rightDeg, meanDeg, uncertainties, warnings, fit.',
  }),
});
