import { z } from 'zod';
import { DEFAULT_SETTINGS, type AnalysisSettings } from '@/lib/analysis/settings';
import { FIT_METHODS, type AnalysisResult, type FitMethod } from '@/lib/analysis/types';
import { ANALYSIS_REVIEW_STATUSES } from './reviews';

/** /api/photos/[id]/drop: save a photo's analysis to a sample, and read its revisions. */

const coordinate = z.number().finite('Coordinates must be numbers.').min(-1e5).max(1e5);

export const baselineSchema = z
  .object({ x1: coordinate, y1: coordinate, x2: coordinate, y2: coordinate })
  .refine(
    (b) => Math.hypot(b.x2 - b.x1, b.y2 - b.y1) >= 2,
    'The baseline ends are on top of each other; drag them apart.',
  );

/** The engine's fit methods (lib/analysis FIT_METHODS) as a tuple for z.enum. */
export const FIT_METHOD_VALUES = [
  'circle',
  'polynomial',
  'ellipse',
  'young-laplace',
  'height-width',
] as const satisfies readonly FitMethod[];
// A method the engine adds must be listed above: this line stops compiling until it is.
const _everyMethod: Exclude<FitMethod, (typeof FIT_METHOD_VALUES)[number]> extends never
  ? true
  : never = true;

/** How an analysis revision was obtained: a fit of the engine, or angles read by hand. */
export const ANALYSIS_METHODS = [...FIT_METHOD_VALUES, 'manual'] as const;
export type AnalysisMethod = (typeof ANALYSIS_METHODS)[number];

/** How each analysis method is named on screen and in documents. */
export const ANALYSIS_METHOD_NAMES: Record<AnalysisMethod, string> = {
  'young-laplace': 'Young–Laplace',
  circle: 'Circle',
  polynomial: 'Polynomial tangent',
  ellipse: 'Ellipse',
  'height-width': 'Height–width',
  manual: 'Read by hand',
};

/** The on-screen name of a stored method; an unknown one is shown as stored. */
export function analysisMethodName(method: string): string {
  return (ANALYSIS_METHOD_NAMES as Record<string, string>)[method] ?? method;
}

export const fitMethodSchema = z.enum(FIT_METHOD_VALUES, {
  error: `Choose a method: ${FIT_METHODS.join(', ')}.`,
});

const settingNumber = z.number().finite('Analysis settings are numbers.');

/**
 * Analysis settings other than the defaults (lib/analysis/settings.ts), each optional: a number,
 * or 'auto' where the default is 'auto'; an unknown name is refused. The declared type is the
 * engine's own, which the shape below is built from.
 */
export const analysisSettingsSchema = z.strictObject(
  Object.fromEntries(
    Object.entries(DEFAULT_SETTINGS).map(([key, fallback]) => [
      key,
      (fallback === 'auto'
        ? z.union([settingNumber, z.literal('auto')], {
            error: `${key} is a number or "auto".`,
          })
        : settingNumber
      ).optional(),
    ]),
  ),
) as unknown as z.ZodType<Partial<AnalysisSettings>>;

/** What the workspace sends to save a photo's analysis to a sample. */
export const saveDropAnalysisSchema = z.object({
  sampleId: z.string().min(1, 'Choose the sample this drop was placed on.'),
  probeLiquidId: z.string().min(1, 'Choose the probe liquid.'),
  sessionId: z.string().min(1).nullable().optional(),
  method: fitMethodSchema,
  /** null: use the automatic baseline. */
  baseline: baselineSchema.nullable(),
  scalePxPerMm: z
    .number()
    .positive('The camera scale must be above 0 px/mm.')
    .max(100_000)
    .nullable()
    .optional(),
  /**
   * The revision this save was based on: the drop's latest when the workspace loaded it, 0 for a
   * photo never saved. A save based on an older one is refused (409 stale_revision).
   */
  expectedRevision: z
    .number({ error: 'Say which revision this save is based on (0 for the first save).' })
    .int()
    .min(0),
  /** Stored with the result (`result.settings`, complete) so the analysis can be reproduced. */
  settings: analysisSettingsSchema.optional(),
});
export type SaveDropAnalysisInput = z.infer<typeof saveDropAnalysisSchema>;

/** The engine's result as kept with an analysis: without the edge points and the profile. */
export type KeptAnalysisResult = Omit<AnalysisResult, 'edgePoints' | 'profile'>;

/** The result of an analysis revision of angles read by hand and imported (method 'manual'). */
export type ManualAnalysisResult = {
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  operator: string;
  note: string;
  /** The row of the import file, as a spreadsheet numbers it. */
  importedRow: number;
};

/** What `analyses.result` holds: the engine's result, or the angles of an imported row. */
export type StoredAnalysisResult = KeptAnalysisResult | ManualAnalysisResult;

/** What `analyses.options` holds besides the method and baseline (empty for an import). */
export type StoredAnalysisOptions = {
  scalePxPerMm?: number | null;
  baselineSource?: 'automatic' | 'given';
  /** The complete settings the engine used (the same as `result.settings`). */
  settings?: AnalysisSettings;
};

/** 201 of POST: the drop, the new revision, and the result the server computed. */
export type SavedDropAnalysis = {
  dropId: string;
  analysisId: string;
  revision: number;
  result: KeptAnalysisResult;
};

export const analysisRevisionSchema = z.object({
  id: z.string(),
  revision: z.number().int(),
  method: z.enum(ANALYSIS_METHODS),
  baseline: z.object({ x1: z.number(), y1: z.number(), x2: z.number(), y2: z.number() }).nullable(),
  leftDeg: z.number(),
  rightDeg: z.number(),
  meanDeg: z.number(),
  leftUncertaintyDeg: z.number().nullable(),
  rightUncertaintyDeg: z.number().nullable(),
  softwareVersion: z.string(),
  reviewStatus: z.enum(ANALYSIS_REVIEW_STATUSES),
  createdAt: z.coerce.date(),
  createdByUserId: z.string().nullable(),
  result: z.custom<StoredAnalysisResult>(),
});
export type AnalysisRevision = z.output<typeof analysisRevisionSchema>;

/** GET: the drop saved from this photo (null when none) with its revisions, newest first. */
export const dropOfPhotoResponseSchema = z.object({
  drop: z
    .object({
      id: z.string(),
      sampleId: z.string(),
      probeLiquidId: z.string(),
      sessionId: z.string().nullable(),
      sampleLabel: z.string(),
      lotCode: z.string(),
      coatingCode: z.string(),
      revisions: z.array(analysisRevisionSchema),
    })
    .nullable(),
});
export type DropOfPhoto = z.output<typeof dropOfPhotoResponseSchema>['drop'];
