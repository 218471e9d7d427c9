import type { Metadata } from 'next';
import { VerifyEmailForm } from '@/components/auth/verify-email-form';

export const metadata: Metadata = { title: 'Confirm your e-mail' };

/** The link in the verification mail lands here; confirming is a button, so mail scanners that open links do not use it up. */
export default async function VerifyEmailPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string }>;
}) {
  const { token = '' } = await searchParams;
  return (
    <>
      <h1 className="mb-1">Confirm your e-mail address</h1>
      <p className="mb-6 text-sm text-ink-600">One click confirms that this address is yours.</p>
      <VerifyEmailForm token={token} />
    </>
  );
}
