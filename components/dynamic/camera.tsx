'use client';

import { useEffect, useRef, useState } from 'react';
import { NumberField, useFieldState } from '@/components/ui/fields';
import type { GrayImage } from '@/lib/analysis/types';
import { frameCanvas } from './frame-sources';

/** At most this many frames are captured in one recording (≈ 1 GB of 1024 × 768 gray is far more). */
export const MAX_CAPTURED_FRAMES = 600;

export interface CapturedSeries {
  frames: GrayImage[];
  fps: number;
  /** The recording as the browser encoded it (WebM), for the user to keep; null without MediaRecorder. */
  recording: Blob | null;
}

type CameraState =
  | { kind: 'off' }
  | { kind: 'starting' }
  | { kind: 'live'; width: number; height: number }
  | { kind: 'recording'; width: number; height: number; captured: number }
  | { kind: 'failed'; message: string };

function cameraProblem(error: unknown): string {
  const name = error instanceof DOMException ? error.name : '';
  if (name === 'NotAllowedError')
    return 'The browser was not allowed to use the camera. Allow the camera for this site, then start it again.';
  if (name === 'NotFoundError' || name === 'OverconstrainedError')
    return 'No camera was found. Connect the instrument camera, then start it again.';
  if (name === 'NotReadableError')
    return 'The camera is in use by another program. Close it there, then start it again.';
  return 'The camera could not be started. Check that it is connected and allowed, then try again.';
}

/**
 * The live camera: a preview (getUserMedia), then a recording that captures frames at the chosen
 * rate from the frames the camera delivers and keeps the browser's own recording beside them.
 * The captured frames go to the same series analysis as a video file.
 */
export function LiveCamera({ onCaptured }: { onCaptured(series: CapturedSeries): void }) {
  const video = useRef<HTMLVideoElement>(null);
  const stream = useRef<MediaStream | null>(null);
  const recorder = useRef<MediaRecorder | null>(null);
  const capture = useRef<{ frames: GrayImage[]; active: boolean; finish?: () => void } | null>(null);
  const [state, setState] = useState<CameraState>({ kind: 'off' });
  const [rate, , rateField] = useFieldState('10');

  const release = () => {
    stream.current?.getTracks().forEach((track) => track.stop());
    stream.current = null;
  };
  useEffect(() => release, []);

  async function start() {
    if (!navigator.mediaDevices?.getUserMedia) {
      setState({
        kind: 'failed',
        message: 'This browser offers no camera access here; open the page over HTTPS in a current browser.',
      });
      return;
    }
    setState({ kind: 'starting' });
    try {
      const media = await navigator.mediaDevices.getUserMedia({
        video: { width: { ideal: 1024 }, height: { ideal: 768 } },
        audio: false,
      });
      stream.current = media;
      const element = video.current!;
      element.srcObject = media;
      await element.play();
      setState({ kind: 'live', width: element.videoWidth, height: element.videoHeight });
    } catch (error) {
      release();
      setState({ kind: 'failed', message: cameraProblem(error) });
    }
  }

  function stopCamera() {
    if (capture.current) capture.current.active = false;
    if (recorder.current?.state === 'recording') recorder.current.stop();
    release();
    setState({ kind: 'off' });
  }

  function record() {
    const element = video.current;
    const fps = Number(rate);
    if (!element || state.kind !== 'live' || !(fps > 0 && fps <= 120)) return;
    const { width, height } = state;
    const canvas = frameCanvas(width, height);
    const run: { frames: GrayImage[]; active: boolean; finish?: () => void } = { frames: [], active: true };
    capture.current = run;
    const chunks: Blob[] = [];
    const media = stream.current;
    recorder.current =
      typeof MediaRecorder !== 'undefined' && media ? new MediaRecorder(media) : null;
    recorder.current?.addEventListener('dataavailable', (e) => e.data.size && chunks.push(e.data));
    recorder.current?.start();
    const finish = () => {
      const done = () =>
        onCaptured({
          frames: run.frames,
          fps,
          recording: chunks.length ? new Blob(chunks, { type: recorder.current?.mimeType || 'video/webm' }) : null,
        });
      if (recorder.current && recorder.current.state === 'recording') {
        recorder.current.addEventListener('stop', done, { once: true });
        recorder.current.stop();
      } else done();
      setState({ kind: 'live', width, height });
    };
    run.finish = finish;
    let firstSec: number | null = null;
    const onFrame = (_now: number, meta: VideoFrameCallbackMetadata) => {
      if (!run.active) return;
      firstSec ??= meta.mediaTime;
      // Capture when the camera's clock reaches the next frame's time at the chosen rate.
      if (meta.mediaTime - firstSec >= run.frames.length / fps - 1e-3) {
        run.frames.push(canvas.grab(element));
        setState({ kind: 'recording', width, height, captured: run.frames.length });
        if (run.frames.length >= MAX_CAPTURED_FRAMES) {
          run.active = false;
          finish();
          return;
        }
      }
      element.requestVideoFrameCallback(onFrame);
    };
    element.requestVideoFrameCallback(onFrame);
    setState({ kind: 'recording', width, height, captured: 0 });
  }

  function stopRecording() {
    const run = capture.current;
    if (!run || !run.active) return;
    run.active = false;
    run.finish?.();
  }

  const live = state.kind === 'live' || state.kind === 'recording';
  return (
    <div className="space-y-3">
      <video
        ref={video}
        muted
        playsInline
        aria-label="Live camera preview"
        className={`max-h-80 w-full rounded-md bg-ink-900 object-contain ${live ? '' : 'hidden'}`}
      />
      <div className="flex flex-wrap items-end gap-3">
        {!live ? (
          <button type="button" className="btn-primary" onClick={start} disabled={state.kind === 'starting'}>
            {state.kind === 'starting' ? 'Starting the camera…' : 'Start the camera'}
          </button>
        ) : (
          <>
            <NumberField
              id="capture-rate"
              label="Capture rate"
              unit="frames/s"
              className="w-36"
              disabled={state.kind === 'recording'}
              {...rateField}
            />
            {state.kind === 'recording' ? (
              <button type="button" className="btn-primary" onClick={stopRecording}>
                Stop recording
              </button>
            ) : (
              <button type="button" className="btn-primary" onClick={record} disabled={!(Number(rate) > 0)}>
                Record
              </button>
            )}
            <button type="button" className="btn-quiet" onClick={stopCamera}>
              Turn the camera off
            </button>
          </>
        )}
      </div>
      {state.kind === 'live' ? (
        <p className="text-sm text-ink-700">
          Camera on: {state.width} × {state.height} px. Record while the drop grows and is withdrawn, then stop.
        </p>
      ) : null}
      {state.kind === 'recording' ? (
        <p role="status" className="text-sm text-ink-700" data-testid="captured-count">
          Recording: {state.captured} frame{state.captured === 1 ? '' : 's'} captured.
        </p>
      ) : null}
      {state.kind === 'failed' ? (
        <p role="alert" className="text-sm text-coral-700">
          {state.message}
        </p>
      ) : null}
    </div>
  );
}
