'use client';

import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { SelectField, type Choice } from '@/components/ui/fields';

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
    const map = new Map<string, Choice>();
    for (const c of choices)
      map.set(c.coatingId, { value: c.coatingId, label: `${c.coatingCode} — ${c.coatingName}` });
    return [...map.values()];
  }, [choices]);
  const batches = useMemo(() => {
    const map = new Map<string, Choice>();
    for (const c of choices)
      if (c.coatingId === coatingId) map.set(c.batchId, { value: c.batchId, label: c.lotCode });
    return [...map.values()];
  }, [choices, coatingId]);
  const samples = choices.filter((c) => c.batchId === batchId);

  return (
    <form
      className="card grid gap-4 sm:grid-cols-3"
      aria-label="Choose a sample"
      onSubmit={(event) => event.preventDefault()}
    >
      <SelectField
        id="se-coating"
        label="Coating"
        placeholder="Choose a coating…"
        options={coatings}
        value={coatingId}
        onChange={(event) => {
          setCoatingId(event.target.value);
          setBatchId('');
        }}
      />
      <SelectField
        id="se-batch"
        label="Batch"
        placeholder={coatingId ? 'Choose a batch…' : 'Choose a coating first'}
        options={batches}
        value={batchId}
        disabled={!coatingId}
        onChange={(event) => setBatchId(event.target.value)}
      />
      <SelectField
        id="se-sample"
        label="Sample"
        placeholder={batchId ? 'Choose a sample…' : 'Choose a batch first'}
        options={[
          ...(batchId ? [{ value: WHOLE_BATCH, label: 'All samples of the batch' }] : []),
          ...samples.map((s) => ({ value: s.sampleId, label: s.sampleLabel })),
        ]}
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
      />
    </form>
  );
}
