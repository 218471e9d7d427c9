'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { apiFetch } from '@/components/measure/api';

type BatchChoice = { id: string; lotCode: string; coatingCode: string };

/** Analysts submit a batch's new or rejected results for review. */
export function SubmitForReviewForm({ batches }: { batches: BatchChoice[] }) {
  const router = useRouter();
  const [batchId, setBatchId] = useState('');
  const [note, setNote] = useState('');
  const [pending, setPending] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  if (batches.length === 0) {
    return <p className="text-sm text-ink-600">No batch has measured results yet.</p>;
  }
  return (
    <form
      className="space-y-3"
      onSubmit={async (event) => {
        event.preventDefault();
        if (!batchId) return setMessage({ ok: false, text: 'Choose the batch whose results you submit.' });
        setPending(true);
        setMessage(null);
        try {
          const result = await apiFetch<{ reviewId: string; analysisCount: number }>('/api/reviews', {
            method: 'POST',
            json: { batchId, note },
          });
          setMessage({ ok: true, text: `Submitted ${result.analysisCount} result${result.analysisCount === 1 ? '' : 's'} for review.` });
          setNote('');
          router.refresh();
        } catch (error) {
          setMessage({ ok: false, text: error instanceof Error ? error.message : 'Submitting failed.' });
        } finally {
          setPending(false);
        }
      }}
    >
      <div>
        <label htmlFor="review-batch" className="field-label">
          Batch
        </label>
        <select id="review-batch" className="field-input" value={batchId} onChange={(e) => setBatchId(e.target.value)}>
          <option value="">Choose a batch…</option>
          {batches.map((b) => (
            <option key={b.id} value={b.id}>
              {b.coatingCode} · {b.lotCode}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="review-note" className="field-label">
          Note for the reviewer <span className="font-normal text-ink-500">(optional)</span>
        </label>
        <textarea id="review-note" className="field-input" rows={2} value={note} onChange={(e) => setNote(e.target.value)} />
      </div>
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Submitting…' : 'Submit for review'}
      </button>
      {message ? (
        <p role="status" className={`text-sm ${message.ok ? 'text-leaf-700' : 'text-coral-700'}`}>
          {message.text}
        </p>
      ) : null}
    </form>
  );
}
