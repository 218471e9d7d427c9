import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertMembership, insertOrganization } from '@/db/queries/organizations';
import { violatedUniqueConstraint } from '@/db/queries/records';
import { inTransaction } from '@/db/queries/transaction';
import { findUserByEmail, insertUser } from '@/db/queries/users';
import { AppError } from '@/lib/app-error';
import { hashPassword } from '@/lib/auth/password';
import { startSession } from '@/lib/auth/session';
import { sendEmailVerification } from './email-verification';

const emailTaken = () => {
  const message = 'An account with this e-mail address already exists. Sign in instead.';
  return new AppError('account_exists', message, { fields: { email: message } });
};

/**
 * Sign-up: the user, a new organization and the user's admin membership with the audit row, in
 * one transaction; then the session, and the confirmation mail queued (sign-up never waits on it
 * or fails for it).
 */
export async function signUp(input: {
  name: string;
  email: string;
  password: string;
  organizationName: string;
}): Promise<void> {
  const passwordHash = await hashPassword(input.password);
  const userId = newId();
  const organizationId = newId();
  try {
    await inTransaction(async (tx) => {
      if (await findUserByEmail(input.email, tx)) throw emailTaken();
      await insertUser(tx, { id: userId, email: input.email, name: input.name, passwordHash });
      await insertOrganization(tx, { id: organizationId, name: input.organizationName });
      await insertMembership(tx, { userId, organizationId, role: 'admin' });
      await recordAudit(tx, {
        actorUserId: userId,
        organizationId,
        action: 'organization.create',
        entityType: 'organization',
        entityId: organizationId,
        after: { name: input.organizationName, createdBy: input.email },
      });
    });
  } catch (error) {
    // Two sign-ups with one address at once: the unique index decides.
    if (violatedUniqueConstraint(error) === 'users_email_unique') throw emailTaken();
    throw error;
  }
  await startSession(userId, organizationId);
  await sendEmailVerification(userId).catch((error: unknown) =>
    console.error('[sign-up] could not queue the confirmation mail', error),
  );
}
