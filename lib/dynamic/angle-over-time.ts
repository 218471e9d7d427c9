/**
 * Angle over time, for spreading and absorption: θ(t), base(t) and volume(t) from the moment the
 * drop landed (t = 0 at `zeroSec` on the series clock), the initial angle extrapolated to t = 0
 * and the rates of change over a chosen window.
 *
 * Initial angle: a least-squares polynomial in t (degree 1 by default, 2 for a curved start)
 * through the first `initialFrames` analysed frames, evaluated at t = 0; its standard error is the
 * intercept's (ordinary least squares). The model's own error is the curvature of θ(t) over those
 * frames (a straight line through θ∞ + Δθ e^(−t/τ) over t₁…t_N misses θ(0) by about
 * Δθ/(2τ²) · (mean t² − 2 mean(t)²)); keep the first frames close to t = 0 or use degree 2.
 *
 * Rate: the least-squares slope over the window (°/s) with its standard error, and the slopes of
 * the base diameter (px/s) and volume (px³/s) over the same frames.
 */
import { fitLine, fitPolynomial } from './regression';
import type { PhaseWindow, SeriesFrame, SeriesWarning } from './types';

export interface AngleOverTimeOptions {
  /** Series time of the drop's landing; times are reported from there (default 0). */
  zeroSec?: number;
  /** Frames in the initial-angle fit (default 5) and the degree of its polynomial (default 1). */
  initialFrames?: number;
  initialDegree?: 1 | 2;
  /** Window of the rate, in series time; default the whole series. */
  rateWindow?: PhaseWindow;
}

export interface AngleOverTimePoint {
  index: number;
  /** Time since the drop landed (s). */
  tSec: number;
  meanDeg: number;
  leftDeg: number;
  rightDeg: number;
  baseDiameterPx: number;
  volumePx3: number | null;
}

export interface InitialAngle {
  angleDeg: number;
  standardErrorDeg: number;
  degree: 1 | 2;
  frameCount: number;
  /** Times (since landing) of the first and last frame in the fit. */
  fromSec: number;
  toSec: number;
}

export interface RateOverWindow {
  degPerSec: number;
  standardErrorDegPerSec: number;
  baseDiameterPxPerSec: number;
  /** Null when the method gives no volume. */
  volumePx3PerSec: number | null;
  fromSec: number;
  toSec: number;
  frameCount: number;
}

export interface AngleOverTime {
  points: AngleOverTimePoint[];
  initial: InitialAngle | null;
  rate: RateOverWindow | null;
  warnings: SeriesWarning[];
}

export function analyseAngleOverTime(
  frames: readonly SeriesFrame[],
  options: AngleOverTimeOptions = {},
): AngleOverTime {
  const zero = options.zeroSec ?? 0;
  const warnings: SeriesWarning[] = [];
  const points: AngleOverTimePoint[] = frames
    .filter(
      (f) =>
        f.meanDeg !== null &&
        f.leftDeg !== null &&
        f.rightDeg !== null &&
        f.baseDiameterPx !== null,
    )
    .map((f) => ({
      index: f.index,
      tSec: f.tSec - zero,
      meanDeg: f.meanDeg as number,
      leftDeg: f.leftDeg as number,
      rightDeg: f.rightDeg as number,
      baseDiameterPx: f.baseDiameterPx as number,
      volumePx3: f.volumePx3,
    }));

  const degree = options.initialDegree ?? 1;
  const count = options.initialFrames ?? 5;
  const first = points.filter((p) => p.tSec >= 0).slice(0, count);
  let initial: InitialAngle | null = null;
  if (first.length >= degree + 2) {
    const fit = fitPolynomial(
      first.map((p) => p.tSec),
      first.map((p) => p.meanDeg),
      degree,
      0,
    );
    initial = {
      angleDeg: fit.coefficients[0],
      standardErrorDeg: fit.standardErrors[0],
      degree,
      frameCount: first.length,
      fromSec: first[0].tSec,
      toSec: first[first.length - 1].tSec,
    };
  } else {
    warnings.push({
      code: 'no_initial_angle',
      message: `The initial angle needs at least ${degree + 2} analysed frames after the drop landed; ${first.length} were found.`,
    });
  }

  const window = options.rateWindow;
  const inWindow = window
    ? points.filter(
        (p) => p.tSec + zero >= window.fromSec - 1e-9 && p.tSec + zero <= window.toSec + 1e-9,
      )
    : points;
  let rate: RateOverWindow | null = null;
  if (inWindow.length >= 3) {
    const t = inWindow.map((p) => p.tSec);
    const angle = fitLine(
      t,
      inWindow.map((p) => p.meanDeg),
    );
    const base = fitLine(
      t,
      inWindow.map((p) => p.baseDiameterPx),
    );
    const volumes = inWindow.map((p) => p.volumePx3);
    const volume = volumes.every((v): v is number => v !== null) ? fitLine(t, volumes) : null;
    rate = {
      degPerSec: angle.slope,
      standardErrorDegPerSec: angle.slopeSe,
      baseDiameterPxPerSec: base.slope,
      volumePx3PerSec: volume ? volume.slope : null,
      fromSec: t[0],
      toSec: t[t.length - 1],
      frameCount: t.length,
    };
  } else {
    warnings.push({
      code: 'empty_window',
      message: 'The rate window holds fewer than 3 analysed frames; widen it.',
    });
  }
  return { points, initial, rate, warnings };
}
