import { isErrorCode, type ErrorCode } from '@/lib/contracts/errors';

/**
 * The one error the client's data layer throws: a non-2xx answer with Beadline's error body
 * `{ error: { code, message, fields? }, ...extra }`, or a request that never reached the server.
 */

/**
 * The server's closed set of codes (lib/contracts/errors.ts) and the client's own: `network` when
 * no answer came. Every `switch` on `code` is checked by the compiler against this union.
 */
export type ApiErrorCode = ErrorCode | 'network';

export const NETWORK_MESSAGE =
  'The server could not be reached. Check the connection and try again; nothing was lost: what you entered is still here.';

export class ApiError extends Error {
  override readonly name = 'ApiError';

  constructor(
    /** HTTP status; 0 when the server was not reached. */
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    /** Field name (dotted for nested fields) → what is wrong with it. */
    readonly fields: Readonly<Record<string, string>> = {},
    /** The body's keys beside `error`, e.g. `current` with a 409 stale_version. */
    readonly extra: Readonly<Record<string, unknown>> = {},
    /** How long the server asked to wait before sending again (Retry-After, in seconds). */
    readonly retryAfterSeconds: number | null = null,
  ) {
    super(message);
  }

  /** True when the request never got an answer (offline, server down, connection cut). */
  get isNetwork(): boolean {
    return this.code === 'network';
  }

  static network(): ApiError {
    return new ApiError(0, 'network', NETWORK_MESSAGE);
  }

  /**
   * Reads Beadline's error body. Anything else (a proxy's HTML page, no body, a code outside the
   * closed set) is `internal`, as the server calls what it did not expect, and keeps the status.
   */
  static fromReply(status: number, body: unknown, retryAfter: string | null = null): ApiError {
    const error = isRecord(body) && isRecord(body.error) ? body.error : null;
    if (!error || typeof error.message !== 'string' || !isErrorCode(error.code)) {
      return new ApiError(
        status,
        'internal',
        `The server answered ${status} without saying why. Try again; if it keeps happening, tell your admin.`,
      );
    }
    const fields = isRecord(error.fields)
      ? Object.fromEntries(
          Object.entries(error.fields).filter(
            (entry): entry is [string, string] => typeof entry[1] === 'string',
          ),
        )
      : {};
    const { error: _error, ...extra } = body as Record<string, unknown>;
    const seconds = retryAfter === null ? NaN : Number(retryAfter);
    return new ApiError(
      status,
      error.code,
      error.message,
      fields,
      extra,
      Number.isFinite(seconds) && seconds >= 0 ? seconds : null,
    );
  }
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
