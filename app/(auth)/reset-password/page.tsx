import type { Metadata } from 'next';
import Link from 'next/link';
import { ResetPasswordForm } from '@/components/auth/reset-password-form';
import { resetLinkProblem } from '@/server/account/password-reset';

export const metadata: Metadata = { title: 'Set a new password' };

export default async function ResetPasswordPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string }>;
}) {
  const { token = '' } = await searchParams;
  const problem = await resetLinkProblem(token);
  return (
    <>
      <h1 className="mb-1">Set a new password</h1>
      {problem === null ? (
        <>
          <p className="mb-6 text-sm text-ink-600">
            Choose a new password. You will be signed out everywhere and can then sign in with it.
          </p>
          <ResetPasswordForm token={token} />
        </>
      ) : (
        <>
          <p
            role="alert"
            className="mt-4 rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900"
          >
            {problem}
          </p>
          <p className="mt-6 text-sm">
            <Link
              href="/forgot-password"
              className="font-medium text-lagoon-700 underline-offset-2 hover:underline"
            >
              Ask for a new link
            </Link>
          </p>
        </>
      )}
    </>
  );
}
