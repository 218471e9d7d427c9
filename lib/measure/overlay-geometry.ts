import type { Baseline, Point } from '@/lib/analysis/types';

/** Unit vector along the baseline (left to right) and the normal pointing up into the drop. */
export function baselineFrame(baseline: Baseline) {
  let dx = baseline.x2 - baseline.x1;
  let dy = baseline.y2 - baseline.y1;
  if (dx < 0) {
    dx = -dx;
    dy = -dy;
  }
  const length = Math.hypot(dx, dy) || 1;
  const u: Point = [dx / length, dy / length];
  // Image y points down, so "up" is (u.y, -u.x).
  const n: Point = [u[1], -u[0]];
  return { u, n };
}

/**
 * End point of the tangent drawn from a contact point at `angleDeg` to the baseline, measured
 * inside the liquid (left contact opens to the right, right contact to the left).
 */
export function tangentEnd(
  baseline: Baseline,
  contact: Point,
  angleDeg: number,
  side: 'left' | 'right',
  length: number,
): Point {
  const { u, n } = baselineFrame(baseline);
  const t = (angleDeg * Math.PI) / 180;
  const along = side === 'left' ? Math.cos(t) : -Math.cos(t);
  return [
    contact[0] + length * (along * u[0] + Math.sin(t) * n[0]),
    contact[1] + length * (along * u[1] + Math.sin(t) * n[1]),
  ];
}

export type BaselineHandle = 'start' | 'end' | 'line';

/** Moves one end (or the whole line) of a baseline by (dx, dy) image pixels. */
export function nudgeBaseline(
  baseline: Baseline,
  handle: BaselineHandle,
  dx: number,
  dy: number,
): Baseline {
  const round = (v: number) => Math.round(v * 1000) / 1000;
  const moveStart = handle === 'start' || handle === 'line';
  const moveEnd = handle === 'end' || handle === 'line';
  return {
    x1: round(baseline.x1 + (moveStart ? dx : 0)),
    y1: round(baseline.y1 + (moveStart ? dy : 0)),
    x2: round(baseline.x2 + (moveEnd ? dx : 0)),
    y2: round(baseline.y2 + (moveEnd ? dy : 0)),
  };
}

/** Keyboard nudge: arrows move 1 px, with Alt (or Option) 0.1 px. */
export function nudgeFromKey(key: string, fine: boolean): [number, number] | null {
  const step = fine ? 0.1 : 1;
  switch (key) {
    case 'ArrowLeft':
      return [-step, 0];
    case 'ArrowRight':
      return [step, 0];
    case 'ArrowUp':
      return [0, -step];
    case 'ArrowDown':
      return [0, step];
    default:
      return null;
  }
}

/** The baseline extended across the whole image width, for drawing. */
export function baselineAcross(baseline: Baseline, width: number): [Point, Point] {
  const { x1, y1, x2, y2 } = baseline;
  if (Math.abs(x2 - x1) < 1e-9)
    return [
      [x1, 0],
      [x1, width],
    ];
  const slope = (y2 - y1) / (x2 - x1);
  return [
    [0, y1 - slope * x1],
    [width, y1 + slope * (width - x1)],
  ];
}

/** The point of the baseline's line nearest to `p`. */
export function projectOnBaseline(baseline: Baseline, p: Point): Point {
  const { u } = baselineFrame(baseline);
  const t = (p[0] - baseline.x1) * u[0] + (p[1] - baseline.y1) * u[1];
  return [baseline.x1 + t * u[0], baseline.y1 + t * u[1]];
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/**
 * Where the two baseline handles sit, in image pixels: a baseline set by hand at its own ends,
 * the automatic one at the contact points (projected on the line); either way kept `margin`
 * pixels inside the photo so a handle is never cut by the frame.
 */
export function baselineHandles(
  baseline: Baseline,
  contacts: [Point, Point] | null,
  size: { width: number; height: number },
  margin: number,
): { start: Point; end: Point } {
  const [start, end]: [Point, Point] = contacts
    ? [projectOnBaseline(baseline, contacts[0]), projectOnBaseline(baseline, contacts[1])]
    : [
        [baseline.x1, baseline.y1],
        [baseline.x2, baseline.y2],
      ];
  const inside = ([x, y]: Point): Point => [
    clamp(x, margin, size.width - margin),
    clamp(y, margin, size.height - margin),
  ];
  return { start: inside(start), end: inside(end) };
}

/** The baseline through the two handles (what a drag of one of them gives). */
export const baselineThrough = (start: Point, end: Point): Baseline => ({
  x1: start[0],
  y1: start[1],
  x2: end[0],
  y2: end[1],
});

/**
 * Zoom and offset (screen pixels) that frame the contact region: both contact points and the
 * apex height, with a margin, inside a view of `view` screen pixels at `fitScale` px per image px.
 */
export function contactZoom(
  contacts: [Point, Point],
  heightPx: number,
  fitScale: number,
  view: { width: number; height: number },
): { zoom: number; offset: { x: number; y: number } } {
  const [[x1, y1], [x2, y2]] = contacts;
  const margin = Math.max(20, Math.abs(x2 - x1) * 0.12);
  const left = Math.min(x1, x2) - margin;
  const right = Math.max(x1, x2) + margin;
  const bottom = Math.max(y1, y2) + margin;
  const top = Math.min(y1, y2) - Math.max(heightPx, margin) - margin;
  const zoom = clamp(
    Math.min(view.width / ((right - left) * fitScale), view.height / ((bottom - top) * fitScale)),
    1,
    16,
  );
  const scale = fitScale * zoom;
  const cx = (left + right) / 2;
  const cy = (top + bottom) / 2;
  return { zoom, offset: { x: view.width / 2 - cx * scale, y: view.height / 2 - cy * scale } };
}
