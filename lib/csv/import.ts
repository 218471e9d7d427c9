import 'server-only';
import { parse } from 'csv-parse/sync';
import {
  IMPORT_COLUMNS,
  MAX_IMPORT_ROWS,
  REQUIRED_COLUMNS,
  importRowSchema,
  normalizeHeader,
  type ImportColumn,
  type ImportIssue,
  type ParsedImportRow,
} from '@/lib/contracts/import';
import { TOO_MANY_IMPORT_ROWS } from '@/lib/contracts/limits';

/**
 * Parses and checks the CSV text: the header, then every row with importRowSchema. Returns all
 * the issues at once (never stops at the first), or the rows when there are none.
 */
export function parseImportCsv(
  csv: string,
): { ok: true; rows: ParsedImportRow[] } | { ok: false; issues: ImportIssue[] } {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(csv.replace(/^\uFEFF/, ''), {
      bom: true,
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      trim: true,
      delimiter: [',', ';', '\t'],
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    const line = (error as { lines?: number }).lines;
    return {
      ok: false,
      issues: [
        {
          row: typeof line === 'number' ? line : 1,
          column: '—',
          message: `The text is not valid CSV (${(error as Error).message}). Check quotes and separators.`,
        },
      ],
    };
  }
  if (records.length === 0) {
    return {
      ok: false,
      issues: [{ row: 1, column: '—', message: 'The file is empty. Start with a header row.' }],
    };
  }
  const [headerRecord, ...dataRecords] = records;
  const headerRow = headerRecord.info.lines;
  const columnIndex = new Map<ImportColumn, number>();
  const headers = headerRecord.record;
  const issues: ImportIssue[] = [];
  headers.forEach((raw, index) => {
    const name = normalizeHeader(raw);
    const key = (Object.keys(IMPORT_COLUMNS) as ImportColumn[]).find((candidate) =>
      (IMPORT_COLUMNS[candidate].aliases as readonly string[]).includes(name),
    );
    if (!key) {
      if (name !== '')
        issues.push({
          row: headerRow,
          column: raw,
          message: `Unknown column "${raw}". Use: ${Object.values(IMPORT_COLUMNS)
            .map((column) => column.header)
            .join(', ')}.`,
        });
      return;
    }
    if (columnIndex.has(key)) {
      issues.push({ row: headerRow, column: raw, message: `The column "${raw}" appears twice.` });
      return;
    }
    columnIndex.set(key, index);
  });
  for (const key of REQUIRED_COLUMNS) {
    if (!columnIndex.has(key)) {
      issues.push({
        row: headerRow,
        column: IMPORT_COLUMNS[key].header,
        message: `Add the column "${IMPORT_COLUMNS[key].header}" to the header row.`,
      });
    }
  }
  if (issues.length > 0) return { ok: false, issues };
  if (dataRecords.length === 0) {
    return {
      ok: false,
      issues: [{ row: headerRow + 1, column: '—', message: 'There are no rows below the header.' }],
    };
  }
  if (dataRecords.length > MAX_IMPORT_ROWS) {
    return {
      ok: false,
      issues: [
        {
          row: dataRecords[MAX_IMPORT_ROWS].info.lines,
          column: '—',
          message: TOO_MANY_IMPORT_ROWS,
        },
      ],
    };
  }
  const headerOf = (key: ImportColumn) =>
    headers[columnIndex.get(key)!] ?? IMPORT_COLUMNS[key].header;
  const rows: ParsedImportRow[] = [];
  for (const { record, info } of dataRecords) {
    const input: Record<string, string> = {};
    for (const [key, index] of columnIndex) input[key] = record[index] ?? '';
    const result = importRowSchema.safeParse(input);
    if (result.success) {
      rows.push({ ...result.data, row: info.lines });
      continue;
    }
    for (const issue of result.error.issues) {
      const key = String(issue.path[0]) as ImportColumn;
      issues.push({
        row: info.lines,
        column: columnIndex.has(key) ? headerOf(key) : String(issue.path[0] ?? '—'),
        message: issue.message,
      });
    }
  }
  return issues.length > 0 ? { ok: false, issues } : { ok: true, rows };
}
