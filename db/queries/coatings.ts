import 'server-only';
import { isNull } from 'drizzle-orm';
import type { Coating, CoatingListQuery } from '@/lib/contracts/coatings';
import type { Page } from '@/lib/contracts/common';
import { coatings } from '../schema';
import { listPage, ownedBy, textSearch } from './records';

const SORT_COLUMNS = {
  code: coatings.code,
  name: coatings.name,
  createdAt: coatings.createdAt,
  updatedAt: coatings.updatedAt,
} as const;

export async function listCoatings(
  organizationId: string,
  query: CoatingListQuery,
): Promise<Page<Coating>> {
  return listPage({
    from: coatings,
    where: [
      ownedBy(coatings, organizationId),
      query.includeArchived ? undefined : isNull(coatings.archivedAt),
      textSearch(query.q, [coatings.code, coatings.name, coatings.description]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}
