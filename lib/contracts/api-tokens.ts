import { z } from 'zod';
import { API_TOKEN_SCOPES } from '@/lib/auth/permissions';
import { requiredNumber, requiredText } from './common';

export const apiTokenScopeSchema = z.enum(API_TOKEN_SCOPES, {
  message: 'Choose a scope: read, measure, or read and measure.',
});

/** The admin's form: a name to recognise the token by, its scope and how long it works. */
export const apiTokenCreateSchema = z.object({
  name: requiredText(80, 'Name the token after the instrument or system that uses it.'),
  scope: apiTokenScopeSchema,
  expiresInDays: requiredNumber({
    min: 1,
    max: 730,
    message: 'Enter how many days the token works: a whole number from 1 to 730.',
  }).pipe(z.number().int('Enter a whole number of days.')),
});
export type ApiTokenCreate = z.output<typeof apiTokenCreateSchema>;

export const apiTokenIdSchema = z.object({
  tokenId: z.string().trim().min(1, 'Choose a token.').max(64),
});

export const apiTokenSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  scope: apiTokenScopeSchema,
  prefix: z.string(),
  createdBy: z.string().nullable(),
  createdAt: z.coerce.date(),
  expiresAt: z.coerce.date(),
  lastUsedAt: z.coerce.date().nullable(),
  lastUsedAddress: z.string().nullable(),
  revokedAt: z.coerce.date().nullable(),
  status: z.enum(['active', 'expired', 'revoked']),
});
export type ApiTokenSummary = z.output<typeof apiTokenSummarySchema>;
