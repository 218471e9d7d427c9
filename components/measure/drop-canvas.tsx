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
  baselineHandles,
  baselineThrough,
  contactZoom,
  nudgeBaseline,
  nudgeFromKey,
  tangentEnd,
  type BaselineHandle,
} from '@/lib/measure/overlay-geometry';
import { Magnifier } from './magnifier';

/**
 * Overlay colours from the Okabe–Ito palette (told apart with the common colour-vision
 * deficiencies), each mark also with its own line pattern: edge points as dots, the profile
 * solid, tangents long dashes, the baseline short dashes.
 */
export const COLORS = {
  edge: '#56B4E9', // sky blue
  profile: '#E69F00', // orange
  baseline: '#0072B2', // blue
  baselineHalo: '#ffffff',
  handle: '#F0E442', // yellow
  handleSelected: '#CC79A7', // reddish purple
  tangent: '#D55E00', // vermillion
};
const TANGENT_DASH = [10, 4];
const BASELINE_DASH = [6, 4];

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
  /** Shows the fit and baseline without handles (a saved drop's page). */
  readOnly?: boolean;
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
  const frameRef = useRef<HTMLDivElement>(null);
  const [viewWidth, setViewWidth] = useState(800);
  const fitScale = viewWidth / width;
  const viewHeight = Math.round(height * fitScale);
  const [zoom, setZoom] = useState(1);
  const [offset, setOffset] = useState({ x: 0, y: 0 });
  const scale = fitScale * zoom;

  // The frame's content box (inside its border) is what the stage may fill: sized to the outer
  // box, the canvas was the border's 2 px wider than the frame and cut off at the right.
  useEffect(() => {
    const element = frameRef.current;
    if (!element) return;
    const observer = new ResizeObserver(([entry]) =>
      setViewWidth(Math.max(240, entry.contentRect.width)),
    );
    observer.observe(element);
    return () => observer.disconnect();
  }, []);

  const baseline = dragged ?? props.baseline ?? result?.baseline ?? null;
  const handleRadius = 8 / scale;
  const stroke = 1.5 / scale;
  // A baseline set by hand has its handles at its ends; the automatic one at the contact points.
  const handles = baseline
    ? baselineHandles(
        baseline,
        dragged || props.baseline || !result ? null : [result.contactLeft, result.contactRight],
        { width, height },
        8 / fitScale,
      )
    : null;
  const [magnified, setMagnified] = useState<'start' | 'end' | null>(null);

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
    if (!handles || props.readOnly) return;
    const pick = ({ '1': 'start', '2': 'end', '3': 'line' } as const)[event.key as '1' | '2' | '3'];
    if (pick) {
      event.preventDefault();
      onSelectHandle(pick);
      return;
    }
    if (!selectedHandle) return;
    const step = nudgeFromKey(event.key, event.altKey);
    if (!step) return;
    event.preventDefault();
    const through = baselineThrough(handles.start, handles.end);
    onBaselineChange(nudgeBaseline(through, selectedHandle, step[0], step[1]));
  }

  function zoomToContacts() {
    if (!result) return;
    const next = contactZoom([result.contactLeft, result.contactRight], result.heightPx, fitScale, {
      width: viewWidth,
      height: viewHeight,
    });
    setZoom(next.zoom);
    setOffset(next.offset);
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
      if (!handles) return;
      const { x, y } = event.target.position();
      if ((magnified === null) === !final) setMagnified(final ? null : handle);
      follow(
        handle === 'start'
          ? baselineThrough([x, y], handles.end)
          : baselineThrough(handles.start, [x, y]),
        final,
      );
    };

  return (
    <div className="w-full">
      <div
        ref={frameRef}
        role="application"
        aria-label={
          props.readOnly
            ? 'Drop photo with its edge points, fitted profile, tangents and baseline.'
            : 'Drop photo with profile and baseline. Press 1 for the left baseline handle, 2 for the right one, 3 for the whole line, then the arrow keys move it by 1 pixel, or with Alt by 0.1 pixel.'
        }
        tabIndex={0}
        onKeyDown={onKeyDown}
        className="overflow-hidden rounded-md border border-ink-200 bg-ink-900 focus-visible:outline-2 focus-visible:outline-lagoon-600"
        data-testid="drop-canvas"
        data-baseline={
          baseline ? [baseline.x1, baseline.y1, baseline.x2, baseline.y2].join(',') : undefined
        }
        // Where the two handles are drawn, in image pixels (tests grab them here).
        data-handles={handles ? [...handles.start, ...handles.end].join(',') : undefined}
        data-selected-handle={selectedHandle ?? undefined}
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
                      dash={(provisionalDash ?? TANGENT_DASH).map((d) =>
                        provisionalDash ? d : d / scale,
                      )}
                    />
                    <Line
                      points={flat([result.contactRight, tangents.right])}
                      stroke={COLORS.tangent}
                      strokeWidth={stroke * 1.6}
                      dash={(provisionalDash ?? TANGENT_DASH).map((d) =>
                        provisionalDash ? d : d / scale,
                      )}
                    />
                    {/* Each angle beside its contact point, outside the drop. */}
                    <AngleLabel
                      at={result.contactLeft}
                      side="left"
                      scale={scale}
                      text={`${approx}${result.leftDeg.toFixed(1)}°`}
                    />
                    <AngleLabel
                      at={result.contactRight}
                      side="right"
                      scale={scale}
                      text={`${approx}${result.rightDeg.toFixed(1)}°`}
                    />
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
            {baseline && props.readOnly ? (
              <Line
                points={flat(baselineAcross(baseline, width))}
                stroke={COLORS.baseline}
                strokeWidth={stroke * 1.5}
                dash={BASELINE_DASH.map((d) => d / scale)}
                listening={false}
              />
            ) : null}
            {baseline && handles && !props.onPickPoint && !props.readOnly ? (
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
                  dash={BASELINE_DASH.map((d) => d / scale)}
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
                  const [x, y] = handles[handle];
                  const selected = selectedHandle === handle;
                  return (
                    <Group key={handle}>
                      <Circle
                        x={x}
                        y={y}
                        radius={handleRadius}
                        fill={selected ? COLORS.handleSelected : COLORS.handle}
                        stroke="#000000"
                        strokeWidth={stroke * 1.2}
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
          {magnified && handles && image ? (
            <Magnifier
              image={image}
              at={handles[magnified]}
              scale={scale}
              offset={offset}
              view={{ width: viewWidth, height: viewHeight }}
              baseline={baseline}
              imageWidth={width}
              imageHeight={height}
            />
          ) : null}
        </Stage>
      </div>
      <div className="mt-2 flex flex-wrap items-center gap-3 text-xs text-ink-600">
        <span>
          Scroll to zoom ({zoom.toFixed(1)}×){zoom > 1 ? ', drag to pan' : ''}.
        </span>
        <button type="button" className="underline" disabled={!result} onClick={zoomToContacts}>
          Zoom to the contact points
        </button>
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
        {props.readOnly ? null : (
          <>
            <span role="group" aria-label="Baseline handle to move" className="flex gap-2">
              {(
                [
                  ['start', 'Left handle (1)'],
                  ['end', 'Right handle (2)'],
                  ['line', 'Whole line (3)'],
                ] as const
              ).map(([handle, label]) => (
                <button
                  key={handle}
                  type="button"
                  className={`rounded border px-1.5 ${selectedHandle === handle ? 'border-ink-900 bg-ink-900 text-white' : 'border-ink-300'}`}
                  aria-pressed={selectedHandle === handle}
                  onClick={() => onSelectHandle(handle)}
                >
                  {label}
                </button>
              ))}
            </span>
            <span>
              Drag a round handle (a magnifier shows it up close) or the dashed line. With the photo
              focused, 1, 2 or 3 picks a handle and the arrow keys move it by 1 px (Alt: 0.1 px).
            </span>
          </>
        )}
      </div>
      <p className="mt-1 flex flex-wrap gap-3 text-xs text-ink-600" aria-label="Legend">
        <span>
          <span style={{ color: COLORS.edge }}>■</span> edge points (dots)
        </span>
        <span>
          <span style={{ color: COLORS.profile }}>━</span> fitted profile (solid)
        </span>
        <span>
          <span style={{ color: COLORS.tangent }}>╍</span> tangents (long dashes)
        </span>
        <span>
          <span style={{ color: COLORS.baseline }}>┅</span> baseline (short dashes)
        </span>
      </p>
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

/** An angle's label beside its contact point, on the outside of the drop. */
function AngleLabel({
  at,
  side,
  scale,
  text,
}: {
  at: Point;
  side: 'left' | 'right';
  scale: number;
  text: string;
}) {
  const width = 54 / scale;
  return (
    <Label
      x={side === 'left' ? at[0] - width - 6 / scale : at[0] + 6 / scale}
      y={at[1] - 26 / scale}
    >
      <Tag fill="#000000" opacity={0.75} cornerRadius={3 / scale} />
      <Text
        text={text}
        fontSize={13 / scale}
        padding={3 / scale}
        fill="#ffffff"
        width={width}
        align="center"
      />
    </Label>
  );
}
