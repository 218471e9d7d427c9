'use client';

import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { RecordApiError, sendJson } from './api';

/**
 * Archive-or-delete: the API deletes a record with nothing under it and archives one that has
 * results or children; the button reports which happened.
 */
export function ArchiveButton({
  url,
  version,
  what,
  afterDeleteHref,
  label = 'Archive',
}: {
  url: string;
  version: number;
  what: string;
  afterDeleteHref?: string;
  label?: string;
}) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const run = async () => {
    if (
      !window.confirm(
        `Archive or remove this ${what}? Records with results are archived, not deleted.`,
      )
    )
      return;
    setBusy(true);
    try {
      const body = await sendJson<{ outcome: 'archived' | 'deleted' }>(
        `${url}?version=${version}`,
        'DELETE',
      );
      setMessage(
        body.outcome === 'archived'
          ? `The ${what} was archived: it has records under it, so it is kept but can no longer be changed.`
          : `The ${what} was deleted: nothing referred to it.`,
      );
      if (body.outcome === 'deleted' && afterDeleteHref) router.push(afterDeleteHref);
      else router.refresh();
    } catch (error) {
      setMessage(
        error instanceof RecordApiError ? error.message : 'Something went wrong. Try again.',
      );
    } finally {
      setBusy(false);
    }
  };
  return (
    <span className="inline-flex flex-col gap-1">
      <button type="button" className="btn-quiet py-1" onClick={run} disabled={busy}>
        {label}
      </button>
      {message ? (
        <span role="status" className="max-w-xs text-xs text-ink-700">
          {message}
        </span>
      ) : null}
    </span>
  );
}
