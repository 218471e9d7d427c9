import 'server-only';
import { organizationDataVersion } from '@/db/queries/data-version';
import type { ResultVisibility } from '../visibility';

/*
 * Results computed from an organization's lab data (comparisons, the dashboard's lists), kept in
 * this process under the organization's data version. Every change to that data commits a new
 * version (migration 0018, in the writing transaction, from any web instance), so an entry is
 * served only while the data it was computed from is unchanged; the first request after a change
 * computes afresh. The visibility of the asking role is part of every key: a viewer's request
 * never reads what was computed for a role that sees drafts.
 *
 * An entry is stored under the version read BEFORE its data was loaded, so it holds data at
 * least as new as that version; a newer version is never served older data.
 */

/** Organizations kept, least recently used dropped first. */
const MAX_ORGANIZATIONS = 64;
/** Entries per organization and version (coatings × chosen batches × roles, roughly). */
const MAX_ENTRIES = 48;

type Shelf = { version: bigint; entries: Map<string, Promise<unknown>> };

const globalForCache = globalThis as typeof globalThis & {
  beadlineResultCache?: Map<string, Shelf>;
};
const shelves = (globalForCache.beadlineResultCache ??= new Map<string, Shelf>());

/** The results of one organization, as one role sees them, at the version read now. */
export type ResultCache = {
  readonly version: bigint;
  /** Whose view of the results it holds (server/visibility.ts). */
  readonly visibility: ResultVisibility;
  /** `compute()`'s value for `key`, computed once per data version (concurrent askers share it). */
  get<T>(key: string, compute: () => Promise<T>): Promise<T>;
};

function shelfFor(organizationId: string, version: bigint): Shelf | null {
  const shelf = shelves.get(organizationId);
  if (shelf && shelf.version > version) return null; // a slower request read an older version
  shelves.delete(organizationId); // re-inserted last: least recently used first in the map
  const current = shelf && shelf.version === version ? shelf : { version, entries: new Map() };
  shelves.set(organizationId, current);
  while (shelves.size > MAX_ORGANIZATIONS) shelves.delete(shelves.keys().next().value!);
  return current;
}

/**
 * Reads the organization's data version (one indexed row) and returns the cache of its results
 * for `visibility` at that version.
 */
export async function resultCache(
  organizationId: string,
  visibility: ResultVisibility,
): Promise<ResultCache> {
  const version = await organizationDataVersion(organizationId);
  return {
    version,
    visibility,
    get<T>(key: string, compute: () => Promise<T>): Promise<T> {
      const shelf = shelfFor(organizationId, version);
      if (!shelf) return compute();
      const full = `${visibility}\u0000${key}`;
      const held = shelf.entries.get(full) as Promise<T> | undefined;
      if (held) {
        shelf.entries.delete(full);
        shelf.entries.set(full, held);
        return held;
      }
      const made = compute();
      shelf.entries.set(full, made);
      // A failure is not kept: the next request tries again.
      made.catch(() => {
        if (shelf.entries.get(full) === made) shelf.entries.delete(full);
      });
      while (shelf.entries.size > MAX_ENTRIES)
        shelf.entries.delete(shelf.entries.keys().next().value!);
      return made;
    },
  };
}

/** Forgets every cached result of this process (tests). */
export function clearResultCache(): void {
  shelves.clear();
}
