import type { z } from 'zod';
import { listQueryToSearchParams, searchParamsToObject } from '@/lib/contracts/common';

export type PageSearchParams = Record<string, string | string[] | undefined>;

/** What Next.js hands a record's own page (`/batches/[id]`): its id and the list state in the URL. */
export type RecordPageProps = {
  params: Promise<{ id: string }>;
  searchParams: Promise<PageSearchParams>;
};

/**
 * A page's list query from its URL. A bad parameter (hand-edited link) falls back to the
 * default for that parameter instead of failing the page.
 */
export function listQueryFromPage<Schema extends z.ZodType>(
  schema: Schema,
  searchParams: PageSearchParams,
  prefix = '',
): z.output<Schema> {
  const raw = searchParamsToObject(searchParams);
  const input: Record<string, string> = {};
  for (const [key, value] of Object.entries(raw)) {
    if (!prefix) input[key] = value;
    else if (key.startsWith(prefix) && key.length > prefix.length)
      input[key[prefix.length].toLowerCase() + key.slice(prefix.length + 1)] = value;
  }
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  const bad = new Set(parsed.error.issues.map((issue) => String(issue.path[0])));
  return schema.parse(Object.fromEntries(Object.entries(input).filter(([key]) => !bad.has(key))));
}

/** The export link of a list: the same filters and sort, without the page. */
export function exportHref<Schema extends z.ZodType>(
  path: string,
  schema: Schema,
  query: Partial<z.output<Schema>>,
): string {
  const params = listQueryToSearchParams(schema, query);
  params.delete('page');
  params.delete('pageSize');
  const search = params.toString();
  return search ? `${path}?${search}` : path;
}

/**
 * A list page's table props from the loaded page of rows and its query: the rows, the paging,
 * the sort and, when the viewer may export, the CSV link with the same filters.
 */
export function listTableProps<Schema extends z.ZodType, Row>(
  list: { items: Row[]; total: number; page: number; pageSize: number },
  query: z.output<Schema> & { sort: string; dir: 'asc' | 'desc' },
  exported: { path: string; schema: Schema; allowed: boolean },
) {
  return {
    rows: list.items,
    total: list.total,
    page: list.page,
    pageSize: list.pageSize,
    sort: query.sort,
    dir: query.dir,
    exportHref: exported.allowed ? exportHref(exported.path, exported.schema, query) : null,
  };
}
