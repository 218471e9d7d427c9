import { z } from 'zod';

/*
 * Building blocks of the request and response contracts (lib/contracts/*): the zod schemas that
 * forms, route handlers, server actions and the client share.
 *
 * Create schemas describe a whole record. Update schemas carry `version` (optimistic
 * concurrency) and any subset of the fields: a field left out stays as it is, `null` clears an
 * optional value. Rules that span fields (min ≤ max, components adding up) are checked on what
 * the body holds, and again by the records service on the merged record (`check*`).
 *
 * Form values arrive as strings; numeric fields accept numbers or numeric text, and an empty
 * text box means "not given". No field has a zod default: a default inside an optional field
 * would overwrite the stored value on a partial update, so defaults are applied on create.
 */

// ---------------------------------------------------------------------------------------------
// Request building blocks
// ---------------------------------------------------------------------------------------------

/**
 * '' and whitespace → undefined; numeric text → number (NaN, refused with the field's message,
 * for anything else, including a decimal comma, which could as well be a thousands separator).
 */
export function toNumber(value: unknown): unknown {
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

/** '' and whitespace → null (an emptied box clears the value). */
export const emptyToNull = (value: unknown) =>
  typeof value === 'string' && value.trim() === '' ? null : value;

export type NumberRange = { min: number; max: number; minExclusive?: boolean; message: string };

export function rangedNumber({ min, max, minExclusive, message }: NumberRange) {
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

export function text(max: number, tooLong = `Use at most ${max} characters.`) {
  return z.string({ error: 'Enter this as text.' }).trim().max(max, tooLong);
}

export function requiredText(max: number, missing: string) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(max, `Use at most ${max} characters.`);
}

/** A code like HT-200 or B-0412: letters, digits, spaces and . _ / -. */
export function codeText(max: number, missing: string, tooLong: string, pattern: string) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(max, tooLong)
    .regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, pattern);
}

export function recordId(missing: string) {
  return z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(64, 'That identifier is too long.');
}

export function optionalRecordId(message: string) {
  return z.preprocess(emptyToNull, recordId(message).nullable()).optional();
}

export const isoDate = (message: string) => z.iso.date({ error: message });
export const isoDateTime = (message: string) => z.iso.datetime({ offset: true, error: message });

const versionField = z
  .number({ error: 'Reload the record and try again: its version is missing.' })
  .int('Reload the record and try again: its version is not valid.')
  .min(1, 'Reload the record and try again: its version is not valid.');

/** An update body: any subset of the fields, plus the version the editor started from. */
export function updateSchema<Shape extends z.ZodRawShape>(shape: Shape) {
  return z.object(shape).partial().extend({ version: versionField });
}

/** A rule that spans fields, broken: which field to mark and what to say. */
export type Issue = { path: string; message: string };
type IssueSink = { addIssue: (issue: { code: 'custom'; message: string; path: string[] }) => void };

export function report(ctx: IssueSink, issues: Issue[]) {
  for (const issue of issues)
    ctx.addIssue({ code: 'custom', message: issue.message, path: [issue.path] });
}

/** Throws the ZodError a failed parse would, so the caller answers 400 with the fields. */
export function throwIssues(issues: Issue[]): void {
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

export const given = (value: number | null | undefined): value is number =>
  typeof value === 'number';

/** Turns zod issues into `{ field: message }` for forms and error bodies. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || 'form';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** `[id]` route segments. */
export const idParamsSchema = z.object({ id: z.string() });
export const userIdParamsSchema = z.object({ userId: z.string() });

// ---------------------------------------------------------------------------------------------
// Response building blocks. A timestamp travels as ISO 8601 text and is a Date once parsed, so
// the server's rows (Dates) and the client's parsed replies have the same type.
// ---------------------------------------------------------------------------------------------

export const timestamp = z.coerce.date();
/** An id column. */
export const id = z.string();

/** Columns every lab record has. */
export const recordColumns = {
  id,
  organizationId: id,
  version: z.number().int(),
  archivedAt: timestamp.nullable(),
  createdAt: timestamp,
  updatedAt: timestamp,
};

/** One page of a list; `page` is 1-based, `total` counts every matching record. */
export function pageSchema<Item extends z.ZodType>(item: Item) {
  return z.object({
    items: z.array(item),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
  });
}
export type Page<T> = { items: T[]; total: number; page: number; pageSize: number };

export const okSchema = z.object({ ok: z.literal(true) });

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

export const filterId = (what: string) =>
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

/** The answer to DELETE of a record: archived (results depend on it) or deleted. */
export const deleteOutcomeSchema = z.enum(['archived', 'deleted']);
export const deleteReplySchema = z.object({ outcome: deleteOutcomeSchema });

/**
 * The replies of a kind of record's routes: a list page of `item`, one record under `key`
 * (`{ coating }`), and DELETE's `{ outcome, <key> }`.
 */
export function recordReplies<Key extends string, Record extends z.ZodType, Item extends z.ZodType>(
  key: Key,
  record: Record,
  item: Item,
) {
  const one = { [key]: record } as { [K in Key]: Record };
  return {
    page: pageSchema(item),
    one: z.object(one),
    deleted: deleteReplySchema.extend(one),
  };
}

/** The list query of one kind of record: `q`, `includeArchived`, sort, page, and its filters. */
export function listQuerySchema<
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

/** What every list query has, whatever its filters. */
export type ListQuery = {
  q?: string;
  includeArchived: boolean;
  sort: string;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
};

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
