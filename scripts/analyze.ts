/**
 * Batch analysis of drop photos.
 *
 *   npm run --silent analyze -- [--method circle|polynomial|ellipse|young-laplace|height-width]
 *                               [--baseline x1,y1,x2,y2] [--scale PX_PER_MM] [--json] FILE...
 *
 * With --json: one JSON object per file per line, in input order. A file that cannot be read or
 * holds no drop prints {file, error: {code, message}}; the other files still run and the exit
 * status is 1 at the end.
 */
import {
  analyseDropWith,
  loadOpenCv,
  AnalysisError,
  FIT_METHODS,
  DEFAULT_METHOD,
  type AnalysisResult,
  type Baseline,
  type FitMethod,
} from '../lib/analysis';
import { decodeImageFile, DecodeError } from '../lib/analysis/node/decode';
import { runCli } from './support/run-cli';

interface CliOptions {
  method: FitMethod;
  baseline?: Baseline;
  scale?: number;
  json: boolean;
  files: string[];
}

const USAGE =
  'Usage: npm run --silent analyze -- [--method circle|polynomial|ellipse|young-laplace|height-width] [--baseline x1,y1,x2,y2] [--scale PX_PER_MM] [--json] FILE...';

function parseArgs(argv: string[]): CliOptions {
  const options: CliOptions = { method: DEFAULT_METHOD, json: false, files: [] };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const [flag, inline] =
      arg.startsWith('--') && arg.includes('=')
        ? [arg.slice(0, arg.indexOf('=')), arg.slice(arg.indexOf('=') + 1)]
        : [arg, undefined];
    const value = () => {
      const v = inline ?? argv[++i];
      if (v === undefined) throw new Error(`${flag} needs a value.`);
      return v;
    };
    if (flag === '--json') options.json = true;
    else if (flag === '--method') {
      const m = value();
      if (!FIT_METHODS.includes(m as FitMethod))
        throw new Error(`Unknown method "${m}"; use one of ${FIT_METHODS.join(', ')}.`);
      options.method = m as FitMethod;
    } else if (flag === '--baseline') {
      const parts = value().split(',').map(Number);
      if (parts.length !== 4 || parts.some((p) => !Number.isFinite(p)))
        throw new Error('--baseline needs four numbers: x1,y1,x2,y2.');
      const [x1, y1, x2, y2] = parts;
      if (x1 === x2 && y1 === y2) throw new Error('--baseline needs two different points.');
      options.baseline = { x1, y1, x2, y2 };
    } else if (flag === '--scale') {
      const s = Number(value());
      if (!(s > 0)) throw new Error('--scale needs a positive number of pixels per millimetre.');
      options.scale = s;
    } else if (flag === '--help' || flag === '-h') {
      process.stdout.write(`${USAGE}\n`);
      process.exit(0);
    } else if (flag === '--') continue;
    else if (flag.startsWith('--')) throw new Error(`Unknown option ${flag}.`);
    else options.files.push(arg);
  }
  if (!options.files.length) throw new Error('No image files given.');
  return options;
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));
const roundPoint = (p: [number, number]): [number, number] => [round(p[0], 3), round(p[1], 3)];

function toJson(file: string, r: AnalysisResult) {
  return {
    file,
    method: r.method,
    leftDeg: round(r.leftDeg, 3),
    rightDeg: round(r.rightDeg, 3),
    meanDeg: round(r.meanDeg, 3),
    leftUncertaintyDeg: round(r.leftUncertaintyDeg, 3),
    rightUncertaintyDeg: round(r.rightUncertaintyDeg, 3),
    baseline: {
      x1: round(r.baseline.x1, 3),
      y1: round(r.baseline.y1, 3),
      x2: round(r.baseline.x2, 3),
      y2: round(r.baseline.y2, 3),
    },
    baselineSource: r.baselineSource,
    contactLeft: roundPoint(r.contactLeft),
    contactRight: roundPoint(r.contactRight),
    baseDiameterPx: round(r.baseDiameterPx, 3),
    heightPx: round(r.heightPx, 3),
    apexRadiusPx: r.apexRadiusPx === null ? null : round(r.apexRadiusPx, 3),
    bond: r.bond === null ? null : round(r.bond, 5),
    volumePx3: r.volumePx3 === null ? null : round(r.volumePx3, 1),
    surfaceAreaPx2: r.surfaceAreaPx2 === null ? null : round(r.surfaceAreaPx2, 1),
    volumeUl: r.volumeUl === null ? null : round(r.volumeUl, 5),
    surfaceAreaMm2: r.surfaceAreaMm2 === null ? null : round(r.surfaceAreaMm2, 5),
    rmsResidualPx: round(r.rmsResidualPx, 4),
    edgePointCount: r.edgePointCount,
    warnings: r.warnings,
    timeMs: round(r.timeMs, 1),
  };
}

function errorOf(error: unknown): { code: string; message: string } {
  if (error instanceof AnalysisError) return { code: error.code, message: error.message };
  if (error instanceof DecodeError) return { code: error.code, message: error.message };
  return {
    code: 'internal_error',
    message: error instanceof Error ? error.message : String(error),
  };
}

function pad(text: string, width: number, right = false): string {
  return right ? text.padStart(width) : text.padEnd(width);
}

async function main(): Promise<number> {
  let options: CliOptions;
  try {
    options = parseArgs(process.argv.slice(2));
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n${USAGE}\n`);
    return 2;
  }
  const { cv } = await loadOpenCv();
  let failed = false;
  const fileWidth = Math.max(4, ...options.files.map((f) => f.length));
  if (!options.json) {
    process.stdout.write(
      `${pad('file', fileWidth)}  ${pad('method', 13)}  ${pad('left°', 15, true)}  ${pad('right°', 15, true)}  ${pad('mean°', 8, true)}  ${pad('base px', 8, true)}  ${pad('height px', 9, true)}  ${pad('rms px', 7, true)}  warnings\n`,
    );
  }
  for (const file of options.files) {
    try {
      const image = await decodeImageFile(file);
      const result = analyseDropWith(cv, image, {
        method: options.method,
        baseline: options.baseline,
        scalePxPerMm: options.scale,
      });
      if (options.json) process.stdout.write(`${JSON.stringify(toJson(file, result))}\n`);
      else {
        const pm = (a: number, u: number) => `${a.toFixed(2)} ± ${u.toFixed(2)}`;
        process.stdout.write(
          `${pad(file, fileWidth)}  ${pad(result.method, 13)}  ${pad(pm(result.leftDeg, result.leftUncertaintyDeg), 15, true)}  ${pad(pm(result.rightDeg, result.rightUncertaintyDeg), 15, true)}  ${pad(result.meanDeg.toFixed(2), 8, true)}  ${pad(result.baseDiameterPx.toFixed(1), 8, true)}  ${pad(result.heightPx.toFixed(1), 9, true)}  ${pad(result.rmsResidualPx.toFixed(3), 7, true)}  ${result.warnings.map((w) => w.code).join(', ') || '-'}\n`,
        );
      }
    } catch (error) {
      failed = true;
      const err = errorOf(error);
      if (options.json) process.stdout.write(`${JSON.stringify({ file, error: err })}\n`);
      else process.stdout.write(`${pad(file, fileWidth)}  error ${err.code}: ${err.message}\n`);
    }
  }
  return failed ? 1 : 0;
}

runCli(main);
