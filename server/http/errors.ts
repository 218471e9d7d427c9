import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/app-error';
import { fieldErrors } from '@/lib/contracts/common';
import type { ErrorBody, ErrorCode } from '@/lib/contracts/errors';

/**
 * The HTTP status of every error code: the one place where domain errors meet HTTP. The table is
 * complete by type, so a new code in lib/contracts/errors.ts does not compile until it has a
 * status here (and a row in DEVELOPERS.md).
 */
export const HTTP_STATUS = {
  invalid_input: 400,
  invalid_json: 400,
  payload_too_large: 413,
  invalid_rows: 400,
  unauthorized: 401,
  forbidden: 403,
  bad_origin: 403,
  read_only: 403,
  wrong_email: 403,
  signature_failed: 403,
  invalid_credentials: 401,
  too_many_attempts: 429,
  too_soon: 429,
  rate_limited: 429,
  idempotency_conflict: 409,
  not_found: 404,
  archived: 409,
  duplicate: 409,
  stale_version: 409,
  already_member: 409,
  already_invited: 409,
  account_exists: 409,
  last_admin: 409,
  invitation_closed: 409,
  invitation_not_found: 404,
  invitation_used: 410,
  invitation_revoked: 410,
  invitation_expired: 410,
  token_not_found: 404,
  token_used: 410,
  token_expired: 410,
  token_stale: 410,
  nothing_to_submit: 409,
  already_decided: 409,
  results_changed: 409,
  own_review: 403,
  not_approved: 409,
  stale_revision: 409,
  no_angles: 422,
  nothing_computed: 422,
  invalid_measurement: 422,
  unreadable_photo: 422,
  unreadable_video: 422,
  no_drop_found: 422,
  baseline_not_found: 422,
  fit_failed: 422,
  bad_input: 422,
  busy: 429,
  database_unreachable: 503,
  internal: 500,
} as const satisfies Record<ErrorCode, number>;

type Described = { status: number; body: ErrorBody & Record<string, unknown> };

/** Any thrown value → its status and error body. Unknown errors are logged and answered 500. */
export function describeError(error: unknown, where: string): Described {
  if (error instanceof AppError) return { status: HTTP_STATUS[error.code], body: error.toBody() };
  if (error instanceof z.ZodError) {
    return {
      status: HTTP_STATUS.invalid_input,
      body: {
        error: {
          code: 'invalid_input',
          message: 'Some fields are not valid. Correct them and try again.',
          fields: fieldErrors(error),
        },
      },
    };
  }
  console.error(`[${where}] unexpected error`, error);
  return {
    status: HTTP_STATUS.internal,
    body: {
      error: {
        code: 'internal',
        message: 'Something went wrong on our side. Try again in a moment.',
      },
    },
  };
}

export function errorResponse(error: unknown): Response {
  const { status, body } = describeError(error, 'api');
  const retryAfter = error instanceof AppError ? error.retryAfterSeconds : undefined;
  return Response.json(body, {
    status,
    headers: retryAfter === undefined ? undefined : { 'Retry-After': String(retryAfter) },
  });
}
