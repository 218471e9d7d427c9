import type { ErrorBody, ErrorCode } from '@/lib/contracts/errors';

/**
 * The one domain error of Beadline: a code from the closed set in lib/contracts/errors.ts, a
 * message that says what was wrong and what to do, and optionally the fields it concerns.
 * Services throw it; the route and action wrappers (server/http) turn it into the error body and
 * the HTTP status of its code. It knows nothing about HTTP itself.
 */
export class AppError extends Error {
  readonly fields?: Record<string, string>;
  /** Merged into the body next to `error`, e.g. `{ current }` with stale_version. */
  readonly extra?: Record<string, unknown>;
  /** When to try again (a 429): the route wrapper sends it as Retry-After. */
  readonly retryAfterSeconds?: number;

  constructor(
    readonly code: ErrorCode,
    message: string,
    options: {
      fields?: Record<string, string>;
      extra?: Record<string, unknown>;
      retryAfterSeconds?: number;
    } = {},
  ) {
    super(message);
    this.name = 'AppError';
    this.fields = options.fields;
    this.extra = options.extra;
    this.retryAfterSeconds = options.retryAfterSeconds;
  }

  toBody(): ErrorBody & Record<string, unknown> {
    return {
      ...this.extra,
      error: {
        code: this.code,
        message: this.message,
        ...(this.fields ? { fields: this.fields } : {}),
      },
    };
  }
}

export const unauthorized = () =>
  new AppError('unauthorized', 'You are not signed in. Sign in and try again.');

export const forbidden = (what = 'do this') =>
  new AppError(
    'forbidden',
    `Your role in this organization does not allow you to ${what}. Ask an admin of the organization if you need it.`,
  );

export const notFound = (what = 'That record') =>
  new AppError('not_found', `${what} was not found in this organization.`);

export const badOrigin = () =>
  new AppError(
    'bad_origin',
    'This request did not come from a Beadline page. Reload the page and try again.',
  );

/** A record named in the body (`field`) that this organization does not have. */
export function referenceNotFound(field: string, what: string): AppError {
  const message = `${what} was not found in this organization. Choose one of your organization’s records.`;
  return new AppError('not_found', message, { fields: { [field]: message } });
}

/** A 400 naming one field (for checks a zod schema cannot make). */
export function invalidField(field: string, message: string): AppError {
  return new AppError('invalid_input', message, { fields: { [field]: message } });
}
