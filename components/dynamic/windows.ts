/**
 * Moving a time window over a series (the advancing and receding windows, the rate window of an
 * angle-over-time series): an edge typed or dragged, or the whole window shifted, always kept
 * inside the series and with its start before its end. Plain functions, tested without a page.
 */
import type { PhaseWindow } from '@/lib/dynamic/types';

export interface SeriesSpan {
  startSec: number;
  endSec: number;
}

/** The span of the frames' times; null for an empty series. */
export function spanOf(times: readonly number[]): SeriesSpan | null {
  if (times.length === 0) return null;
  let startSec = times[0];
  let endSec = times[0];
  for (const t of times) {
    if (t < startSec) startSec = t;
    if (t > endSec) endSec = t;
  }
  return { startSec, endSec };
}

const clamp = (value: number, span: SeriesSpan) =>
  Math.min(span.endSec, Math.max(span.startSec, value));

/**
 * One edge moved to `sec` (clamped to the series); when it passes the other edge the other edge
 * goes with it, so the window never turns inside out.
 */
export function moveEdge(
  window: PhaseWindow,
  edge: 'from' | 'to',
  sec: number,
  span: SeriesSpan,
): PhaseWindow {
  if (!Number.isFinite(sec)) return window;
  const at = clamp(sec, span);
  if (edge === 'from') return { fromSec: at, toSec: Math.max(at, window.toSec) };
  return { fromSec: Math.min(at, window.fromSec), toSec: at };
}

/** The whole window shifted by `deltaSec`, stopping at the ends of the series with its length. */
export function shiftWindow(window: PhaseWindow, deltaSec: number, span: SeriesSpan): PhaseWindow {
  const length = Math.min(window.toSec - window.fromSec, span.endSec - span.startSec);
  const from = Math.min(span.endSec - length, Math.max(span.startSec, window.fromSec + deltaSec));
  return { fromSec: from, toSec: from + length };
}

/** A new window for a phase the detection did not find: the middle third of the series. */
export function defaultWindow(span: SeriesSpan): PhaseWindow {
  const third = (span.endSec - span.startSec) / 3;
  return { fromSec: span.startSec + third, toSec: span.endSec - third };
}
