import { z } from 'zod';
import { IMPORT_TOO_LONG, MAX_IMPORT_CHARS } from './limits';

/*
 * CSV import of contact angles read by hand (legacy data). The same parsing and row schema run
 * in the browser (to show mistakes before sending) and in the route handler (the decision).
 * Parsing the text is lib/csv/import.ts (server only: csv-parse needs Node's Buffer).
 * Rows are numbered as a spreadsheet numbers them: the header is row 1, the first data row 2.
 */

/** The columns of an import file; `header` is what the template writes. */
export const IMPORT_COLUMNS = {
  sample: { header: 'Sample label', aliases: ['sample', 'sample label', 'sample id'] },
  probeLiquid: {
    header: 'Probe liquid',
    aliases: ['probe liquid', 'liquid', 'probe liquid id', 'probe'],
  },
  leftDeg: {
    header: 'Left angle (°)',
    aliases: ['left angle', 'left', 'left deg', 'left angle deg'],
  },
  rightDeg: {
    header: 'Right angle (°)',
    aliases: ['right angle', 'right', 'right deg', 'right angle deg'],
  },
  measuredAt: {
    header: 'Measured at',
    aliases: ['measured at', 'measured on', 'date', 'measured', 'time'],
  },
  operator: { header: 'Operator', aliases: ['operator', 'operator name', 'measured by'] },
  note: { header: 'Note', aliases: ['note', 'notes', 'comment'] },
} as const;
export type ImportColumn = keyof typeof IMPORT_COLUMNS;

export const REQUIRED_COLUMNS: ImportColumn[] = [
  'sample',
  'probeLiquid',
  'leftDeg',
  'rightDeg',
  'measuredAt',
];

export { MAX_IMPORT_CHARS, MAX_IMPORT_ROWS } from './limits';

export const IMPORT_TEMPLATE = `${Object.values(IMPORT_COLUMNS)
  .map((column) => column.header)
  .join(',')}\r\nP-01,Water,104.2,103.8,2019-05-14 10:30,J. Doe,from notebook 7\r\n`;

/** "Left angle (°)" → "left angle"; "Measured_at" → "measured at". */
export function normalizeHeader(header: string): string {
  return header
    .replace(/^\uFEFF/, '')
    .replace(/\(.*?\)|\[.*?\]/g, ' ')
    .replace(/[°_.:/-]+/g, ' ')
    .trim()
    .toLowerCase()
    .replace(/\s+/g, ' ');
}

const angle = (side: string) =>
  z.preprocess(
    (value) => {
      if (typeof value !== 'string') return value;
      const text = value.trim();
      return text === '' ? undefined : Number(text);
    },
    z
      .number({ error: `Enter the ${side} angle in degrees, from 0 to 180, like 104.2.` })
      .min(0, `Enter the ${side} angle in degrees, from 0 to 180.`)
      .max(180, `Enter the ${side} angle in degrees, from 0 to 180.`),
  );

const DATE_TIME =
  /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/;

/** YYYY-MM-DD, optionally with HH:MM[:SS] and an offset; without an offset the time is UTC. */
export function parseMeasuredAt(text: string): Date | null {
  const match = DATE_TIME.exec(text.trim());
  if (!match) return null;
  const [, y, mo, d, h = '00', mi = '00', s = '00', zone] = match;
  const offset =
    !zone || zone === 'Z' ? 'Z' : zone.length === 5 ? `${zone.slice(0, 3)}:${zone.slice(3)}` : zone;
  const date = new Date(`${y}-${mo}-${d}T${h}:${mi}:${s}${offset}`);
  if (Number.isNaN(date.getTime())) return null;
  // Reject 2019-02-30 and the like, which Date would roll over.
  if (!zone && date.getUTCDate() !== Number(d)) return null;
  return date;
}

const measuredAtMessage =
  'Enter when the drop was measured as YYYY-MM-DD or YYYY-MM-DD HH:MM (UTC), like 2019-05-14 10:30.';

/** One data row of an import file, after the header is mapped to these keys. */
export const importRowSchema = z.object({
  sample: z
    .string({ error: 'Enter the sample label, as on the batch page.' })
    .trim()
    .min(1, 'Enter the sample label, as on the batch page.')
    .max(60, 'A sample label has at most 60 characters.'),
  probeLiquid: z
    .string({ error: 'Enter the probe liquid by name (like Water) or id.' })
    .trim()
    .min(1, 'Enter the probe liquid by name (like Water) or id.')
    .max(80, 'A probe liquid name has at most 80 characters.'),
  leftDeg: angle('left'),
  rightDeg: angle('right'),
  measuredAt: z.string({ error: measuredAtMessage }).transform((text, ctx) => {
    const date = parseMeasuredAt(text);
    if (!date) {
      ctx.addIssue({ code: 'custom', message: measuredAtMessage });
      return z.NEVER;
    }
    if (date.getTime() > Date.now() + 60_000) {
      ctx.addIssue({
        code: 'custom',
        message: 'The measurement date is in the future. Check the year.',
      });
      return z.NEVER;
    }
    return date;
  }),
  operator: z
    .string()
    .trim()
    .max(120, 'Keep the operator name to 120 characters or fewer.')
    .optional()
    .default(''),
  note: z
    .string()
    .trim()
    .max(2000, 'Keep the note to 2000 characters or fewer.')
    .optional()
    .default(''),
});
export type ImportRow = z.output<typeof importRowSchema>;

/** A problem in the file: `row` as a spreadsheet counts it (header = 1), `column` as headed. */
export type ImportIssue = { row: number; column: string; message: string };
export type ParsedImportRow = ImportRow & { row: number };

/** The request body: the CSV text, pasted or read from the chosen file. */
export const importRequestSchema = z.object({
  csv: z
    .string({ error: 'Paste the CSV text or choose a CSV file.' })
    .min(1, 'Paste the CSV text or choose a CSV file.')
    .max(MAX_IMPORT_CHARS, IMPORT_TOO_LONG),
});

/** 201: how many rows became drops, and their ids. */
export const importResponseSchema = z.object({
  imported: z.number().int(),
  dropIds: z.array(z.string()),
});
export type ImportOutcome = z.output<typeof importResponseSchema>;
