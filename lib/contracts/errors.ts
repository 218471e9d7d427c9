import { z } from 'zod';

/**
 * The closed set of error codes a route handler or server action answers with, in the body
 * `{ error: { code, message, fields? } }` (plus extra keys such as `current` on a 409
 * stale_version). The HTTP status of each code is decided in one place: server/http/errors.ts.
 */
export const ERROR_CODES = [
  // Request
  'invalid_input',
  'invalid_json',
  'payload_too_large',
  'invalid_rows',
  // Who is asking
  'unauthorized',
  'forbidden',
  'bad_origin',
  'read_only',
  'wrong_email',
  'signature_failed',
  'invalid_credentials',
  'too_many_attempts',
  'too_soon',
  'rate_limited',
  'idempotency_conflict',
  // Records
  'not_found',
  'archived',
  'duplicate',
  'stale_version',
  // Team and account links
  'already_member',
  'already_invited',
  'account_exists',
  'last_admin',
  'invitation_closed',
  'invitation_not_found',
  'invitation_used',
  'invitation_revoked',
  'invitation_expired',
  'token_not_found',
  'token_used',
  'token_expired',
  'token_stale',
  // Reviews
  'nothing_to_submit',
  'already_decided',
  'results_changed',
  'own_review',
  'not_approved',
  // Computation: surface energy, tensiometry, the drop-analysis engine
  'no_angles',
  'nothing_computed',
  'invalid_measurement',
  'unreadable_photo',
  'unreadable_video',
  'no_drop_found',
  'baseline_not_found',
  'fit_failed',
  'bad_input',
  // Drop saves
  'stale_revision',
  // The server itself
  'busy',
  'database_unreachable',
  'internal',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

export function isErrorCode(value: unknown): value is ErrorCode {
  return typeof value === 'string' && (ERROR_CODES as readonly string[]).includes(value);
}

/** The error body; `Code` is widened on the client for its own codes (e.g. 'network'). */
export type ErrorBody<Code extends string = ErrorCode> = {
  error: { code: Code; message: string; fields?: Record<string, string> };
};

export const errorBodySchema = z.looseObject({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
