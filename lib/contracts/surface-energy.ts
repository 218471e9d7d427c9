import { z } from 'zod';
import { MAX_SURFACE_ENERGY_LIQUIDS, TOO_MANY_LIQUIDS } from './limits';
import {
  SURFACE_ENERGY_METHOD_KEYS,
  UNCERTAINTY_BASES,
  type LiquidAngle,
  type MethodAvailability,
  type SurfaceEnergyOutputs,
} from '@/lib/surface-energy/compute';

/*
 * /api/surface-energy/calculate, /api/samples/[id]/surface-energy and
 * /api/batches/[id]/surface-energy: the request shapes (shared by the page and the route
 * handlers) and the replies. The computation itself is lib/surface-energy/compute.ts.
 */

const tension = (label: string) =>
  z
    .number({ error: `Enter the ${label} in mN/m.` })
    .finite(`Enter the ${label} in mN/m.`)
    .min(0, `The ${label} cannot be negative.`)
    .max(1000, `The ${label} must be at most 1000 mN/m.`);

export const liquidAngleSchema = z.object({
  probeLiquidId: z.string().trim().max(100).optional(),
  name: z.string().trim().min(1, 'Name the liquid.').max(120, 'Use at most 120 characters.'),
  gammaTotal: tension('total surface tension').positive(
    'The total surface tension must be above 0.',
  ),
  gammaDispersive: tension('dispersive component'),
  gammaPolar: tension('polar component'),
  gammaLW: tension('Lifshitz–van der Waals component').optional(),
  gammaPlus: tension('acid component').optional(),
  gammaMinus: tension('base component').optional(),
  angleDeg: z
    .number({ error: 'Enter the mean contact angle in degrees.' })
    .finite('Enter the mean contact angle in degrees.')
    .min(0, 'A contact angle is between 0° and 180°.')
    .max(180, 'A contact angle is between 0° and 180°.'),
  angleSdDeg: z
    .number({ error: 'Enter the standard deviation of the angle in degrees.' })
    .finite('Enter the standard deviation of the angle in degrees.')
    .min(0, 'The standard deviation cannot be negative.')
    .max(90, 'The standard deviation must be at most 90°.')
    .optional(),
  n: z
    .number({ error: 'Enter the number of drops.' })
    .int('The number of drops is a whole number.')
    .min(1, 'At least one drop.')
    .max(10_000, 'At most 10 000 drops.')
    .optional(),
});

const methodsSchema = z
  .array(
    z.enum(SURFACE_ENERGY_METHOD_KEYS, {
      error: `Choose methods among ${SURFACE_ENERGY_METHOD_KEYS.join(', ')}.`,
    }),
  )
  .min(1, 'Choose at least one method.')
  .max(SURFACE_ENERGY_METHOD_KEYS.length)
  .default(['owrk'])
  .transform((methods) => [...new Set(methods)]);

const optionsShape = {
  methods: methodsSchema,
  uncertaintyBasis: z.enum(UNCERTAINTY_BASES).default('mean'),
  /** Contact angle of the wetting envelope, degrees (0 = the liquids that spread completely). */
  envelopeAngleDeg: z
    .number({ error: 'Enter the envelope angle in degrees.' })
    .finite()
    .min(0, 'The envelope angle is between 0° and 179°.')
    .max(179, 'The envelope angle is between 0° and 179°.')
    .default(0),
};

/** POST /api/surface-energy/calculate */
export const surfaceEnergyCalculateSchema = z
  .object({
    liquids: z
      .array(liquidAngleSchema, { error: 'Send the liquids as a list.' })
      .min(1, 'Enter at least one liquid with its angle.')
      .max(MAX_SURFACE_ENERGY_LIQUIDS, TOO_MANY_LIQUIDS),
    ...optionsShape,
  })
  .superRefine((body, ctx) => {
    const seen = new Set<string>();
    body.liquids.forEach((liquid, i) => {
      const key = liquid.name.toLowerCase();
      if (seen.has(key))
        ctx.addIssue({
          code: 'custom',
          path: ['liquids', i, 'name'],
          message: 'This liquid is listed twice; give each liquid once with its mean angle.',
        });
      seen.add(key);
      if (Math.abs(liquid.gammaDispersive + liquid.gammaPolar - liquid.gammaTotal) > 0.5)
        ctx.addIssue({
          code: 'custom',
          path: ['liquids', i, 'gammaTotal'],
          message:
            'Dispersive + polar should equal the total (within 0.5 mN/m). Correct the components.',
        });
    });
  });
export type SurfaceEnergyCalculate = z.output<typeof surfaceEnergyCalculateSchema>;

/** POST /api/samples/[id]/surface-energy; GET takes the same fields as a query (methods=owrk,wu). */
export const sampleSurfaceEnergySchema = z.object(optionsShape);
export type SampleSurfaceEnergyOptions = z.output<typeof sampleSurfaceEnergySchema>;

export const sampleSurfaceEnergyQuerySchema = z.object({
  methods: z
    .string()
    .optional()
    .transform((v) =>
      v
        ? v
            .split(',')
            .map((m) => m.trim())
            .filter(Boolean)
        : undefined,
    )
    .pipe(methodsSchema),
  uncertaintyBasis: z.enum(UNCERTAINTY_BASES).default('mean'),
  envelopeAngleDeg: z.coerce.number().finite().min(0).max(179).default(0),
});

// Replies --------------------------------------------------------------------------------------

/** What a surface energy is computed for: one sample, or all samples of one batch. */
export type SurfaceEnergySubject = { sampleId: string } | { batchId: string };

export const subjectSummarySchema = z.object({
  kind: z.enum(['sample', 'batch']),
  id: z.string(),
  sampleLabel: z.string().nullable(),
  batchId: z.string(),
  lotCode: z.string(),
  coatingId: z.string(),
  coatingCode: z.string(),
  coatingName: z.string(),
  treatedAt: z.coerce.date().nullable(),
  /** Surface-energy limits of the coating's specs (mN/m), if any. */
  surfaceEnergySpecs: z.array(
    z.object({
      id: z.string(),
      min: z.number().nullable(),
      max: z.number().nullable(),
      /** The spec counts only drops measured within this many days of treatment. */
      maxDaysSinceTreatment: z.number().nullable(),
      note: z.string(),
    }),
  ),
});
export type SubjectSummary = z.output<typeof subjectSummarySchema>;

/** One probe liquid measured on the subject: the mean angle of its drops and its components. */
export const angleTableRowSchema = z.object({
  probeLiquidId: z.string(),
  name: z.string(),
  builtIn: z.boolean(),
  meanDeg: z.number(),
  sdDeg: z.number().nullable(),
  n: z.number().int(),
  gammaTotal: z.number(),
  gammaDispersive: z.number().nullable(),
  gammaPolar: z.number().nullable(),
  gammaLW: z.number().nullable(),
  gammaPlus: z.number().nullable(),
  gammaMinus: z.number().nullable(),
  sources: z.record(z.string(), z.string()),
  hazardNote: z.string().nullable(),
  /** Ids of the analyses (latest revision of each drop) the mean is taken from. */
  analysisIds: z.array(z.string()),
});
export type AngleTableRow = z.output<typeof angleTableRowSchema>;

/** What a saved result was computed from. */
export type SurfaceEnergyInputs = {
  subject: { kind: 'sample' | 'batch'; id: string };
  options: SampleSurfaceEnergyOptions;
  /** The angle table exactly as used, components and their sources included. */
  liquids: AngleTableRow[];
  readAll: boolean;
};

export const savedSurfaceEnergyResultSchema = z.object({
  id: z.string(),
  sampleId: z.string().nullable(),
  batchId: z.string().nullable(),
  inputs: z.custom<SurfaceEnergyInputs>(),
  outputs: z.custom<SurfaceEnergyOutputs>(),
  createdByUserId: z.string().nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.coerce.date(),
});
export type SavedSurfaceEnergyResult = z.output<typeof savedSurfaceEnergyResultSchema>;

/** 201 of POST /api/samples/[id]/surface-energy (and the batch's): the result as saved. */
export const surfaceEnergySavedResponseSchema = z.object({
  result: savedSurfaceEnergyResultSchema,
});

/** POST /api/surface-energy/calculate */
export const surfaceEnergyCalculationSchema = z.object({
  availability: z.array(z.custom<MethodAvailability>()),
  outputs: z.custom<SurfaceEnergyOutputs>(),
});
export type SurfaceEnergyCalculation = z.output<typeof surfaceEnergyCalculationSchema>;

/**
 * A surface-energy spec with an age window (days since treatment): the drops that count for it
 * (lib/compare/window.ts, the compare page's rule), as liquids, and what they compute to.
 */
export const specWindowSchema = z.object({
  specId: z.string(),
  maxDaysSinceTreatment: z.number(),
  /** Drops that count, and drops outside the window (or on a sample without a treatment time). */
  counted: z.number().int(),
  excluded: z.number().int(),
  liquids: z.array(liquidAngleSchema),
  outputs: z.custom<SurfaceEnergyOutputs>(),
});
export type SpecWindow = z.output<typeof specWindowSchema>;

/** An evaluation of a sample or batch: its angle table and what it computes to. */
export type SurfaceEnergyEvaluation = SurfaceEnergyCalculation & {
  subject: SubjectSummary;
  angleTable: AngleTableRow[];
  liquids: LiquidAngle[];
  specWindows: SpecWindow[];
  readAll: boolean;
};

/** GET /api/samples/[id]/surface-energy (and the batch's) */
export const surfaceEnergyReplySchema = surfaceEnergyCalculationSchema.extend({
  subject: subjectSummarySchema,
  angleTable: z.array(angleTableRowSchema),
  specWindows: z.array(specWindowSchema),
  readAll: z.boolean(),
  options: sampleSurfaceEnergySchema,
  saved: z.array(savedSurfaceEnergyResultSchema),
});
export type SurfaceEnergyReply = z.output<typeof surfaceEnergyReplySchema>;

/** The page's picker: coatings → batches → samples. */
export const surfaceEnergyChoiceSchema = z.object({
  sampleId: z.string(),
  sampleLabel: z.string(),
  batchId: z.string(),
  lotCode: z.string(),
  coatingId: z.string(),
  coatingCode: z.string(),
  coatingName: z.string(),
});
export type SurfaceEnergyChoice = z.output<typeof surfaceEnergyChoiceSchema>;
