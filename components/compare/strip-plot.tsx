'use client';

import {
  CartesianGrid,
  ErrorBar,
  Legend,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  ScatterChart,
  Tooltip,
  XAxis,
  YAxis,
  ZAxis,
} from 'recharts';
import type { SpecLine } from '@/lib/compare/types';

export type StripBatch = {
  lotCode: string;
  /** Mean angle of each drop, with its sample and whether Tukey's fences flag it. */
  drops: { value: number; sample: string; outlier: boolean; outsideAgeWindow: boolean; ageDays: number | null }[];
  mean: number | null;
  ciLower: number | null;
  ciUpper: number | null;
};

type Point = { x: number; y: number; label: string; err?: [number, number] };

// Print-safe colours that also differ in shape, not only in hue.
const COLOURS = { drop: '#116467', outlier: '#b32f1d', mean: '#0e141c', min: '#b32f1d', max: '#9a5206' };

function yDomain(batches: StripBatch[], lines: SpecLine[]): [number, number] {
  const values = [
    ...batches.flatMap((b) => b.drops.map((d) => d.value)),
    ...batches.flatMap((b) => [b.ciLower, b.ciUpper].filter((v): v is number => v !== null)),
    ...lines.map((l) => l.value),
  ];
  if (values.length === 0) return [0, 180];
  const lo = Math.max(0, Math.floor((Math.min(...values) - 1) / 5) * 5);
  const hi = Math.min(180, Math.ceil((Math.max(...values) + 1) / 5) * 5);
  return [lo, hi];
}

/**
 * Every drop per batch (a strip plot, drops spread sideways so none hide), the batch mean with
 * its 95 % confidence interval beside them, and the spec limits as lines.
 */
export function StripPlot({
  liquidName,
  batches,
  specLines,
  testId,
}: {
  liquidName: string;
  batches: StripBatch[];
  specLines: SpecLine[];
  testId: string;
}) {
  const drops: Point[] = [];
  const outliers: Point[] = [];
  const aged: Point[] = [];
  const means: Point[] = [];
  batches.forEach((b, i) => {
    const n = b.drops.length;
    b.drops.forEach((d, j) => {
      const offset = n > 1 ? -0.22 + (0.34 * j) / (n - 1) : -0.05;
      const age = d.ageDays === null ? '' : ` · ${d.ageDays.toFixed(1)} d after treatment`;
      const note = `${d.outlier ? ' · outlier' : ''}${d.outsideAgeWindow ? ' · outside the age window' : ''}`;
      const point = { x: i + offset, y: d.value, label: `${b.lotCode} · ${d.sample}${age}${note}` };
      (d.outlier ? outliers : d.outsideAgeWindow ? aged : drops).push(point);
    });
    if (b.mean !== null) {
      means.push({
        x: i + 0.3,
        y: b.mean,
        label: `${b.lotCode} mean`,
        err: b.ciLower !== null && b.ciUpper !== null ? [b.mean - b.ciLower, b.ciUpper - b.mean] : [0, 0],
      });
    }
  });
  const ticks = batches.map((_, i) => i);
  const [lo, hi] = yDomain(batches, specLines);
  return (
    <figure className="compare-chart" data-testid={testId}>
      <div className="h-80 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 12, right: 16, bottom: 8, left: 4 }} accessibilityLayer>
            <CartesianGrid stroke="#e6eaef" />
            <XAxis
              type="number"
              dataKey="x"
              domain={[-0.5, Math.max(0.5, batches.length - 0.5)]}
              ticks={ticks}
              interval={0}
              tickFormatter={(i: number) => batches[i]?.lotCode ?? ''}
              tick={{ fontSize: 12, fill: '#263040' }}
              name="Batch"
            />
            <YAxis
              type="number"
              dataKey="y"
              domain={[lo, hi]}
              tick={{ fontSize: 12, fill: '#263040' }}
              tickFormatter={(v: number) => `${v}°`}
              width={52}
              name="Angle"
              label={{ value: `${liquidName} contact angle (°)`, angle: -90, position: 'insideLeft', fontSize: 12, fill: '#263040', dy: 70 }}
            />
            <ZAxis range={[42, 42]} />
            <Tooltip
              cursor={{ strokeDasharray: '3 3' }}
              content={({ active, payload }) => {
                const p = payload?.[0]?.payload as Point | undefined;
                if (!active || !p) return null;
                return (
                  <div className="rounded border border-ink-200 bg-white px-2 py-1 text-xs shadow">
                    <div className="font-medium">{p.label}</div>
                    <div>{p.y.toFixed(2)}°</div>
                  </div>
                );
              }}
            />
            {specLines.map((l) => (
              <ReferenceLine
                key={`${l.specId}-${l.kind}`}
                y={l.value}
                stroke={l.kind === 'min' ? COLOURS.min : COLOURS.max}
                strokeDasharray={l.scope === 'mean' ? '8 4' : '3 3'}
                strokeWidth={1.5}
                ifOverflow="extendDomain"
                label={{ value: l.label, position: 'insideBottomRight', fontSize: 11, fill: '#263040' }}
              />
            ))}
            <Scatter name="Drop" data={drops} fill={COLOURS.drop} shape="circle" isAnimationActive={false} />
            {aged.length > 0 ? (
              <Scatter
                name="Outside the spec's age window (not counted)"
                data={aged}
                fill="#ffffff"
                stroke={COLOURS.drop}
                strokeWidth={1.5}
                shape="circle"
                isAnimationActive={false}
              />
            ) : null}
            <Scatter
              name="Outlier (Tukey's fences)"
              data={outliers}
              fill={COLOURS.outlier}
              shape="cross"
              isAnimationActive={false}
            />
            <Scatter name="Mean ± 95 % CI" data={means} fill={COLOURS.mean} shape="diamond" isAnimationActive={false}>
              <ErrorBar dataKey="err" direction="y" width={8} stroke={COLOURS.mean} strokeWidth={1.5} />
            </Scatter>
            <Legend verticalAlign="bottom" height={28} wrapperStyle={{ fontSize: 12 }} />
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink-600">
        {liquidName}: every drop per batch (circles; crosses are drops flagged by Tukey&apos;s fences; hollow circles are drops outside a spec&apos;s age window, which that spec does not count), the batch mean
        (diamond) with its 95 % confidence interval, and the spec limits (dashed lines; long dashes are limits on the
        mean).
      </figcaption>
    </figure>
  );
}
