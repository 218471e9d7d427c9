import 'server-only';
import { getSql } from '../client';

/** A trivial query; throws when the database does not answer. */
export async function ping(): Promise<void> {
  await getSql()`select 1`;
}
