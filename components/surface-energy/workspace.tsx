'use client';

import { useState } from 'react';
import type { AngleTableRow, SavedSurfaceEnergyResult, SubjectSummary } from '@/lib/contracts/surface-energy';
import type { SurfaceEnergyMethod } from '@/lib/surface-energy';
import { COMPONENT_LABELS, METHOD_LABELS } from '@/components/surface-energy/labels';
import { SURFACE_ENERGY_METHOD_KEYS, headlineTotal, type LiquidAngle, type MethodAvailability, type MethodOutcome, type SurfaceEnergyOutputs, type UncertaintyBasis } from '@/lib/surface-energy/compute';
import { ApiError, apiFetch } from '@/components/measure/api';
import { EnvelopeChart, OwrkChart } from './charts';

type Serialized<T> = Omit<T, 'createdAt' | 'treatedAt'> & {
  createdAt?: string;
  treatedAt?: string | null;
};
export type SavedResult = Omit<SavedSurfaceEnergyResult, 'createdAt'> & { createdAt: string };

const fmt = (v: number | null | undefined, digits = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);

const dateTime = (iso: string) =>
  new Intl.DateTimeFormat('en-GB', {
    dateStyle: 'medium',
    timeStyle: 'short',
    timeZone: 'UTC',
  }).format(new Date(iso)) + ' UTC';

function ValueWithU({ value, u }: { value: number; u: number }) {
  return (
    <span className="font-mono">
      {fmt(value)} ± {fmt(u)} <span className="text-ink-500">mN/m</span>
    </span>
  );
}

function ResultCard({ outcome }: { outcome: MethodOutcome }) {
  const title =
    outcome.method === 'neumann'
      ? `${outcome.label} — ${outcome.liquidsUsed.join(', ')}`
      : outcome.label;
  return (
    <article
      className="rounded-md border border-ink-200 p-4"
      data-testid={`result-${outcome.method}`}
      aria-label={title}
    >
      <h3 className="text-sm font-semibold text-ink-900">{title}</h3>
      {outcome.status === 'ok' ? (
        <>
          <dl className="mt-2 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-2">
            {Object.entries(outcome.components).map(([key, c]) => (
              <div key={key} className="flex justify-between gap-2">
                <dt className="text-ink-600">{COMPONENT_LABELS[key] ?? key}</dt>
                <dd data-testid={`${outcome.method}-${key}`}>
                  <ValueWithU value={c.value} u={c.standardUncertainty} />
                </dd>
              </div>
            ))}
          </dl>
          <p className="mt-2 text-xs text-ink-600">
            Liquids used: {outcome.liquidsUsed.join(', ')}
          </p>
          {outcome.warnings.length > 0 ? (
            <ul className="mt-2 list-disc pl-5 text-xs text-amber-900">
              {outcome.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
        </>
      ) : (
        <p className="mt-2 text-sm text-ink-700">
          {outcome.status === 'unavailable' ? 'Not available: ' : 'Could not be computed: '}
          {outcome.reason}
        </p>
      )}
    </article>
  );
}

function SpecVerdict({
  subject,
  outputs,
}: {
  subject: Serialized<SubjectSummary>;
  outputs: SurfaceEnergyOutputs;
}) {
  if (subject.surfaceEnergySpecs.length === 0) return null;
  const headline = headlineTotal(outputs);
  return (
    <section className="card" aria-label="Spec check">
      <h2 className="mb-2">Spec check — {subject.coatingCode}</h2>
      {subject.surfaceEnergySpecs.map((spec) => {
        const limits = [
          spec.min !== null ? `≥ ${spec.min}` : null,
          spec.max !== null ? `≤ ${spec.max}` : null,
        ]
          .filter(Boolean)
          .join(' and ');
        if (!headline?.components.gammaTotal) {
          return (
            <p key={spec.id} className="text-sm text-ink-700">
              Surface free energy {limits} mN/m: no total to compare yet (choose OWRK, Wu or
              acid–base with enough liquids).
            </p>
          );
        }
        const total = headline.components.gammaTotal;
        const meets =
          (spec.min === null || total.value >= spec.min) &&
          (spec.max === null || total.value <= spec.max);
        const nearLimit =
          meets &&
          [spec.min, spec.max].some(
            (l) => l !== null && Math.abs(total.value - l) < 2 * total.standardUncertainty,
          );
        return (
          <p
            key={spec.id}
            data-testid="spec-verdict"
            className={`rounded-md px-3 py-2 text-sm ${meets ? 'bg-leaf-50 text-leaf-900' : 'bg-coral-50 text-coral-900'}`}
          >
            <strong>{meets ? 'Meets' : 'Does not meet'}</strong> the spec surface free energy{' '}
            {limits} mN/m: {headline.label} total {fmt(total.value)} ±{' '}
            {fmt(total.standardUncertainty)} mN/m.
            {nearLimit
              ? ' The limit lies within two standard uncertainties of the result; confirm with more drops.'
              : ''}
            {spec.maxDaysSinceTreatment !== null ? (
              <span className="mt-1 block text-xs" data-testid="spec-window">
                The spec counts only drops measured within {spec.maxDaysSinceTreatment} days of
                treatment; this page uses every drop shown above, the compare page applies the
                window.
              </span>
            ) : null}
          </p>
        );
      })}
      <p className="mt-2 text-xs text-ink-600">
        Results that release product for safety-relevant uses (medical, food contact, structural
        bonding) must follow the lab’s validated procedure and applicable standards, with qualified
        sign-off; this check supports that procedure and does not replace it.
      </p>
    </section>
  );
}

export function SurfaceEnergyWorkspace({
  subject,
  angleTable,
  liquids,
  availability,
  initialOutputs,
  initialSaved,
  canSave,
  readAll,
}: {
  subject: Serialized<SubjectSummary>;
  angleTable: AngleTableRow[];
  liquids: LiquidAngle[];
  availability: MethodAvailability[];
  initialOutputs: SurfaceEnergyOutputs | null;
  initialSaved: SavedResult[];
  canSave: boolean;
  readAll: boolean;
}) {
  const [methods, setMethods] = useState<SurfaceEnergyMethod[]>(['owrk']);
  const [basis, setBasis] = useState<UncertaintyBasis>('mean');
  const [outputs, setOutputs] = useState<SurfaceEnergyOutputs | null>(initialOutputs);
  const [computing, setComputing] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState<SavedResult[]>(initialSaved);
  const [saving, setSaving] = useState(false);
  const [saveMessage, setSaveMessage] = useState<{ ok: boolean; text: string } | null>(null);

  const kind = subject.kind;
  const subjectName =
    kind === 'batch'
      ? `${subject.coatingCode} / ${subject.lotCode} (all samples)`
      : `${subject.coatingCode} / ${subject.lotCode} / ${subject.sampleLabel ?? ''}`;
  const hazards = angleTable.filter((row) => row.hazardNote && /harmful/i.test(row.hazardNote));

  async function recompute(nextMethods: SurfaceEnergyMethod[], nextBasis: UncertaintyBasis) {
    setMethods(nextMethods);
    setBasis(nextBasis);
    setSaveMessage(null);
    if (nextMethods.length === 0) {
      setError('Choose at least one method.');
      return;
    }
    setComputing(true);
    setError(null);
    try {
      const response = await apiFetch<{ outputs: SurfaceEnergyOutputs }>(
        '/api/surface-energy/calculate',
        {
          method: 'POST',
          json: { liquids, methods: nextMethods, uncertaintyBasis: nextBasis },
        },
      );
      setOutputs(response.outputs);
    } catch (e) {
      setError(
        e instanceof ApiError
          ? e.message
          : 'The calculation did not answer. Check your connection and try again.',
      );
    } finally {
      setComputing(false);
    }
  }

  async function save() {
    setSaving(true);
    setSaveMessage(null);
    try {
      const response = await apiFetch<{ result: SavedResult }>(
        `/api/${kind === 'batch' ? 'batches' : 'samples'}/${encodeURIComponent(subject.id)}/surface-energy`,
        { method: 'POST', json: { methods, uncertaintyBasis: basis } },
      );
      setSaved((list) => [response.result, ...list]);
      setSaveMessage({ ok: true, text: `Saved with the ${kind}.` });
    } catch (e) {
      setSaveMessage({
        ok: false,
        text: e instanceof ApiError ? e.message : 'Saving failed. Try again.',
      });
    } finally {
      setSaving(false);
    }
  }

  if (angleTable.length === 0) {
    return (
      <section className="card border-dashed text-center" aria-label="No angles">
        <h2 className="text-base">No contact angles on {subjectName} yet</h2>
        <p className="mx-auto mt-1 max-w-prose text-sm text-ink-600">
          {readAll
            ? `Measure at least two probe liquids on this ${kind} (for example water and diiodomethane) to compute its surface free energy.`
            : `No approved results on this ${kind} yet. Surface free energy is shown once its results are approved.`}
        </p>
      </section>
    );
  }

  const sources = [
    ...new Set(
      angleTable
        .flatMap((row) => [row.sources.total, row.sources.lifshitzVanDerWaals])
        .filter(Boolean),
    ),
  ];

  return (
    <div className="grid gap-6">
      <section className="card" aria-label="Liquids measured">
        <h2 className="mb-1">Liquids measured on {subjectName}</h2>
        <p className="mb-3 text-xs text-ink-600">
          Mean of each drop’s latest analysis{readAll ? '' : ' (approved results only)'}
          {kind === 'batch' ? ', pooled over every sample of the batch' : ''}; components in mN/m.
        </p>
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead className="text-xs text-ink-500">
              <tr>
                <th scope="col" className="py-1 pr-3">
                  Liquid
                </th>
                <th scope="col" className="py-1 pr-3">
                  Mean angle ± SD
                </th>
                <th scope="col" className="py-1 pr-3">
                  n
                </th>
                <th scope="col" className="py-1 pr-3">
                  γL
                </th>
                <th scope="col" className="py-1 pr-3">
                  γd / γp
                </th>
                <th scope="col" className="py-1 pr-3">
                  γLW / γ+ / γ−
                </th>
                <th scope="col" className="py-1 pr-3">
                  Values from
                </th>
              </tr>
            </thead>
            <tbody>
              {angleTable.map((row) => (
                <tr
                  key={row.probeLiquidId}
                  className="border-t border-ink-100"
                  data-testid={`liquid-${row.probeLiquidId}`}
                >
                  <th scope="row" className="py-2 pr-3 font-medium">
                    {row.name}
                  </th>
                  <td className="py-2 pr-3 font-mono">
                    {fmt(row.meanDeg)}° ±{' '}
                    {row.sdDeg === null ? '— (one drop)' : `${fmt(row.sdDeg)}°`}
                  </td>
                  <td className="py-2 pr-3 font-mono">{row.n}</td>
                  <td className="py-2 pr-3 font-mono">{fmt(row.gammaTotal)}</td>
                  <td className="py-2 pr-3 font-mono">
                    {row.gammaDispersive === null
                      ? 'not given'
                      : `${fmt(row.gammaDispersive)} / ${fmt(row.gammaPolar)}`}
                  </td>
                  <td className="py-2 pr-3 font-mono">
                    {row.gammaLW === null
                      ? 'not given'
                      : `${fmt(row.gammaLW)} / ${fmt(row.gammaPlus, 2)} / ${fmt(row.gammaMinus)}`}
                  </td>
                  <td className="py-2 pr-3 text-xs text-ink-600">
                    {row.builtIn ? 'Built-in library' : 'Lab’s own values'}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {sources.length > 0 ? (
          <p className="mt-2 text-xs text-ink-600">Sources: {sources.join(' · ')}</p>
        ) : null}
        {hazards.length > 0 ? (
          <div
            role="note"
            className="mt-3 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900"
            data-testid="hazard-notes"
          >
            {hazards.map((row) => (
              <p key={row.probeLiquidId}>
                <strong>{row.name}:</strong> {row.hazardNote}
              </p>
            ))}
          </div>
        ) : null}
      </section>

      <section className="card" aria-label="Methods">
        <h2 className="mb-2">Methods</h2>
        <fieldset>
          <legend className="sr-only">Surface-energy methods</legend>
          <ul className="grid gap-2 sm:grid-cols-2">
            {SURFACE_ENERGY_METHOD_KEYS.map((method) => {
              const check = availability.find((a) => a.method === method);
              const id = `se-method-${method}`;
              return (
                <li key={method}>
                  <label htmlFor={id} className="flex items-start gap-2 text-sm">
                    <input
                      id={id}
                      type="checkbox"
                      className="mt-1"
                      checked={methods.includes(method)}
                      disabled={!check?.available || computing}
                      aria-describedby={check?.available ? undefined : `${id}-why`}
                      onChange={(event) =>
                        void recompute(
                          event.target.checked
                            ? [...methods, method]
                            : methods.filter((m) => m !== method),
                          basis,
                        )
                      }
                    />
                    <span>
                      <span className={check?.available ? 'text-ink-900' : 'text-ink-500'}>
                        {METHOD_LABELS[method]}
                      </span>
                      {check?.available ? null : (
                        <span id={`${id}-why`} className="block text-xs text-ink-600">
                          {check?.reason}
                        </span>
                      )}
                    </span>
                  </label>
                </li>
              );
            })}
          </ul>
        </fieldset>
        <div className="mt-3 max-w-sm">
          <label htmlFor="se-basis" className="field-label">
            Uncertainty of
          </label>
          <select
            id="se-basis"
            className="field-input"
            value={basis}
            disabled={computing}
            onChange={(event) => void recompute(methods, event.target.value as UncertaintyBasis)}
          >
            <option value="mean">the {kind}’s value (standard error of each mean angle)</option>
            <option value="single">single drops (SD of the angles)</option>
          </select>
        </div>
        {error ? (
          <p role="alert" className="field-error">
            {error}
          </p>
        ) : null}
        {computing ? (
          <p className="mt-2 text-sm text-ink-600" aria-live="polite">
            Computing…
          </p>
        ) : null}
      </section>

      {outputs ? (
        <>
          <section className="card" aria-label="Results" data-testid="surface-energy-results">
            <h2 className="mb-1">Results</h2>
            <p className="mb-3 text-xs text-ink-600">
              ± is one standard uncertainty. {outputs.uncertainty.note}
            </p>
            <div className="grid gap-3">
              {outputs.results.map((outcome, i) => (
                <ResultCard key={`${outcome.method}-${i}`} outcome={outcome} />
              ))}
            </div>
            {canSave ? (
              <div className="mt-4 flex flex-wrap items-center gap-3">
                <button
                  type="button"
                  className="btn-primary"
                  onClick={() => void save()}
                  disabled={saving || computing}
                >
                  {saving ? 'Saving…' : `Save with the ${kind}`}
                </button>
                {saveMessage ? (
                  <p
                    role={saveMessage.ok ? 'status' : 'alert'}
                    className={`text-sm ${saveMessage.ok ? 'text-leaf-700' : 'text-coral-700'}`}
                  >
                    {saveMessage.text}
                  </p>
                ) : null}
              </div>
            ) : null}
          </section>

          <SpecVerdict subject={subject} outputs={outputs} />

          <div className="grid gap-6 lg:grid-cols-2">
            <section className="card" aria-label="OWRK regression">
              <h2 className="mb-2">OWRK regression</h2>
              {outputs.owrkPlot ? (
                <OwrkChart plot={outputs.owrkPlot} />
              ) : (
                <p className="text-sm text-ink-600">
                  No regression: OWRK needs two liquids of different polarity on this {kind}.
                </p>
              )}
            </section>
            <section className="card" aria-label="Wetting envelope">
              <h2 className="mb-2">Wetting envelope</h2>
              {outputs.envelope ? (
                <EnvelopeChart envelope={outputs.envelope} />
              ) : (
                <p className="text-sm text-ink-600">
                  No envelope: it is drawn from the OWRK components, which are not available here.
                </p>
              )}
            </section>
          </div>
        </>
      ) : null}

      <section className="card" aria-label="Saved results" data-testid="saved-results">
        <h2 className="mb-2">Saved results</h2>
        {saved.length === 0 ? (
          <p className="text-sm text-ink-600">No surface energy saved with this {kind} yet.</p>
        ) : (
          <ul className="divide-y divide-ink-100 text-sm">
            {saved.map((result) => {
              const head = headlineTotal(result.outputs);
              return (
                <li key={result.id} className="py-2" data-testid="saved-result">
                  <span className="font-medium">{dateTime(result.createdAt)}</span>
                  {result.createdByName ? (
                    <span className="text-ink-600"> · {result.createdByName}</span>
                  ) : null}
                  <span className="text-ink-600">
                    {' '}
                    · {result.inputs.options.methods.map((m) => METHOD_LABELS[m]).join(', ')}
                  </span>
                  {head?.components.gammaTotal ? (
                    <span className="block font-mono">
                      {head.label}: {fmt(head.components.gammaTotal.value)} ±{' '}
                      {fmt(head.components.gammaTotal.standardUncertainty)} mN/m
                    </span>
                  ) : null}
                  <span className="block text-xs text-ink-600">
                    From{' '}
                    {result.inputs.liquids
                      .map((l) => `${l.name} ${fmt(l.meanDeg)}° (n = ${l.n})`)
                      .join(', ')}
                  </span>
                </li>
              );
            })}
          </ul>
        )}
      </section>
    </div>
  );
}
