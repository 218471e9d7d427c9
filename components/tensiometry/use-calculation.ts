'use client';

import { useRef, useState } from 'react';
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
 * One tensiometry form: its inputs as typed, and the calculation they are posted to. The answer
 * is kept until a failure or `clear`; the server's errors go to the inputs they name; a result
 * saved with it is handed on.
 */
export function useCalculation<Field extends string, Reply extends { saved?: SavedTensiometry }>({
  url,
  initial,
  idPrefix = '',
  onSaved,
}: {
  url: string;
  /** Every input with its starting text. */
  initial: Record<Field, string>;
  /** Before each input's id, when names could repeat on the page. */
  idPrefix?: string;
  onSaved?: (saved: SavedTensiometry) => void;
}) {
  const [values, setValues] = useState(initial);
  const mutation = useMutation<Reply>({ fields: [...Object.keys(initial), 'photoId'] });
  const [reply, setReply] = useState<Reply | null>(null);

  // Bumped by `clear`: an answer to a request sent before it (another mode) is not shown.
  const generation = useRef(0);

  async function submit(body: Record<string, unknown>) {
    const sentIn = generation.current;
    const outcome = await mutation.run(url, { method: 'POST', json: body });
    if (outcome.ok && outcome.data.saved) onSaved?.(outcome.data.saved);
    if (sentIn !== generation.current) return;
    setReply(outcome.ok ? outcome.data : null);
  }

  function clear() {
    generation.current += 1;
    setReply(null);
    mutation.reset();
  }

  /** Binds a number field to an input: its id, its text and its error. */
  const bind = (key: Field) => ({
    id: `${idPrefix}${key}`,
    name: key,
    value: values[key],
    onChange: (event: React.ChangeEvent<HTMLInputElement>) =>
      setValues((s) => ({ ...s, [key]: event.target.value })),
    error: mutation.fieldErrors[key],
  });

  return {
    values,
    bind,
    reply,
    errors: mutation.fieldErrors,
    message: mutation.message,
    busy: mutation.pending,
    submit,
    clear,
  };
}
