import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { pageMeasurement, type EditorChoices } from '@/components/dynamic/measurement';
import { SeriesPlot } from '@/components/dynamic/series-plot';
import { WindowControls } from '@/components/dynamic/window-controls';
import { defaultWindow, moveEdge, shiftWindow, spanOf } from '@/components/dynamic/windows';
import type { SeriesFrameResult } from '@/lib/dynamic/worker-protocol';

const span = { startSec: 0, endSec: 10 };

/** A frame as the worker answers it; angles and base are the test's own numbers. */
function frame(index: number, meanDeg: number | null, baseDiameterPx: number, warn = false): SeriesFrameResult {
  return {
    index,
    tSec: index,
    leftDeg: meanDeg === null ? null : meanDeg - 0.5,
    rightDeg: meanDeg === null ? null : meanDeg + 0.5,
    meanDeg,
    baseDiameterPx: meanDeg === null ? null : baseDiameterPx,
    heightPx: null,
    volumePx3: null,
    contactLeft: null,
    contactRight: null,
    baseline: null,
    warnings: warn || meanDeg === null ? [{ code: 'low_contrast', message: 'Low contrast.' }] : [],
    tracking: { roi: null, baseline: 'found', retried: false, warmStart: false },
    timeMs: 1,
  };
}

const choices = (over: Partial<EditorChoices> = {}): EditorChoices => ({
  kind: 'grow-and-withdraw',
  windows: {},
  tilt: { type: 'rate', rateDegPerSec: '1', startDeg: '0' },
  downhillSide: 'auto',
  initialFrames: 5,
  initialDegree: 1,
  ...over,
});

describe('moving a window over a series', () => {
  it('keeps an edge inside the series and never lets the window turn inside out', () => {
    expect(moveEdge({ fromSec: 2, toSec: 5 }, 'from', 7, span)).toEqual({ fromSec: 7, toSec: 7 });
    expect(moveEdge({ fromSec: 2, toSec: 5 }, 'to', 1, span)).toEqual({ fromSec: 1, toSec: 1 });
    expect(moveEdge({ fromSec: 2, toSec: 5 }, 'to', 99, span)).toEqual({ fromSec: 2, toSec: 10 });
    expect(moveEdge({ fromSec: 2, toSec: 5 }, 'from', -3, span)).toEqual({ fromSec: 0, toSec: 5 });
    expect(moveEdge({ fromSec: 2, toSec: 5 }, 'from', Number.NaN, span)).toEqual({ fromSec: 2, toSec: 5 });
  });

  it('shifts a whole window and stops at the ends with its length', () => {
    expect(shiftWindow({ fromSec: 2, toSec: 5 }, 1, span)).toEqual({ fromSec: 3, toSec: 6 });
    expect(shiftWindow({ fromSec: 2, toSec: 5 }, 20, span)).toEqual({ fromSec: 7, toSec: 10 });
    expect(shiftWindow({ fromSec: 2, toSec: 5 }, -20, span)).toEqual({ fromSec: 0, toSec: 3 });
  });

  it('finds the span of the frames and a middle third for a new window', () => {
    expect(spanOf([0.5, 3, 1])).toEqual({ startSec: 0.5, endSec: 3 });
    expect(spanOf([])).toBeNull();
    expect(defaultWindow({ startSec: 0, endSec: 9 })).toEqual({ fromSec: 3, toSec: 6 });
  });
});

describe('the window controls', () => {
  it('moves an end when the typed number is applied, shifts by one frame, removes and adds a window', async () => {
    const onChange = vi.fn();
    const { rerender } = render(
      <WindowControls name="Advancing" window={{ fromSec: 2, toSec: 5 }} span={span} stepSec={0.5} detected onChange={onChange} />,
    );
    expect(screen.getByText('(detected)')).toBeTruthy();
    const to = screen.getByLabelText('To (s)');
    await userEvent.clear(to);
    await userEvent.type(to, '4.');
    // Nothing moves while a number is being typed; Enter applies it.
    expect(onChange).not.toHaveBeenCalled();
    await userEvent.type(to, '5{Enter}');
    expect(onChange).toHaveBeenLastCalledWith({ fromSec: 2, toSec: 4.5 });
    await userEvent.click(screen.getByRole('button', { name: 'Shift the advancing window one frame later' }));
    expect(onChange).toHaveBeenLastCalledWith({ fromSec: 2.5, toSec: 5.5 });
    await userEvent.click(screen.getByRole('button', { name: 'Remove' }));
    expect(onChange).toHaveBeenLastCalledWith(null);
    rerender(<WindowControls name="Advancing" window={null} span={span} stepSec={0.5} detected={false} onChange={onChange} />);
    await userEvent.click(screen.getByRole('button', { name: 'Add a advancing window' }));
    expect(onChange).toHaveBeenLastCalledWith(defaultWindow(span));
  });
});

describe('the numbers follow the windows', () => {
  // Grown: base 100 → 140 px at 108°, then withdrawn: base 140 → 100 px at 83°.
  const frames = [
    ...Array.from({ length: 6 }, (_, i) => frame(i, 108 + (i % 2 ? 0.1 : -0.1), 100 + 8 * i)),
    ...Array.from({ length: 6 }, (_, i) => frame(6 + i, 83 + (i % 2 ? 0.1 : -0.1), 140 - 8 * i)),
  ];

  it('takes the advancing and receding means over the frames inside the chosen windows', () => {
    const m = pageMeasurement(frames, choices({ windows: { advancing: { fromSec: 1, toSec: 4 }, receding: { fromSec: 7, toSec: 8 } } }));
    if (!m.ok) throw new Error(m.message);
    expect(m.result.advancing?.frameCount).toBe(4);
    expect(m.result.advancing?.meanDeg).toBeCloseTo(108, 10);
    expect(m.result.receding?.frameCount).toBe(2);
    expect(m.result.receding?.meanDeg).toBeCloseTo(83, 10);
    expect(m.result.hysteresisDeg).toBeCloseTo(25, 10);
    // The save sends the same windows, so the server's numbers are these.
    expect(m.save.windows).toEqual({ advancing: { fromSec: 1, toSec: 4 }, receding: { fromSec: 7, toSec: 8 } });
  });

  it('drops a removed window and says why a tilt cannot be computed', () => {
    const m = pageMeasurement(frames, choices({ windows: { advancing: { fromSec: 0, toSec: 5 }, receding: null } }));
    if (!m.ok) throw new Error(m.message);
    expect(m.result.receding).toBeNull();
    expect(m.result.hysteresisDeg).toBeNull();
    const tilt = pageMeasurement(frames, choices({ kind: 'tilt', tilt: { type: 'rate', rateDegPerSec: '0', startDeg: '0' } }));
    expect(tilt).toEqual({ ok: false, message: 'Type the tilt rate in °/s (a number other than 0).' });
  });
});

describe('the series plot', () => {
  it('plots every frame and counts the flagged ones, failed frames included', () => {
    const frames = [frame(0, 100, 120), frame(1, null, 0), frame(2, 101, 121, true), frame(3, 102, 122)];
    render(<SeriesPlot frames={frames} windows={[{ name: 'Advancing', window: { fromSec: 0, toSec: 3 }, fill: '#2f7d4f' }]} endSec={3} width={600} />);
    const plot = screen.getByTestId('series-plot');
    expect(plot.getAttribute('data-points')).toBe('4');
    expect(plot.textContent).toContain('4 frames plotted, 2 flagged (red crosses)');
    expect(plot.textContent).toContain('Shaded: Advancing window.');
  });
});
