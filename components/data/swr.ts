'use client';

import useSWR, { type SWRConfiguration } from 'swr';
import type { ZodType } from 'zod';
import type { ApiError } from './api-error';
import { apiFetch } from './fetch';

/**
 * How every resource hook reads: no refetch on window focus and no automatic retries (a 4xx
 * will not heal itself; the page says what to do instead), and data the server already
 * rendered (`fallbackData`) is not fetched again on mount.
 */
const READ_DEFAULTS: SWRConfiguration = {
  revalidateOnFocus: false,
  shouldRetryOnError: false,
};

/** GET `url` through `apiFetch` with SWR; null pauses the hook. */
export function useApi<T>(
  url: string | null,
  options: SWRConfiguration<T, ApiError> & { schema?: ZodType<T> } = {},
) {
  const { schema, ...config } = options;
  return useSWR<T, ApiError>(url, (key: string) => apiFetch<T>(key, { schema }), {
    ...READ_DEFAULTS,
    ...(config.fallbackData !== undefined ? { revalidateOnMount: false } : {}),
    ...config,
  });
}

/**
 * A read that needs a body (a computation sent by POST, with no side effects). The body is part
 * of the key, so the latest inputs always win and equal inputs are not sent twice; null pauses.
 */
export function useApiPost<T>(
  url: string,
  json: unknown,
  options: SWRConfiguration<T, ApiError> & { schema?: ZodType<T> } = {},
) {
  const { schema, ...config } = options;
  return useSWR<T, ApiError>(
    json === null ? null : ([url, json] as const),
    ([key, body]: readonly [string, unknown]) =>
      apiFetch<T>(key, { method: 'POST', json: body, schema }),
    {
      ...READ_DEFAULTS,
      ...(config.fallbackData !== undefined ? { revalidateOnMount: false } : {}),
      ...config,
    },
  );
}
