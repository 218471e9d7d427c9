'use client';

import { useState } from 'react';
import type { TensiometryResult } from '@/lib/contracts/tensiometry';
import type {
  ProbeLiquidCheck,
  WilhelmyContactAngleResult,
  WilhelmySurfaceTensionResult,
} from '@/lib/tensiometry';
import { ApiError, apiFetch } from '@/components/measure/api';
import { PendantDropForm } from './pendant-drop';

export type SavedTensiometry = Omit<TensiometryResult, 'createdAt'> & { createdAt: string };

const fmt = (v: number | null | undefined, digits = 2) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);

type FieldErrors = Record<string, string>;

/** Text fields → numbers; an empty optional field is left out, anything else unparsable is sent as is for the server to name. */
function numbers(
  values: Record<string, string>,
  optional: string[] = [],
): Record<string, number | string> {
  const out: Record<string, number | string> = {};
  for (const [key, raw] of Object.entries(values)) {
    const text = raw.trim().replace(',', '.');
    if (text === '' && optional.includes(key)) continue;
    const n = Number(text);
    out[key] = text === '' || !Number.isFinite(n) ? raw : n;
  }
  return out;
}

function NumberField({
  id,
  label,
  value,
  onChange,
  error,
  hint,
}: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
  error?: string;
  hint?: string;
}) {
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <input
        id={id}
        name={id}
        inputMode="decimal"
        className="field-input"
        value={value}
        onChange={(event) => onChange(event.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
      />
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-600">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="field-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}

function useSubmit<T>() {
  const [errors, setErrors] = useState<FieldErrors>({});
  const [message, setMessage] = useState<string | null>(null);
  const [result, setResult] = useState<T | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(
    url: string,
    body: Record<string, unknown>,
    onSaved?: (saved: SavedTensiometry) => void,
  ) {
    setBusy(true);
    setMessage(null);
    try {
      const response = await apiFetch<{ result: T; saved?: SavedTensiometry }>(url, {
        method: 'POST',
        json: body,
      });
      setResult(response.result);
      setErrors({});
      if (response.saved && onSaved) onSaved(response.saved);
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
  return { errors, message, result, busy, submit };
}

function WilhelmyForm({
  canSave,
  onSaved,
}: {
  canSave: boolean;
  onSaved: (s: SavedTensiometry) => void;
}) {
  const [mode, setMode] = useState<'tension' | 'angle'>('tension');
  const [values, setValues] = useState({
    forceMilliNewton: '',
    plateWidthMm: '19.62',
    plateThicknessMm: '0.10',
    immersionDepthMm: '0',
    liquidDensityGPerCm3: '',
    liquidSurfaceTensionMilliNewtonPerM: '',
  });
  const { errors, message, result, busy, submit } = useSubmit<
    WilhelmySurfaceTensionResult | WilhelmyContactAngleResult
  >();
  const set = (key: keyof typeof values) => (v: string) => setValues((s) => ({ ...s, [key]: v }));

  function send(save: boolean) {
    const { liquidSurfaceTensionMilliNewtonPerM, ...common } = values;
    const body = numbers(
      mode === 'angle' ? { ...common, liquidSurfaceTensionMilliNewtonPerM } : common,
      ['liquidDensityGPerCm3', 'immersionDepthMm'],
    );
    void submit('/api/tensiometry/wilhelmy', { mode, ...body, save }, onSaved);
  }

  return (
    <section className="card" aria-label="Wilhelmy plate">
      <h2 className="mb-1">Wilhelmy plate</h2>
      <p className="mb-3 text-xs text-ink-600">
        γ · 2(w + t) · cos θ = F − W + ρ g w t d (Wilhelmy 1863). Balance tared with the plate
        hanging in air.
      </p>
      <form
        noValidate
        onSubmit={(event) => {
          event.preventDefault();
          send(false);
        }}
        className="grid gap-4"
      >
        <fieldset className="flex flex-wrap gap-4 text-sm">
          <legend className="field-label mb-1">Compute</legend>
          <label className="flex items-center gap-2">
            <input
              type="radio"
              name="wilhelmy-mode"
              checked={mode === 'tension'}
              onChange={() => setMode('tension')}
            />
            Surface tension of the liquid (platinum plate, θ = 0)
          </label>
          <label className="flex items-center gap-2">
            <input
              type="radio"
              name="wilhelmy-mode"
              checked={mode === 'angle'}
              onChange={() => setMode('angle')}
            />
            Contact angle on a plate of another material (γ known)
          </label>
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <NumberField
            id="forceMilliNewton"
            label="Force (mN)"
            value={values.forceMilliNewton}
            onChange={set('forceMilliNewton')}
            error={errors.forceMilliNewton}
          />
          <NumberField
            id="plateWidthMm"
            label="Plate width w (mm)"
            value={values.plateWidthMm}
            onChange={set('plateWidthMm')}
            error={errors.plateWidthMm}
          />
          <NumberField
            id="plateThicknessMm"
            label="Plate thickness t (mm)"
            value={values.plateThicknessMm}
            onChange={set('plateThicknessMm')}
            error={errors.plateThicknessMm}
          />
          <NumberField
            id="immersionDepthMm"
            label="Immersion depth d (mm)"
            value={values.immersionDepthMm}
            onChange={set('immersionDepthMm')}
            error={errors.immersionDepthMm}
            hint="0 when the plate just touches the surface."
          />
          <NumberField
            id="liquidDensityGPerCm3"
            label="Liquid density ρ (g/cm³)"
            value={values.liquidDensityGPerCm3}
            onChange={set('liquidDensityGPerCm3')}
            error={errors.liquidDensityGPerCm3}
            hint="Needed for the buoyancy correction when d > 0."
          />
          {mode === 'angle' ? (
            <NumberField
              id="liquidSurfaceTensionMilliNewtonPerM"
              label="Liquid surface tension γ (mN/m)"
              value={values.liquidSurfaceTensionMilliNewtonPerM}
              onChange={set('liquidSurfaceTensionMilliNewtonPerM')}
              error={errors.liquidSurfaceTensionMilliNewtonPerM}
            />
          ) : null}
        </div>
        <div className="flex flex-wrap gap-3">
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? 'Computing…' : 'Compute'}
          </button>
          {canSave ? (
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => send(true)}>
              Compute and save
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
        <dl
          className="mt-4 grid gap-1 rounded-md bg-lagoon-50 p-3 text-sm"
          data-testid="wilhelmy-result"
          aria-live="polite"
        >
          {'surfaceTensionMilliNewtonPerM' in result ? (
            <div className="flex justify-between gap-2">
              <dt>Surface tension γ</dt>
              <dd className="font-mono">
                {fmt(result.surfaceTensionMilliNewtonPerM)} mN/m (θ ={' '}
                {fmt(result.contactAngleDeg, 0)}°)
              </dd>
            </div>
          ) : (
            <div className="flex justify-between gap-2">
              <dt>Contact angle θ</dt>
              <dd className="font-mono">
                {fmt(result.contactAngleDeg, 1)}° (cos θ = {fmt(result.cosTheta, 4)})
              </dd>
            </div>
          )}
          <div className="flex justify-between gap-2">
            <dt>Wetted perimeter 2(w + t)</dt>
            <dd className="font-mono">{fmt(result.wettedPerimeterMm, 3)} mm</dd>
          </div>
          <div className="flex justify-between gap-2">
            <dt>Buoyancy correction ρ g w t d (added)</dt>
            <dd className="font-mono">{fmt(result.buoyancyMilliNewton, 4)} mN</dd>
          </div>
          <div className="flex justify-between gap-2">
            <dt>Corrected wetting force</dt>
            <dd className="font-mono">{fmt(result.wettingForceMilliNewton, 4)} mN</dd>
          </div>
        </dl>
      ) : null}
    </section>
  );
}

const FLAG_TEXT: Record<ProbeLiquidCheck['flag'], { label: string; tone: string }> = {
  'within-tolerance': { label: 'Within tolerance', tone: 'bg-leaf-50 text-leaf-900' },
  'low-likely-contamination': {
    label: 'Low — likely contaminated',
    tone: 'bg-coral-50 text-coral-900',
  },
  'high-check-instrument': {
    label: 'High — check the instrument',
    tone: 'bg-amber-50 text-amber-900',
  },
};

function WaterCheckForm({
  canSave,
  onSaved,
}: {
  canSave: boolean;
  onSaved: (s: SavedTensiometry) => void;
}) {
  const [values, setValues] = useState({
    measuredMilliNewtonPerM: '',
    temperatureC: '20',
    toleranceMilliNewtonPerM: '1.0',
  });
  const { errors, message, result, busy, submit } = useSubmit<ProbeLiquidCheck>();
  const set = (key: keyof typeof values) => (v: string) => setValues((s) => ({ ...s, [key]: v }));
  const send = (save: boolean) =>
    void submit('/api/tensiometry/water-check', { ...numbers(values), save }, onSaved);
  return (
    <section className="card" aria-label="Water check">
      <h2 className="mb-1">Probe water check</h2>
      <p className="mb-3 text-xs text-ink-600">
        Measured water surface tension against IAPWS R1-76(2014) at the measured temperature. A low
        value usually means surface-active contamination of the water or the vessel.
      </p>
      <form
        noValidate
        onSubmit={(event) => {
          event.preventDefault();
          send(false);
        }}
        className="grid gap-4"
      >
        <div className="grid gap-4 sm:grid-cols-3">
          <NumberField
            id="measuredMilliNewtonPerM"
            label="Measured γ (mN/m)"
            value={values.measuredMilliNewtonPerM}
            onChange={set('measuredMilliNewtonPerM')}
            error={errors.measuredMilliNewtonPerM}
          />
          <NumberField
            id="temperatureC"
            label="Temperature (°C)"
            value={values.temperatureC}
            onChange={set('temperatureC')}
            error={errors.temperatureC}
          />
          <NumberField
            id="toleranceMilliNewtonPerM"
            label="Tolerance (± mN/m)"
            value={values.toleranceMilliNewtonPerM}
            onChange={set('toleranceMilliNewtonPerM')}
            error={errors.toleranceMilliNewtonPerM}
            hint="Set by your lab."
          />
        </div>
        <div className="flex flex-wrap gap-3">
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? 'Checking…' : 'Check'}
          </button>
          {canSave ? (
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => send(true)}>
              Check and save
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
        <div className="mt-4 grid gap-2" data-testid="water-check-result" aria-live="polite">
          <dl className="grid gap-1 text-sm">
            <div className="flex justify-between gap-2">
              <dt>IAPWS R1-76(2014) at {values.temperatureC} °C</dt>
              <dd className="font-mono" data-testid="water-reference">
                {fmt(result.referenceMilliNewtonPerM)} mN/m
              </dd>
            </div>
            <div className="flex justify-between gap-2">
              <dt>Difference (measured − reference)</dt>
              <dd className="font-mono">
                {result.deviationMilliNewtonPerM >= 0 ? '+' : ''}
                {fmt(result.deviationMilliNewtonPerM)} mN/m
              </dd>
            </div>
          </dl>
          <p
            className={`rounded-md px-3 py-2 text-sm ${FLAG_TEXT[result.flag].tone}`}
            data-testid="water-flag"
          >
            <strong>{FLAG_TEXT[result.flag].label}.</strong> {result.message}
          </p>
        </div>
      ) : null}
    </section>
  );
}

const KIND_LABELS: Record<string, string> = {
  'wilhelmy-tension': 'Wilhelmy, surface tension',
  'wilhelmy-angle': 'Wilhelmy, contact angle',
  'water-check': 'Water check',
  'pendant-drop': 'Pendant drop',
};

function summary(r: SavedTensiometry): string {
  const o: Record<string, unknown> = { ...r.outputs };
  if (r.kind === 'water-check')
    return `${fmt(Number(o.measuredMilliNewtonPerM))} vs ${fmt(Number(o.referenceMilliNewtonPerM))} mN/m — ${String(o.flag)}`;
  if (r.kind === 'wilhelmy-angle') return `θ = ${fmt(Number(o.contactAngleDeg), 1)}°`;
  if (r.kind === 'wilhelmy-tension' || r.kind === 'pendant-drop')
    return `γ = ${fmt(Number(o.surfaceTensionMilliNewtonPerM))} mN/m`;
  return '';
}

export function TensiometryWorkspace({
  canSave,
  canReadPhotos,
  initialSaved,
}: {
  /** May save results and upload photos ('records:write'). */
  canSave: boolean;
  /** May see drop photos ('results:read-all'). */
  canReadPhotos: boolean;
  initialSaved: SavedTensiometry[];
}) {
  const [saved, setSaved] = useState(initialSaved);
  const onSaved = (s: SavedTensiometry) => setSaved((list) => [s, ...list]);
  return (
    <div className="grid gap-6">
      <div className="grid gap-6 xl:grid-cols-2">
        <WilhelmyForm canSave={canSave} onSaved={onSaved} />
        <WaterCheckForm canSave={canSave} onSaved={onSaved} />
      </div>
      {canSave ? (
        <PendantDropForm onSaved={onSaved} />
      ) : (
        <section className="card" aria-label="Pendant drop">
          <h2 className="mb-1">Pendant drop</h2>
          <p className="text-sm text-ink-600">
            Pendant-drop fits are run by analysts, who upload the photo of the hanging drop; the
            results they save are listed below.
          </p>
        </section>
      )}
      <section className="card" aria-label="Saved tensiometry results">
        <h2 className="mb-2">Saved results</h2>
        {saved.length === 0 ? (
          <p className="text-sm text-ink-600">No tensiometry results saved yet.</p>
        ) : (
          <ul className="divide-y divide-ink-100 text-sm">
            {saved.map((r) => (
              <li key={r.id} className="flex items-start gap-3 py-2" data-testid="saved-result">
                {r.photoId && canReadPhotos ? (
                  <a
                    href={`/api/photos/${r.photoId}/image`}
                    target="_blank"
                    rel="noreferrer"
                    className="shrink-0"
                    title="Open the photo this result was fitted from"
                  >
                    {/* eslint-disable-next-line @next/next/no-img-element -- authenticated thumbnail from our own route */}
                    <img
                      src={`/api/photos/${r.photoId}/thumbnail`}
                      alt="Photo of the hanging drop"
                      className="h-16 w-16 rounded border border-ink-200 object-contain"
                    />
                  </a>
                ) : null}
                <div className="min-w-0">
                  <span className="font-medium">{KIND_LABELS[r.kind] ?? r.kind}</span>
                  <span className="font-mono"> · {summary(r)}</span>
                  <span className="block text-xs text-ink-600">
                    {new Date(r.createdAt).toISOString().slice(0, 16).replace('T', ' ')} UTC
                    {r.createdByName ? ` · ${r.createdByName}` : ''}
                    {r.photoId && !canReadPhotos ? ' · fitted from a photo' : ''}
                  </span>
                </div>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
