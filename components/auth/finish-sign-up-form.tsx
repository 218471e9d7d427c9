'use client';

import { useActionState } from 'react';
import { finishSignUpAction } from '@/app/(auth)/actions';
import { FormMessages } from './form-messages';
import { initialFormState } from './form-state';

export function FinishSignUpForm({ token }: { token: string }) {
  const [state, formAction, pending] = useActionState(finishSignUpAction, initialFormState);
  return (
    <form action={formAction} className="space-y-4">
      <FormMessages state={state} />
      <input type="hidden" name="token" value={token} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? 'Creating your lab…' : 'Finish creating my account'}
      </button>
    </form>
  );
}
