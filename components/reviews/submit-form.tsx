'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { SelectField, TextAreaField, useFieldState } from '@/components/ui/fields';
import { submitReviewResponseSchema } from '@/lib/contracts/reviews';

type BatchChoice = { id: string; lotCode: string; coatingCode: string };

/** Analysts submit a batch's new or rejected results for review. */
export function SubmitForReviewForm({ batches }: { batches: BatchChoice[] }) {
  const router = useRouter();
  const [batchId, , batchField] = useFieldState('');
  const [note, setNote, noteField] = useFieldState('');
  const [outcome, setOutcome] = useState<{ ok: boolean; text: string } | null>(null);
  const submitting = useMutation<{ reviewId: string; analysisCount: number }>({
    fields: ['batchId', 'note'],
  });
  if (batches.length === 0) {
    return <p className="text-sm text-ink-600">No batch has measured results yet.</p>;
  }
  const message = submitting.message ? { ok: false, text: submitting.message } : outcome;
  return (
    <form
      className="space-y-3"
      onSubmit={async (event) => {
        event.preventDefault();
        if (!batchId)
          return setOutcome({ ok: false, text: 'Choose the batch whose results you submit.' });
        setOutcome(null);
        const result = await submitting.run('/api/reviews', {
          method: 'POST',
          json: { batchId, note },
          schema: submitReviewResponseSchema,
        });
        if (!result.ok) return;
        const count = result.data.analysisCount;
        setOutcome({
          ok: true,
          text: `Submitted ${count} result${count === 1 ? '' : 's'} for review.`,
        });
        setNote('');
        router.refresh();
      }}
    >
      <SelectField
        id="review-batch"
        label="Batch"
        placeholder="Choose a batch…"
        options={batches.map((b) => ({ value: b.id, label: `${b.coatingCode} · ${b.lotCode}` }))}
        {...batchField}
        error={submitting.fieldErrors.batchId}
      />
      <TextAreaField
        id="review-note"
        label={
          <>
            Note for the reviewer <span className="font-normal text-ink-500">(optional)</span>
          </>
        }
        rows={2}
        {...noteField}
        error={submitting.fieldErrors.note}
      />
      <button type="submit" className="btn-primary" disabled={submitting.pending}>
        {submitting.pending ? 'Submitting…' : 'Submit for review'}
      </button>
      {message ? (
        <p role="status" className={`text-sm ${message.ok ? 'text-leaf-700' : 'text-coral-700'}`}>
          {message.text}
        </p>
      ) : null}
    </form>
  );
}
