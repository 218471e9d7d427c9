/**
 * Series analysis from the command line (issue 16, item 7):
 *
 *   npm run --silent analyze-series -- [--method circle|polynomial|ellipse|young-laplace] [--fps N] [--json] FILE...
 *
 * FILE is one video (MP4, WebM, AVI…; decoded by ffmpeg) or several frame images in order (then
 * --fps is required). With --json: one JSON object on stdout,
 *   { frames: [{ index, tSec, leftDeg, rightDeg, meanDeg, baseDiameterPx, volumePx3, warnings }],
 *     advancing: {…} | null, receding: {…} | null, hysteresisDeg, warnings: [{ code, message }] }
 * and on bad input { error: { code, message } } with exit status 1. Without --json, a table.
 */
import { parseArgs as parseNodeArgs } from 'node:util';
import { AnalysisError, DEFAULT_METHOD, loadOpenCv, type FitMethod } from '../lib/analysis';
import { DecodeError } from '../lib/analysis/node/decode';
import {
  analyseSeries,
  isFlagged,
  seriesReport,
  summariseDynamic,
  type SeriesReport,
} from '../lib/dynamic';
import type { PhaseSegment } from '../lib/dynamic/phases';
import { VideoError } from '../lib/dynamic/node/ffmpeg';
import { SeriesInputError, openSeries } from '../lib/dynamic/node/source';
import { runCli } from './support/run-cli';

const METHODS: readonly FitMethod[] = ['circle', 'polynomial', 'ellipse', 'young-laplace'];

const USAGE =
  'Usage: npm run --silent analyze-series -- [--method circle|polynomial|ellipse|young-laplace] [--fps N] [--json] FILE...';

interface CliOptions {
  method: FitMethod;
  fps?: number;
  json: boolean;
  files: string[];
}

class ArgumentError extends Error {
  readonly code = 'bad_arguments';
}

function parseArgs(argv: string[]): CliOptions {
  let parsed: ReturnType<typeof parseCommandLine>;
  try {
    parsed = parseCommandLine(argv);
  } catch (error) {
    throw new ArgumentError((error as Error).message);
  }
  const { values, positionals } = parsed;
  if (values.help) {
    process.stdout.write(`${USAGE}\n`);
    process.exit(0);
  }
  const method = (values.method ?? DEFAULT_METHOD) as FitMethod;
  if (!METHODS.includes(method))
    throw new ArgumentError(`Unknown method "${method}"; use one of ${METHODS.join(', ')}.`);
  let fps: number | undefined;
  if (values.fps !== undefined) {
    fps = Number(values.fps);
    if (!(Number.isFinite(fps) && fps > 0))
      throw new ArgumentError('--fps needs a positive number of frames per second.');
  }
  if (!positionals.length)
    throw new ArgumentError('No input given: name one video, or frame images in order with --fps.');
  return { method, fps, json: values.json ?? false, files: positionals };
}

function parseCommandLine(argv: string[]) {
  return parseNodeArgs({
    args: argv,
    allowPositionals: true,
    strict: true,
    options: {
      method: { type: 'string' },
      fps: { type: 'string' },
      json: { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
  });
}

function errorOf(error: unknown): { code: string; message: string } {
  if (
    error instanceof ArgumentError ||
    error instanceof SeriesInputError ||
    error instanceof VideoError ||
    error instanceof DecodeError ||
    error instanceof AnalysisError
  )
    return { code: error.code, message: error.message };
  return {
    code: 'internal_error',
    message: error instanceof Error ? error.message : String(error),
  };
}

const fixed = (v: number | null, digits: number, width: number) =>
  (v === null ? '–' : v.toFixed(digits)).padStart(width);

const flagOf = (f: SeriesReport['frames'][number]) =>
  f.meanDeg === null ? 'failed' : isFlagged(f) ? 'check' : '-';

function printTable(report: SeriesReport, segments: PhaseSegment[]) {
  const out: string[] = [];
  const phaseOf = (index: number) =>
    segments.find((s) => index >= s.fromIndex && index <= s.toIndex)?.kind ?? '–';
  out.push(
    `${'frame'.padStart(5)} ${'t s'.padStart(8)} ${'left°'.padStart(8)} ${'right°'.padStart(8)} ${'mean°'.padStart(8)} ${'base px'.padStart(9)} ${'volume px³'.padStart(12)}  ${'phase'.padEnd(9)}  ${'flag'.padEnd(6)}  warnings`,
  );
  for (const f of report.frames) {
    out.push(
      `${String(f.index).padStart(5)} ${fixed(f.tSec, 3, 8)} ${fixed(f.leftDeg, 2, 8)} ${fixed(f.rightDeg, 2, 8)} ${fixed(f.meanDeg, 2, 8)} ${fixed(f.baseDiameterPx, 1, 9)} ${fixed(f.volumePx3, 0, 12)}  ${phaseOf(f.index).padEnd(9)}  ${flagOf(f).padEnd(6)}  ${f.warnings.map((w) => w.code).join(', ') || '-'}`,
    );
  }
  out.push('');
  // The page's and the server's rule: failed, or a warning other than the needle in the drop.
  out.push(
    `flagged    ${report.frames.filter((f) => isFlagged(f)).length} of ${report.frames.length} frames (failed, or a warning other than the needle in the drop)`,
  );
  for (const [name, s] of [
    ['advancing', report.advancing],
    ['receding', report.receding],
  ] as const) {
    out.push(
      s
        ? `${name.padEnd(10)} ${s.meanDeg.toFixed(2)}° (left ${s.leftDeg.toFixed(2)}°, right ${s.rightDeg.toFixed(2)}°, SD ${s.sdDeg === null ? '–' : `${s.sdDeg.toFixed(2)}°`}) over ${s.frameCount} frames, ${s.fromSec.toFixed(2)}–${s.toSec.toFixed(2)} s`
        : `${name.padEnd(10)} –`,
    );
  }
  out.push(
    `hysteresis ${report.hysteresisDeg === null ? '–' : `${report.hysteresisDeg.toFixed(2)}°`}`,
  );
  for (const w of report.warnings) out.push(`warning ${w.code}: ${w.message}`);
  process.stdout.write(`${out.join('\n')}\n`);
}

async function main(): Promise<number> {
  const argv = process.argv.slice(2);
  const wantsJson = argv.includes('--json');
  const fail = (error: unknown): number => {
    const err = errorOf(error);
    if (wantsJson) process.stdout.write(`${JSON.stringify({ error: err })}\n`);
    else
      process.stderr.write(
        `error ${err.code}: ${err.message}\n${error instanceof ArgumentError ? `${USAGE}\n` : ''}`,
      );
    return 1;
  };
  try {
    const options = parseArgs(argv);
    const source = await openSeries(options.files, options.fps);
    const { cv } = await loadOpenCv();
    const progress = !options.json && process.stderr.isTTY;
    const frames = await analyseSeries(cv, source.frames, {
      method: options.method,
      total: source.total ?? undefined,
      onFrame: progress
        ? (_, p) => process.stderr.write(`\rframe ${p.done}${p.total ? ` of ${p.total}` : ''}`)
        : undefined,
    });
    if (progress) process.stderr.write('\n');
    if (!frames.some((f) => f.meanDeg !== null))
      throw new AnalysisError(
        'no_drop_found',
        `None of the ${frames.length} frames showed a drop on a baseline; the first says: ${frames[0]?.warnings[0]?.message ?? 'no frames were decoded'}`,
      );
    const summary = summariseDynamic(frames);
    const report = seriesReport(frames, summary);
    if (options.json) process.stdout.write(`${JSON.stringify(report)}\n`);
    else printTable(report, summary.phases.segments);
    return 0;
  } catch (error) {
    return fail(error);
  }
}

runCli(main);
