'use client';

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

/**
 * OWRK regression: y = γL(1 + cos θ)/(2√γLd) against x = √(γLp/γLd) for each liquid, and the
 * fitted line y = √γSp·x + √γSd.
 */
export function OwrkChart({ plot }: { plot: OwrkPlot }) {
  const xs = plot.points.map((p) => p.x);
  const xMax = niceCeil(Math.max(...xs) * 1.05);
  const line = [
    { x: 0, fitted: round(plot.intercept, 4) },
    { x: round(xMax, 4), fitted: round(plot.intercept + plot.slope * xMax, 4) },
  ];
  const points = plot.points.map((p) => ({ x: round(p.x, 4), y: round(p.y, 4), liquid: p.liquid }));
  return (
    <figure aria-label="OWRK regression plot" data-testid="owrk-plot">
      <ResponsiveContainer width="100%" height={300}>
        <ComposedChart margin={{ top: 10, right: 20, bottom: 30, left: 10 }}>
          <CartesianGrid stroke="#e6eaef" />
          <XAxis
            type="number"
            dataKey="x"
            domain={[0, xMax]}
            stroke={INK}
            tickFormatter={(v: number) => v.toFixed(1)}
          >
            <Label value="√(γLp / γLd)" position="insideBottom" offset={-18} fill={INK} />
          </XAxis>
          <YAxis type="number" stroke={INK} tickFormatter={(v: number) => v.toFixed(1)}>
            <Label
              value="γL(1 + cos θ) / 2√γLd"
              angle={-90}
              position="insideLeft"
              style={{ textAnchor: 'middle' }}
              fill={INK}
            />
          </YAxis>
          <Tooltip
            formatter={(value) => (typeof value === 'number' ? value.toFixed(3) : String(value))}
          />
          <Legend verticalAlign="top" height={28} />
          <Line
            data={line}
            dataKey="fitted"
            name={`Fitted line (R² = ${plot.rSquared.toFixed(3)})`}
            stroke={LAGOON}
            dot={false}
            strokeWidth={2}
            isAnimationActive={false}
          />
          <Scatter
            data={points}
            dataKey="y"
            name="Liquids"
            fill={AMBER}
            isAnimationActive={false}
          />
        </ComposedChart>
      </ResponsiveContainer>
      <figcaption className="mt-1 text-xs text-ink-600">
        Slope √γSp = {plot.slope.toFixed(3)}, intercept √γSd = {plot.intercept.toFixed(3)}, R² ={' '}
        {plot.rSquared.toFixed(3)}
        {plot.points.length === 2
          ? ' (two liquids: the line passes through both points, so R² says nothing).'
          : '.'}{' '}
        Points:{' '}
        {plot.points.map((p) => `${p.liquid} (${p.x.toFixed(2)}, ${p.y.toFixed(2)})`).join('; ')}.
      </figcaption>
    </figure>
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
    <figure aria-label="Wetting envelope" data-testid="envelope-plot">
      <ResponsiveContainer width="100%" height={300}>
        <ComposedChart margin={{ top: 10, right: 20, bottom: 30, left: 10 }}>
          <CartesianGrid stroke="#e6eaef" />
          <XAxis type="number" dataKey="d" domain={[0, top]} stroke={INK}>
            <Label value="Dispersive γd (mN/m)" position="insideBottom" offset={-18} fill={INK} />
          </XAxis>
          <YAxis type="number" dataKey="p" domain={[0, top]} stroke={INK}>
            <Label
              value="Polar γp (mN/m)"
              angle={-90}
              position="insideLeft"
              style={{ textAnchor: 'middle' }}
              fill={INK}
            />
          </YAxis>
          <Tooltip
            formatter={(value) => (typeof value === 'number' ? value.toFixed(1) : String(value))}
          />
          <Legend verticalAlign="top" height={28} />
          <Line
            data={curve}
            dataKey="p"
            name={`Envelope, θ = ${envelope.angleDeg}°`}
            stroke={LAGOON}
            dot={false}
            strokeWidth={2}
            isAnimationActive={false}
          />
          <Scatter
            data={liquids}
            dataKey="p"
            name="Probe liquids"
            fill={AMBER}
            isAnimationActive={false}
          />
        </ComposedChart>
      </ResponsiveContainer>
      <figcaption className="mt-1 text-xs text-ink-600">
        Probe liquids:{' '}
        {envelope.liquids
          .map((l) => `${l.name} (γd ${l.gammaDispersive}, γp ${l.gammaPolar} mN/m)`)
          .join('; ')}
        . A liquid inside the curve wets the surface at less than {envelope.angleDeg}°.
      </figcaption>
    </figure>
  );
}
