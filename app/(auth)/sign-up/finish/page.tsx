import type { Metadata } from 'next';
import { FinishSignUpForm } from '@/components/auth/finish-sign-up-form';

export const metadata: Metadata = { title: 'Finish creating your account' };

/** The link in the sign-up mail lands here; finishing is a button, so mail scanners that open links do not use it up. */
export default async function FinishSignUpPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string }>;
}) {
  const { token = '' } = await searchParams;
  return (
    <>
      <h1 className="mb-1">Finish creating your account</h1>
      <p className="mb-6 text-sm text-ink-600">
        One click creates your account and your lab, with you as its admin, and signs you in.
      </p>
      <FinishSignUpForm token={token} />
    </>
  );
}
