'use client';

import { finishSignUpAction } from '@/app/(auth)/actions';
import { ActionForm } from './action-form';

export function FinishSignUpForm({ token }: { token: string }) {
  return (
    <ActionForm
      action={finishSignUpAction}
      hidden={{ token }}
      submit="Finish creating my account"
      busy="Creating your lab…"
    />
  );
}
