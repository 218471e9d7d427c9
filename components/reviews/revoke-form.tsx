'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { TextAreaField, useFieldState } from '@/components/ui/fields';
import { revokeReviewResponseSchema } from '@/lib/contracts/reviews';

/** Revokes a signed approval, with the reason that goes in the audit log and the mail. */
export function RevokeApprovalForm({ reviewId }: { reviewId: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [reason, , reasonField] = useFieldState('');
  const revocation = useMutation({ fields: ['reason'] });

  async function revoke() {
    const result = await revocation.run(`/api/reviews/${reviewId}/revocation`, {
      method: 'POST',
      json: { reason },
      schema: revokeReviewResponseSchema,
    });
    if (!result.ok) return;
    setOpen(false);
    router.refresh();
  }

  if (!open) {
    return (
      <button type="button" className="btn-quiet" onClick={() => setOpen(true)}>
        Revoke approval…
      </button>
    );
  }
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        void revoke();
      }}
    >
      <TextAreaField
        id="revoke-reason"
        label="Why is this approval withdrawn?"
        {...reasonField}
        error={revocation.fieldErrors.reason}
      />
      <p className="text-xs text-ink-600">
        The results go back to draft and need a new review; the submitter is told by mail and the
        reason is kept in the audit log.
      </p>
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={revocation.pending}>
          {revocation.pending ? 'Revoking…' : 'Revoke approval'}
        </button>
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
      {revocation.message ? (
        <p role="alert" className="text-sm text-coral-700">
          {revocation.message}
        </p>
      ) : null}
    </form>
  );
}
