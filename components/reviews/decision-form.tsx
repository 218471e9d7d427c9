'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { apiFetch, ApiError } from '@/components/measure/api';

/** Approve (signed with the reviewer's password) or reject with a comment. */
export function ReviewDecisionForm({ reviewId }: { reviewId: string }) {
  const router = useRouter();
  const [comment, setComment] = useState('');
  const [password, setPassword] = useState('');
  const [pending, setPending] = useState<'approve' | 'reject' | null>(null);
  const [error, setError] = useState<{ text: string; code?: string; fields?: Record<string, string> } | null>(null);

  async function decide(decision: 'approve' | 'reject') {
    setPending(decision);
    setError(null);
    try {
      await apiFetch(`/api/reviews/${reviewId}/decision`, { method: 'POST', json: { decision, comment, password } });
      setPassword('');
      router.refresh();
    } catch (caught) {
      setError({
        text: caught instanceof Error ? caught.message : 'The decision was not saved.',
        code: caught instanceof ApiError ? caught.body?.error.code : undefined,
        fields: caught instanceof ApiError ? caught.body?.error.fields : undefined,
      });
    } finally {
      setPending(null);
    }
  }

  return (
    <form className="space-y-3" onSubmit={(e) => e.preventDefault()}>
      <div>
        <label htmlFor="decision-comment" className="field-label">
          Comment <span className="font-normal text-ink-500">(required to reject)</span>
        </label>
        <textarea
          id="decision-comment"
          className="field-input"
          rows={3}
          value={comment}
          onChange={(e) => setComment(e.target.value)}
          aria-invalid={error?.fields?.comment ? true : undefined}
        />
        {error?.fields?.comment ? <p className="field-error">{error.fields.comment}</p> : null}
      </div>
      <div>
        <label htmlFor="decision-password" className="field-label">
          Your password <span className="font-normal text-ink-500">(your signature, to approve)</span>
        </label>
        <input
          id="decision-password"
          type="password"
          autoComplete="current-password"
          className="field-input"
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          aria-invalid={error?.fields?.password ? true : undefined}
        />
        {error?.fields?.password ? <p className="field-error">{error.fields.password}</p> : null}
      </div>
      <p className="text-xs text-ink-600">
        Approving signs these results with your name. Results that release product for safety-relevant uses
        (medical, food contact, structural bonding) must also follow your lab&apos;s validated procedure and the
        applicable standards.
      </p>
      <div className="flex gap-2">
        <button type="button" className="btn-primary" disabled={pending !== null} onClick={() => decide('approve')}>
          {pending === 'approve' ? 'Signing…' : 'Approve and sign'}
        </button>
        <button type="button" className="btn-quiet" disabled={pending !== null} onClick={() => decide('reject')}>
          {pending === 'reject' ? 'Rejecting…' : 'Reject'}
        </button>
      </div>
      {error && error.code !== 'invalid_input' ? (
        <p role="alert" className="text-sm text-coral-700">
          {error.text}
        </p>
      ) : null}
    </form>
  );
}
