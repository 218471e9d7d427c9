'use client';

import { useState } from 'react';
import { apiFetch } from '@/components/measure/api';

/** Subscribe to an e-mail when a batch of this coating turns out of spec. */
export function WatchCoatingButton({
  coatingId,
  initiallyWatching,
}: {
  coatingId: string;
  initiallyWatching: boolean;
}) {
  const [watching, setWatching] = useState(initiallyWatching);
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="flex flex-wrap items-center gap-2">
      <button
        type="button"
        className="btn-quiet py-1"
        aria-pressed={watching}
        disabled={pending}
        onClick={async () => {
          setPending(true);
          setError(null);
          try {
            const result = await apiFetch<{ watching: boolean }>(
              `/api/coatings/${coatingId}/watch`,
              {
                method: watching ? 'DELETE' : 'PUT',
              },
            );
            setWatching(result.watching);
          } catch (caught) {
            setError(caught instanceof Error ? caught.message : 'That did not work. Try again.');
          } finally {
            setPending(false);
          }
        }}
      >
        {watching
          ? 'Watching: e-mail me when a batch fails'
          : 'Watch: e-mail me when a batch fails'}
      </button>
      {error ? (
        <span role="alert" className="text-sm text-coral-700">
          {error}
        </span>
      ) : null}
    </div>
  );
}
