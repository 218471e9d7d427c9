'use client';

import { useRef, useState } from 'react';
import { ApiError, apiFetch } from '@/components/measure/api';
import { photoFileProblem, useUploadThing } from '@/components/measure/uploads';
import type { EdgePoint, PendantDropResult } from '@/lib/tensiometry/pendant-drop';
import type { DropPhotoUploadResult } from '@/lib/uploads/file-router';
import type { SavedTensiometry } from './workspace';

const fmt = (v: number, digits = 2) => (Number.isFinite(v) ? v.toFixed(digits) : '—');

type StoredPhoto = { id: string; name: string; width: number; height: number };

type Upload =
  | { kind: 'none' }
  | { kind: 'uploading'; name: string; progress: number }
  | { kind: 'refused'; name: string; message: string }
  | { kind: 'stored'; photo: StoredPhoto };

/** What POST /api/tensiometry/pendant-drop answers for a photo. */
type PhotoFit = {
  result: PendantDropResult;
  photo: { id: string; width: number; height: number };
  extraction: {
    pointCount: number;
    needleOuterDiameterPx: number;
    needleTipY: number;
    warnings: string[];
  };
  profile: EdgePoint[];
  saved?: SavedTensiometry;
};

/**
 * The photo with the fitted Young–Laplace outline drawn over it. The outline comes in pixel
 * coordinates with pixel centres at whole numbers, hence the half-pixel shift of the view box.
 */
export function PendantPhotoView({
  photoId,
  width,
  height,
  profile,
  name,
}: {
  photoId: string;
  width: number;
  height: number;
  profile?: EdgePoint[];
  name: string;
}) {
  return (
    <figure className="grid gap-1">
      <div className="relative w-full max-w-md" style={{ aspectRatio: `${width} / ${height}` }}>
        {/* eslint-disable-next-line @next/next/no-img-element -- authenticated photo from our own route */}
        <img
          src={`/api/photos/${photoId}/image`}
          alt={`Photo of the hanging drop (${name})`}
          className="absolute inset-0 h-full w-full rounded-md border border-ink-200"
        />
        {profile && profile.length > 1 ? (
          <svg
            viewBox={`-0.5 -0.5 ${width} ${height}`}
            preserveAspectRatio="none"
            className="absolute inset-0 h-full w-full"
            aria-hidden="true"
            data-testid="pendant-fitted-outline"
          >
            <polyline
              points={profile.map((p) => `${p.x.toFixed(2)},${p.y.toFixed(2)}`).join(' ')}
              fill="none"
              className="stroke-amber-500"
              strokeWidth={2}
              vectorEffect="non-scaling-stroke"
            />
          </svg>
        ) : null}
      </div>
      <figcaption className="text-xs text-ink-600">
        {profile && profile.length > 1
          ? `${name}: the fitted Young–Laplace profile is drawn in amber.`
          : name}
      </figcaption>
    </figure>
  );
}

/**
 * Pendant drop: the photo is uploaded through the upload service like the measurement
 * workspace's, and the route handler finds its outline, fits the Young–Laplace profile and, on
 * "Fit and save", keeps the result with the photo. Shown to those who may upload photos.
 */
export function PendantDropForm({ onSaved }: { onSaved: (s: SavedTensiometry) => void }) {
  const [upload, setUpload] = useState<Upload>({ kind: 'none' });
  const [values, setValues] = useState({ needleOuterDiameterMm: '', densityDifferenceKgPerM3: '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [fit, setFit] = useState<PhotoFit | null>(null);
  const [busy, setBusy] = useState(false);
  // Only the latest chosen file's upload may update the form.
  const attempt = useRef(0);
  // The SDK reports a failed upload here and then resolves startUpload with nothing.
  const uploadError = useRef<string | null>(null);
  const { startUpload } = useUploadThing('dropPhoto', {
    onUploadProgress: (progress) =>
      setUpload((u) => (u.kind === 'uploading' ? { ...u, progress } : u)),
    onUploadError: (error) => {
      uploadError.current = error.message;
    },
  });

  async function choose(file: File | undefined) {
    setFit(null);
    setMessage(null);
    setErrors({});
    if (!file) {
      setUpload({ kind: 'none' });
      return;
    }
    const current = ++attempt.current;
    const refuse = (text: string) => {
      if (attempt.current === current)
        setUpload({ kind: 'refused', name: file.name, message: text });
    };
    const problem = photoFileProblem(file);
    if (problem) return refuse(problem);
    setUpload({ kind: 'uploading', name: file.name, progress: 0 });
    uploadError.current = null;
    try {
      const results = await startUpload([file], { purpose: 'pendant-drop' });
      const outcome = results?.[0]?.serverData as DropPhotoUploadResult | undefined;
      if (!outcome)
        return refuse(uploadError.current ?? 'The upload did not finish. Choose the photo again.');
      if (outcome.status !== 'stored') return refuse(outcome.message);
      if (attempt.current !== current) return;
      setUpload({
        kind: 'stored',
        photo: {
          id: outcome.photoId,
          name: file.name,
          width: outcome.width,
          height: outcome.height,
        },
      });
    } catch (error) {
      refuse(error instanceof Error ? error.message : 'The upload failed. Try again.');
    }
  }

  async function send(save: boolean) {
    if (upload.kind !== 'stored') {
      setMessage(
        upload.kind === 'uploading'
          ? 'The photo is still uploading; wait until it is done.'
          : 'Choose a photo of the hanging drop first.',
      );
      return;
    }
    setBusy(true);
    setMessage(null);
    const number = (raw: string) => {
      const n = Number(raw.trim().replace(',', '.'));
      return raw.trim() === '' || !Number.isFinite(n) ? raw : n;
    };
    try {
      const response = await apiFetch<PhotoFit>('/api/tensiometry/pendant-drop', {
        method: 'POST',
        json: {
          photoId: upload.photo.id,
          needleOuterDiameterMm: number(values.needleOuterDiameterMm),
          densityDifferenceKgPerM3: number(values.densityDifferenceKgPerM3),
          save,
        },
      });
      setFit(response);
      setErrors({});
      if (response.saved) onSaved(response.saved);
    } catch (e) {
      setFit(null);
      if (e instanceof ApiError) {
        setErrors(e.body?.error.fields ?? {});
        setMessage(e.message);
      } else setMessage('The calculation did not answer. Check your connection and try again.');
    } finally {
      setBusy(false);
    }
  }

  const field = (key: keyof typeof values, label: string, hint: string) => (
    <div>
      <label htmlFor={`pd-${key}`} className="field-label">
        {label}
      </label>
      <input
        id={`pd-${key}`}
        inputMode="decimal"
        className="field-input"
        value={values[key]}
        onChange={(event) => setValues((s) => ({ ...s, [key]: event.target.value }))}
        aria-invalid={errors[key] ? true : undefined}
        aria-describedby={`pd-${key}-note`}
      />
      <p
        id={`pd-${key}-note`}
        className={errors[key] ? 'field-error' : 'mt-1 text-xs text-ink-600'}
      >
        {errors[key] ?? hint}
      </p>
    </div>
  );

  const photoError = errors.photoId;
  const uploading = upload.kind === 'uploading';

  return (
    <section className="card" aria-label="Pendant drop">
      <h2 className="mb-1">Pendant drop</h2>
      <p className="mb-3 text-xs text-ink-600">
        Surface tension of a liquid from a backlit photo of a drop hanging from a needle:
        Young–Laplace fit of the outline, scale from the needle’s outer diameter, γ = Δρ g b² / β.
        The photo is uploaded and kept with a saved result.
      </p>
      <form
        noValidate
        className="grid gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          void send(false);
        }}
      >
        <div>
          <label htmlFor="pd-photo" className="field-label">
            Photo of the hanging drop
          </label>
          <input
            id="pd-photo"
            type="file"
            accept=".png,.jpg,.jpeg,.tif,.tiff,.bmp,image/png,image/jpeg,image/tiff,image/bmp"
            className="mt-1 block text-sm"
            aria-describedby="pd-photo-note"
            onChange={(event) => void choose(event.target.files?.[0])}
          />
          <div id="pd-photo-note" className="mt-1 text-xs">
            {upload.kind === 'none' ? (
              <p className="text-ink-600">
                PNG, JPEG, TIFF or BMP, up to 25 MB; the needle enters from the top.
              </p>
            ) : upload.kind === 'uploading' ? (
              <p className="flex items-center gap-3 text-ink-600">
                <span className="truncate">Uploading {upload.name}</span>
                <progress
                  max={100}
                  value={upload.progress}
                  className="h-2 w-32 accent-lagoon-600"
                  aria-label={`Uploading ${upload.name}`}
                />
                <span className="font-mono">{upload.progress}%</span>
              </p>
            ) : upload.kind === 'refused' ? (
              <p role="alert" className="field-error">
                {upload.message}
              </p>
            ) : (
              <p className="text-ink-600" data-testid="pendant-photo-stored">
                {upload.photo.name} uploaded ({upload.photo.width} × {upload.photo.height} px).
              </p>
            )}
            {photoError ? <p className="field-error">{photoError}</p> : null}
          </div>
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          {field(
            'needleOuterDiameterMm',
            'Needle outer diameter (mm)',
            'Sets the scale of the photo.',
          )}
          {field(
            'densityDifferenceKgPerM3',
            'Density difference Δρ (kg/m³)',
            'Drop minus surrounding phase; about 997 for water in air at 23 °C.',
          )}
        </div>
        <div className="flex flex-wrap gap-3">
          <button type="submit" className="btn-primary" disabled={busy || uploading}>
            {busy ? 'Fitting…' : 'Fit'}
          </button>
          <button
            type="button"
            className="btn-quiet"
            disabled={busy || uploading}
            onClick={() => void send(true)}
          >
            Fit and save
          </button>
        </div>
        {message ? (
          <p role="alert" className="field-error">
            {message}
          </p>
        ) : null}
      </form>
      {upload.kind === 'stored' ? (
        <div className="mt-4 grid gap-4 md:grid-cols-2">
          <PendantPhotoView
            photoId={upload.photo.id}
            width={upload.photo.width}
            height={upload.photo.height}
            name={upload.photo.name}
            profile={fit?.photo.id === upload.photo.id ? fit.profile : undefined}
          />
          {fit ? <FitFigures fit={fit} /> : null}
        </div>
      ) : null}
    </section>
  );
}

function FitFigures({ fit }: { fit: PhotoFit }) {
  const { result, extraction } = fit;
  const warnings = [...extraction.warnings, ...result.warnings];
  return (
    <div className="grid content-start gap-2" aria-live="polite" data-testid="pendant-result">
      <dl className="grid gap-1 rounded-md bg-lagoon-50 p-3 text-sm">
        <div className="flex justify-between gap-2">
          <dt>Surface tension γ</dt>
          <dd className="font-mono">{fmt(result.surfaceTensionMilliNewtonPerM)} mN/m</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt>Shape factor β</dt>
          <dd className="font-mono">{fmt(result.shapeFactor, 3)}</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt>Apex radius b</dt>
          <dd className="font-mono">{fmt(result.apexRadiusMm, 3)} mm</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt>Fit residual (RMS)</dt>
          <dd className="font-mono">{fmt(result.rmsResidualPx)} px</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt>Outline points</dt>
          <dd className="font-mono">{extraction.pointCount}</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt>Needle width in the photo</dt>
          <dd className="font-mono">{fmt(extraction.needleOuterDiameterPx, 1)} px</dd>
        </div>
      </dl>
      {warnings.length > 0 ? (
        <ul className="list-disc rounded-md bg-amber-50 py-2 pl-8 pr-3 text-sm text-amber-900">
          {warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : null}
      {fit.saved ? (
        <p className="text-sm text-leaf-700" role="status">
          Saved with its photo.
        </p>
      ) : null}
    </div>
  );
}
