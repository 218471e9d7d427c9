'use client';

import Link from 'next/link';
import { useMemo, useRef, useState } from 'react';
import { fetchDynamicMeasurement, type SavedDynamicMeasurement } from '@/components/data/resources';
import { LiquidSelect, SampleSelect } from '@/components/measure/sample-select';
import { NumberField, SelectField, useFieldState } from '@/components/ui/fields';
import type { LiquidChoice, SampleChoice } from '@/components/measure/types';
import type { FitMethod } from '@/lib/analysis/types';
import type { DynamicKind } from '@/lib/dynamic/measurement';
import type { FrameWarning, PhaseWindow } from '@/lib/dynamic/types';
import type { SeriesFrameResult } from '@/lib/dynamic/worker-protocol';
import { LiveCamera, type CapturedSeries } from './camera';
import {
  FrameSourceError,
  IMAGE_ACCEPT,
  VIDEO_ACCEPT,
  grayToPng,
  imageFrames,
  inFrameOrder,
  openVideo,
} from './frame-sources';
import { pageMeasurement } from './measurement';
import { FlaggedFrames, FrameTable, ResultsPanel } from './results-panel';
import { SeriesPlot, type PlotWindow } from './series-plot';
import { useDynamicEditor } from './store';
import { TiltSettings } from './tilt-settings';
import {
  uploadDescription,
  useSaveSeries,
  type PageSource,
  type SourceChoice,
} from './use-save-series';
import { useSeriesAnalysis } from './use-series-analysis';
import { spanOf } from './windows';

export const KIND_LABELS: Record<DynamicKind, string> = {
  'grow-and-withdraw': 'Drop grown, then withdrawn through the needle (advancing and receding)',
  growing: 'Drop grown through the needle (advancing)',
  shrinking: 'Drop withdrawn through the needle (receding)',
  tilt: 'Tilting plate (downhill, uphill and roll-off)',
  'over-time': 'Angle over time (spreading or absorption)',
};

const METHOD_LABELS: Partial<Record<FitMethod, string>> = {
  polynomial: 'Polynomial tangent (fastest)',
  'young-laplace': 'Young–Laplace (gravity-deformed drops)',
  circle: 'Circle (spherical cap)',
  ellipse: 'Ellipse',
};

/** A frame of the server's stored series, in the page's shape (no outline or tracking kept). */
function serverFrame(f: SavedDynamicMeasurement['series'][number]): SeriesFrameResult {
  const n = (v: unknown) => (typeof v === 'number' ? v : null);
  return {
    index: f.index,
    tSec: f.tSec,
    leftDeg: n(f.leftDeg),
    rightDeg: n(f.rightDeg),
    meanDeg: f.meanDeg,
    baseDiameterPx: n(f.baseDiameterPx),
    heightPx: null,
    volumePx3: n(f.volumePx3),
    contactLeft: null,
    contactRight: null,
    baseline: null,
    warnings: Array.isArray(f.warnings) ? (f.warnings as FrameWarning[]) : [],
    tracking: { roi: null, baseline: 'found', retried: false, warmStart: false },
    timeMs: 0,
  };
}

/** The worker's own time per frame (analysis only), median. */
function medianMs(frames: readonly SeriesFrameResult[]): number {
  const times = frames.map((f) => f.timeMs).sort((a, b) => a - b);
  return times.length ? times[Math.floor(times.length / 2)] : 0;
}

type SourceMode = SourceChoice;

/** What the page analyses: the frames' origin, kept for the save. */
type Loaded =
  | { type: 'video'; file: File; fps: number }
  | { type: 'frames'; files: File[]; fps: number }
  | { type: 'camera'; captured: CapturedSeries };

/**
 * The dynamic-wetting page: a series of one drop (a video, frame images with their rate, or the
 * live camera) analysed frame by frame in the series worker, the plot filling in as frames finish,
 * the numbers of the chosen kind with windows the user can move, and the save to a sample.
 */
export function DynamicWorkspace({
  samples,
  liquids,
}: {
  samples: SampleChoice[];
  liquids: LiquidChoice[];
}) {
  const editor = useDynamicEditor();
  const { run, analyse, stop, show } = useSeriesAnalysis();
  const saving = useSaveSeries();
  const [mode, setMode] = useState<SourceMode>('video');
  const [videoFile, setVideoFile] = useState<File | null>(null);
  const [frameFiles, setFrameFiles] = useState<File[]>([]);
  const [fps, , fpsField] = useFieldState('30');
  const [problem, setProblem] = useState<{ message: string; serverCanDecode: boolean } | null>(
    null,
  );
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [expectedEndSec, setExpectedEndSec] = useState<number | null>(null);
  const [sampleId, , sampleField] = useFieldState('');
  const [liquidId, , liquidField] = useFieldState(
    () => liquids.find((l) => /water/i.test(l.name))?.id ?? liquids[0]?.id ?? '',
  );
  const camerasFrames = useRef<File[] | null>(null);

  const measurement = useMemo(() => pageMeasurement(run.frames, editor), [run.frames, editor]);
  const span = spanOf(run.frames.map((f) => f.tSec)) ?? { startSec: 0, endSec: 0 };
  const fpsOfRun = loaded
    ? loaded.type === 'camera'
      ? loaded.captured.fps
      : loaded.fps
    : Number(fps);
  const stepSec = fpsOfRun > 0 ? 1 / fpsOfRun : 0.1;

  const plotWindows: PlotWindow[] = [];
  if (measurement.ok) {
    const r = measurement.result;
    if (r.advancingWindow)
      plotWindows.push({ name: 'Advancing', window: r.advancingWindow, fill: '#2f7d4f' });
    if (r.recedingWindow)
      plotWindows.push({ name: 'Receding', window: r.recedingWindow, fill: '#b36b00' });
    if (r.rate)
      plotWindows.push({
        name: 'Rate',
        window: { fromSec: r.rate.fromSec, toSec: r.rate.toSec },
        fill: '#5b3f8c',
      });
  }

  async function start(source: Loaded) {
    setProblem(null);
    saving.reset();
    editor.resetWindows();
    camerasFrames.current = null;
    try {
      if (source.type === 'video') {
        // Kept first: a video the browser cannot decode can still be saved and decoded on the server.
        setLoaded(source);
        const video = await openVideo(source.file, source.fps);
        setExpectedEndSec((video.frameCount - 1) / source.fps);
        await analyse(video.frames, { method: editor.method, total: video.frameCount });
      } else if (source.type === 'frames') {
        setLoaded(source);
        setExpectedEndSec((source.files.length - 1) / source.fps);
        await analyse(imageFrames(source.files, source.fps), {
          method: editor.method,
          total: source.files.length,
        });
      } else {
        const { frames, fps: rate } = source.captured;
        setLoaded(source);
        setExpectedEndSec((frames.length - 1) / rate);
        await analyse(
          // Copies: the worker takes the pixels over, and the frames are kept for the save.
          frames.map((image, i) => ({
            image: { ...image, data: image.data.slice() },
            tSec: i / rate,
          })),
          { method: editor.method, total: frames.length },
        );
      }
    } catch (error) {
      if (error instanceof FrameSourceError)
        setProblem({ message: error.message, serverCanDecode: error.serverCanDecode });
      else if (error instanceof Error && error.message !== 'Stopped.')
        setProblem({ message: error.message, serverCanDecode: false });
    }
  }

  function analyseChosen() {
    const rate = Number(fps);
    if (!(rate > 0)) {
      setProblem({
        message: 'Type the frame rate in frames per second (a number above 0).',
        serverCanDecode: false,
      });
      return;
    }
    if (mode === 'video') {
      if (!videoFile)
        return setProblem({ message: 'Choose a video file first.', serverCanDecode: false });
      void start({ type: 'video', file: videoFile, fps: rate });
    } else if (mode === 'frames') {
      if (frameFiles.length < 3)
        return setProblem({
          message: 'Choose at least 3 frame images of the series.',
          serverCanDecode: false,
        });
      void start({ type: 'frames', files: frameFiles, fps: rate });
    }
  }

  async function pageSource(): Promise<PageSource | null> {
    if (!loaded) return null;
    if (loaded.type !== 'camera') return loaded;
    camerasFrames.current ??= await Promise.all(
      loaded.captured.frames.map((image, i) =>
        grayToPng(image, `camera-frame-${String(i).padStart(4, '0')}.png`),
      ),
    );
    return { type: 'frames', files: camerasFrames.current, fps: loaded.captured.fps };
  }

  /** A video only the server can decode: saved with the detected windows, then its series shown. */
  const serverDecodes =
    loaded?.type === 'video' && run.frames.length === 0 && problem?.serverCanDecode === true;

  async function save() {
    const source = await pageSource();
    if (!source) return;
    const rate = editor.tilt.type === 'rate' ? editor.tilt : null;
    const choices = measurement.ok
      ? measurement.save
      : serverDecodes && (editor.kind !== 'tilt' || rate)
        ? {
            kind: editor.kind,
            ...(editor.kind === 'tilt' && rate
              ? {
                  tilt: {
                    rateDegPerSec: Number(rate.rateDegPerSec),
                    startDeg: Number(rate.startDeg || 0),
                  },
                }
              : {}),
          }
        : null;
    if (!choices) return;
    const saved = await saving.save(source, {
      sampleId,
      probeLiquidId: liquidId,
      method: editor.method,
      ...choices,
    });
    if (saved && serverDecodes) {
      const stored = await fetchDynamicMeasurement(saved.measurementId).catch(() => null);
      if (stored) show(stored.series.map(serverFrame));
    }
  }

  const running = run.status === 'running';
  const total = run.total ?? null;
  const sample = samples.find((s) => s.id === sampleId);
  const windowsForPanel: Record<'advancing' | 'receding' | 'rate', PhaseWindow | null | undefined> =
    {
      advancing: editor.windows.advancing,
      receding: editor.windows.receding,
      rate: editor.windows.rate,
    };

  return (
    <div className="space-y-4">
      <section className="card space-y-3" aria-labelledby="series-source-heading">
        <h2 id="series-source-heading">The series</h2>
        <div
          role="radiogroup"
          aria-label="Where the frames come from"
          className="flex flex-wrap gap-4 text-sm"
        >
          {(
            [
              ['video', 'Video file'],
              ['frames', 'Frame images'],
              ['camera', 'Live camera'],
            ] as const
          ).map(([value, label]) => (
            <label key={value} className="flex items-center gap-2">
              <input
                type="radio"
                name="series-source"
                value={value}
                checked={mode === value}
                onChange={() => setMode(value)}
              />
              {label}
            </label>
          ))}
        </div>
        <div className="grid gap-3 md:grid-cols-2">
          <SelectField
            id="series-kind"
            label="What the series shows"
            value={editor.kind}
            onChange={(e) => editor.setKind(e.target.value as DynamicKind)}
          >
            {(Object.keys(KIND_LABELS) as DynamicKind[]).map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </SelectField>
          <SelectField
            id="series-method"
            label="Profile fit"
            value={editor.method}
            onChange={(e) => editor.setMethod(e.target.value as FitMethod)}
            hint="Applies to the next analysis."
          >
            {Object.entries(METHOD_LABELS).map(([m, label]) => (
              <option key={m} value={m}>
                {label}
              </option>
            ))}
          </SelectField>
        </div>
        {mode === 'camera' ? (
          <LiveCamera
            onCaptured={(captured) =>
              captured.frames.length >= 3
                ? void start({ type: 'camera', captured })
                : setProblem({
                    message: 'Fewer than 3 frames were captured; record for longer.',
                    serverCanDecode: false,
                  })
            }
          />
        ) : (
          <div className="flex flex-wrap items-end gap-3">
            {mode === 'video' ? (
              <label className="flex flex-col text-sm text-ink-800" htmlFor="series-video">
                Video (MP4 H.264, WebM; AVI MJPEG is decoded on the server)
                <input
                  id="series-video"
                  type="file"
                  accept={VIDEO_ACCEPT}
                  className="mt-1 text-sm"
                  onChange={(e) => setVideoFile(e.target.files?.[0] ?? null)}
                />
              </label>
            ) : (
              <label className="flex flex-col text-sm text-ink-800" htmlFor="series-frames">
                Frame images in order (PNG, JPEG or BMP; sorted by name)
                <input
                  id="series-frames"
                  type="file"
                  multiple
                  accept={IMAGE_ACCEPT}
                  className="mt-1 text-sm"
                  onChange={(e) => setFrameFiles(inFrameOrder([...(e.target.files ?? [])]))}
                />
              </label>
            )}
            <NumberField
              id="series-fps"
              label="Frame rate"
              unit="frames/s"
              className="w-36"
              {...fpsField}
            />
            <button
              type="button"
              className="btn-primary"
              disabled={running}
              onClick={analyseChosen}
            >
              Analyse the series
            </button>
            {running ? (
              <button type="button" className="btn-quiet" onClick={stop}>
                Stop
              </button>
            ) : null}
          </div>
        )}
        {mode === 'video' ? (
          <p className="text-xs text-ink-600">
            A video file does not tell the page its frame rate: type the camera&apos;s. The server
            uses the same rate when it analyses the saved video.
          </p>
        ) : null}
        {problem ? (
          <div
            role="alert"
            className="rounded-md border border-coral-300 bg-coral-50 px-3 py-2 text-sm text-coral-800"
          >
            {problem.message}
            {problem.serverCanDecode && videoFile ? (
              <span>
                {' '}
                Choose the sample and probe liquid below and save: the server decodes the video with
                ffmpeg and analyses it.
              </span>
            ) : null}
          </div>
        ) : null}
        {run.status !== 'idle' ? (
          <div className="flex items-center gap-3 text-sm">
            <progress
              aria-label="Frames analysed"
              data-testid="series-progress"
              max={total ?? undefined}
              value={run.frames.length}
              className="h-2 w-64 accent-lagoon-600"
            />
            <span role="status" className="font-mono text-xs text-ink-700">
              {run.frames.length}
              {total ? ` / ${total}` : ''} frames
              {run.status === 'done' ? ' — done' : run.status === 'stopped' ? ' — stopped' : ''}
              {run.status === 'done' && run.msPerFrame
                ? ` (${run.msPerFrame.toFixed(0)} ms per frame in all; the fit ${medianMs(run.frames).toFixed(0)} ms median)`
                : ''}
            </span>
          </div>
        ) : null}
        {run.error ? (
          <p role="alert" className="text-sm text-coral-700">
            {run.error}
          </p>
        ) : null}
      </section>

      {editor.kind === 'tilt' ? <TiltSettings /> : null}

      {run.frames.length > 0 ? (
        <section className="card" aria-labelledby="series-plot-heading">
          <h2 id="series-plot-heading">Angle, base diameter and volume against time</h2>
          <SeriesPlot frames={run.frames} kind={editor.kind} windows={plotWindows} endSec={expectedEndSec} />
        </section>
      ) : null}

      {run.frames.length > 0 && !running ? (
        measurement.ok ? (
          <ResultsPanel
            result={measurement.result}
            span={span}
            stepSec={stepSec}
            windows={windowsForPanel}
            onWindow={(name, w) => editor.setWindow(name, w)}
          />
        ) : (
          <p role="alert" className="card text-sm text-coral-700">
            {measurement.message}
          </p>
        )
      ) : null}

      <FlaggedFrames frames={run.frames} kind={editor.kind} />
      <FrameTable
        frames={run.frames}
        kind={editor.kind}
        tiltsDeg={measurement.ok ? measurement.tiltsDeg : null}
      />

      <section className="card space-y-3" aria-labelledby="series-save-heading">
        <h2 id="series-save-heading">Save to a sample</h2>
        <div className="grid gap-3 md:grid-cols-2">
          <SampleSelect
            id="series-sample"
            label="Sample"
            placeholder="Choose a sample…"
            samples={samples}
            {...sampleField}
          />
          <LiquidSelect
            id="series-liquid"
            label="Probe liquid"
            liquids={liquids}
            {...liquidField}
          />
        </div>
        <p className="text-xs text-ink-600" data-testid="series-upload-note">
          The source goes to the upload service{' '}
          {uploadDescription(
            loaded === null
              ? null
              : loaded.type === 'video'
                ? { type: 'video', fileName: loaded.file.name }
                : loaded.type === 'frames'
                  ? { type: 'frames', count: loaded.files.length }
                  : { type: 'camera', count: loaded.captured.frames.length },
            mode,
          )}
          ; the server analyses it again with the same method, windows and settings before it
          saves.
        </p>
        <button
          type="button"
          className="btn-primary"
          disabled={
            !sampleId ||
            !liquidId ||
            running ||
            !(measurement.ok || serverDecodes) ||
            saving.step.kind === 'uploading' ||
            saving.step.kind === 'analysing'
          }
          onClick={() => void save()}
        >
          Save the measurement
        </button>
        <SaveStatus
          step={saving.step}
          compareHref={
            sample
              ? `/compare?coating=${encodeURIComponent(sample.coatingCode)}&batches=${encodeURIComponent(sample.lotCode)}`
              : null
          }
        />
      </section>
    </div>
  );
}

function SaveStatus({
  step,
  compareHref,
}: {
  step: ReturnType<typeof useSaveSeries>['step'];
  compareHref: string | null;
}) {
  if (step.kind === 'idle') return null;
  if (step.kind === 'uploading')
    return (
      <p role="status" className="text-sm text-ink-700">
        Uploading {step.what}… {step.progress}%
      </p>
    );
  if (step.kind === 'analysing')
    return (
      <p role="status" className="text-sm text-ink-700">
        The server is analysing the series…
      </p>
    );
  if (step.kind === 'failed')
    return (
      <p role="alert" className="text-sm text-coral-700">
        {step.message}
      </p>
    );
  const { saved } = step;
  const r = saved.result;
  const parts = [
    r.advancing ? `advancing ${r.advancing.meanDeg.toFixed(2)}°` : null,
    r.receding ? `receding ${r.receding.meanDeg.toFixed(2)}°` : null,
    r.hysteresisDeg !== null ? `hysteresis ${r.hysteresisDeg.toFixed(2)}°` : null,
    r.rollOff ? `roll-off at ${r.rollOff.tiltDeg.toFixed(1)}° tilt` : null,
    r.initialAngle ? `initial angle ${r.initialAngle.angleDeg.toFixed(2)}°` : null,
  ].filter(Boolean);
  return (
    <p role="status" className="text-sm text-ink-800" data-testid="series-saved">
      Saved as revision {saved.revision} (server analysis: {parts.join(', ') || 'no phase found'};{' '}
      {r.frameCount} frames, {r.flaggedFrameCount + r.failedFrameCount} flagged).{' '}
      {compareHref ? (
        <Link href={compareHref} className="underline">
          Compare this batch
        </Link>
      ) : null}
    </p>
  );
}
