/**
 * Tilting plate: the stage tilts while the camera follows it, so the baseline stays put in the
 * image and gravity pulls the drop towards one side (downhill). Per frame: the tilt, the downhill
 * and uphill angles and how far each contact point has moved downhill. The roll-off tilt is where
 * the contact line starts to move as a whole, i.e. the later of the two contact points' onsets of
 * downhill motion (the downhill front often creeps first while the rear stays pinned).
 *
 * Onset of one contact point: its displacement along the baseline from its position in the first
 * frames; the first frame from which it stays more than `noiseMultiplier` noise SDs downhill for
 * `persistFrames` frames marks the onset roughly; it is then refined by a least-squares hinge fit
 * over the frames around it, d(α) = d₀ for α ≤ α*, d₀ + c₁ s + c₂ s² for s = α − α* > 0, the
 * quadratic term taking up a drop that speeds up as it slides. α* is found on a fine grid.
 *
 * The angles at roll-off are read by a straight line through the last `rollOffFrames` frames up to
 * the roll-off tilt, evaluated there (their standard errors from the line).
 */
import { fitLine, fitPolynomial, noiseFromSecondDifferences } from './regression';
import type { SeriesFrame, SeriesWarning } from './types';

export type DropSide = 'left' | 'right';

export interface TiltFrame {
  index: number;
  tSec: number;
  tiltDeg: number;
  downhillDeg: number | null;
  uphillDeg: number | null;
  /** Displacement of each contact point downhill along the baseline since the first frames (px). */
  downhillShiftPx: number | null;
  uphillShiftPx: number | null;
}

export interface AngleAtTilt {
  angleDeg: number;
  standardErrorDeg: number;
}

export interface TiltResult {
  frames: TiltFrame[];
  downhillSide: DropSide;
  downhillSideSource: 'given' | 'from-angles';
  /** Tilt where the downhill and where the uphill contact point start to move (°). */
  downhillOnsetDeg: number | null;
  uphillOnsetDeg: number | null;
  /** Tilt where both contact points move downhill (°); null when the drop never slides. */
  rollOffTiltDeg: number | null;
  atRollOff: { downhill: AngleAtTilt; uphill: AngleAtTilt; hysteresisDeg: number } | null;
  warnings: SeriesWarning[];
}

export interface TiltOptions {
  /** Which side of the image is downhill; found from the angles when left out. */
  downhillSide?: DropSide;
  /** Frames at the start that define the resting contact points (default 3). */
  referenceFrames?: number;
  noiseMultiplier?: number;
  persistFrames?: number;
  rollOffFrames?: number;
}

const DEFAULTS = { referenceFrames: 3, noiseMultiplier: 5, persistFrames: 3, rollOffFrames: 5 };

/** Tilt per frame from a constant rate: α = start + rate · t. */
export function tiltsFromRate(
  times: readonly number[],
  rateDegPerSec: number,
  startDeg = 0,
): number[] {
  if (!Number.isFinite(rateDegPerSec) || rateDegPerSec === 0)
    throw new RangeError('The tilt rate must be a non-zero number of degrees per second.');
  return times.map((t) => startDeg + rateDegPerSec * t);
}

export function analyseTiltingPlate(
  frames: readonly SeriesFrame[],
  tiltsDeg: readonly number[],
  options: TiltOptions = {},
): TiltResult {
  const o = { ...DEFAULTS, ...options };
  if (tiltsDeg.length !== frames.length)
    throw new RangeError(
      `${tiltsDeg.length} tilt values were given for ${frames.length} frames; give one tilt per frame.`,
    );
  const warnings: SeriesWarning[] = [];
  const ok = frames
    .map((f, i) => ({ f, tilt: tiltsDeg[i] }))
    .filter(
      ({ f }) =>
        f.leftDeg !== null && f.rightDeg !== null && f.contactLeft && f.contactRight && f.baseline,
    );

  let downhillSide = options.downhillSide;
  let source: TiltResult['downhillSideSource'] = 'given';
  if (!downhillSide) {
    source = 'from-angles';
    // The downhill angle grows with the tilt relative to the uphill one.
    const diff = ok.map(({ f }) => (f.rightDeg as number) - (f.leftDeg as number));
    const slope =
      ok.length >= 3
        ? fitLine(
            ok.map((p) => p.tilt),
            diff,
          ).slope
        : 0;
    downhillSide = slope >= 0 ? 'right' : 'left';
    if (!(Math.abs(slope) > 0))
      warnings.push({
        code: 'downhill_side_unclear',
        message:
          'The angles do not show which side is downhill; the right side was assumed. Say which side is downhill.',
      });
  }
  const sign = downhillSide === 'right' ? 1 : -1;

  // Positions along the first analysed frame's baseline, so all frames share one axis.
  const ref = ok[0]?.f.baseline;
  const axis = ref ? unit(ref.x2 - ref.x1, ref.y2 - ref.y1) : [1, 0];
  const along = (p: readonly [number, number]) => p[0] * axis[0] + p[1] * axis[1];
  const downhillPos = ok.map(({ f }) =>
    along(downhillSide === 'right' ? f.contactRight! : f.contactLeft!),
  );
  const uphillPos = ok.map(({ f }) =>
    along(downhillSide === 'right' ? f.contactLeft! : f.contactRight!),
  );
  const restOf = (pos: number[]) =>
    median(pos.slice(0, Math.max(1, Math.min(o.referenceFrames, pos.length))));
  const shifts = (pos: number[]) => {
    const rest = restOf(pos);
    return pos.map((p) => sign * (p - rest));
  };
  const downhillShift = shifts(downhillPos);
  const uphillShift = shifts(uphillPos);

  const byIndex = new Map(ok.map(({ f }, k) => [f.index, k]));
  const out: TiltFrame[] = frames.map((f, i) => {
    const k = byIndex.get(f.index);
    const down = downhillSide === 'right' ? f.rightDeg : f.leftDeg;
    const up = downhillSide === 'right' ? f.leftDeg : f.rightDeg;
    return {
      index: f.index,
      tSec: f.tSec,
      tiltDeg: tiltsDeg[i],
      downhillDeg: k === undefined ? null : down,
      uphillDeg: k === undefined ? null : up,
      downhillShiftPx: k === undefined ? null : downhillShift[k],
      uphillShiftPx: k === undefined ? null : uphillShift[k],
    };
  });

  const tilts = ok.map((p) => p.tilt);
  const downhillOnsetDeg = onset(tilts, downhillShift, o);
  const uphillOnsetDeg = onset(tilts, uphillShift, o);
  const rollOffTiltDeg =
    downhillOnsetDeg === null || uphillOnsetDeg === null
      ? null
      : Math.max(downhillOnsetDeg, uphillOnsetDeg);
  if (rollOffTiltDeg === null)
    warnings.push({
      code: 'no_roll_off',
      message: `The contact line did not move as a whole up to ${Math.max(...tiltsDeg).toFixed(1)}° of tilt; tilt further or use a larger drop.`,
    });

  let atRollOff: TiltResult['atRollOff'] = null;
  if (rollOffTiltDeg !== null) {
    const before = out.filter(
      (f) => f.tiltDeg <= rollOffTiltDeg + 1e-9 && f.downhillDeg !== null && f.uphillDeg !== null,
    );
    const last = before.slice(-o.rollOffFrames);
    if (last.length >= 3) {
      const at = (values: number[]): AngleAtTilt => {
        const line = fitLine(
          last.map((f) => f.tiltDeg),
          values,
          rollOffTiltDeg,
        );
        return { angleDeg: line.intercept, standardErrorDeg: line.interceptSe };
      };
      const downhill = at(last.map((f) => f.downhillDeg as number));
      const uphill = at(last.map((f) => f.uphillDeg as number));
      atRollOff = { downhill, uphill, hysteresisDeg: downhill.angleDeg - uphill.angleDeg };
    }
  }
  return {
    frames: out,
    downhillSide,
    downhillSideSource: source,
    downhillOnsetDeg,
    uphillOnsetDeg,
    rollOffTiltDeg,
    atRollOff,
    warnings,
  };
}

function unit(x: number, y: number): [number, number] {
  const l = Math.hypot(x, y) || 1;
  return x < 0 ? [-x / l, -y / l] : [x / l, y / l];
}

function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** Tilt where a contact point's downhill displacement starts; null when it never clearly moves. */
function onset(
  tilts: readonly number[],
  shift: readonly number[],
  o: typeof DEFAULTS,
): number | null {
  const n = shift.length;
  if (n < o.referenceFrames + o.persistFrames) return null;
  const noise = Math.max(noiseFromSecondDifferences(shift), 0.01);
  const threshold = o.noiseMultiplier * noise;
  let first = -1;
  for (let i = 0; i + o.persistFrames <= n; i++) {
    let all = true;
    for (let j = i; j < i + o.persistFrames; j++) if (!(shift[j] > threshold)) all = false;
    if (all) {
      first = i;
      break;
    }
  }
  if (first < 0) return null;
  // Hinge fit over the frames around the rough onset.
  const from = Math.max(0, first - 8);
  const to = Math.min(n - 1, first + 6);
  const x = tilts.slice(from, to + 1);
  const y = shift.slice(from, to + 1);
  const lo = tilts[Math.max(from, first - 3)];
  const hi = tilts[first];
  let best = { ssr: Infinity, at: hi };
  const steps = 400;
  for (let k = 0; k <= steps; k++) {
    const at = lo + ((hi - lo) * k) / steps;
    const ssr = hingeResidual(
      x.map((a) => Math.max(0, a - at)),
      y,
    );
    if (ssr < best.ssr) best = { ssr, at };
  }
  return best.at;
}

/** Residual sum of squares of y against 1, s, s² (s = 0 before the hinge, > 0 past it). */
function hingeResidual(s: readonly number[], y: readonly number[]): number {
  const moving = s.filter((v) => v > 0).length;
  // With fewer than three moving points the quadratic is not determined; fall back to the line.
  const degree = moving >= 3 ? 2 : moving >= 1 ? 1 : 0;
  const fit = fitPolynomial(s, y, degree);
  let ssr = 0;
  for (let i = 0; i < y.length; i++) {
    let value = 0;
    for (let j = fit.coefficients.length - 1; j >= 0; j--)
      value = value * s[i] + fit.coefficients[j];
    ssr += (y[i] - value) ** 2;
  }
  return ssr;
}
