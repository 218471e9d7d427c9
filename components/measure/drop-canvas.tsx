'use client';

import { useEffect, useMemo, useRef, useState } from 'react';
import {
  Circle,
  Group,
  Image as KonvaImage,
  Label,
  Layer,
  Line,
  Shape,
  Stage,
  Tag,
  Text,
} from 'react-konva';
import type Konva from 'konva';
import type { AnalysisResult, Baseline, Point } from '@/lib/analysis/types';
import { previewBaseline, useLiveResult } from './use-analysis';
import {
  baselineAcross,
  nudgeBaseline,
  nudgeFromKey,
  tangentEnd,
  type BaselineHandle,
} from '@/lib/measure/overlay-geometry';

/** Beadline's overlay colours and marks (its own; see app/globals.css palette). */
const COLORS = {
  edge: '#30b9b8',
  profile: '#e08a0b',
  baseline: '#134f52',
  baselineHalo: '#ecfbfa',
  handle: '#169c9d',
  handleSelected: '#e5533d',
  tangent: '#b32f1d',
};

type Props = {
  /** The photo, to follow its newest analysis (drafts included) as it arrives from the worker. */
  photoId?: string;
  imageUrl: string;
  width: number;
  height: number;
  result: AnalysisResult | null;
  baseline: Baseline | null;
  selectedHandle: BaselineHandle | null;
  onSelectHandle(handle: BaselineHandle | null): void;
  /** Called when a drag ends (and for each keyboard nudge); during a drag the canvas follows it. */
  onBaselineChange(baseline: Baseline): void;
  /** When set, a click on the photo picks an image point (scale calibration on the needle). */
  onPickPoint?: (point: Point) => void;
  pickedPoints?: Point[];
};

function useLoadedImage(url: string) {
  const [image, setImage] = useState<HTMLImageElement | null>(null);
  useEffect(() => {
    const element = new window.Image();
    element.onload = () => setImage(element);
    element.src = url;
    return () => {
      element.onload = null;
    };
  }, [url]);
  return image;
}

export function DropCanvas(props: Props) {
  const { width, height, selectedHandle, onSelectHandle } = props;
  // The worker's newest result for this photo (a draft while the baseline is dragged) is shown as
  // soon as it arrives; the page's own result once nothing newer has come.
  const live = useLiveResult(props.photoId);
  const result = live ?? props.result;
  const { onBaselineChange } = props;
  // While a handle or the line is dragged the baseline lives here: the page re-renders only when
  // the drag ends, and meanwhile the worker gets each position at once (`previewBaseline`) and the
  // canvas shows its drafts.
  const [dragged, setDragged] = useState<Baseline | null>(null);
  const image = useLoadedImage(props.imageUrl);
  const containerRef = useRef<HTMLDivElement>(null);
  const [viewWidth, setViewWidth] = useState(800);
  const fitScale = viewWidth / width;
  const viewHeight = Math.round(height * fitScale);
  const [zoom, setZoom] = useState(1);
  const [offset, setOffset] = useState({ x: 0, y: 0 });
  const scale = fitScale * zoom;

  useEffect(() => {
    const element = containerRef.current;
    if (!element) return;
    const observer = new ResizeObserver(([entry]) =>
      setViewWidth(Math.max(240, entry.contentRect.width)),
    );
    observer.observe(element);
    return () => observer.disconnect();
  }, []);

  const baseline = dragged ?? props.baseline ?? result?.baseline ?? null;
  const handleRadius = 7 / scale;
  const stroke = 1.5 / scale;

  const tangents = useMemo(() => {
    if (!result || !baseline) return null;
    const length = Math.max(result.heightPx, result.baseDiameterPx / 3) * 0.9;
    return {
      left: tangentEnd(baseline, result.contactLeft, result.leftDeg, 'left', length),
      right: tangentEnd(baseline, result.contactRight, result.rightDeg, 'right', length),
    };
  }, [result, baseline]);

  const flat = (points: Point[]) => points.flatMap(([x, y]) => [x, y]);
  // A draft (while the baseline is dragged) is drawn dashed and marked ≈ until the full fit lands.
  const provisional = result?.provisional === true;
  const provisionalDash = provisional ? [6 / scale, 4 / scale] : undefined;
  const approx = provisional ? '≈' : '';

  function onWheel(event: Konva.KonvaEventObject<WheelEvent>) {
    event.evt.preventDefault();
    const stage = event.target.getStage();
    const pointer = stage?.getPointerPosition();
    if (!pointer) return;
    const nextZoom = Math.min(16, Math.max(1, zoom * (event.evt.deltaY < 0 ? 1.2 : 1 / 1.2)));
    const nextScale = fitScale * nextZoom;
    // Keep the image point under the pointer where it is.
    const imageX = (pointer.x - offset.x) / scale;
    const imageY = (pointer.y - offset.y) / scale;
    setZoom(nextZoom);
    setOffset(
      nextZoom === 1
        ? { x: 0, y: 0 }
        : { x: pointer.x - imageX * nextScale, y: pointer.y - imageY * nextScale },
    );
  }

  function onKeyDown(event: React.KeyboardEvent) {
    if (!baseline || !selectedHandle) return;
    const step = nudgeFromKey(event.key, event.altKey);
    if (!step) return;
    event.preventDefault();
    onBaselineChange(nudgeBaseline(baseline, selectedHandle, step[0], step[1]));
  }

  const follow = (next: Baseline, final: boolean) => {
    if (final) {
      setDragged(null);
      onBaselineChange(next);
    } else {
      setDragged(next);
      previewBaseline(props.photoId, next);
    }
  };

  const dragTo =
    (handle: 'start' | 'end', final = false) =>
    (event: Konva.KonvaEventObject<DragEvent>) => {
      if (!baseline) return;
      const { x, y } = event.target.position();
      follow(
        handle === 'start' ? { ...baseline, x1: x, y1: y } : { ...baseline, x2: x, y2: y },
        final,
      );
    };

  return (
    <div ref={containerRef} className="w-full">
      <div
        role="application"
        aria-label="Drop photo with profile and baseline. Select a baseline handle, then use the arrow keys to move it by 1 pixel, or with Alt by 0.1 pixel."
        tabIndex={0}
        onKeyDown={onKeyDown}
        className="overflow-hidden rounded-md border border-ink-200 bg-ink-900 focus-visible:outline-2 focus-visible:outline-lagoon-600"
        data-testid="drop-canvas"
        data-baseline={
          baseline ? [baseline.x1, baseline.y1, baseline.x2, baseline.y2].join(',') : undefined
        }
        data-scale={scale}
        // The shown result: its baseline, full-precision angles and whether it is a draft (tests).
        data-result-baseline={
          result
            ? [result.baseline.x1, result.baseline.y1, result.baseline.x2, result.baseline.y2].join(
                ',',
              )
            : undefined
        }
        data-result-method={result?.method}
        data-result-left={result?.leftDeg}
        data-result-right={result?.rightDeg}
        data-result-provisional={result ? String(provisional) : undefined}
        data-result-time-ms={result?.timeMs}
      >
        <Stage
          width={viewWidth}
          height={viewHeight}
          onWheel={onWheel}
          draggable={zoom > 1}
          x={offset.x}
          y={offset.y}
          onDragEnd={(event) => {
            if (event.target === event.target.getStage()) setOffset(event.target.position());
          }}
          onMouseDown={(event) => {
            if (event.target === event.target.getStage() || event.target.name() === 'photo')
              onSelectHandle(null);
          }}
          onClick={(event) => {
            if (!props.onPickPoint) return;
            const pointer = event.target.getStage()?.getPointerPosition();
            if (!pointer) return;
            props.onPickPoint([(pointer.x - offset.x) / scale, (pointer.y - offset.y) / scale]);
          }}
        >
          {/* The photo on its own layer: a drag redraws the overlay, not the scaled photo. */}
          <Layer scaleX={scale} scaleY={scale}>
            {image ? <KonvaImage image={image} width={width} height={height} name="photo" /> : null}
          </Layer>
          <Layer scaleX={scale} scaleY={scale}>
            {result ? (
              <Group listening={false}>
                <EdgePoints result={result} size={1.2 / scale} />
                {result.profile ? (
                  <Line
                    points={flat(result.profile)}
                    stroke={COLORS.profile}
                    strokeWidth={stroke * 1.4}
                  />
                ) : null}
                {tangents ? (
                  <>
                    <Line
                      points={flat([result.contactLeft, tangents.left])}
                      stroke={COLORS.tangent}
                      strokeWidth={stroke * 1.6}
                      dash={provisionalDash}
                    />
                    <Line
                      points={flat([result.contactRight, tangents.right])}
                      stroke={COLORS.tangent}
                      strokeWidth={stroke * 1.6}
                      dash={provisionalDash}
                    />
                    <Label x={tangents.left[0] - 64 / scale} y={tangents.left[1] - 24 / scale}>
                      <Tag fill="#0e141c" opacity={0.8} cornerRadius={3 / scale} />
                      <Text
                        text={`${approx}${result.leftDeg.toFixed(1)}°`}
                        fontSize={13 / scale}
                        padding={3 / scale}
                        fill="#ffffff"
                      />
                    </Label>
                    <Label x={tangents.right[0] + 8 / scale} y={tangents.right[1] - 24 / scale}>
                      <Tag fill="#0e141c" opacity={0.8} cornerRadius={3 / scale} />
                      <Text
                        text={`${approx}${result.rightDeg.toFixed(1)}°`}
                        fontSize={13 / scale}
                        padding={3 / scale}
                        fill="#ffffff"
                      />
                    </Label>
                  </>
                ) : null}
              </Group>
            ) : null}
            {(props.pickedPoints ?? []).map(([x, y], i) => (
              <Group key={`pick-${i}`} listening={false}>
                <Line
                  points={[x - 8 / scale, y, x + 8 / scale, y]}
                  stroke={COLORS.handleSelected}
                  strokeWidth={stroke}
                />
                <Line
                  points={[x, y - 8 / scale, x, y + 8 / scale]}
                  stroke={COLORS.handleSelected}
                  strokeWidth={stroke}
                />
              </Group>
            ))}
            {baseline && !props.onPickPoint ? (
              <Group>
                <Line
                  points={flat(baselineAcross(baseline, width))}
                  stroke={COLORS.baselineHalo}
                  strokeWidth={stroke * 3}
                  listening={false}
                  opacity={0.7}
                />
                <Line
                  points={flat(baselineAcross(baseline, width))}
                  stroke={COLORS.baseline}
                  strokeWidth={stroke * 1.5}
                  dash={[8 / scale, 5 / scale]}
                  hitStrokeWidth={12 / scale}
                  draggable
                  name="baseline-line"
                  onMouseDown={() => onSelectHandle('line')}
                  onDragMove={(event) => {
                    const { x, y } = event.target.position();
                    event.target.position({ x: 0, y: 0 });
                    follow(nudgeBaseline(baseline, 'line', x, y), false);
                  }}
                  onDragEnd={() => follow(baseline, true)}
                />
                {(['start', 'end'] as const).map((handle) => {
                  const x = handle === 'start' ? baseline.x1 : baseline.x2;
                  const y = handle === 'start' ? baseline.y1 : baseline.y2;
                  const selected = selectedHandle === handle;
                  return (
                    <Group key={handle}>
                      <Circle
                        x={x}
                        y={y}
                        radius={handleRadius}
                        fill={selected ? COLORS.handleSelected : COLORS.handle}
                        stroke="#ffffff"
                        strokeWidth={stroke}
                        draggable
                        name={`baseline-${handle}`}
                        onMouseDown={() => onSelectHandle(handle)}
                        onDragMove={dragTo(handle)}
                        onDragEnd={dragTo(handle, true)}
                      />
                    </Group>
                  );
                })}
              </Group>
            ) : null}
          </Layer>
        </Stage>
      </div>
      <div className="mt-2 flex flex-wrap items-center gap-3 text-xs text-ink-600">
        <span>
          Scroll to zoom ({zoom.toFixed(1)}×){zoom > 1 ? ', drag to pan' : ''}.
        </span>
        <button
          type="button"
          className="underline"
          onClick={() => {
            setZoom(1);
            setOffset({ x: 0, y: 0 });
          }}
        >
          Fit to view
        </button>
        <span>
          Drag the round handles or the dashed line; arrow keys nudge the selected handle by 1 px
          (Alt: 0.1 px).
        </span>
      </div>
    </div>
  );
}

/** The fitted edge points as one shape: a drag redraws one node, not a thousand. */
function EdgePoints({ result, size }: { result: AnalysisResult; size: number }) {
  const { left, right } = result.edgePoints;
  return (
    <Shape
      listening={false}
      fill={COLORS.edge}
      perfectDrawEnabled={false}
      sceneFunc={(context, shape) => {
        context.beginPath();
        for (const points of [left, right]) {
          for (const [x, y] of points) context.rect(x - size / 2, y - size / 2, size, size);
        }
        context.fillShape(shape);
      }}
    />
  );
}
