import { z } from 'zod';

/** What a comparison is of, as it stands in the URL: ?coating=HT-200&batches=B-0411,B-0412&ref=B-0408 */
export interface CompareQuery {
  /** Coating id or code. */
  coating: string | null;
  /** Batch ids or lot codes; empty means the coating's newest batches. */
  batches: string[];
  /** Reference batch id or lot code. */
  ref: string | null;
}

const token = z.string().trim().min(1).max(120);
const list = z
  .union([z.string(), z.array(z.string())])
  .optional()
  .transform((v) =>
    (Array.isArray(v) ? v : v === undefined ? [] : [v])
      .flatMap((s) => s.split(','))
      .map((s) => s.trim())
      .filter((s) => s.length > 0 && s.length <= 120),
  );
const single = z
  .union([z.string(), z.array(z.string())])
  .optional()
  .transform((v) => {
    const first = Array.isArray(v) ? v[0] : v;
    const parsed = token.safeParse(first);
    return parsed.success ? parsed.data : null;
  });

export const compareQuerySchema = z.object({ coating: single, batches: list, ref: single });

type Params = URLSearchParams | Record<string, string | string[] | undefined>;

/** Reads the comparison's choices from a URL's search parameters; unusable values are dropped. */
export function parseCompareQuery(params: Params): CompareQuery {
  const record: Record<string, string | string[]> = {};
  if (params instanceof URLSearchParams) {
    for (const key of ['coating', 'batches', 'ref']) {
      const all = params.getAll(key);
      if (all.length > 0) record[key] = all;
    }
  } else {
    for (const [key, value] of Object.entries(params)) if (value !== undefined) record[key] = value;
  }
  const parsed = compareQuerySchema.parse(record);
  return { coating: parsed.coating, batches: [...new Set(parsed.batches)].slice(0, 100), ref: parsed.ref };
}

/** The search string of a comparison, e.g. "?coating=HT-200&batches=B-0411%2CB-0412". */
export function compareSearch(query: CompareQuery): string {
  const params = new URLSearchParams();
  if (query.coating) params.set('coating', query.coating);
  if (query.batches.length > 0) params.set('batches', query.batches.join(','));
  if (query.ref) params.set('ref', query.ref);
  const s = params.toString();
  return s ? `?${s}` : '';
}
