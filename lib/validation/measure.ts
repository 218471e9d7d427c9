import { z } from 'zod';
import { FIT_METHODS } from '@/lib/analysis/types';

const coordinate = z.number().finite('Coordinates must be numbers.').min(-1e5).max(1e5);

export const baselineSchema = z.object({ x1: coordinate, y1: coordinate, x2: coordinate, y2: coordinate }).refine(
  (b) => Math.hypot(b.x2 - b.x1, b.y2 - b.y1) >= 2,
  'The baseline ends are on top of each other; drag them apart.',
);

export const fitMethodSchema = z.enum(FIT_METHODS as unknown as [string, ...string[]], {
  error: `Choose a method: ${FIT_METHODS.join(', ')}.`,
});

/** What the workspace sends to save a photo's analysis to a sample. */
export const saveDropAnalysisSchema = z.object({
  sampleId: z.string().min(1, 'Choose the sample this drop was placed on.'),
  probeLiquidId: z.string().min(1, 'Choose the probe liquid.'),
  sessionId: z.string().min(1).nullable().optional(),
  method: fitMethodSchema,
  /** null: use the automatic baseline. */
  baseline: baselineSchema.nullable(),
  scalePxPerMm: z.number().positive('The camera scale must be above 0 px/mm.').max(100_000).nullable().optional(),
  /** Analysis settings other than the defaults (lib/analysis/settings.ts); stored with the result. */
  settings: z
    .record(z.string(), z.union([z.number().finite(), z.literal('auto')]), {
      error: 'Analysis settings are numbers (or "auto" where the default is).',
    })
    .optional(),
});

export type SaveDropAnalysisInput = z.infer<typeof saveDropAnalysisSchema>;
