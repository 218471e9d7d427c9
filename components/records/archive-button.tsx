'use client';

import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { useMutation } from '@/components/data/use-mutation';
import { deleteReplySchema } from '@/lib/contracts/common';

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
  const archiving = useMutation<{ outcome: 'archived' | 'deleted' }>();
  const [outcome, setOutcome] = useState<'archived' | 'deleted' | null>(null);
  const run = async () => {
    if (
      !window.confirm(
        `Archive or remove this ${what}? Records with results are archived, not deleted.`,
      )
    )
      return;
    setOutcome(null);
    const result = await archiving.run(`${url}?version=${version}`, {
      method: 'DELETE',
      schema: deleteReplySchema,
    });
    if (!result.ok) return;
    setOutcome(result.data.outcome);
    if (result.data.outcome === 'deleted' && afterDeleteHref) router.push(afterDeleteHref);
    else router.refresh();
  };
  const message =
    archiving.message ??
    (outcome === 'archived'
      ? `The ${what} was archived: it has records under it, so it is kept but can no longer be changed.`
      : outcome === 'deleted'
        ? `The ${what} was deleted: nothing referred to it.`
        : null);
  return (
    <span className="inline-flex flex-col gap-1">
      <button type="button" className="btn-quiet py-1" onClick={run} disabled={archiving.pending}>
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
