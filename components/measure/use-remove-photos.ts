'use client';

import { useState } from 'react';
import { useMutation } from '@/components/data/use-mutation';
import { removePhotosReplySchema, type RemovePhotosReply } from '@/lib/contracts/photos';
import { useWorkspace } from './store';
import { useAnalysisWorker } from './use-analysis';

/** Removes unsaved photos from the workspace on the server, then from the table and the worker. */
export function useRemovePhotos() {
  const removePhotos = useWorkspace((state) => state.removePhotos);
  const worker = useAnalysisWorker();
  const send = useMutation<RemovePhotosReply>();
  const [message, setMessage] = useState<string | null>(null);

  async function remove(ids: string[]) {
    if (ids.length === 0) return;
    setMessage(null);
    const reply = await send.run('/api/photos/remove', {
      method: 'POST',
      json: { photoIds: ids },
      schema: removePhotosReplySchema,
    });
    if (!reply.ok) {
      setMessage(reply.error.message);
      return;
    }
    const { removed } = reply.data;
    removePhotos(removed);
    for (const id of removed) worker.forget(id);
    setMessage(`Removed ${removed.length} photo${removed.length === 1 ? '' : 's'}.`);
  }

  return { remove, pending: send.pending, message };
}
