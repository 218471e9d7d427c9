'use client';

import { useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { watchReplySchema } from '@/lib/contracts/coatings';

/** Subscribe to an e-mail when a batch of this coating turns out of spec. */
export function WatchCoatingButton({
  coatingId,
  initiallyWatching,
}: {
  coatingId: string;
  initiallyWatching: boolean;
}) {
  const [watching, setWatching] = useState(initiallyWatching);
  const toggle = useMutation<{ watching: boolean }>();
  return (
    <div className="flex flex-wrap items-center gap-2">
      <button
        type="button"
        className="btn-quiet py-1"
        aria-pressed={watching}
        disabled={toggle.pending}
        onClick={async () => {
          const result = await toggle.run(`/api/coatings/${coatingId}/watch`, {
            method: watching ? 'DELETE' : 'PUT',
            schema: watchReplySchema,
          });
          if (result.ok) setWatching(result.data.watching);
        }}
      >
        {watching
          ? 'Watching: e-mail me when a batch fails'
          : 'Watch: e-mail me when a batch fails'}
      </button>
      {toggle.message ? (
        <span role="alert" className="text-sm text-coral-700">
          {toggle.message}
        </span>
      ) : null}
    </div>
  );
}
