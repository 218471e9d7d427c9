import type { Metadata } from 'next';
import Link from 'next/link';
import { ForgotPasswordForm } from '@/components/auth/forgot-password-form';

export const metadata: Metadata = { title: 'Forgot password' };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="mb-1">Forgot your password?</h1>
      <p className="mb-6 text-sm text-ink-600">
        Enter the e-mail address of your account and we will send you a link to set a new password.
      </p>
      <ForgotPasswordForm />
      <p className="mt-6 text-sm text-ink-600">
        Remembered it?{' '}
        <Link
          href="/sign-in"
          className="font-medium text-lagoon-700 underline-offset-2 hover:underline"
        >
          Sign in
        </Link>
      </p>
    </>
  );
}
