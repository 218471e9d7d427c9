import { stringify } from 'csv-stringify/sync';

/*
 * CSV for spreadsheets: UTF-8 with a byte-order mark (so Excel reads °, µ and accents right),
 * a header row naming each column with its unit, RFC 4180 quoting (csv-stringify), and cells
 * that a spreadsheet would run as a formula defused with a leading apostrophe.
 */

export type CsvValue = string | number | boolean | Date | null | undefined;

/** One column of an exported table: its header (with the unit) and how to read it from a row. */
export type CsvColumn<Row> = { header: string; value: (row: Row) => CsvValue };

/** UTF-8 byte-order mark: spreadsheets otherwise guess a legacy code page. */
export const UTF8_BOM = '\uFEFF';

const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * A text cell that starts with = + - @ (or a tab / carriage return) is prefixed with ', so a
 * spreadsheet shows it as text instead of evaluating it (OWASP "CSV injection"). Numbers are
 * written as numbers, so a negative value stays a number.
 */
export function safeCell(value: CsvValue): string | number {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? value : '';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (value instanceof Date) return value.toISOString();
  return FORMULA_START.test(value) ? `'${value}` : value;
}

export function csvHeader<Row>(columns: CsvColumn<Row>[]): string {
  return stringify([columns.map((column) => safeCell(column.header))], {
    record_delimiter: '\r\n',
  });
}

export function csvRows<Row>(columns: CsvColumn<Row>[], rows: Row[]): string {
  if (rows.length === 0) return '';
  return stringify(
    rows.map((row) => columns.map((column) => safeCell(column.value(row)))),
    { record_delimiter: '\r\n' },
  );
}

/** A whole CSV document in memory (tests, small tables). */
export function toCsv<Row>(columns: CsvColumn<Row>[], rows: Row[]): string {
  return UTF8_BOM + csvHeader(columns) + csvRows(columns, rows);
}

/** A file name safe in a Content-Disposition header: letters, digits, - and _. */
export function csvFileName(stem: string, date = new Date()): string {
  const clean = stem.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '') || 'export';
  return `${clean}-${date.toISOString().slice(0, 10)}.csv`;
}

/**
 * Streams a CSV response page by page: `fetchPage(n)` returns the rows of page n (1-based) and
 * whether more follow, so a large filtered table never sits in memory whole. The first page is
 * read before answering, so a failing query still gets an error status instead of a cut file.
 */
export async function csvResponse<Row>(options: {
  fileName: string;
  columns: CsvColumn<Row>[];
  fetchPage: (page: number) => Promise<{ rows: Row[]; more: boolean }>;
}): Promise<Response> {
  const encoder = new TextEncoder();
  const first = await options.fetchPage(1);
  let next = first.more && first.rows.length > 0 ? 2 : null;
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(
        encoder.encode(
          UTF8_BOM + csvHeader(options.columns) + csvRows(options.columns, first.rows),
        ),
      );
      if (next === null) controller.close();
    },
    async pull(controller) {
      if (next === null) return;
      try {
        const { rows, more } = await options.fetchPage(next);
        if (rows.length > 0) controller.enqueue(encoder.encode(csvRows(options.columns, rows)));
        next = more && rows.length > 0 ? next + 1 : null;
        if (next === null) controller.close();
      } catch (error) {
        console.error('[csv] export failed part-way', error);
        controller.error(error);
      }
    },
  });
  return new Response(stream, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${options.fileName}"`,
      'cache-control': 'no-store',
    },
  });
}

/** Pages through a list query (`Page<T>` shape) for csvResponse. */
export function pagedRows<Row>(
  list: (page: number, pageSize: number) => Promise<{ items: Row[]; total: number }>,
  pageSize: number,
): (page: number) => Promise<{ rows: Row[]; more: boolean }> {
  return async (page) => {
    const { items, total } = await list(page, pageSize);
    return { rows: items, more: page * pageSize < total };
  };
}
