import { z } from 'zod';
import {
  recordReplies,
  filterId,
  given,
  id,
  listQuerySchema,
  optionalNumber,
  recordColumns,
  recordId,
  report,
  text,
  throwIssues,
  updateSchema,
  type Issue,
} from './common';

/** /api/specs and /api/specs/[id]: acceptance limits of a coating for one probe liquid. */

export const SPEC_SCOPES = ['each-drop', 'mean'] as const;

const angle = (which: string) =>
  optionalNumber({
    min: 0,
    max: 180,
    message: `Enter the ${which} contact angle in degrees, from 0 to 180.`,
  });
const surfaceEnergy = (which: string) =>
  optionalNumber({
    min: 0,
    max: 200,
    minExclusive: true,
    message: `Enter the ${which} surface free energy in mN/m, above 0 and up to 200.`,
  });

const specShape = {
  coatingId: recordId('Choose the coating this spec belongs to.'),
  probeLiquidId: recordId('Choose the probe liquid, like water.'),
  minDeg: angle('minimum'),
  maxDeg: angle('maximum'),
  scope: z.enum(SPEC_SCOPES, {
    error: 'Choose whether the limits apply to each drop ("each-drop") or to the mean ("mean").',
  }),
  minSurfaceEnergyMnM: surfaceEnergy('minimum'),
  maxSurfaceEnergyMnM: surfaceEnergy('maximum'),
  minAdvancingDeg: angle('minimum advancing'),
  maxAdvancingDeg: angle('maximum advancing'),
  minRecedingDeg: angle('minimum receding'),
  maxRecedingDeg: angle('maximum receding'),
  minHysteresisDeg: angle('minimum hysteresis'),
  maxHysteresisDeg: angle('maximum hysteresis'),
  minRollOffDeg: optionalNumber({
    min: 0,
    max: 90,
    message: 'Enter the minimum roll-off angle in degrees of tilt, from 0 to 90.',
  }),
  maxRollOffDeg: optionalNumber({
    min: 0,
    max: 90,
    message: 'Enter the maximum roll-off angle in degrees of tilt, from 0 to 90.',
  }),
  maxDaysSinceTreatment: optionalNumber({
    min: 0,
    max: 3650,
    minExclusive: true,
    message:
      'Enter the number of days after treatment within which results count (above 0, up to 3650).',
  }),
  note: text(2000),
};

export type SpecLimits = {
  minDeg?: number | null;
  maxDeg?: number | null;
  minSurfaceEnergyMnM?: number | null;
  maxSurfaceEnergyMnM?: number | null;
} & DynamicLimitValues;

/** The dynamic-wetting limits of a spec (°), each optional. */
export type DynamicLimitValues = { [K in (typeof DYNAMIC_LIMITS)[number][1 | 2]]?: number | null };

/** The dynamic-wetting limit pairs of a spec: what each limits, its minimum and its maximum. */
export const DYNAMIC_LIMITS = [
  ['advancing angle', 'minAdvancingDeg', 'maxAdvancingDeg'],
  ['receding angle', 'minRecedingDeg', 'maxRecedingDeg'],
  ['hysteresis', 'minHysteresisDeg', 'maxHysteresisDeg'],
  ['roll-off angle', 'minRollOffDeg', 'maxRollOffDeg'],
] as const;

/** Cross-field rules of a spec: at least one limit, and each minimum at most its maximum. */
export function specLimitIssues(spec: SpecLimits): Issue[] {
  const issues: Issue[] = [];
  const { minDeg, maxDeg, minSurfaceEnergyMnM: minSfe, maxSurfaceEnergyMnM: maxSfe } = spec;
  const dynamic = DYNAMIC_LIMITS.flatMap(([, min, max]) => [spec[min], spec[max]]);
  if (![minDeg, maxDeg, minSfe, maxSfe, ...dynamic].some(given)) {
    issues.push({
      path: 'minDeg',
      message:
        'Enter at least one limit: a minimum or maximum contact angle, a surface-energy limit, or a dynamic-wetting limit.',
    });
  }
  for (const [name, minKey, maxKey] of DYNAMIC_LIMITS) {
    const min = spec[minKey];
    const max = spec[maxKey];
    if (given(min) && given(max) && min > max)
      issues.push({ path: maxKey, message: `Make the maximum ${name} at least the minimum.` });
  }
  if (given(minDeg) && given(maxDeg) && minDeg > maxDeg) {
    issues.push({ path: 'maxDeg', message: 'Make the maximum angle at least the minimum angle.' });
  }
  if (given(minSfe) && given(maxSfe) && minSfe > maxSfe) {
    issues.push({
      path: 'maxSurfaceEnergyMnM',
      message: 'Make the maximum surface energy at least the minimum surface energy.',
    });
  }
  return issues;
}

/** Re-checks a spec after an update is merged into the stored record. */
export function checkSpecLimits(spec: SpecLimits): void {
  throwIssues(specLimitIssues(spec));
}

export const specCreateSchema = z
  .object({ ...specShape, note: specShape.note.optional() })
  .superRefine((spec, ctx) => report(ctx, specLimitIssues(spec)));

export const specUpdateSchema = updateSchema(specShape).superRefine((spec, ctx) => {
  // Only the pairs present in the body; the merged record is checked by the records service.
  const issues = specLimitIssues(spec).filter((issue) => issue.path !== 'minDeg');
  report(ctx, issues);
});
export type SpecCreate = z.output<typeof specCreateSchema>;
export type SpecUpdate = z.output<typeof specUpdateSchema>;

export const specListQuerySchema = listQuerySchema({
  sort: ['createdAt', 'updatedAt', 'minDeg', 'maxDeg', 'scope'],
  defaultSort: 'createdAt',
  defaultDir: 'asc',
  filters: { coatingId: filterId('coating'), probeLiquidId: filterId('probe liquid') },
});
export type SpecListQuery = z.output<typeof specListQuerySchema>;

export const specSchema = z.object({
  ...recordColumns,
  coatingId: id,
  probeLiquidId: id,
  minDeg: z.number().nullable(),
  maxDeg: z.number().nullable(),
  scope: z.enum(SPEC_SCOPES),
  minSurfaceEnergyMnM: z.number().nullable(),
  maxSurfaceEnergyMnM: z.number().nullable(),
  minAdvancingDeg: z.number().nullable(),
  maxAdvancingDeg: z.number().nullable(),
  minRecedingDeg: z.number().nullable(),
  maxRecedingDeg: z.number().nullable(),
  minHysteresisDeg: z.number().nullable(),
  maxHysteresisDeg: z.number().nullable(),
  minRollOffDeg: z.number().nullable(),
  maxRollOffDeg: z.number().nullable(),
  maxDaysSinceTreatment: z.number().nullable(),
  note: z.string(),
});
export type Spec = z.output<typeof specSchema>;

/** A spec in a list, with its coating's code and its probe liquid's name. */
export const specListItemSchema = specSchema.extend({
  coatingCode: z.string(),
  probeLiquidName: z.string(),
});
export type SpecListItem = z.output<typeof specListItemSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const specReplies = recordReplies('spec', specSchema, specListItemSchema);
