import 'server-only';
import { getDropDetail, listDropRevisions } from '@/db/queries/drops';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility } from '../visibility';

/**
 * A drop's page: where it sits, its photo, and every revision with who, when, why and how. Null
 * when the organization has no such drop, or when the role sees approved results only and this
 * drop's latest result is not approved.
 */
export async function loadDropPage(ctx: OrgContext, dropId: string) {
  const drop = await getDropDetail(ctx.organization.id, dropId);
  if (!drop) return null;
  const visibility = resultVisibility(ctx.organization.role);
  const listed = await listDropRevisions(dropId, visibility);
  if (visibility === 'approved' && listed.length === 0) return null;
  const revisions = listed.map((r) => ({
    ...r,
    baselineSource: r.options.baselineSource ?? (r.baseline ? 'given' : 'automatic'),
    scaleUsedPxPerMm: r.options.scalePxPerMm ?? null,
    settings: r.options.settings ?? null,
    warnings: r.warnings ?? [],
  }));
  return { drop, revisions };
}
export type DropPage = NonNullable<Awaited<ReturnType<typeof loadDropPage>>>;
