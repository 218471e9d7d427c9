'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { TextAreaField, TextField, useFieldState } from '@/components/ui/fields';
import { reviewDecisionResponseSchema } from '@/lib/contracts/reviews';

type Decision = 'approve' | 'reject';

/** Approve (signed with the reviewer's password) or reject with a comment. */
export function ReviewDecisionForm({ reviewId }: { reviewId: string }) {
  const router = useRouter();
  const [comment, , commentField] = useFieldState('');
  const [password, setPassword, passwordField] = useFieldState('');
  const [deciding, setDeciding] = useState<Decision | null>(null);
  const decision = useMutation({ fields: ['comment', 'password'] });

  async function decide(choice: Decision) {
    setDeciding(choice);
    const result = await decision.run(`/api/reviews/${reviewId}/decision`, {
      method: 'POST',
      json: { decision: choice, comment, password },
      schema: reviewDecisionResponseSchema,
    });
    setDeciding(null);
    if (!result.ok) return;
    setPassword('');
    router.refresh();
  }

  return (
    <form className="space-y-3" onSubmit={(e) => e.preventDefault()}>
      <TextAreaField
        id="decision-comment"
        label={
          <>
            Comment <span className="font-normal text-ink-500">(required to reject)</span>
          </>
        }
        {...commentField}
        error={decision.fieldErrors.comment}
      />
      <TextField
        id="decision-password"
        type="password"
        autoComplete="current-password"
        label={
          <>
            Your password{' '}
            <span className="font-normal text-ink-500">(your signature, to approve)</span>
          </>
        }
        {...passwordField}
        error={decision.fieldErrors.password}
      />
      <p className="text-xs text-ink-600">
        Approving signs these results with your name. Results that release product for
        safety-relevant uses (medical, food contact, structural bonding) must also follow your
        lab&apos;s validated procedure and the applicable standards.
      </p>
      <div className="flex gap-2">
        <button
          type="button"
          className="btn-primary"
          disabled={deciding !== null}
          onClick={() => decide('approve')}
        >
          {deciding === 'approve' ? 'Signing…' : 'Approve and sign'}
        </button>
        <button
          type="button"
          className="btn-quiet"
          disabled={deciding !== null}
          onClick={() => decide('reject')}
        >
          {deciding === 'reject' ? 'Rejecting…' : 'Reject'}
        </button>
      </div>
      {decision.message ? (
        <p role="alert" className="text-sm text-coral-700">
          {decision.message}
        </p>
      ) : null}
    </form>
  );
}
