import { z } from 'zod';
import { ROLES } from '@/lib/auth/permissions';
import { emailSchema, passwordSchema } from './auth';

export const roleSchema = z.enum(ROLES, {
  message: 'Choose a role: admin, analyst, reviewer or viewer.',
});

export const invitationRequestSchema = z.object({
  email: emailSchema,
  role: roleSchema,
});

export const roleChangeSchema = z.object({ role: roleSchema });

const tokenSchema = z
  .string()
  .trim()
  .min(1, 'The link is missing its token; open the whole link from the mail.');

/** A signed-out person without an account accepts: their name and a password (sign-up rules). */
export const acceptInvitationSchema = z.object({
  token: tokenSchema,
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
  password: passwordSchema,
});

export const forgotPasswordSchema = z.object({ email: emailSchema });

export const resetPasswordSchema = z.object({
  token: tokenSchema,
  password: passwordSchema,
});

export const tokenOnlySchema = z.object({ token: tokenSchema });

export const organizationNameSchema = z.object({
  name: z
    .string()
    .trim()
    .min(2, 'Use at least 2 characters for the organization name.')
    .max(120, 'Use at most 120 characters.'),
});

export const switchOrganizationSchema = z.object({
  organizationId: z.string().min(1, 'Choose an organization.'),
});

/** Server actions that name a record of the team page by a hidden field. */
export const invitationIdSchema = z.object({ invitationId: z.string().default('') });
export const memberRoleChangeSchema = roleChangeSchema.extend({ userId: z.string().default('') });
export const memberIdSchema = z.object({ userId: z.string().default('') });

// Responses ------------------------------------------------------------------------------------

export const INVITATION_STATUSES = ['pending', 'accepted', 'revoked', 'expired'] as const;
export type InvitationStatus = (typeof INVITATION_STATUSES)[number];

export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  expiresAt: z.coerce.date(),
});
export const invitationResponseSchema = z.object({ invitation: invitationSchema });

export const openInvitationSchema = invitationSchema.extend({
  createdAt: z.coerce.date(),
  invitedBy: z.string().nullable(),
  status: z.enum(INVITATION_STATUSES),
});
export type OpenInvitation = z.output<typeof openInvitationSchema>;
export const invitationListResponseSchema = z.object({
  invitations: z.array(openInvitationSchema),
});

export const memberSchema = z.object({
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  joinedAt: z.coerce.date(),
});
export type Member = z.output<typeof memberSchema>;
export const memberListResponseSchema = z.object({ members: z.array(memberSchema) });
export const memberRoleResponseSchema = z.object({
  member: z.object({ userId: z.string(), role: roleSchema }),
});

export const organizationResponseSchema = z.object({
  organization: z.object({ id: z.string(), name: z.string() }),
});

export const membershipSummarySchema = z.object({
  organizationId: z.string(),
  organizationName: z.string(),
  role: roleSchema,
});
export type MembershipSummary = z.output<typeof membershipSummarySchema>;

/** GET /api/me */
export const meResponseSchema = z.object({
  user: z.object({ id: z.string(), email: z.string(), name: z.string() }),
  organization: z.object({ id: z.string(), name: z.string(), role: roleSchema }),
  memberships: z.array(membershipSummarySchema),
});
