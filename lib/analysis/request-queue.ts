/**
 * Pending analysis requests, one per drop: a newer request for the same drop replaces (supersedes)
 * an older pending one; a late-arriving older request is superseded at once. Used by the worker.
 */
export interface QueuedRequest {
  requestId: number;
  dropId: string;
}

export class LatestPerDropQueue<T extends QueuedRequest> {
  private readonly pending = new Map<string, T>();

  /** Queues `request`; returns the request it supersedes (possibly itself), if any. */
  enqueue(request: T): T | null {
    const older = this.pending.get(request.dropId);
    if (older && older.requestId > request.requestId) return request;
    this.pending.set(request.dropId, request);
    return older ?? null;
  }

  /** The oldest-queued drop's latest request, removed from the queue. */
  next(): T | null {
    const first = this.pending.entries().next();
    if (first.done) return null;
    this.pending.delete(first.value[0]);
    return first.value[1];
  }

  get size(): number {
    return this.pending.size;
  }
}
