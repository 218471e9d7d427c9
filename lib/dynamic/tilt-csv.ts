/**
 * Tilt per frame from a stage log in CSV: one named column holds the tilt (°). Either one row per
 * frame in frame order, or with a time column the tilt is interpolated linearly at each frame's
 * time. Parsed with csv-parse's browser build, so it runs in the worker as well as in Node.
 */
import { parse } from 'csv-parse/browser/esm/sync';

export class TiltCsvError extends Error {
  readonly code = 'bad-tilt-csv' as const;
}

export interface TiltCsvOptions {
  /** Header of the tilt column (matched without case and surrounding spaces). */
  column: string;
  /** Header of a time column (s); when given, tilts are interpolated at the frame times. */
  timeColumn?: string;
}

export function tiltsFromCsv(
  text: string,
  frameTimes: readonly number[],
  options: TiltCsvOptions,
): number[] {
  let rows: string[][];
  try {
    rows = parse(text.replace(/^\uFEFF/, ''), {
      relax_column_count: true,
      skip_empty_lines: true,
      trim: true,
      delimiter: [',', ';', '\t'],
    }) as string[][];
  } catch (error) {
    throw new TiltCsvError(
      `The tilt file is not valid CSV (${(error as Error).message}). Check quotes and separators.`,
    );
  }
  if (rows.length < 2)
    throw new TiltCsvError('The tilt file needs a header row and at least one value row.');
  const header = rows[0].map((h) => h.trim().toLowerCase());
  const find = (name: string) => {
    const k = header.indexOf(name.trim().toLowerCase());
    if (k < 0)
      throw new TiltCsvError(
        `The tilt file has no column "${name}"; its columns are ${rows[0].map((h) => `"${h}"`).join(', ')}.`,
      );
    return k;
  };
  const number = (row: string[], k: number, line: number, what: string) => {
    const value = Number((row[k] ?? '').replace(',', '.'));
    if (!Number.isFinite(value))
      throw new TiltCsvError(
        `Row ${line} of the tilt file has no number in the ${what} column ("${row[k] ?? ''}").`,
      );
    return value;
  };
  const tiltColumn = find(options.column);
  const body = rows.slice(1);
  const tilts = body.map((row, i) => number(row, tiltColumn, i + 2, 'tilt'));
  if (!options.timeColumn) {
    if (tilts.length !== frameTimes.length)
      throw new TiltCsvError(
        `The tilt file has ${tilts.length} rows but the series has ${frameTimes.length} frames; give one row per frame, or name the time column.`,
      );
    return tilts;
  }
  const timeColumn = find(options.timeColumn);
  const times = body.map((row, i) => number(row, timeColumn, i + 2, 'time'));
  for (let i = 1; i < times.length; i++)
    if (!(times[i] > times[i - 1]))
      throw new TiltCsvError(`The times in the tilt file must increase (row ${i + 2}).`);
  return frameTimes.map((t) => {
    if (t < times[0] - 1e-9 || t > times[times.length - 1] + 1e-9)
      throw new TiltCsvError(
        `Frame time ${t.toFixed(3)} s lies outside the tilt log (${times[0]}–${times[times.length - 1]} s).`,
      );
    let k = 0;
    while (k < times.length - 2 && times[k + 1] < t) k++;
    if (times.length === 1) return tilts[0];
    const f = (t - times[k]) / (times[k + 1] - times[k]);
    return tilts[k] + Math.min(1, Math.max(0, f)) * (tilts[k + 1] - tilts[k]);
  });
}
