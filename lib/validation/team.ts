import { z } from 'zod';
import { ROLES } from '@/lib/auth/permissions';
import { emailSchema, passwordSchema } from './auth';

export const roleSchema = z.enum(ROLES, {
  message: 'Choose a role: admin, analyst, reviewer or viewer.',
});

export const invitationSchema = z.object({
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
