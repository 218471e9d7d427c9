import 'server-only';
import { ping } from '@/db/queries/health';

/** Whether the database answers a trivial query. */
export async function databaseAnswers(): Promise<boolean> {
  try {
    await ping();
    return true;
  } catch {
    return false;
  }
}
