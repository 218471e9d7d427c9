'use client';

import type { ReactNode } from 'react';
import {
  CartesianGrid,
  ComposedChart,
  Label,
  Legend,
  Line,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import type { EnvelopePlot, OwrkPlot } from '@/lib/surface-energy/compute';

const LAGOON = '#0f7d80';
const AMBER = '#9a5206';
const INK = '#354154';

const round = (v: number, digits = 2) => Number(v.toFixed(digits));
/** The next round axis end above `v`: 1, 2, 2.5, 5 × a power of ten. */
function niceCeil(v: number): number {
  if (!(v > 0)) return 1;
  const power = 10 ** Math.floor(Math.log10(v));
  const step = [1, 2, 2.5, 5, 10].find((m) => m * power >= v) ?? 10;
  return step * power;
}

type Axis = {
  dataKey?: string;
  domain?: [number, number];
  label: string;
  tickDigits?: number;
};
type Series = { data: object[]; dataKey: string; name: string };

/** Points (the liquids) and a line through them on number axes, with the figures in words. */
function PointsAndLine({
  label,
  testId,
  x,
  y,
  line,
  points,
  tooltipDigits,
  caption,
}: {
  label: string;
  testId: string;
  x: Axis;
  y: Axis;
  line: Series;
  points: Series;
  tooltipDigits: number;
  caption: ReactNode;
}) {
  /** What both number axes share: their key, range, ink and tick digits. */
  const axisProps = (axis: Axis) => ({
    type: 'number' as const,
    dataKey: axis.dataKey,
    domain: axis.domain,
    stroke: INK,
    tickFormatter:
      axis.tickDigits === undefined ? undefined : (v: number) => v.toFixed(axis.tickDigits),
  });
  return (
    <figure aria-label={label} data-testid={testId}>
      <ResponsiveContainer width="100%" height={300}>
        <ComposedChart margin={{ top: 10, right: 20, bottom: 30, left: 10 }}>
          <CartesianGrid stroke="#e6eaef" />
          <XAxis {...axisProps(x)}>
            <Label value={x.label} position="insideBottom" offset={-18} fill={INK} />
          </XAxis>
          <YAxis {...axisProps(y)}>
            <Label
              value={y.label}
              angle={-90}
              position="insideLeft"
              style={{ textAnchor: 'middle' }}
              fill={INK}
            />
          </YAxis>
          <Tooltip
            formatter={(value) =>
              typeof value === 'number' ? value.toFixed(tooltipDigits) : String(value)
            }
          />
          <Legend verticalAlign="top" height={28} />
          <Line
            data={line.data}
            dataKey={line.dataKey}
            name={line.name}
            stroke={LAGOON}
            dot={false}
            strokeWidth={2}
            isAnimationActive={false}
          />
          <Scatter
            data={points.data}
            dataKey={points.dataKey}
            name={points.name}
            fill={AMBER}
            isAnimationActive={false}
          />
        </ComposedChart>
      </ResponsiveContainer>
      <figcaption className="mt-1 text-xs text-ink-600">{caption}</figcaption>
    </figure>
  );
}

/**
 * OWRK regression: y = γL(1 + cos θ)/(2√γLd) against x = √(γLp/γLd) for each liquid, and the
 * fitted line y = √γSp·x + √γSd.
 */
export function OwrkChart({ plot }: { plot: OwrkPlot }) {
  const xMax = niceCeil(Math.max(...plot.points.map((p) => p.x)) * 1.05);
  return (
    <PointsAndLine
      label="OWRK regression plot"
      testId="owrk-plot"
      x={{ dataKey: 'x', domain: [0, xMax], label: '√(γLp / γLd)', tickDigits: 1 }}
      y={{ label: 'γL(1 + cos θ) / 2√γLd', tickDigits: 1 }}
      line={{
        data: [
          { x: 0, fitted: round(plot.intercept, 4) },
          { x: round(xMax, 4), fitted: round(plot.intercept + plot.slope * xMax, 4) },
        ],
        dataKey: 'fitted',
        name: `Fitted line (R² = ${plot.rSquared.toFixed(3)})`,
      }}
      points={{
        data: plot.points.map((p) => ({ x: round(p.x, 4), y: round(p.y, 4), liquid: p.liquid })),
        dataKey: 'y',
        name: 'Liquids',
      }}
      tooltipDigits={3}
      caption={
        <>
          Slope √γSp = {plot.slope.toFixed(3)}, intercept √γSd = {plot.intercept.toFixed(3)}, R² ={' '}
          {plot.rSquared.toFixed(3)}
          {plot.points.length === 2
            ? ' (two liquids: the line passes through both points, so R² says nothing).'
            : '.'}{' '}
          Points:{' '}
          {plot.points.map((p) => `${p.liquid} (${p.x.toFixed(2)}, ${p.y.toFixed(2)})`).join('; ')}.
        </>
      }
    />
  );
}

/**
 * Wetting envelope: the liquids (γLd, γLp) that would show the envelope angle on this solid; a
 * liquid inside the curve wets it at a smaller angle.
 */
export function EnvelopeChart({ envelope }: { envelope: EnvelopePlot }) {
  const curve = envelope.points.map((p) => ({
    d: round(p.gammaDispersive),
    p: round(p.gammaPolar),
  }));
  const liquids = envelope.liquids.map((l) => ({
    d: l.gammaDispersive,
    p: l.gammaPolar,
    name: l.name,
  }));
  const top = niceCeil(
    Math.max(...curve.map((c) => Math.max(c.d, c.p)), ...liquids.map((l) => Math.max(l.d, l.p))) *
      1.02,
  );
  return (
    <PointsAndLine
      label="Wetting envelope"
      testId="envelope-plot"
      x={{ dataKey: 'd', domain: [0, top], label: 'Dispersive γd (mN/m)' }}
      y={{ dataKey: 'p', domain: [0, top], label: 'Polar γp (mN/m)' }}
      line={{ data: curve, dataKey: 'p', name: `Envelope, θ = ${envelope.angleDeg}°` }}
      points={{ data: liquids, dataKey: 'p', name: 'Probe liquids' }}
      tooltipDigits={1}
      caption={
        <>
          Probe liquids:{' '}
          {envelope.liquids
            .map((l) => `${l.name} (γd ${l.gammaDispersive}, γp ${l.gammaPolar} mN/m)`)
            .join('; ')}
          .{' '}
          {envelope.angleDeg === 0
            ? 'A liquid whose point lies inside the curve spreads completely on the surface (θ = 0°); one outside it stands as a drop.'
            : `A liquid whose point lies inside the curve wets the surface with a contact angle below ${envelope.angleDeg}°; one outside it stands at a larger angle.`}
        </>
      }
    />
  );
}
