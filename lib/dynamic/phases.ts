/**
 * Contact-line phases from the base diameter over time, and the advancing and receding angles.
 *
 * The base diameter against time is split into straight pieces where its slope changes (optimal
 * partitioning, ./segments.ts), with the base's noise estimated from the series itself (second
 * differences), so a noisy video needs clearer changes than a clean one. A piece is "moving" when
 * its slope exceeds `noiseMultiplier` standard errors and the base changes by at least
 * `minChangePx` over it (the analysis' own slight dependence of the base on the angle must not
 * count as motion); growing base = advancing, shrinking = receding, else pinned. Neighbouring
 * pieces of one kind join, and phases shorter than `minPhaseFrames` join their neighbours. The
 * volume, where the method gives one, is checked to move the same way.
 *
 * Advancing angle = mean over the frames of the longest advancing phase, less `edgeFrames` frames
 * at each end (where the contact line starts or stops and the angle settles) and as many more as
 * the noise blurs where the phase starts (3σ over the base's change per frame); receding likewise;
 * hysteresis = advancing − receding. This follows the needle-in practice for advancing angles
 * (ASTM D7334) and dynamic angles (ISO 19403-6): the angle is read while the contact line moves
 * steadily. The caller may pass its own windows instead.
 */
import { mean, sampleSd } from '../stats/describe';
import { fitLine, noiseFromSecondDifferences } from './regression';
import { segmentLines } from './segments';
import type { DynamicKind } from './measurement';
import type { AngleWindowStats, PhaseWindow, SeriesFrame, SeriesWarning } from './types';

export type PhaseKind = 'pinned' | 'advancing' | 'receding';

export interface PhaseSegment {
  kind: PhaseKind;
  /** Input indices of the first and last frame of the phase (inclusive). */
  fromIndex: number;
  toIndex: number;
  fromSec: number;
  toSec: number;
  frameCount: number;
}

export interface PhaseOptions {
  /** Slope threshold in standard errors of the slope (default 4). */
  noiseMultiplier?: number;
  /** Smallest change of the base diameter over a piece that counts as motion (default 1 px). */
  minChangePx?: number;
  /** Shortest phase kept; shorter runs join their neighbours (default 3 frames). */
  minPhaseFrames?: number;
  /** Frames left out at each end of a phase for its default window (default 1). */
  edgeFrames?: number;
  /** Cost of one more straight piece, in units of the noise variance (default 4 ln n). */
  penalty?: number;
}

export interface PhaseDetection {
  segments: PhaseSegment[];
  /** d(base diameter)/dt per input frame (px/s), the slope of its straight piece; null without a base. */
  baseRatePxPerSec: (number | null)[];
  /** Noise of the base diameter estimated from the series (px). */
  baseNoisePx: number;
  /** Default windows: the longest advancing and receding phases, less their edge frames. */
  advancingWindow: PhaseWindow | null;
  recedingWindow: PhaseWindow | null;
  warnings: SeriesWarning[];
}

type FrameValues = Pick<SeriesFrame, 'index' | 'tSec' | 'baseDiameterPx' | 'volumePx3'>;

const DEFAULTS = { noiseMultiplier: 4, minChangePx: 1, minPhaseFrames: 3, edgeFrames: 1 };

/** Smallest base-diameter noise assumed (px): a noise-free series must not make every wobble a break. */
const NOISE_FLOOR_PX = 0.01;

export function detectPhases(
  frames: readonly FrameValues[],
  options: PhaseOptions = {},
): PhaseDetection {
  const o = { ...DEFAULTS, ...options };
  const warnings: SeriesWarning[] = [];
  const valid = frames.filter(
    (f) => f.baseDiameterPx !== null && Number.isFinite(f.baseDiameterPx),
  );
  const rates: (number | null)[] = frames.map(() => null);
  const needed = Math.max(5, o.minPhaseFrames);
  if (valid.length < needed) {
    warnings.push({
      code: 'too_few_frames',
      message: `Only ${valid.length} frames have a drop; at least ${needed} are needed to tell pinned from moving.`,
    });
    return {
      segments: [],
      baseRatePxPerSec: rates,
      baseNoisePx: 0,
      advancingWindow: null,
      recedingWindow: null,
      warnings,
    };
  }
  const t = valid.map((f) => f.tSec);
  const base = valid.map((f) => f.baseDiameterPx as number);
  const noise = Math.max(noiseFromSecondDifferences(base), NOISE_FLOOR_PX);
  const pieces = segmentLines(t, base, { sigma: noise, penalty: o.penalty });
  const position = new Map(frames.map((f, i) => [f, i]));
  const kinds: PhaseKind[] = [];
  for (const piece of pieces) {
    const sigma = Math.max(noise, piece.residualSd);
    const standardError = piece.sxx > 0 ? sigma / Math.sqrt(piece.sxx) : Infinity;
    const change = piece.slope * (t[piece.to] - t[piece.from]);
    const moving =
      Math.abs(piece.slope) > o.noiseMultiplier * standardError &&
      Math.abs(change) >= o.minChangePx;
    const kind: PhaseKind = !moving ? 'pinned' : piece.slope > 0 ? 'advancing' : 'receding';
    for (let k = piece.from; k <= piece.to; k++) {
      kinds[k] = kind;
      rates[position.get(valid[k]) as number] = piece.slope;
    }
  }

  const runs = mergeShortRuns(toRuns(kinds), o.minPhaseFrames);
  const segments: PhaseSegment[] = runs.map((r) => ({
    kind: r.kind,
    fromIndex: valid[r.from].index,
    toIndex: valid[r.to].index,
    fromSec: valid[r.from].tSec,
    toSec: valid[r.to].tSec,
    frameCount: r.to - r.from + 1,
  }));

  for (const r of runs) {
    if (r.kind === 'pinned') continue;
    const volumes = valid.slice(r.from, r.to + 1).map((f) => f.volumePx3);
    const first = volumes[0];
    const last = volumes[volumes.length - 1];
    if (first === null || last === null || !(first > 0)) continue;
    const change = (last - first) / first;
    if ((r.kind === 'advancing' && change < -0.01) || (r.kind === 'receding' && change > 0.01)) {
      warnings.push({
        code: 'phase_volume_disagree',
        message: `From ${valid[r.from].tSec.toFixed(2)} s to ${valid[r.to].tSec.toFixed(2)} s the base ${r.kind === 'advancing' ? 'grows' : 'shrinks'} while the volume ${change < 0 ? 'falls' : 'rises'} by ${Math.abs(100 * change).toFixed(1)} %; the drop may be sliding, spreading or evaporating rather than being grown or withdrawn.`,
      });
    }
  }

  const window = (kind: PhaseKind): PhaseWindow | null => {
    let best: { from: number; to: number } | null = null;
    for (const r of runs)
      if (r.kind === kind && (!best || r.to - r.from > best.to - best.from)) best = r;
    if (!best) return null;
    // Where a phase starts is known to about 3σ / (base change per frame) frames: leave that out too.
    const run = { t: t.slice(best.from, best.to + 1), base: base.slice(best.from, best.to + 1) };
    const perFrame =
      run.t.length > 1
        ? Math.abs(fitLine(run.t, run.base).slope) *
          ((run.t[run.t.length - 1] - run.t[0]) / (run.t.length - 1))
        : 0;
    const edge =
      o.edgeFrames + (perFrame > 0 ? Math.min(Math.ceil((3 * noise) / perFrame), 10) : 0);
    let from = best.from + edge;
    let to = best.to - edge;
    if (to < from) from = to = (best.from + best.to) >> 1;
    if (to - from < 2)
      warnings.push({
        code: 'short_phase',
        message: `The ${kind} phase (${best.to - best.from + 1} frames) leaves only ${to - from + 1} steady frame${to > from ? 's' : ''} once its edges are left out. Record more frames while the contact line moves.`,
      });
    return { fromSec: valid[from].tSec, toSec: valid[to].tSec };
  };
  const advancingWindow = window('advancing');
  const recedingWindow = window('receding');
  return {
    segments,
    baseRatePxPerSec: rates,
    baseNoisePx: noise,
    advancingWindow,
    recedingWindow,
    warnings,
  };
}

interface Run {
  kind: PhaseKind;
  from: number;
  to: number;
}

function toRuns(kinds: readonly PhaseKind[]): Run[] {
  const runs: Run[] = [];
  kinds.forEach((kind, i) => {
    const last = runs[runs.length - 1];
    if (last && last.kind === kind) last.to = i;
    else runs.push({ kind, from: i, to: i });
  });
  return runs;
}

/** Repeatedly gives the shortest run below `minLength` to its neighbours, then joins equal neighbours. */
function mergeShortRuns(input: Run[], minLength: number): Run[] {
  const runs = input.map((r) => ({ ...r }));
  const length = (r: Run) => r.to - r.from + 1;
  for (;;) {
    if (runs.length < 2) return runs;
    let shortest = -1;
    for (let i = 0; i < runs.length; i++)
      if (length(runs[i]) < minLength && (shortest < 0 || length(runs[i]) < length(runs[shortest])))
        shortest = i;
    if (shortest < 0) return runs;
    const prev = runs[shortest - 1];
    const next = runs[shortest + 1];
    const into =
      prev && next
        ? prev.kind === next.kind || length(prev) >= length(next)
          ? prev
          : next
        : (prev ?? next);
    into.from = Math.min(into.from, runs[shortest].from);
    into.to = Math.max(into.to, runs[shortest].to);
    runs.splice(shortest, 1);
    for (let i = runs.length - 1; i > 0; i--) {
      if (runs[i].kind === runs[i - 1].kind) {
        runs[i - 1].to = runs[i].to;
        runs.splice(i, 1);
      }
    }
  }
}

/** Angle statistics over the analysed frames whose time lies inside the window (ends included). */
export function windowStats(
  frames: readonly Pick<SeriesFrame, 'tSec' | 'leftDeg' | 'rightDeg' | 'meanDeg'>[],
  window: PhaseWindow,
): AngleWindowStats | null {
  const inside = frames.filter(
    (f) =>
      f.tSec >= window.fromSec - 1e-9 &&
      f.tSec <= window.toSec + 1e-9 &&
      f.meanDeg !== null &&
      f.leftDeg !== null &&
      f.rightDeg !== null,
  );
  if (!inside.length) return null;
  const means = inside.map((f) => f.meanDeg as number);
  return {
    meanDeg: mean(means),
    leftDeg: mean(inside.map((f) => f.leftDeg as number)),
    rightDeg: mean(inside.map((f) => f.rightDeg as number)),
    sdDeg: means.length > 1 ? sampleSd(means) : null,
    fromSec: inside[0].tSec,
    toSec: inside[inside.length - 1].tSec,
    frameCount: inside.length,
  };
}

export interface DynamicSummary {
  phases: PhaseDetection;
  advancingWindow: PhaseWindow | null;
  recedingWindow: PhaseWindow | null;
  advancing: AngleWindowStats | null;
  receding: AngleWindowStats | null;
  /** Advancing − receding mean angle; null unless both are known. */
  hysteresisDeg: number | null;
  warnings: SeriesWarning[];
}

export interface SummaryOptions extends PhaseOptions {
  /** The kind of series, for which warnings are expected of it (see `isFlagged`). */
  kind?: DynamicKind;
  /**
   * Windows chosen by the user; they replace the detected ones. `null` means "no such phase";
   * leaving a key out keeps the detected window.
   */
  windows?: { advancing?: PhaseWindow | null; receding?: PhaseWindow | null };
}

/** Phases, advancing and receding angles and hysteresis of an analysed series. */
export function summariseDynamic(
  frames: readonly SeriesFrame[],
  options: SummaryOptions = {},
): DynamicSummary {
  const phases = detectPhases(frames, options);
  const warnings: SeriesWarning[] = [...frameWarnings(frames, options.kind), ...phases.warnings];
  const chosen = options.windows ?? {};
  const advancingWindow =
    chosen.advancing !== undefined ? chosen.advancing : phases.advancingWindow;
  const recedingWindow = chosen.receding !== undefined ? chosen.receding : phases.recedingWindow;
  const stats = (window: PhaseWindow | null, kind: 'advancing' | 'receding') => {
    if (!window) {
      warnings.push({
        code: kind === 'advancing' ? 'no_advancing_phase' : 'no_receding_phase',
        message:
          kind === 'advancing'
            ? 'No frames where the contact line moves outward were found; grow the drop until its base spreads, or choose the window by hand.'
            : 'No frames where the contact line moves inward were found; withdraw liquid until its base shrinks, or choose the window by hand.',
      });
      return null;
    }
    const s = windowStats(frames, window);
    if (!s)
      warnings.push({
        code: 'empty_window',
        message: `The ${kind} window ${window.fromSec.toFixed(2)}–${window.toSec.toFixed(2)} s holds no analysed frame.`,
      });
    return s;
  };
  const advancing = stats(advancingWindow, 'advancing');
  const receding = stats(recedingWindow, 'receding');
  return {
    phases,
    advancingWindow,
    recedingWindow,
    advancing,
    receding,
    hysteresisDeg: advancing && receding ? advancing.meanDeg - receding.meanDeg : null,
    warnings,
  };
}

/**
 * The one rule for "this frame needs a look", used by the page's flagged list, the server's
 * counts and the CLI's series notes alike: the frame failed, or it carries a warning the series
 * does not expect. The needle in the drop is expected always (in the needle-in method it is there on
 * purpose); left and right angles that differ are expected on a tilting plate (downhill and uphill
 * are what it measures).
 */
export function isFlagged(
  frame: Pick<SeriesFrame, 'meanDeg' | 'warnings'>,
  kind?: DynamicKind,
): boolean {
  const expected = (code: string) =>
    code === 'needle_in_contact' || (kind === 'tilt' && code === 'left_right_disagree');
  return frame.meanDeg === null || frame.warnings.some((w) => !expected(w.code));
}

/** Series-level notes about failed and flagged frames (each frame keeps its own warnings). */
export function frameWarnings(frames: readonly SeriesFrame[], kind?: DynamicKind): SeriesWarning[] {
  const warnings: SeriesWarning[] = [];
  const failed = frames.filter((f) => f.meanDeg === null).map((f) => f.index);
  if (failed.length)
    warnings.push({
      code: 'frames_failed',
      message: `${failed.length} of ${frames.length} frames could not be analysed (frames ${listIndices(failed)}); they are left out of every mean. Each says why in its warnings.`,
    });
  const flagged = frames
    .filter((f) => f.meanDeg !== null && isFlagged(f, kind))
    .map((f) => f.index);
  if (flagged.length)
    warnings.push({
      code: 'frames_flagged',
      message: `${flagged.length} analysed frames carry warnings (frames ${listIndices(flagged)}); check them.`,
    });
  return warnings;
}

/** "3, 7–12, 20" */
function listIndices(indices: readonly number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < indices.length; i++) {
    let j = i;
    while (j + 1 < indices.length && indices[j + 1] === indices[j] + 1) j++;
    parts.push(j > i ? `${indices[i]}–${indices[j]}` : `${indices[i]}`);
    i = j;
  }
  return parts.join(', ');
}
