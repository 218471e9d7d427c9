'use client';

import { useActionState } from 'react';
import { resendVerificationAction } from '@/app/(app)/account-actions';
import { initialFormState } from '@/components/auth/form-state';

/** A quiet reminder until the user confirms their address; it never blocks anything. */
export function VerifyEmailBanner({ email }: { email: string }) {
  const [state, formAction, pending] = useActionState(resendVerificationAction, initialFormState);
  return (
    <section
      aria-label="Confirm your e-mail"
      className="mb-6 flex flex-col gap-2 rounded-md border border-ink-200 bg-white px-4 py-3 text-sm text-ink-700 sm:flex-row sm:items-center sm:justify-between"
    >
      <p>
        Confirm your e-mail address: we sent a link to{' '}
        <span className="font-medium text-ink-900">{email}</span>.
        {state.notice ? <span className="ml-1 text-leaf-700">{state.notice}</span> : null}
        {state.message ? <span className="ml-1 text-coral-700">{state.message}</span> : null}
      </p>
      <form action={formAction}>
        <button type="submit" className="btn-quiet whitespace-nowrap" disabled={pending}>
          {pending ? 'Sending…' : 'Send the mail again'}
        </button>
      </form>
    </section>
  );
}
