'use client';

import { Circle, Group, Image as KonvaImage, Layer, Line } from 'react-konva';
import type { Baseline, Point } from '@/lib/analysis/types';
import { baselineAcross } from '@/lib/measure/overlay-geometry';

const RADIUS = 64;
const POWER = 4;

/**
 * A round lens beside the dragged handle: the photo around it at 4× the view's scale, with the
 * baseline and a cross-hair on the handle. Its own layer, drawn only during a drag.
 */
export function Magnifier({
  image,
  at,
  scale,
  offset,
  view,
  baseline,
  imageWidth,
  imageHeight,
}: {
  image: HTMLImageElement;
  at: Point;
  scale: number;
  offset: { x: number; y: number };
  view: { width: number; height: number };
  baseline: Baseline | null;
  imageWidth: number;
  imageHeight: number;
}) {
  const zoom = scale * POWER;
  // Where the handle is on screen, and the lens above it (below when there is no room above).
  const sx = at[0] * scale + offset.x;
  const sy = at[1] * scale + offset.y;
  const cx = Math.min(view.width - RADIUS - 4, Math.max(RADIUS + 4, sx));
  const cy = sy - RADIUS - 24 >= RADIUS ? sy - RADIUS - 24 : sy + RADIUS + 24;
  // The lens is in screen pixels: undo the stage's pan.
  const x = cx - offset.x;
  const y = cy - offset.y;
  const line = baseline ? baselineAcross(baseline, imageWidth) : null;
  return (
    <Layer listening={false}>
      <Group
        x={x}
        y={y}
        clipFunc={(context) => {
          context.arc(0, 0, RADIUS, 0, Math.PI * 2);
        }}
      >
        <KonvaImage
          image={image}
          x={-at[0] * zoom}
          y={-at[1] * zoom}
          width={imageWidth * zoom}
          height={imageHeight * zoom}
        />
        {line ? (
          <Line
            points={[
              (line[0][0] - at[0]) * zoom,
              (line[0][1] - at[1]) * zoom,
              (line[1][0] - at[0]) * zoom,
              (line[1][1] - at[1]) * zoom,
            ]}
            stroke="#0072B2"
            strokeWidth={1.5}
            dash={[6, 4]}
          />
        ) : null}
        <Line points={[-10, 0, 10, 0]} stroke="#F0E442" strokeWidth={1.5} />
        <Line points={[0, -10, 0, 10]} stroke="#F0E442" strokeWidth={1.5} />
      </Group>
      <Circle x={x} y={y} radius={RADIUS} stroke="#000000" strokeWidth={2} />
      <Circle x={x} y={y} radius={RADIUS + 2} stroke="#ffffff" strokeWidth={1.5} />
    </Layer>
  );
}
