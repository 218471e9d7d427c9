'use client';

import { useState } from 'react';
import type { SavedTensiometry } from '@/components/data/resources';
import { useMutation } from '@/components/data/use-mutation';

/**
 * Text fields → numbers: an empty optional field is left out, anything else that is not a
 * number is sent as typed, for the server to say what is wrong with it.
 */
export function toNumbers(
  values: Record<string, string>,
  optional: readonly string[] = [],
): Record<string, number | string> {
  const out: Record<string, number | string> = {};
  for (const [key, raw] of Object.entries(values)) {
    const text = raw.trim().replace(',', '.');
    if (text === '' && optional.includes(key)) continue;
    const n = Number(text);
    out[key] = text === '' || !Number.isFinite(n) ? raw : n;
  }
  return out;
}

/**
 * One tensiometry calculation: posts the inputs, keeps the answer (cleared by a failure or by
 * `clear`), the errors per field and the pending state; a result saved with it is handed on.
 */
export function useCalculation<Reply extends { saved?: SavedTensiometry }>({
  url,
  fields,
  onSaved,
}: {
  url: string;
  /** The inputs this form shows, for the server's field errors. */
  fields: readonly string[];
  onSaved?: (saved: SavedTensiometry) => void;
}) {
  const mutation = useMutation<Reply>({ fields });
  const [reply, setReply] = useState<Reply | null>(null);

  async function submit(body: Record<string, unknown>) {
    const outcome = await mutation.run(url, { method: 'POST', json: body });
    setReply(outcome.ok ? outcome.data : null);
    if (outcome.ok && outcome.data.saved) onSaved?.(outcome.data.saved);
  }

  function clear() {
    setReply(null);
    mutation.reset();
  }

  return {
    reply,
    errors: mutation.fieldErrors,
    message: mutation.message,
    busy: mutation.pending,
    submit,
    clear,
  };
}
