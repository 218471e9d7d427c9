import 'server-only';
import { AppError, notFound } from '@/lib/app-error';
import { violatedUniqueConstraint } from '@/db/queries/records';

/** What a missing, archived or moved-on record means for a change, as AppErrors. */

/** The record changed since the editor loaded it; the body carries `current`. */
export function staleVersion(what: string, current: unknown): AppError {
  return new AppError(
    'stale_version',
    `Someone changed this ${what} after you opened it. Review the current values and make your change again.`,
    { extra: { current } },
  );
}

export function archivedRecord(what: string): AppError {
  return new AppError(
    'archived',
    `This ${what} is archived and can no longer be changed. Ask an admin if it should come back.`,
  );
}

export function duplicate(field: string, message: string): AppError {
  return new AppError('duplicate', message, { fields: { [field]: message } });
}

export function referenceArchived(field: string, what: string): AppError {
  const message = `${what} is archived. Choose a current one.`;
  return new AppError('archived', message, { fields: { [field]: message } });
}

type Versioned = { archivedAt: Date | null; version: number };

/** Checks before an update: the record exists here, is not archived, and is at `version`. */
export function assertEditable<T extends Versioned>(
  what: string,
  current: T | undefined,
  version: number,
  present: (row: T) => unknown = (row) => row,
): asserts current is T {
  if (!current) throw notFound(`That ${what}`);
  if (current.archivedAt) throw archivedRecord(what);
  if (current.version !== version) throw staleVersion(what, present(current));
}

/**
 * After an UPDATE … WHERE version = $v touched no row: not found when the record is gone,
 * archived when it was archived meanwhile, else stale_version with the current record.
 */
export function failedUpdate<T extends Versioned>(
  what: string,
  current: T | undefined,
  present: (row: T) => unknown = (row) => row,
): AppError {
  if (!current) return notFound(`That ${what}`);
  if (current.archivedAt) return archivedRecord(what);
  return staleVersion(what, present(current));
}

/** Runs `work`, turning a unique violation of a known constraint into its AppError (duplicate). */
export async function withUniqueChecks<T>(
  work: () => Promise<T>,
  constraints: Record<string, () => AppError> = {},
): Promise<T> {
  try {
    return await work();
  } catch (error) {
    const constraint = violatedUniqueConstraint(error);
    const toError = constraint === null ? undefined : constraints[constraint];
    if (toError) throw toError();
    throw error;
  }
}
