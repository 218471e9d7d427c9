import 'server-only';
import { after } from 'next/server';

/**
 * Runs `task` once the answer has been sent (Next's after()), so how long the answer takes
 * cannot tell what the task found — whether an address has an account, for instance. Failures
 * are logged, as nobody waits for them. Outside a request (scripts, tests) it runs at once.
 */
export async function runAfterResponse(label: string, task: () => Promise<unknown>): Promise<void> {
  const guarded = async () => {
    try {
      await task();
    } catch (error) {
      console.error(`[${label}] failed after the answer was sent`, error);
    }
  };
  try {
    after(guarded);
  } catch {
    // after() throws outside a request scope.
    await guarded();
  }
}
