import { z } from 'zod';
import {
  recordReplies,
  emptyToNull,
  given,
  id,
  listQuerySchema,
  optionalNumber,
  recordColumns,
  report,
  requiredNumber,
  requiredText,
  text,
  throwIssues,
  updateSchema,
  type Issue,
} from './common';

/**
 * /api/probe-liquids and /api/probe-liquids/[id]: the built-in library (read-only) and each
 * organization's own liquids, with surface tension components in mN/m.
 */

/** The values of a probe liquid that can each name their source. */
export const PROBE_LIQUID_VALUES = [
  'total',
  'dispersive',
  'polar',
  'lifshitzVanDerWaals',
  'acid',
  'base',
  'density',
] as const;

/** Components may differ from their sum by this much (rounding in published tables), mN/m. */
export const COMPONENT_SUM_TOLERANCE_MNM = 0.5;

const component = (what: string) =>
  optionalNumber({ min: 0, max: 200, message: `Enter the ${what} in mN/m, from 0 to 200.` });

const probeLiquidShape = {
  name: requiredText(80, 'Enter the liquid’s name, like "Water (lab supply)".'),
  totalMnM: requiredNumber({
    min: 0,
    max: 200,
    minExclusive: true,
    message: 'Enter the total surface tension in mN/m, above 0 and up to 200 (water: 72.8).',
  }),
  dispersiveMnM: component('dispersive component'),
  polarMnM: component('polar component'),
  lifshitzVanDerWaalsMnM: component('Lifshitz–van der Waals component'),
  acidMnM: component('acid (electron-acceptor) component'),
  baseMnM: component('base (electron-donor) component'),
  densityGPerCm3: optionalNumber({
    min: 0,
    max: 25,
    minExclusive: true,
    message: 'Enter the density in g/cm³, above 0 and up to 25 (water: 0.998).',
  }),
  sources: z.partialRecord(
    z.enum(PROBE_LIQUID_VALUES, {
      error: `Name sources only for these values: ${PROBE_LIQUID_VALUES.join(', ')}.`,
    }),
    z
      .string({ error: 'Enter where the value comes from, like a paper or a data sheet.' })
      .trim()
      .min(1, 'Enter where the value comes from, or leave the source out.')
      .max(300, 'Keep each source to 300 characters or fewer.'),
    {
      error: (issue) =>
        issue.code === 'invalid_type'
          ? 'Enter the sources as { value: "where it comes from" }.'
          : `Name sources only for these values: ${PROBE_LIQUID_VALUES.join(', ')}.`,
    },
  ),
  hazardNote: z.preprocess(emptyToNull, text(1000).nullable()).optional(),
};

export type ProbeLiquidComponents = {
  totalMnM: number;
  dispersiveMnM?: number | null;
  polarMnM?: number | null;
  lifshitzVanDerWaalsMnM?: number | null;
  acidMnM?: number | null;
  baseMnM?: number | null;
};

const round = (value: number) => Math.round(value * 100) / 100;

/**
 * Cross-field rules of a probe liquid: dispersive + polar = total, and (van Oss–Chaudhury–Good)
 * γLW + 2√(γ+γ−) = total, each within COMPONENT_SUM_TOLERANCE_MNM when all parts are given.
 */
export function probeLiquidComponentIssues(liquid: ProbeLiquidComponents): Issue[] {
  const issues: Issue[] = [];
  const { totalMnM, dispersiveMnM: d, polarMnM: p } = liquid;
  const { lifshitzVanDerWaalsMnM: lw, acidMnM: acid, baseMnM: base } = liquid;
  if (given(d) && d > totalMnM + COMPONENT_SUM_TOLERANCE_MNM) {
    issues.push({
      path: 'dispersiveMnM',
      message: 'Make the dispersive component at most the total.',
    });
  }
  if (given(p) && p > totalMnM + COMPONENT_SUM_TOLERANCE_MNM) {
    issues.push({ path: 'polarMnM', message: 'Make the polar component at most the total.' });
  }
  if (given(d) && given(p) && Math.abs(d + p - totalMnM) > COMPONENT_SUM_TOLERANCE_MNM) {
    issues.push({
      path: 'polarMnM',
      message: `Make dispersive + polar add up to the total (${totalMnM} mN/m) within ${COMPONENT_SUM_TOLERANCE_MNM} mN/m; they add up to ${round(d + p)}.`,
    });
  }
  if (given(lw) && given(acid) && given(base)) {
    const sum = lw + 2 * Math.sqrt(acid * base);
    if (Math.abs(sum - totalMnM) > COMPONENT_SUM_TOLERANCE_MNM) {
      issues.push({
        path: 'lifshitzVanDerWaalsMnM',
        message: `Make LW + 2√(acid × base) add up to the total (${totalMnM} mN/m) within ${COMPONENT_SUM_TOLERANCE_MNM} mN/m; it comes to ${round(sum)}.`,
      });
    }
  }
  return issues;
}

/** Re-checks a probe liquid after an update is merged into the stored record. */
export function checkProbeLiquidComponents(liquid: ProbeLiquidComponents): void {
  throwIssues(probeLiquidComponentIssues(liquid));
}

export const probeLiquidCreateSchema = z
  .object({ ...probeLiquidShape, sources: probeLiquidShape.sources.optional() })
  .superRefine((liquid, ctx) => report(ctx, probeLiquidComponentIssues(liquid)));

export const probeLiquidUpdateSchema = updateSchema(probeLiquidShape).superRefine((liquid, ctx) => {
  if (given(liquid.totalMnM))
    report(ctx, probeLiquidComponentIssues({ ...liquid, totalMnM: liquid.totalMnM }));
});
export type ProbeLiquidCreate = z.output<typeof probeLiquidCreateSchema>;
export type ProbeLiquidUpdate = z.output<typeof probeLiquidUpdateSchema>;

export const PROBE_LIQUID_ORIGINS = ['all', 'built-in', 'own'] as const;

export const probeLiquidListQuerySchema = listQuerySchema({
  sort: ['name', 'totalMnM', 'createdAt'],
  defaultSort: 'name',
  defaultDir: 'asc',
  filters: {
    origin: z
      .enum(PROBE_LIQUID_ORIGINS, { error: 'Show all, built-in or own liquids.' })
      .default('all'),
  },
});
export type ProbeLiquidListQuery = z.output<typeof probeLiquidListQuerySchema>;

/** A probe liquid as the API returns it; `builtIn` marks the read-only library entries. */
export const probeLiquidSchema = z.object({
  ...recordColumns,
  /** null for the built-in library. */
  organizationId: id.nullable(),
  name: z.string(),
  totalMnM: z.number(),
  dispersiveMnM: z.number().nullable(),
  polarMnM: z.number().nullable(),
  lifshitzVanDerWaalsMnM: z.number().nullable(),
  acidMnM: z.number().nullable(),
  baseMnM: z.number().nullable(),
  densityGPerCm3: z.number().nullable(),
  sources: z.record(z.string(), z.string()),
  hazardNote: z.string().nullable(),
  builtIn: z.boolean(),
});
export type ProbeLiquid = z.output<typeof probeLiquidSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const probeLiquidReplies = recordReplies(
  'probeLiquid',
  probeLiquidSchema,
  probeLiquidSchema,
);
