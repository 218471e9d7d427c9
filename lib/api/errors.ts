/** The error body every route handler and server action returns: `{ error: { code, message, fields? } }`. */
export type ErrorBody = {
  error: { code: string; message: string; fields?: Record<string, string> };
};

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** Merged into the body next to `error`, e.g. `{ current }` with a 409 stale_version. */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'HttpError';
  }

  toBody(): ErrorBody & Record<string, unknown> {
    return {
      ...this.extra,
      error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) },
    };
  }
}

export const unauthorized = () =>
  new HttpError(401, 'unauthorized', 'You are not signed in. Sign in and try again.');

export const forbidden = (what = 'do this') =>
  new HttpError(
    403,
    'forbidden',
    `Your role in this organization does not allow you to ${what}. Ask an admin of the organization if you need it.`,
  );

export const notFound = (what = 'That record') =>
  new HttpError(404, 'not_found', `${what} was not found in this organization.`);

export const badOrigin = () =>
  new HttpError(
    403,
    'bad_origin',
    'This request did not come from a Beadline page. Reload the page and try again.',
  );
