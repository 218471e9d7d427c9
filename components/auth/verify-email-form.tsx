'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { verifyEmailAction } from '@/app/(auth)/account-actions';
import { FormMessages } from './action-form';
import { initialFormState } from './form-state';

export function VerifyEmailForm({ token }: { token: string }) {
  const [state, formAction, pending] = useActionState(verifyEmailAction, initialFormState);
  if (state.notice) {
    return (
      <div className="space-y-4">
        <FormMessages state={state} />
        <Link href="/dashboard" className="btn-primary w-full">
          Go to the dashboard
        </Link>
      </div>
    );
  }
  return (
    <form action={formAction} className="space-y-4">
      <FormMessages state={state} />
      <input type="hidden" name="token" value={token} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Confirming…' : 'Confirm my e-mail address'}
      </button>
    </form>
  );
}
