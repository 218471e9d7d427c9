import 'server-only';
import { getDb, type Database } from '../client';

export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
/** The database or a transaction: what a query runs on. */
export type Executor = Database | Transaction;

/**
 * Runs `work` in one transaction: everything it writes (rows, audit rows, queued mail) is kept
 * together or not at all. Services call this; queries take the transaction as their executor.
 */
export function inTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  return getDb().transaction(work);
}

/** The executor for a query that runs on its own. */
export const database = (): Executor => getDb();
