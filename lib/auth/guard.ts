import 'server-only';
import { forbidden, redirect } from 'next/navigation';
import { forbidden as forbiddenError, unauthorized } from '@/lib/app-error';
import { getAuthContext, type AuthContext, type OrgContext } from './context';
import { can, type Action } from './permissions';

/*
 * The authorization decisions. Pages call requirePage; route handlers and server actions go
 * through the wrappers in server/http, which call requireApi / requireSignedIn.
 */

/** Pages: signed out → sign-in page; signed in without the permission → the 403 page. */
export async function requirePage(action: Action): Promise<OrgContext> {
  const ctx = await getAuthContext();
  if (!ctx) redirect('/sign-in');
  if (!ctx.organization) redirect('/sign-in?reason=no-organization');
  if (!can(ctx.organization.role, action)) forbidden();
  return ctx as OrgContext;
}

/** Route handlers and server actions: the same decision, as an AppError. */
export async function requireApi(action: Action, what?: string): Promise<OrgContext> {
  const ctx = await getAuthContext();
  if (!ctx) throw unauthorized();
  if (!ctx.organization) throw forbiddenError('work in an organization you are not a member of');
  if (!can(ctx.organization.role, action)) throw forbiddenError(what);
  return ctx as OrgContext;
}

/** Signed in, in an organization or not (switching organization, signing out). */
export async function requireSignedIn(): Promise<AuthContext> {
  const ctx = await getAuthContext();
  if (!ctx) throw unauthorized();
  return ctx;
}
