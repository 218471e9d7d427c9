'use server';

import { sendEmailVerification } from '@/db/queries/account-tokens';
import { runAction } from '@/lib/auth/guard';
import type { FormState } from '@/components/auth/form-state';

/** The dashboard banner's "Send the mail again". */
export async function resendVerificationAction(
  _previous: FormState,
  _formData: FormData,
): Promise<FormState> {
  const result = await runAction('organization:read', async (ctx) =>
    sendEmailVerification(ctx.user.id),
  );
  if (!result.ok) return { message: result.error.message, code: result.error.code };
  return {
    notice:
      result.data === 'already-verified'
        ? 'Your address is already confirmed.'
        : 'Sent. Check your inbox for the new link.',
  };
}
