'use client';

import { useState } from 'react';
import { ApiError, apiFetch } from '@/components/measure/api';
import {
  pendantEdgeFromImage,
  type PendantDropResult,
  type PendantEdgeExtraction,
} from '@/lib/tensiometry/pendant-drop';
import { TensiometryInputError } from '@/lib/tensiometry';
import type { SavedTensiometry } from './workspace';

const fmt = (v: number, digits = 2) => (Number.isFinite(v) ? v.toFixed(digits) : '—');

/** Reads a photo in the browser and returns its luminance, row by row. */
async function grayscale(file: File) {
  const bitmap = await createImageBitmap(file);
  const canvas = document.createElement('canvas');
  canvas.width = bitmap.width;
  canvas.height = bitmap.height;
  const context = canvas.getContext('2d');
  if (!context) throw new Error('This browser cannot read images.');
  context.drawImage(bitmap, 0, 0);
  const { data } = context.getImageData(0, 0, bitmap.width, bitmap.height);
  const gray = new Uint8Array(bitmap.width * bitmap.height);
  for (let i = 0; i < gray.length; i++)
    gray[i] = Math.round(0.299 * data[4 * i] + 0.587 * data[4 * i + 1] + 0.114 * data[4 * i + 2]);
  return { width: bitmap.width, height: bitmap.height, data: gray };
}

/**
 * Pendant drop: the photo is read in the browser, its outline found by lib/tensiometry, and the
 * outline sent to the route handler, which fits the Young–Laplace profile.
 */
export function PendantDropForm({
  canSave,
  onSaved,
}: {
  canSave: boolean;
  onSaved: (s: SavedTensiometry) => void;
}) {
  const [extraction, setExtraction] = useState<PendantEdgeExtraction | null>(null);
  const [fileName, setFileName] = useState<string | null>(null);
  const [values, setValues] = useState({ needleOuterDiameterMm: '', densityDifferenceKgPerM3: '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [result, setResult] = useState<PendantDropResult | null>(null);
  const [busy, setBusy] = useState(false);

  async function readPhoto(file: File | undefined) {
    setResult(null);
    setMessage(null);
    setExtraction(null);
    if (!file) return;
    setFileName(file.name);
    try {
      setExtraction(pendantEdgeFromImage(await grayscale(file)));
    } catch (e) {
      setMessage(
        e instanceof TensiometryInputError
          ? e.message
          : 'This photo could not be read. Use a PNG or JPEG of the hanging drop.',
      );
    }
  }

  async function send(save: boolean) {
    if (!extraction) {
      setMessage('Choose a photo of the hanging drop first.');
      return;
    }
    setBusy(true);
    setMessage(null);
    const number = (raw: string) => {
      const n = Number(raw.trim().replace(',', '.'));
      return raw.trim() === '' || !Number.isFinite(n) ? raw : n;
    };
    try {
      const response = await apiFetch<{ result: PendantDropResult; saved?: SavedTensiometry }>(
        '/api/tensiometry/pendant-drop',
        {
          method: 'POST',
          json: {
            edge: extraction.edge,
            needleOuterDiameterPx: extraction.needleOuterDiameterPx,
            needleOuterDiameterMm: number(values.needleOuterDiameterMm),
            densityDifferenceKgPerM3: number(values.densityDifferenceKgPerM3),
            save,
          },
        },
      );
      setResult(response.result);
      setErrors({});
      if (response.saved) onSaved(response.saved);
    } catch (e) {
      setResult(null);
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

  return (
    <section className="card" aria-label="Pendant drop">
      <h2 className="mb-1">Pendant drop</h2>
      <p className="mb-3 text-xs text-ink-600">
        Surface tension of a liquid from a backlit photo of a drop hanging from a needle:
        Young–Laplace fit of the outline, scale from the needle’s outer diameter, γ = Δρ g b² / β.
        The photo is read in your browser; only the outline is sent.
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
            accept="image/png,image/jpeg,image/bmp,image/webp"
            className="mt-1 block text-sm"
            onChange={(event) => void readPhoto(event.target.files?.[0])}
          />
          {extraction ? (
            <p className="mt-1 text-xs text-ink-600" data-testid="pendant-outline">
              {fileName}: {extraction.edge.length} outline points; needle{' '}
              {fmt(extraction.needleOuterDiameterPx, 1)} px wide.
              {extraction.warnings.map((w) => ` ${w}`)}
            </p>
          ) : null}
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
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? 'Fitting…' : 'Fit'}
          </button>
          {canSave ? (
            <button
              type="button"
              className="btn-quiet"
              disabled={busy}
              onClick={() => void send(true)}
            >
              Fit and save
            </button>
          ) : null}
        </div>
        {message ? (
          <p role="alert" className="field-error">
            {message}
          </p>
        ) : null}
      </form>
      {result ? (
        <div className="mt-4 grid gap-2" aria-live="polite" data-testid="pendant-result">
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
          </dl>
          {result.warnings.length > 0 ? (
            <ul className="list-disc rounded-md bg-amber-50 py-2 pl-8 pr-3 text-sm text-amber-900">
              {result.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}
