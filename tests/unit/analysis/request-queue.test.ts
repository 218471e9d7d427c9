/** The worker's request queue: a newer request for the same drop supersedes an older one. */
import { describe, expect, it } from 'vitest';
import { LatestPerDropQueue } from '@/lib/analysis/request-queue';

describe('LatestPerDropQueue', () => {
  it('keeps only the newest pending request per drop, in first-queued drop order', () => {
    const queue = new LatestPerDropQueue<{ requestId: number; dropId: string }>();
    expect(queue.enqueue({ requestId: 1, dropId: 'a' })).toBeNull();
    expect(queue.enqueue({ requestId: 2, dropId: 'b' })).toBeNull();
    expect(queue.enqueue({ requestId: 3, dropId: 'a' })).toEqual({ requestId: 1, dropId: 'a' });
    // An older request arriving late is superseded at once.
    expect(queue.enqueue({ requestId: 0, dropId: 'b' })).toEqual({ requestId: 0, dropId: 'b' });
    expect(queue.size).toBe(2);
    expect(queue.next()).toEqual({ requestId: 3, dropId: 'a' });
    expect(queue.next()).toEqual({ requestId: 2, dropId: 'b' });
    expect(queue.next()).toBeNull();
  });
});
