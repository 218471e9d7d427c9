'use client';

import {
  CartesianGrid,
  Line,
  LineChart,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
  type XAxisTickContentProps,
} from 'recharts';
import type { SpecLine, TrendPoint } from '@/lib/compare/types';

type DotProps = { cx?: number; cy?: number; payload?: TrendPoint; index?: number };

function TrendDot({ cx, cy, payload }: DotProps) {
  if (cx === undefined || cy === undefined || !payload) return null;
  return payload.outsideLimits ? (
    <path
      d={`M${cx - 5},${cy - 5}L${cx + 5},${cy + 5}M${cx - 5},${cy + 5}L${cx + 5},${cy - 5}`}
      stroke="#b32f1d"
      strokeWidth={2.5}
    />
  ) : (
    <circle cx={cx} cy={cy} r={4} fill="#116467" />
  );
}

/**
 * Batch means in production order with the individuals chart's centre line and control limits;
 * points outside the limits are drawn as crosses. Spec limits on the mean are drawn too.
 */
export function TrendChart({
  liquidName,
  points,
  centreLine,
  ucl,
  lcl,
  specLines,
  testId,
}: {
  liquidName: string;
  points: TrendPoint[];
  centreLine: number;
  ucl: number;
  lcl: number;
  specLines: SpecLine[];
  testId: string;
}) {
  const values = [...points.map((p) => p.mean), ucl, lcl, ...specLines.map((l) => l.value)];
  const lo = Math.max(0, Math.floor((Math.min(...values) - 0.5) / 2) * 2);
  const hi = Math.min(180, Math.ceil((Math.max(...values) + 0.5) / 2) * 2);
  const data = points.map((p) => ({ ...p, label: `${p.lotCode} (${p.producedOn})` }));
  return (
    <figure className="compare-chart" data-testid={testId}>
      <div className="h-72 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart
            data={data}
            margin={{ top: 12, right: 90, bottom: 8, left: 4 }}
            accessibilityLayer
          >
            <CartesianGrid stroke="#e6eaef" />
            <XAxis
              dataKey="lotCode"
              interval={0}
              height={40}
              tick={({ x, y, payload }: XAxisTickContentProps) => {
                const p = points.find((q) => q.lotCode === String(payload.value));
                return (
                  <g transform={`translate(${x},${y})`}>
                    <text dy={12} textAnchor="middle" fontSize={11} fill="#263040">
                      {String(payload.value)}
                    </text>
                    <text dy={25} textAnchor="middle" fontSize={10} fill="#55667d">
                      {p?.producedOn ?? ''}
                    </text>
                  </g>
                );
              }}
            />
            <YAxis
              domain={[lo, hi]}
              tick={{ fontSize: 12, fill: '#263040' }}
              tickFormatter={(v: number) => `${v}°`}
              width={52}
            />
            <Tooltip
              content={({ active, payload }) => {
                const p = payload?.[0]?.payload as (TrendPoint & { label: string }) | undefined;
                if (!active || !p) return null;
                return (
                  <div className="rounded border border-ink-200 bg-white px-2 py-1 text-xs shadow">
                    <div className="font-medium">{p.label}</div>
                    <div>
                      mean {p.mean.toFixed(2)}°
                      {p.outsideLimits ? ' · outside the control limits' : ''}
                    </div>
                  </div>
                );
              }}
            />
            {[
              { y: centreLine, name: 'CL', stroke: '#354154', dash: undefined },
              { y: ucl, name: 'UCL', stroke: '#55667d', dash: '6 3' },
              { y: lcl, name: 'LCL', stroke: '#55667d', dash: '6 3' },
            ].map((line) => (
              <ReferenceLine
                key={line.name}
                y={line.y}
                stroke={line.stroke}
                strokeDasharray={line.dash}
                label={{
                  value: `${line.name} ${line.y.toFixed(1)}°`,
                  position: 'right',
                  fontSize: 11,
                  fill: '#263040',
                }}
              />
            ))}
            {specLines.map((l) => (
              <ReferenceLine
                key={`${l.specId}-${l.kind}`}
                y={l.value}
                stroke={l.kind === 'min' ? '#b32f1d' : '#9a5206'}
                strokeDasharray={l.scope === 'mean' ? '8 4' : '3 3'}
                label={{
                  value: l.label,
                  position: 'insideBottomLeft',
                  fontSize: 11,
                  fill: '#263040',
                }}
              />
            ))}
            <Line
              type="linear"
              dataKey="mean"
              name={`${liquidName} batch mean`}
              stroke="#116467"
              strokeWidth={1.5}
              dot={<TrendDot />}
              activeDot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
