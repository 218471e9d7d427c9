import type { ZodType } from 'zod';
import { ApiError } from './api-error';

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type ApiRequest = {
  method?: HttpMethod;
  /** Sent as the JSON body. */
  json?: unknown;
  /**
   * The reply's contract (a schema of lib/contracts); checked in development, never in
   * production. The reply is handed back as it came, so type it `Wire<z.output<typeof schema>>`.
   */
  schema?: ZodType;
  signal?: AbortSignal;
};

/**
 * A contract's type as it travels in JSON and reaches the client unparsed: timestamps (Dates once
 * a schema parses them) are ISO 8601 text.
 */
export type Wire<T> = T extends Date
  ? string
  : T extends readonly (infer Item)[]
    ? Wire<Item>[]
    : T extends object
      ? { [K in keyof T]: Wire<T[K]> }
      : T;

/**
 * The client's one way to call Beadline's API: JSON in, JSON out, every failure an `ApiError`
 * (a network failure too, with code `network`).
 */
export async function apiFetch<T>(url: string, request: ApiRequest = {}): Promise<T> {
  const { method = 'GET', json, schema, signal } = request;
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      signal,
      headers: json === undefined ? undefined : { 'content-type': 'application/json' },
      body: json === undefined ? undefined : JSON.stringify(json),
    });
  } catch (error) {
    // Cancelled on purpose: not a failure to report.
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw ApiError.network();
  }
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    throw ApiError.fromReply(response.status, body, response.headers.get('retry-after'));
  }
  if (schema && process.env.NODE_ENV !== 'production') checkReply(method, url, schema, body);
  return body as T;
}

/**
 * A reply that does not match its contract is a bug between the route and the page: in
 * development it is reported loudly (Next.js shows console errors in its overlay), and the
 * page carries on with the reply as it is.
 */
export function checkReply(method: string, url: string, schema: ZodType, body: unknown): boolean {
  const parsed = schema.safeParse(body);
  if (parsed.success) return true;
  const issues = parsed.error.issues
    .map((issue) => `${issue.path.join('.') || '(reply)'}: ${issue.message}`)
    .join('; ');
  console.error(`The reply of ${method} ${url} does not match its contract: ${issues}`);
  return false;
}
