import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/auth/sign-in-form';
import { getAuthContext } from '@/lib/auth/context';
import { safeRedirectPath } from '@/lib/auth/redirect';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ next?: string; reason?: string }>;
}) {
  const { next, reason } = await searchParams;
  const ctx = await getAuthContext();
  if (ctx?.organization) redirect(safeRedirectPath(next));
  return (
    <>
      <h1 className="mb-1">Sign in</h1>
      <p className="mb-6 text-sm text-ink-600">Contact angles, batches and reviews of your lab.</p>
      {reason === 'no-organization' ? (
        <p className="mb-4 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900">
          Your account is not a member of any organization any more. Ask an admin to invite you.
        </p>
      ) : null}
      {reason === 'password-reset' ? (
        <p role="status" className="mb-4 rounded-md border border-leaf-100 bg-leaf-50 px-3 py-2 text-sm text-leaf-900">
          Your password was changed and every session was signed out. Sign in with the new password.
        </p>
      ) : null}
      <SignInForm next={next} />
      <p className="mt-4 text-sm">
        <Link href="/forgot-password" className="font-medium text-lagoon-700 underline-offset-2 hover:underline">
          Forgot password?
        </Link>
      </p>
      <p className="mt-2 text-sm text-ink-600">
        New lab?{' '}
        <Link href="/sign-up" className="font-medium text-lagoon-700 underline-offset-2 hover:underline">
          Create an account
        </Link>
      </p>
    </>
  );
}
