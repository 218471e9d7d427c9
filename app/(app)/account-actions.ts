'use server';

import { z } from 'zod';
import { sendEmailVerification } from '@/server/account/email-verification';
import { formAction } from '@/server/http/action';

/** The dashboard banner's "Send the mail again". */
export const resendVerificationAction = formAction({
  access: 'organization:read',
  input: z.object({}),
  async run(_input, { ctx }) {
    const outcome = await sendEmailVerification(ctx.user.id);
    return {
      notice:
        outcome === 'already-verified'
          ? 'Your address is already confirmed.'
          : 'Sent. Check your inbox for the new link.',
    };
  },
});
