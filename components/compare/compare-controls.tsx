'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { compareSearch } from '@/lib/compare/query';
import { SelectField } from '@/components/ui/fields';

type Option = { id: string; code: string; name: string };
type BatchOption = { id: string; lotCode: string; producedOn: string };

/**
 * The comparison's choices. Every choice lives in the URL, so a comparison can be shared;
 * without JavaScript the form still works as a plain GET form.
 */
export function CompareControls({
  coatings,
  coatingCode,
  batches,
  chosen,
  reference,
}: {
  coatings: Option[];
  coatingCode: string | null;
  /** The coating's batches, newest first. */
  batches: BatchOption[];
  /** Lot codes compared now. */
  chosen: string[];
  reference: string | null;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [selected, setSelected] = useState<string[]>(chosen);
  const [ref, setRef] = useState<string>(reference ?? '');
  const [error, setError] = useState<string | null>(null);

  const go = (search: string) => startTransition(() => router.push(`/compare${search}`));

  const toggle = (lot: string, on: boolean) => {
    setError(null);
    setSelected((s) => (on ? [...s, lot] : s.filter((x) => x !== lot)));
  };

  return (
    <form
      method="get"
      action="/compare"
      className="card mb-6 grid gap-4 print:hidden lg:grid-cols-[16rem_1fr_14rem_auto] lg:items-start"
      aria-label="What to compare"
      onSubmit={(event) => {
        event.preventDefault();
        if (!coatingCode) {
          setError('Choose a coating first.');
          return;
        }
        if (selected.length === 0) {
          setError('Tick at least one batch, or use "Newest 12" to compare the latest batches.');
          return;
        }
        const order = batches.map((b) => b.lotCode).filter((l) => selected.includes(l));
        go(compareSearch({ coating: coatingCode, batches: order, ref: ref || null }));
      }}
    >
      <SelectField
        id="compare-coating"
        name="coating"
        label="Coating"
        placeholder="Choose a coating…"
        options={coatings.map((c) => ({ value: c.code, label: `${c.code} — ${c.name}` }))}
        value={coatingCode ?? ''}
        onChange={(event) => {
          const code = event.target.value;
          setSelected([]);
          setRef('');
          setError(null);
          go(compareSearch({ coating: code || null, batches: [], ref: null }));
        }}
      />

      <fieldset disabled={!coatingCode} aria-describedby={error ? 'compare-error' : undefined}>
        <legend className="field-label">Batches</legend>
        {batches.length === 0 ? (
          <p className="mt-1 text-sm text-ink-600">
            {coatingCode
              ? 'This coating has no batches yet.'
              : 'Choose a coating to list its batches.'}
          </p>
        ) : (
          <div className="mt-1 flex max-h-40 flex-wrap gap-x-4 gap-y-1 overflow-y-auto">
            {batches.map((b) => (
              <label key={b.id} className="inline-flex items-center gap-1.5 text-sm text-ink-800">
                <input
                  type="checkbox"
                  name="batches"
                  value={b.lotCode}
                  checked={selected.includes(b.lotCode)}
                  onChange={(event) => toggle(b.lotCode, event.target.checked)}
                  className="h-4 w-4 accent-lagoon-700"
                />
                <span className="font-mono">{b.lotCode}</span>
                <span className="text-xs text-ink-500">{b.producedOn}</span>
              </label>
            ))}
          </div>
        )}
        {batches.length > 0 ? (
          <div className="mt-2 flex gap-2 text-xs">
            <button
              type="button"
              className="text-lagoon-700 underline"
              onClick={() => setSelected(batches.map((b) => b.lotCode))}
            >
              All
            </button>
            <button
              type="button"
              className="text-lagoon-700 underline"
              onClick={() => setSelected(batches.slice(0, 12).map((b) => b.lotCode))}
            >
              Newest 12
            </button>
            <button
              type="button"
              className="text-lagoon-700 underline"
              onClick={() => setSelected([])}
            >
              None
            </button>
          </div>
        ) : null}
      </fieldset>

      <SelectField
        id="compare-ref"
        name="ref"
        label={
          <>
            Reference batch <span className="font-normal text-ink-500">(optional)</span>
          </>
        }
        hint="E.g. the last good batch; every other batch is tested against it."
        placeholder="None"
        options={batches
          .filter((b) => selected.includes(b.lotCode))
          .map((b) => ({ value: b.lotCode, label: b.lotCode }))}
        value={ref}
        disabled={!coatingCode}
        onChange={(event) => setRef(event.target.value)}
      />

      <div className="lg:pt-6">
        <button type="submit" className="btn-primary w-full" disabled={pending || !coatingCode}>
          {pending ? 'Comparing…' : 'Compare'}
        </button>
      </div>
      {error ? (
        <p id="compare-error" role="alert" className="field-error lg:col-span-4">
          {error}
        </p>
      ) : null}
    </form>
  );
}
