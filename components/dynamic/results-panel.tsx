'use client';

import type { ReactNode } from 'react';
import type { DynamicKind, MeasurementResult } from '@/lib/dynamic/measurement';
import type { AngleWindowStats, PhaseWindow } from '@/lib/dynamic/types';
import type { SeriesFrameResult } from '@/lib/dynamic/worker-protocol';
import { isFlagged } from '@/lib/dynamic/measurement';
import { WindowControls } from './window-controls';
import type { SeriesSpan } from './windows';

const deg = (v: number | null | undefined, digits = 2) =>
  v === null || v === undefined ? '—' : `${v.toFixed(digits)}°`;

function Stat({ label, value, detail, testId }: { label: string; value: string; detail?: string; testId: string }) {
  return (
    <div className="rounded-md border border-ink-200 bg-white px-3 py-2">
      <dt className="text-xs text-ink-600">{label}</dt>
      <dd className="font-mono text-lg text-ink-950" data-testid={testId}>
        {value}
      </dd>
      {detail ? <dd className="text-xs text-ink-600">{detail}</dd> : null}
    </div>
  );
}

/** The advancing and receding windows: which kinds show them and where the detected one is. */
const PHASE_WINDOWS = [
  {
    name: 'advancing',
    label: 'Advancing',
    shownFor: (kind: MeasurementResult['kind']) => kind !== 'shrinking',
    detectedOf: (r: MeasurementResult) => r.advancingWindow,
  },
  {
    name: 'receding',
    label: 'Receding',
    shownFor: (kind: MeasurementResult['kind']) => kind !== 'growing',
    detectedOf: (r: MeasurementResult) => r.recedingWindow,
  },
] as const;

const windowDetail = (s: AngleWindowStats | null) =>
  s
    ? `${s.frameCount} frames, ${s.fromSec.toFixed(2)}–${s.toSec.toFixed(2)} s; left ${deg(s.leftDeg)}, right ${deg(s.rightDeg)}${s.sdDeg !== null ? `, SD ${s.sdDeg.toFixed(2)}°` : ''}`
    : 'no frames in a window';

/**
 * The measurement's numbers for its kind, with the windows that decide them: advancing and
 * receding (movable), the tilting plate's roll-off, or the angle over time with its rate window.
 */
export function ResultsPanel({
  result,
  span,
  stepSec,
  windows,
  onWindow,
}: {
  result: MeasurementResult;
  span: SeriesSpan;
  stepSec: number;
  /** The user's windows; undefined: the detected one is used. */
  windows: { advancing?: PhaseWindow | null; receding?: PhaseWindow | null; rate?: PhaseWindow | null };
  onWindow(name: 'advancing' | 'receding' | 'rate', window: PhaseWindow | null): void;
}) {
  const { kind } = result;
  return (
    <section className="card space-y-3" aria-labelledby="dynamic-results-heading">
      <h2 id="dynamic-results-heading">Results</h2>
      {kind === 'tilt' ? (
        <dl className="grid gap-2 sm:grid-cols-2 lg:grid-cols-4">
          <Stat label="Roll-off angle (tilt)" value={deg(result.rollOff?.tiltDeg, 1)} testId="roll-off-result" />
          <Stat
            label={`Downhill angle (${result.rollOff?.downhillSide ?? '—'} side)`}
            value={deg(result.rollOff?.downhillDeg)}
            detail={result.rollOff ? `± ${result.rollOff.downhillSeDeg.toFixed(2)}° (SE)` : undefined}
            testId="downhill-result"
          />
          <Stat
            label="Uphill angle"
            value={deg(result.rollOff?.uphillDeg)}
            detail={result.rollOff ? `± ${result.rollOff.uphillSeDeg.toFixed(2)}° (SE)` : undefined}
            testId="uphill-result"
          />
          <Stat label="Hysteresis at roll-off" value={deg(result.hysteresisDeg)} testId="hysteresis-result" />
        </dl>
      ) : kind === 'over-time' ? (
        <>
          <dl className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
            <Stat
              label="Initial angle (extrapolated to t = 0)"
              value={deg(result.initialAngle?.angleDeg)}
              detail={
                result.initialAngle
                  ? `± ${result.initialAngle.standardErrorDeg.toFixed(2)}° (SE), degree ${result.initialAngle.degree} fit of the first ${result.initialAngle.frameCount} frames`
                  : undefined
              }
              testId="initial-angle-result"
            />
            <Stat
              label="Rate of change"
              value={result.rate ? `${result.rate.degPerSec.toFixed(3)}°/s` : '—'}
              detail={
                result.rate
                  ? `± ${result.rate.standardErrorDegPerSec.toFixed(3)}°/s over ${result.rate.frameCount} frames; base ${result.rate.baseDiameterPxPerSec.toFixed(2)} px/s`
                  : undefined
              }
              testId="rate-result"
            />
          </dl>
          <WindowControls
            name="Rate"
            window={windows.rate ?? (result.rate ? { fromSec: result.rate.fromSec, toSec: result.rate.toSec } : span && { fromSec: span.startSec, toSec: span.endSec })}
            span={span}
            stepSec={stepSec}
            detected={windows.rate === undefined}
            onChange={(w) => onWindow('rate', w)}
          />
        </>
      ) : (
        <>
          <dl className="grid gap-2 sm:grid-cols-3">
            {kind !== 'shrinking' ? (
              <Stat label="Advancing angle" value={deg(result.advancing?.meanDeg)} detail={windowDetail(result.advancing)} testId="advancing-result" />
            ) : null}
            {kind !== 'growing' ? (
              <Stat label="Receding angle" value={deg(result.receding?.meanDeg)} detail={windowDetail(result.receding)} testId="receding-result" />
            ) : null}
            {kind === 'grow-and-withdraw' ? (
              <Stat label="Hysteresis (advancing − receding)" value={deg(result.hysteresisDeg)} testId="hysteresis-result" />
            ) : null}
          </dl>
          <div className="grid gap-2 lg:grid-cols-2">
            {PHASE_WINDOWS.filter((p) => p.shownFor(kind)).map(({ name, label, detectedOf }) => (
              <WindowControls
                key={name}
                name={label}
                window={windows[name] === undefined ? detectedOf(result) : (windows[name] ?? null)}
                span={span}
                stepSec={stepSec}
                detected={windows[name] === undefined}
                onChange={(w) => onWindow(name, w)}
              />
            ))}
          </div>
        </>
      )}
      {result.warnings.length ? (
        <ul className="space-y-1 text-sm text-amber-800" aria-label="Notes on the series">
          {result.warnings.map((w) => (
            <li key={w.code}>{w.message}</li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}

/** Every frame that failed or carries a warning, with what is wrong; none is left out. */
/** A table in a box of its own height that scrolls; focusable so it scrolls from the keyboard too. */
function ScrollingTable({
  label,
  box,
  testId,
  children,
}: {
  label: string;
  /** Classes of the box: its height and spacing. */
  box: string;
  testId: string;
  children: ReactNode;
}) {
  return (
    <div className={`${box} overflow-auto`} tabIndex={0} role="region" aria-label={label}>
      <table className="w-full text-sm" data-testid={testId}>
        {children}
      </table>
    </div>
  );
}

export function FlaggedFrames({
  frames,
  kind,
}: {
  frames: readonly SeriesFrameResult[];
  kind?: DynamicKind;
}) {
  const flagged = frames.filter((f) => isFlagged(f, kind));
  if (flagged.length === 0) return null;
  return (
    <section className="card" aria-labelledby="flagged-heading">
      <h2 id="flagged-heading">Flagged frames ({flagged.length})</h2>
      <p className="mb-2 text-sm text-ink-700">
        These frames failed or carry a warning. Failed frames count in no window; check the others in the plot.
      </p>
      <ScrollingTable label="Flagged frames, scrollable" box="max-h-64" testId="flagged-frames">
          <thead>
            <tr className="text-left text-ink-600">
              <th scope="col" className="py-1 pr-3">Frame</th>
              <th scope="col" className="py-1 pr-3">Time (s)</th>
              <th scope="col" className="py-1 pr-3">Angle</th>
              <th scope="col" className="py-1">What to check</th>
            </tr>
          </thead>
          <tbody>
            {flagged.map((f) => (
              <tr key={f.index} className="border-t border-ink-100 align-top">
                <td className="py-1 pr-3 font-mono">{f.index}</td>
                <td className="py-1 pr-3 font-mono">{f.tSec.toFixed(3)}</td>
                <td className="py-1 pr-3 font-mono">{f.meanDeg === null ? 'failed' : deg(f.meanDeg)}</td>
                <td className="py-1">{f.warnings.map((w) => w.message).join(' ')}</td>
              </tr>
            ))}
          </tbody>
      </ScrollingTable>
    </section>
  );
}

/** Every frame's numbers, in input order, for reading off or checking a point of the plot. */
export function FrameTable({
  frames,
  tiltsDeg,
  kind,
}: {
  frames: readonly SeriesFrameResult[];
  tiltsDeg: readonly number[] | null;
  kind?: DynamicKind;
}) {
  if (frames.length === 0) return null;
  const num = (v: number | null, digits: number) => (v === null ? '—' : v.toFixed(digits));
  return (
    <details className="card">
      <summary className="cursor-pointer text-sm font-medium text-ink-900">Every frame ({frames.length})</summary>
      <ScrollingTable label="Every frame, scrollable" box="mt-2 max-h-80" testId="frame-table">
          <thead>
            <tr className="text-left text-ink-600">
              <th scope="col" className="py-1 pr-3">Frame</th>
              <th scope="col" className="py-1 pr-3">Time (s)</th>
              {tiltsDeg ? <th scope="col" className="py-1 pr-3">Tilt (°)</th> : null}
              <th scope="col" className="py-1 pr-3">Left (°)</th>
              <th scope="col" className="py-1 pr-3">Right (°)</th>
              <th scope="col" className="py-1 pr-3">Mean (°)</th>
              <th scope="col" className="py-1 pr-3">Base (px)</th>
              <th scope="col" className="py-1 pr-3">Volume (px³)</th>
              <th scope="col" className="py-1">Flag</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {frames.map((f, i) => (
              <tr key={f.index} className="border-t border-ink-100" data-flagged={isFlagged(f, kind) || undefined}>
                <td className="py-0.5 pr-3">{f.index}</td>
                <td className="py-0.5 pr-3">{f.tSec.toFixed(3)}</td>
                {tiltsDeg ? <td className="py-0.5 pr-3">{num(tiltsDeg[i] ?? null, 2)}</td> : null}
                <td className="py-0.5 pr-3">{num(f.leftDeg, 2)}</td>
                <td className="py-0.5 pr-3">{num(f.rightDeg, 2)}</td>
                <td className="py-0.5 pr-3" data-testid="frame-mean">{num(f.meanDeg, 2)}</td>
                <td className="py-0.5 pr-3">{num(f.baseDiameterPx, 1)}</td>
                <td className="py-0.5 pr-3">{f.volumePx3 === null ? '—' : f.volumePx3.toExponential(3)}</td>
                <td className="py-0.5">{isFlagged(f, kind) ? (f.meanDeg === null ? 'failed' : 'check') : ''}</td>
              </tr>
            ))}
          </tbody>
      </ScrollingTable>
    </details>
  );
}
