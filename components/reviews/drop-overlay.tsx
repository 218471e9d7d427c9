import type { ReviewDropOverlay } from '@/lib/contracts/reviews';
import { baselineAcross, tangentEnd } from '@/lib/measure/overlay-geometry';

/**
 * A drop's photo thumbnail with its stored analysis drawn over it (rendered on the server):
 * baseline (dashed), contact points (rings) and the tangents at the saved angles. The SVG uses
 * the photo's own pixel coordinates, so it lines up with the thumbnail at any size.
 */
export function DropOverlay({
  overlay,
  leftDeg,
  rightDeg,
  label,
}: {
  overlay: NonNullable<ReviewDropOverlay>;
  leftDeg: number;
  rightDeg: number;
  label: string;
}) {
  const { width, height, baseline } = overlay;
  const [[x0, y0], [x1, y1]] = baselineAcross(baseline, width);
  const length = Math.max(overlay.heightPx, width / 12) * 0.9;
  const left = tangentEnd(baseline, overlay.contactLeft, leftDeg, 'left', length);
  const right = tangentEnd(baseline, overlay.contactRight, rightDeg, 'right', length);
  const stroke = Math.max(1.5, width / 320);
  const ring = stroke * 3;
  return (
    <figure className="relative overflow-hidden rounded-md border border-ink-200 bg-ink-900">
      {/* eslint-disable-next-line @next/next/no-img-element -- an authenticated API image, not an optimizable asset */}
      <img
        src={`/api/photos/${overlay.photoId}/thumbnail`}
        alt={label}
        width={width}
        height={height}
        className="block h-auto w-full"
      />
      <svg
        viewBox={`0 0 ${width} ${height}`}
        className="pointer-events-none absolute inset-0 h-full w-full"
        aria-hidden="true"
      >
        <HaloLine
          from={[x0, y0]}
          to={[x1, y1]}
          color="#134f52"
          width={stroke}
          dash={`${stroke * 5} ${stroke * 3}`}
        />
        {[
          [overlay.contactLeft, left],
          [overlay.contactRight, right],
        ].map(([from, to], i) => (
          <g key={i}>
            <HaloLine from={from} to={to} color="#c2410c" width={stroke} />
            <circle
              cx={from[0]}
              cy={from[1]}
              r={ring}
              fill="none"
              stroke="#fde047"
              strokeWidth={stroke}
            />
          </g>
        ))}
      </svg>
    </figure>
  );
}

/** A line over a wider, half-clear white one, so it reads on dark and light parts of a photo. */
function HaloLine({
  from,
  to,
  color,
  width,
  dash,
}: {
  from: readonly number[];
  to: readonly number[];
  color: string;
  width: number;
  dash?: string;
}) {
  const ends = { x1: from[0], y1: from[1], x2: to[0], y2: to[1] };
  return (
    <>
      <line {...ends} stroke="#ffffff" strokeWidth={width * 2.2} opacity={0.7} />
      <line {...ends} stroke={color} strokeWidth={width} strokeDasharray={dash} />
    </>
  );
}
