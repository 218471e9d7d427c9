'use client';

import { DefinitionList } from '@/components/ui/definition-list';
import { fmt } from '@/components/ui/format';
import type { EdgePoint, PendantDropResult } from '@/lib/tensiometry/pendant-drop';
import type { SavedTensiometry } from '@/components/data/resources';
import type { Upload } from './use-pendant-upload';

/** What POST /api/tensiometry/pendant-drop answers for a photo. */
export type PhotoFit = {
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

/** The photo input with what became of the chosen file: its type, its progress, or why not. */
export function PendantPhotoInput({
  upload,
  error,
  onChoose,
}: {
  upload: Upload;
  error?: string;
  onChoose: (file: File | undefined) => void;
}) {
  return (
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
        aria-invalid={error || upload.kind === 'refused' ? true : undefined}
        onChange={(event) => onChoose(event.target.files?.[0])}
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
        {error ? <p className="field-error">{error}</p> : null}
      </div>
    </div>
  );
}

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
  const drawn = profile && profile.length > 1;
  return (
    <figure className="grid gap-1">
      <div className="relative w-full max-w-md" style={{ aspectRatio: `${width} / ${height}` }}>
        {/* eslint-disable-next-line @next/next/no-img-element -- authenticated photo from our own route */}
        <img
          src={`/api/photos/${photoId}/image`}
          alt={`Photo of the hanging drop (${name})`}
          className="absolute inset-0 h-full w-full rounded-md border border-ink-200"
        />
        {drawn ? (
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
        {drawn ? `${name}: the fitted Young–Laplace profile is drawn in amber.` : name}
      </figcaption>
    </figure>
  );
}

/** The fitted surface tension with the figures that say how good the fit and the photo were. */
export function FitFigures({ fit }: { fit: PhotoFit }) {
  const { result, extraction } = fit;
  const warnings = [...extraction.warnings, ...result.warnings];
  return (
    <div className="grid content-start gap-2" aria-live="polite" data-testid="pendant-result">
      <DefinitionList
        className="rounded-md bg-lagoon-50 p-3 text-sm"
        items={[
          {
            term: 'Surface tension γ',
            value: `${fmt(result.surfaceTensionMilliNewtonPerM, 2)} mN/m`,
          },
          { term: 'Shape factor β', value: fmt(result.shapeFactor, 3) },
          { term: 'Apex radius b', value: `${fmt(result.apexRadiusMm, 3)} mm` },
          { term: 'Fit residual (RMS)', value: `${fmt(result.rmsResidualPx, 2)} px` },
          { term: 'Outline points', value: String(extraction.pointCount) },
          {
            term: 'Needle width in the photo',
            value: `${fmt(extraction.needleOuterDiameterPx, 1)} px`,
          },
        ]}
      />
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
