import { ageInDays } from './build';

/** One raw drop of a comparison, as exported. Times are ISO strings. */
export interface CsvDropRow {
  coatingCode: string;
  lotCode: string;
  producedOn: string;
  sampleLabel: string;
  liquidName: string;
  dropId: string;
  revision: number;
  reviewStatus: string;
  measuredAt: string;
  treatedAt: string | null;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
}

/** Units sit in the headers, so every number below is a plain number. */
export const CSV_HEADER = [
  'Coating',
  'Batch',
  'Produced on (date)',
  'Sample',
  'Probe liquid',
  'Drop ID',
  'Analysis revision',
  'Review status',
  'Measured at (UTC)',
  'Treated at (UTC)',
  'Days since treatment (d)',
  'Left angle (°)',
  'Right angle (°)',
  'Mean angle (°)',
] as const;

/**
 * RFC 4180 quoting; text that a spreadsheet would run as a formula (=, +, -, @ first) gets a
 * leading apostrophe so a sample label cannot become a formula.
 */
function textCell(value: string): string {
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

function numberCell(value: number | null, digits: number): string {
  return value === null || !Number.isFinite(value) ? '' : value.toFixed(digits);
}

/** The comparison's raw drops as CSV: UTF-8 with a byte-order mark, CRLF line ends. */
export function dropsCsv(rows: readonly CsvDropRow[]): string {
  const lines = [CSV_HEADER.map(textCell).join(',')];
  for (const r of rows) {
    lines.push(
      [
        textCell(r.coatingCode),
        textCell(r.lotCode),
        textCell(r.producedOn),
        textCell(r.sampleLabel),
        textCell(r.liquidName),
        textCell(r.dropId),
        String(r.revision),
        textCell(r.reviewStatus),
        textCell(r.measuredAt),
        r.treatedAt ? textCell(r.treatedAt) : '',
        numberCell(ageInDays(r.measuredAt, r.treatedAt), 2),
        numberCell(r.leftDeg, 3),
        numberCell(r.rightDeg, 3),
        numberCell(r.meanDeg, 3),
      ].join(','),
    );
  }
  return `\uFEFF${lines.join('\r\n')}\r\n`;
}
