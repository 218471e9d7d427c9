'use client';

import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';

export type SampleChoice = {
  sampleId: string;
  sampleLabel: string;
  batchId: string;
  lotCode: string;
  coatingId: string;
  coatingCode: string;
  coatingName: string;
};

const WHOLE_BATCH = '__batch__';

/**
 * Coating → batch → sample; choosing a sample opens /surface-energy?sample=<id>, choosing
 * "All samples of the batch" opens /surface-energy?batch=<id>.
 */
export function SamplePicker({
  choices,
  selectedSampleId,
  selectedBatchId,
}: {
  choices: SampleChoice[];
  selectedSampleId: string | null;
  /** Set when the whole batch is shown. */
  selectedBatchId: string | null;
}) {
  const router = useRouter();
  const selected =
    choices.find((c) => c.sampleId === selectedSampleId) ??
    choices.find((c) => c.batchId === selectedBatchId) ??
    null;
  const [coatingId, setCoatingId] = useState(selected?.coatingId ?? '');
  const [batchId, setBatchId] = useState(selected?.batchId ?? '');

  const coatings = useMemo(() => {
    const map = new Map<string, { id: string; label: string }>();
    for (const c of choices)
      map.set(c.coatingId, { id: c.coatingId, label: `${c.coatingCode} — ${c.coatingName}` });
    return [...map.values()];
  }, [choices]);
  const batches = useMemo(() => {
    const map = new Map<string, { id: string; label: string }>();
    for (const c of choices)
      if (c.coatingId === coatingId) map.set(c.batchId, { id: c.batchId, label: c.lotCode });
    return [...map.values()];
  }, [choices, coatingId]);
  const samples = choices.filter((c) => c.batchId === batchId);

  return (
    <form
      className="card grid gap-4 sm:grid-cols-3"
      aria-label="Choose a sample"
      onSubmit={(event) => event.preventDefault()}
    >
      <div>
        <label htmlFor="se-coating" className="field-label">
          Coating
        </label>
        <select
          id="se-coating"
          className="field-input"
          value={coatingId}
          onChange={(event) => {
            setCoatingId(event.target.value);
            setBatchId('');
          }}
        >
          <option value="">Choose a coating…</option>
          {coatings.map((c) => (
            <option key={c.id} value={c.id}>
              {c.label}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="se-batch" className="field-label">
          Batch
        </label>
        <select
          id="se-batch"
          className="field-input"
          value={batchId}
          disabled={!coatingId}
          onChange={(event) => setBatchId(event.target.value)}
        >
          <option value="">{coatingId ? 'Choose a batch…' : 'Choose a coating first'}</option>
          {batches.map((b) => (
            <option key={b.id} value={b.id}>
              {b.label}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="se-sample" className="field-label">
          Sample
        </label>
        <select
          id="se-sample"
          className="field-input"
          value={
            selected && selected.batchId === batchId
              ? selectedBatchId
                ? WHOLE_BATCH
                : selected.sampleId
              : ''
          }
          disabled={!batchId}
          onChange={(event) => {
            const value = event.target.value;
            if (value === WHOLE_BATCH)
              router.push(`/surface-energy?batch=${encodeURIComponent(batchId)}`);
            else if (value) router.push(`/surface-energy?sample=${encodeURIComponent(value)}`);
          }}
        >
          <option value="">{batchId ? 'Choose a sample…' : 'Choose a batch first'}</option>
          {batchId ? <option value={WHOLE_BATCH}>All samples of the batch</option> : null}
          {samples.map((s) => (
            <option key={s.sampleId} value={s.sampleId}>
              {s.sampleLabel}
            </option>
          ))}
        </select>
      </div>
    </form>
  );
}
