import { describe, expect, it } from 'vitest';
import {
  baselineAcross,
  baselineHandles,
  baselineThrough,
  contactZoom,
  nudgeBaseline,
  nudgeFromKey,
  tangentEnd,
} from '@/lib/measure/overlay-geometry';

const flat = { x1: 100, y1: 300, x2: 500, y2: 300 };

describe('tangent drawing', () => {
  it('at 90° both tangents point straight up (image y down)', () => {
    const [lx, ly] = tangentEnd(flat, [100, 300], 90, 'left', 50);
    expect(lx).toBeCloseTo(100, 9);
    expect(ly).toBeCloseTo(250, 9);
    const [rx, ry] = tangentEnd(flat, [500, 300], 90, 'right', 50);
    expect(rx).toBeCloseTo(500, 9);
    expect(ry).toBeCloseTo(250, 9);
  });

  it('below 90° the left tangent leans into the drop (right), the right one to the left', () => {
    expect(tangentEnd(flat, [100, 300], 60, 'left', 10)[0]).toBeGreaterThan(100);
    expect(tangentEnd(flat, [500, 300], 60, 'right', 10)[0]).toBeLessThan(500);
  });

  it('follows a tilted baseline: the drawn angle to the baseline equals the contact angle', () => {
    const tilted = { x1: 0, y1: 0, x2: 100, y2: 10 };
    const end = tangentEnd(tilted, [0, 0], 120, 'left', 1);
    const along = [100 / Math.hypot(100, 10), 10 / Math.hypot(100, 10)];
    const cos = end[0] * along[0] + end[1] * along[1];
    expect((Math.acos(cos) * 180) / Math.PI).toBeCloseTo(120, 9);
  });
});

describe('baseline editing', () => {
  it('moves one end, or the whole line', () => {
    expect(nudgeBaseline(flat, 'start', 1, -0.1)).toEqual({ x1: 101, y1: 299.9, x2: 500, y2: 300 });
    expect(nudgeBaseline(flat, 'line', 0, 2)).toEqual({ x1: 100, y1: 302, x2: 500, y2: 302 });
  });

  it('nudges by 1 px, or 0.1 px with Alt', () => {
    expect(nudgeFromKey('ArrowUp', false)).toEqual([0, -1]);
    expect(nudgeFromKey('ArrowRight', true)).toEqual([0.1, 0]);
    expect(nudgeFromKey('a', false)).toBeNull();
  });

  it('extends across the image', () => {
    const [[x0, y0], [x1, y1]] = baselineAcross({ x1: 10, y1: 20, x2: 20, y2: 21 }, 100);
    expect([x0, y0]).toEqual([0, 19]);
    expect(x1).toBe(100);
    expect(y1).toBeCloseTo(29, 9);
  });
});

describe('baseline handles and the contact zoom', () => {
  const size = { width: 640, height: 480 };
  const level = { x1: 0, y1: 300, x2: 639, y2: 300 };

  it('puts the automatic baseline handles at the contact points, inside the frame', () => {
    const { start, end } = baselineHandles(
      level,
      [
        [200, 301],
        [440, 299],
      ],
      size,
      8,
    );
    expect(start).toEqual([200, 300]);
    expect(end).toEqual([440, 300]);
    // A baseline set by hand keeps its ends, pulled inside the photo by the margin.
    const hand = baselineHandles(level, null, size, 8);
    expect(hand.start).toEqual([8, 300]);
    expect(hand.end).toEqual([632, 300]);
    // The baseline through the handles is the same line.
    const through = baselineThrough(start, end);
    expect((through.y2 - through.y1) / (through.x2 - through.x1)).toBeCloseTo(0, 12);
  });

  it('frames both contact points and the drop height when zooming to the contact region', () => {
    const view = { width: 800, height: 600 };
    const fit = 800 / 640;
    const { zoom, offset } = contactZoom(
      [
        [200, 300],
        [440, 300],
      ],
      100,
      fit,
      view,
    );
    expect(zoom).toBeGreaterThan(1);
    const scale = fit * zoom;
    for (const [x, y] of [
      [200, 300],
      [440, 300],
      [320, 200],
    ]) {
      const sx = x * scale + offset.x;
      const sy = y * scale + offset.y;
      expect(sx).toBeGreaterThanOrEqual(0);
      expect(sx).toBeLessThanOrEqual(view.width);
      expect(sy).toBeGreaterThanOrEqual(0);
      expect(sy).toBeLessThanOrEqual(view.height);
    }
  });
});
