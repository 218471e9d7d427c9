import type { Baseline, Point } from './types';

/**
 * The baseline frame: origin at the baseline's first point, u along the baseline to the right,
 * v perpendicular to it pointing up (away from the substrate). Image y points down.
 */
export class BaselineFrame {
  readonly ox: number;
  readonly oy: number;
  readonly eu: Point;
  readonly ev: Point;
  constructor(readonly baseline: Baseline) {
    let dx = baseline.x2 - baseline.x1;
    let dy = baseline.y2 - baseline.y1;
    if (dx < 0) {
      dx = -dx;
      dy = -dy;
    }
    const len = Math.hypot(dx, dy);
    if (!(len > 0)) throw new Error('The baseline needs two distinct points.');
    this.ox = baseline.x1;
    this.oy = baseline.y1;
    this.eu = [dx / len, dy / len];
    this.ev = [dy / len, -dx / len];
  }
  toFrame(x: number, y: number): Point {
    const dx = x - this.ox;
    const dy = y - this.oy;
    return [dx * this.eu[0] + dy * this.eu[1], dx * this.ev[0] + dy * this.ev[1]];
  }
  /** The v (height above the baseline) of an image point. */
  toFrameV(x: number, y: number): number {
    return (x - this.ox) * this.ev[0] + (y - this.oy) * this.ev[1];
  }
  toImage(u: number, v: number): Point {
    return [this.ox + u * this.eu[0] + v * this.ev[0], this.oy + u * this.eu[1] + v * this.ev[1]];
  }
  /** The same frame with the baseline moved by `dv` px along its upward normal. */
  shifted(dv: number): BaselineFrame {
    const [x1, y1] = this.toImage(0, dv);
    const [x2, y2] = this.toImage(100, dv);
    return new BaselineFrame({ x1, y1, x2, y2 });
  }
  /** Tilt of the baseline in degrees (positive: falls to the right in the image). */
  tiltDeg(): number {
    return (Math.atan2(this.eu[1], this.eu[0]) * 180) / Math.PI;
  }
}
