import type { Metadata } from 'next';
import Link from 'next/link';
import { SignUpForm } from '@/components/auth/sign-up-form';

export const metadata: Metadata = { title: 'Create account' };

export default function SignUpPage() {
  return (
    <>
      <h1 className="mb-1">Create your lab</h1>
      <p className="mb-6 text-sm text-ink-600">
        An account and an organization for your lab, with you as its admin.
      </p>
      <SignUpForm />
      <p className="mt-6 text-sm text-ink-600">
        Already have an account?{' '}
        <Link href="/sign-in" className="font-medium text-lagoon-700 underline-offset-2 hover:underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
