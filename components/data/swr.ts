'use client';

import { useEffect, useRef } from 'react';
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

/**
 * GET `url` through `apiFetch` with SWR; null pauses the hook. Data the page rendered on the
 * server (`fallbackData`) is the newest there is when the hook mounts: it replaces whatever the
 * cache kept from an earlier visit, and is not fetched again.
 */
export function useApi<T>(
  url: string | null,
  options: SWRConfiguration<T, ApiError> & { schema?: ZodType } = {},
) {
  const { schema, ...config } = options;
  const query = useSWR<T, ApiError>(url, (key: string) => apiFetch<T>(key, { schema }), {
    ...READ_DEFAULTS,
    ...(config.fallbackData !== undefined ? { revalidateOnMount: false } : {}),
    ...config,
  });
  const rendered = useRef(config.fallbackData);
  const { mutate } = query;
  useEffect(() => {
    if (rendered.current !== undefined) void mutate(rendered.current, { revalidate: false });
  }, [mutate]);
  return query;
}

/**
 * A read that needs a body (a computation sent by POST, with no side effects). The body is part
 * of the key, so the latest inputs always win and equal inputs are not sent twice; null pauses.
 */
export function useApiPost<T>(
  url: string,
  json: unknown,
  options: SWRConfiguration<T, ApiError> & { schema?: ZodType } = {},
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
