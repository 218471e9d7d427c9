import type { Metadata } from 'next';
import Link from 'next/link';
import {
  AcceptAsMemberForm,
  AcceptWithNewAccountForm,
} from '@/components/auth/accept-invitation-forms';
import { getAuthContext } from '@/lib/auth/context';
import { ROLE_LABELS } from '@/lib/auth/permissions';
import { loadInvitationPage } from '@/server/team/accept-invitation';

export const metadata: Metadata = { title: 'Accept invitation' };

const linkClass = 'font-medium text-lagoon-700 underline-offset-2 hover:underline';

export default async function AcceptInvitationPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string }>;
}) {
  const { token = '' } = await searchParams;
  const ctx = await getAuthContext();
  const { invitation, problem, accountExists } = await loadInvitationPage(token, ctx !== null);
  if (!invitation) {
    return (
      <>
        <h1 className="mb-1">Invitation</h1>
        <p
          role="alert"
          className="mt-4 rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900"
        >
          {problem}
        </p>
        <p className="mt-6 text-sm">
          <Link href="/sign-in" className={linkClass}>
            Go to sign-in
          </Link>
        </p>
      </>
    );
  }
  const role = ROLE_LABELS[invitation.role];
  const here = `/invitations/accept?token=${encodeURIComponent(token)}`;
  const intro = (
    <p className="mb-6 text-sm text-ink-600">
      You are invited to join{' '}
      <strong className="text-ink-900">{invitation.organizationName}</strong> as{' '}
      <strong className="text-ink-900">{role.name}</strong> ({role.summary}).
    </p>
  );

  if (ctx) {
    if (ctx.user.email !== invitation.email) {
      return (
        <>
          <h1 className="mb-1">Join {invitation.organizationName}</h1>
          {intro}
          <p
            role="alert"
            className="rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900"
          >
            This invitation is for {invitation.email}, but you are signed in as {ctx.user.email}.
            Sign out, then open the link from the mail again and sign in (or create the account) as{' '}
            {invitation.email}.
          </p>
        </>
      );
    }
    return (
      <>
        <h1 className="mb-1">Join {invitation.organizationName}</h1>
        {intro}
        <AcceptAsMemberForm token={token} organizationName={invitation.organizationName} />
      </>
    );
  }

  if (accountExists) {
    return (
      <>
        <h1 className="mb-1">Join {invitation.organizationName}</h1>
        {intro}
        <p className="mb-4 text-sm text-ink-700">
          {invitation.email} already has a Beadline account. Sign in with it to accept.
        </p>
        <Link href={`/sign-in?next=${encodeURIComponent(here)}`} className="btn-primary w-full">
          Sign in to accept
        </Link>
      </>
    );
  }
  return (
    <>
      <h1 className="mb-1">Join {invitation.organizationName}</h1>
      {intro}
      <AcceptWithNewAccountForm token={token} email={invitation.email} />
    </>
  );
}
