/**
 * The one error the client's data layer throws: a non-2xx answer with Beadline's error body
 * `{ error: { code, message, fields? }, ...extra }`, or a request that never reached the server.
 */

/**
 * The server's codes. Open until the server's closed union of codes exists; then this becomes
 * that union and every `switch` on `code` is checked by the compiler.
 */
export type ServerErrorCode = string;

/** Codes the client sets itself: no answer at all, or an answer without Beadline's error body. */
export type ClientErrorCode = 'network' | 'unexpected_reply';

export type ApiErrorCode = ServerErrorCode | ClientErrorCode;

export const NETWORK_MESSAGE =
  'The server could not be reached. Check the connection and try again; nothing was lost: what you entered is still here.';

export class ApiError<Code extends string = ApiErrorCode> extends Error {
  override readonly name = 'ApiError';

  constructor(
    /** HTTP status; 0 when the server was not reached. */
    readonly status: number,
    readonly code: Code | ClientErrorCode,
    message: string,
    /** Field name (dotted for nested fields) → what is wrong with it. */
    readonly fields: Readonly<Record<string, string>> = {},
    /** The body's keys beside `error`, e.g. `current` with a 409 stale_version. */
    readonly extra: Readonly<Record<string, unknown>> = {},
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

  /** Reads Beadline's error body; anything else (a proxy's HTML page, no body) keeps the status. */
  static fromReply(status: number, body: unknown): ApiError {
    const error = isRecord(body) && isRecord(body.error) ? body.error : null;
    if (!error || typeof error.message !== 'string' || typeof error.code !== 'string') {
      return new ApiError(
        status,
        'unexpected_reply',
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
    return new ApiError(status, error.code, error.message, fields, extra);
  }
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
