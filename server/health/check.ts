import 'server-only';
import { ping } from '@/db/queries/health';
import { computeInFlight } from '../compute/pool';

/** Whether the database answers a trivial query. */
export async function databaseAnswers(): Promise<boolean> {
  try {
    await ping();
    return true;
  } catch {
    return false;
  }
}

/** What /api/health reports besides the database: calculations in the compute pool. */
export function computeLoad(): { inFlight: number } {
  return { inFlight: computeInFlight() };
}
