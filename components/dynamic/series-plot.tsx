'use client';

import {
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceArea,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { isFlagged, type DynamicKind } from '@/lib/dynamic/measurement';
import type { PhaseWindow } from '@/lib/dynamic/types';
import type { SeriesFrameResult } from '@/lib/dynamic/worker-protocol';

/** A shaded window on the plot, with the colour and dash pattern that name it in the legend. */
export interface PlotWindow {
  name: string;
  window: PhaseWindow;
  fill: string;
}

const ANGLE = '#116467';
const BASE = '#7a4b00';
const VOLUME = '#5b3f8c';
const FLAG = '#b32f1d';

type Row = {
  tSec: number;
  meanDeg: number | null;
  baseDiameterPx: number | null;
  volumePx3: number | null;
  flaggedDeg: number | null;
};

function rowsOf(frames: readonly SeriesFrameResult[], kind?: DynamicKind): Row[] {
  return frames.map((f) => ({
    tSec: f.tSec,
    meanDeg: f.meanDeg,
    baseDiameterPx: f.baseDiameterPx,
    volumePx3: f.volumePx3,
    // Flagged frames are drawn again as crosses, on the angle where there is one, else on the axis.
    flaggedDeg: isFlagged(f, kind) ? (f.meanDeg ?? 0) : null,
  }));
}

const seconds = (v: number) => `${Number(v.toPrecision(3))} s`;

/** The time axis both plots share (drawn as an element: the chart reads its children's types). */
const timeAxis = (domain: [number, number | 'dataMax']) => (
  <XAxis dataKey="tSec" type="number" domain={domain} tickCount={8} fontSize={11} tickFormatter={seconds} />
);

/** The shaded windows on one plot; the upper plot names them. */
const windowAreas = (windows: readonly PlotWindow[], yAxisId: string, named: boolean) =>
  windows.map((w) => (
    <ReferenceArea
      key={w.name}
      yAxisId={yAxisId}
      x1={w.window.fromSec}
      x2={w.window.toSec}
      fill={w.fill}
      fillOpacity={0.18}
      {...(named ? { label: { value: w.name, position: 'insideTop' as const, fontSize: 11, fill: '#263040' } } : {})}
    />
  ));

function Cross({ cx, cy }: { cx?: number; cy?: number }) {
  if (cx === undefined || cy === undefined) return null;
  return (
    <path
      d={`M${cx - 4},${cy - 4}L${cx + 4},${cy + 4}M${cx - 4},${cy + 4}L${cx + 4},${cy - 4}`}
      stroke={FLAG}
      strokeWidth={2}
    />
  );
}

/**
 * The series against time as frames finish: the contact angle (top) with the chosen windows
 * shaded and flagged frames as red crosses, and the base diameter and volume (bottom) whose
 * changes show where the contact line is pinned and where it moves. `width` fixes the size
 * (tests); otherwise the plot fills its column.
 */
export function SeriesPlot({
  frames,
  kind,
  windows,
  endSec,
  width,
}: {
  frames: readonly SeriesFrameResult[];
  /** The kind of series, for which warnings are expected (lib/dynamic/phases.ts isFlagged). */
  kind?: DynamicKind;
  windows: readonly PlotWindow[];
  /** The series' last time when known in advance, so the axis does not grow while frames land. */
  endSec: number | null;
  width?: number;
}) {
  const rows = rowsOf(frames, kind);
  const domain: [number, number | 'dataMax'] = [0, endSec ?? 'dataMax'];
  const hasVolume = frames.some((f) => f.volumePx3 !== null);
  const flagged = frames.filter((f) => isFlagged(f, kind)).length;
  const chart = (children: React.ReactElement) =>
    width ? (
      <div style={{ width, height: 220 }}>{children}</div>
    ) : (
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          {children}
        </ResponsiveContainer>
      </div>
    );
  const size = width ? { width, height: 220 } : {};
  return (
    <figure data-testid="series-plot" data-points={frames.length} className="space-y-2">
      <figcaption className="text-sm text-ink-700">
        {frames.length} frame{frames.length === 1 ? '' : 's'} plotted
        {flagged ? `, ${flagged} flagged (red crosses)` : ''}.{' '}
        {windows.length ? `Shaded: ${windows.map((w) => w.name).join(', ')} window.` : null}
      </figcaption>
      {chart(
        <ComposedChart data={rows} margin={{ top: 8, right: 8, bottom: 4, left: 4 }} {...size}>
          <CartesianGrid stroke="#e6eaef" />
          {timeAxis(domain)}
          <YAxis
            yAxisId="angle"
            domain={['auto', 'auto']}
            unit="°"
            fontSize={11}
            label={{ value: 'Contact angle', angle: -90, position: 'insideLeft', fontSize: 11 }}
          />
          {hasVolume ? (
            // Room for the volume axis of the plot below, so both time axes line up.
            <YAxis yAxisId="align" orientation="right" tick={false} axisLine={false} width={60} />
          ) : null}
          <Tooltip formatter={(value) => (typeof value === 'number' ? value.toFixed(2) : String(value))} />
          {windowAreas(windows, 'angle', true)}
          <Line
            yAxisId="angle"
            dataKey="meanDeg"
            name="Mean angle (°)"
            stroke={ANGLE}
            dot={{ r: 2 }}
            isAnimationActive={false}
            connectNulls={false}
          />
          <Scatter
            yAxisId="angle"
            dataKey="flaggedDeg"
            name="Flagged frame"
            shape={<Cross />}
            isAnimationActive={false}
          />
        </ComposedChart>,
      )}
      {chart(
        <ComposedChart data={rows} margin={{ top: 8, right: 8, bottom: 4, left: 4 }} {...size}>
          <CartesianGrid stroke="#e6eaef" />
          {timeAxis(domain)}
          <YAxis
            yAxisId="base"
            domain={['auto', 'auto']}
            fontSize={11}
            label={{ value: 'Base (px)', angle: -90, position: 'insideLeft', fontSize: 11 }}
          />
          {hasVolume ? (
            <YAxis
              yAxisId="volume"
              orientation="right"
              domain={['auto', 'auto']}
              fontSize={11}
              width={60}
              tickFormatter={(v: number) => v.toExponential(1)}
              label={{ value: 'Volume (px³)', angle: 90, position: 'insideRight', fontSize: 11 }}
            />
          ) : null}
          <Tooltip formatter={(value) => (typeof value === 'number' ? value.toFixed(1) : String(value))} />
          {windowAreas(windows, 'base', false)}
          <Line
            yAxisId="base"
            dataKey="baseDiameterPx"
            name="Base diameter (px)"
            stroke={BASE}
            strokeDasharray="6 3"
            dot={false}
            isAnimationActive={false}
          />
          {hasVolume ? (
            <Line
              yAxisId="volume"
              dataKey="volumePx3"
              name="Volume (px³)"
              stroke={VOLUME}
              strokeDasharray="2 2"
              dot={false}
              isAnimationActive={false}
            />
          ) : null}
        </ComposedChart>,
      )}
      <p className="flex flex-wrap gap-4 text-xs text-ink-700">
        <span>
          <span aria-hidden="true" style={{ color: ANGLE }}>
            ━
          </span>{' '}
          mean angle
        </span>
        <span>
          <span aria-hidden="true" style={{ color: BASE }}>
            ╍
          </span>{' '}
          base diameter
        </span>
        {hasVolume ? (
          <span>
            <span aria-hidden="true" style={{ color: VOLUME }}>
              ┄
            </span>{' '}
            volume
          </span>
        ) : (
          <span>volume: the chosen method gives none (polynomial)</span>
        )}
        <span>
          <span aria-hidden="true" style={{ color: FLAG }}>
            ✕
          </span>{' '}
          flagged frame
        </span>
      </p>
    </figure>
  );
}
