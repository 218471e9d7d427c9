import { z } from 'zod';
import { HttpError } from '@/lib/api/errors';

/*
 * Lab records: the zod schemas shared by forms, route handlers and server actions.
 *
 * Create schemas describe a whole record. Update schemas carry `version` (optimistic
 * concurrency) and any subset of the fields: a field left out stays as it is, `null` clears an
 * optional value. Rules that span fields (min ≤ max, components adding up) are checked here on
 * what the body holds, and again by db/queries on the merged record (`check*` below).
 *
 * Form values arrive as strings; numeric fields accept numbers or numeric text, and an empty
 * text box means "not given". No field has a zod default: a default inside an optional field
 * would overwrite the stored value on a partial update, so defaults are applied on create.
 */

// ---------------------------------------------------------------------------------------------
// Building blocks
// ---------------------------------------------------------------------------------------------

/**
 * '' and whitespace → undefined; numeric text → number (NaN, refused with the field's message,
 * for anything else, including a decimal comma, which could as well be a thousands separator).
 */
function toNumber(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  const text = value.trim();
  if (text === '') return undefined;
  return Number(text);
}

/** Like toNumber, but an empty box means "clear this value" (null). */
function toNullableNumber(value: unknown): unknown {
  if (typeof value === 'string' && value.trim() === '') return null;
  return toNumber(value);
}

type NumberRange = { min: number; max: number; minExclusive?: boolean; message: string };

function rangedNumber({ min, max, minExclusive, message }: NumberRange) {
  const base = z.number({ error: message });
  return (minExclusive ? base.gt(min, message) : base.gte(min, message)).lte(max, message);
}

/** A required number in a range; `message` says what to enter. */
export function requiredNumber(range: NumberRange) {
  return z.preprocess(toNumber, rangedNumber(range));
}

/** An optional number in a range: absent → unchanged/none, null or '' → none. */
export function optionalNumber(range: NumberRange) {
  return z.preprocess(toNullableNumber, rangedNumber(range).nullable()).optional();
}

function text(max: number, tooLong = `Use at most ${max} characters.`) {
  return z.string({ error: 'Enter this as text.' }).trim().max(max, tooLong);
}

function requiredText(max: number, missing: string) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(max, `Use at most ${max} characters.`);
}

function recordId(missing: string) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(64, 'That identifier is too long.');
}

function optionalRecordId(message: string) {
  return z
    .preprocess(
      (value) => (typeof value === 'string' && value.trim() === '' ? null : value),
      z
        .string({ error: message })
        .trim()
        .min(1, message)
        .max(64, 'That identifier is too long.')
        .nullable(),
    )
    .optional();
}

const isoDate = (message: string) => z.iso.date({ error: message });
const isoDateTime = (message: string) => z.iso.datetime({ offset: true, error: message });

const versionField = z
  .number({ error: 'Reload the record and try again: its version is missing.' })
  .int('Reload the record and try again: its version is not valid.')
  .min(1, 'Reload the record and try again: its version is not valid.');

/** An update body: any subset of the fields, plus the version the editor started from. */
function updateSchema<Shape extends z.ZodRawShape>(shape: Shape) {
  return z.object(shape).partial().extend({ version: versionField });
}

type Issue = { path: string; message: string };
type IssueSink = { addIssue: (issue: { code: 'custom'; message: string; path: string[] }) => void };

function report(ctx: IssueSink, issues: Issue[]) {
  for (const issue of issues)
    ctx.addIssue({ code: 'custom', message: issue.message, path: [issue.path] });
}

/** Throws the ZodError a failed parse would, so route handlers answer 400 with the fields. */
function throwIssues(issues: Issue[]): void {
  if (issues.length === 0) return;
  throw new z.ZodError(
    issues.map((issue) => ({
      code: 'custom' as const,
      message: issue.message,
      path: [issue.path],
      input: undefined,
    })),
  );
}

const given = (value: number | null | undefined): value is number => typeof value === 'number';

// ---------------------------------------------------------------------------------------------
// Coatings
// ---------------------------------------------------------------------------------------------

const coatingShape = {
  code: z
    .string({ error: 'Enter a coating code, like HT-200.' })
    .trim()
    .min(1, 'Enter a coating code, like HT-200.')
    .max(32, 'Keep the coating code to 32 characters or fewer.')
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/,
      'Use letters, digits, spaces and . _ / - in the coating code, starting with a letter or digit.',
    ),
  name: requiredText(120, 'Enter the coating name, like "Hydrophobic topcoat".'),
  description: text(2000),
};

export const coatingCreateSchema = z.object({
  ...coatingShape,
  description: coatingShape.description.optional(),
});
export const coatingUpdateSchema = updateSchema(coatingShape);
export type CoatingCreate = z.output<typeof coatingCreateSchema>;
export type CoatingUpdate = z.output<typeof coatingUpdateSchema>;

// ---------------------------------------------------------------------------------------------
// Specs
// ---------------------------------------------------------------------------------------------

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
};

/** Cross-field rules of a spec: at least one limit, and each minimum at most its maximum. */
export function specLimitIssues(spec: SpecLimits): Issue[] {
  const issues: Issue[] = [];
  const { minDeg, maxDeg, minSurfaceEnergyMnM: minSfe, maxSurfaceEnergyMnM: maxSfe } = spec;
  if (![minDeg, maxDeg, minSfe, maxSfe].some(given)) {
    issues.push({
      path: 'minDeg',
      message:
        'Enter at least one limit: a minimum or maximum contact angle, or a surface-energy limit.',
    });
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
  // Only the pairs present in the body; the merged record is checked by db/queries.
  const issues = specLimitIssues(spec).filter((issue) => issue.path !== 'minDeg');
  report(ctx, issues);
});
export type SpecCreate = z.output<typeof specCreateSchema>;
export type SpecUpdate = z.output<typeof specUpdateSchema>;

// ---------------------------------------------------------------------------------------------
// Batches
// ---------------------------------------------------------------------------------------------

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

const lotCodeMessage = 'Enter a lot code, like B-0412.';

const batchShape = {
  coatingId: recordId('Choose the coating this batch was made of.'),
  lotCode: z
    .string({ error: lotCodeMessage })
    .trim()
    .min(1, lotCodeMessage)
    .max(40, 'Keep the lot code to 40 characters or fewer.')
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/,
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

// ---------------------------------------------------------------------------------------------
// Samples
// ---------------------------------------------------------------------------------------------

const sampleShape = {
  batchId: recordId('Choose the batch this sample comes from.'),
  label: requiredText(60, 'Enter a sample label, like P-01.'),
  substrate: text(120),
  position: text(120),
  treatedAt: z
    .preprocess(
      (value) => (typeof value === 'string' && value.trim() === '' ? null : value),
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

// ---------------------------------------------------------------------------------------------
// Probe liquids
// ---------------------------------------------------------------------------------------------

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
  hazardNote: z
    .preprocess(
      (value) => (typeof value === 'string' && value.trim() === '' ? null : value),
      text(1000).nullable(),
    )
    .optional(),
};

export type ProbeLiquidComponents = {
  totalMnM: number;
  dispersiveMnM?: number | null;
  polarMnM?: number | null;
  lifshitzVanDerWaalsMnM?: number | null;
  acidMnM?: number | null;
  baseMnM?: number | null;
};

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

const round = (value: number) => Math.round(value * 100) / 100;

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

// ---------------------------------------------------------------------------------------------
// Measurement sessions
// ---------------------------------------------------------------------------------------------

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
    message: 'Enter the camera scale in pixels per mm, above 0 (from the calibration target or the needle), or leave it empty.',
  }),
  instrumentNotes: text(4000),
};

export const measurementSessionCreateSchema = z.object({
  ...measurementSessionShape,
  instrumentNotes: measurementSessionShape.instrumentNotes.optional(),
});
export const measurementSessionUpdateSchema = updateSchema(measurementSessionShape);
export type MeasurementSessionCreate = z.output<typeof measurementSessionCreateSchema>;
export type MeasurementSessionUpdate = z.output<typeof measurementSessionUpdateSchema>;

// ---------------------------------------------------------------------------------------------
// List queries: filters, sort, page. Parseable from URLSearchParams so they can live in the URL.
// ---------------------------------------------------------------------------------------------

export const MAX_PAGE_SIZE = 200;
export const DEFAULT_PAGE_SIZE = 50;

const integerParam = (min: number, max: number, fallback: number, message: string) =>
  z
    .preprocess(
      toNumber,
      z.number({ error: message }).int(message).min(min, message).max(max, message),
    )
    .default(fallback);

const booleanParam = z
  .preprocess(
    (value) => (typeof value === 'boolean' ? String(value) : value),
    z.enum(['true', 'false', '1', '0'], { error: 'Use true or false.' }),
  )
  .transform((value) => value === 'true' || value === '1')
  .default(false);

const filterId = (what: string) =>
  z
    .string({ error: `Choose a ${what}.` })
    .trim()
    .min(1, `Choose a ${what}.`)
    .max(64, 'That identifier is too long.')
    .optional();

/** DELETE query: `mode=archive` archives even a record with nothing under it; `version` guards. */
export const archiveOrDeleteQuerySchema = z.object({
  mode: z.enum(['auto', 'archive'], { error: 'Use mode=auto or mode=archive.' }).default('auto'),
  version: z
    .preprocess(
      toNumber,
      z.number({ error: 'Use the version you last loaded, a whole number.' }).int().min(1),
    )
    .optional(),
});
export type ArchiveOrDeleteQuery = z.output<typeof archiveOrDeleteQuerySchema>;

/** The list query of one kind of record: `q`, `includeArchived`, sort, page, and its filters. */
function listQuerySchema<
  const Sort extends readonly [string, ...string[]],
  Filters extends z.ZodRawShape,
>(options: {
  sort: Sort;
  defaultSort: Sort[number];
  defaultDir: 'asc' | 'desc';
  filters: Filters;
}) {
  return z.object({
    q: z.string().trim().max(200, 'Keep the search to 200 characters or fewer.').optional(),
    includeArchived: booleanParam,
    sort: z
      .enum(options.sort, { error: `Sort by one of: ${options.sort.join(', ')}.` })
      .default(options.defaultSort),
    dir: z
      .enum(['asc', 'desc'], { error: 'Sort direction is asc or desc.' })
      .default(options.defaultDir),
    page: integerParam(1, 1_000_000, 1, 'Use a page number of 1 or more.'),
    pageSize: integerParam(
      1,
      MAX_PAGE_SIZE,
      DEFAULT_PAGE_SIZE,
      `Use a page size from 1 to ${MAX_PAGE_SIZE}.`,
    ),
    ...options.filters,
  });
}

export const coatingListQuerySchema = listQuerySchema({
  sort: ['code', 'name', 'createdAt', 'updatedAt'],
  defaultSort: 'code',
  defaultDir: 'asc',
  filters: {},
});

export const specListQuerySchema = listQuerySchema({
  sort: ['createdAt', 'updatedAt', 'minDeg', 'maxDeg', 'scope'],
  defaultSort: 'createdAt',
  defaultDir: 'asc',
  filters: { coatingId: filterId('coating'), probeLiquidId: filterId('probe liquid') },
});

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

export const sampleListQuerySchema = listQuerySchema({
  sort: ['label', 'treatedAt', 'createdAt', 'updatedAt'],
  defaultSort: 'label',
  defaultDir: 'asc',
  filters: { batchId: filterId('batch'), coatingId: filterId('coating') },
});

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

export type CoatingListQuery = z.output<typeof coatingListQuerySchema>;
export type SpecListQuery = z.output<typeof specListQuerySchema>;
export type BatchListQuery = z.output<typeof batchListQuerySchema>;
export type SampleListQuery = z.output<typeof sampleListQuerySchema>;
export type ProbeLiquidListQuery = z.output<typeof probeLiquidListQuerySchema>;
export type MeasurementSessionListQuery = z.output<typeof measurementSessionListQuerySchema>;

type SearchParamsInput = URLSearchParams | Record<string, string | string[] | undefined>;

/**
 * URLSearchParams (route handlers) or Next's `searchParams` object (pages) → a plain object for
 * a list query schema. The first value of a repeated key counts; empty values are left out.
 */
export function searchParamsToObject(params: SearchParamsInput): Record<string, string> {
  const out: Record<string, string> = {};
  const entries: [string, string | string[] | undefined][] =
    params instanceof URLSearchParams ? [...params.entries()] : Object.entries(params);
  for (const [key, raw] of entries) {
    const value = Array.isArray(raw) ? raw[0] : raw;
    if (value === undefined || value.trim() === '' || key in out) continue;
    out[key] = value;
  }
  return out;
}

/** Parses search parameters (a list query, DELETE options); throws ZodError (→ 400 with fields) on a bad parameter. */
export function parseSearchParams<Schema extends z.ZodType>(
  schema: Schema,
  params: SearchParamsInput,
): z.output<Schema> {
  return schema.parse(searchParamsToObject(params));
}

/**
 * The URL search string of a list query, leaving out values equal to the schema's defaults,
 * so links and filter forms keep short URLs.
 */
export function listQueryToSearchParams<Schema extends z.ZodType>(
  schema: Schema,
  query: Partial<z.output<Schema>>,
): URLSearchParams {
  const defaults = schema.parse({}) as Record<string, unknown>;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query as Record<string, unknown>)) {
    if (value === undefined || value === null || value === '' || value === defaults[key]) continue;
    params.set(key, String(value));
  }
  return params;
}

/**
 * Reads a JSON request body and parses it with `schema` (route handlers). Unreadable JSON → 400
 * invalid_json; schema errors throw ZodError (→ 400 invalid_input with the fields).
 */
export async function parseJsonBody<Schema extends z.ZodType>(
  request: Request,
  schema: Schema,
): Promise<z.output<Schema>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new HttpError(
      400,
      'invalid_json',
      'The request body is not valid JSON. Send the fields as a JSON object.',
    );
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw new HttpError(400, 'invalid_json', 'Send the fields as a JSON object.');
  }
  return schema.parse(body);
}
