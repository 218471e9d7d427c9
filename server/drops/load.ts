import 'server-only';
import { getDropDetail, listDropRevisions } from '@/db/queries/drops';
import type { OrgContext } from '@/lib/auth/context';

/** A drop's page (null when the organization has no such drop): where it sits, its photo, and every revision with who, when, why and how. */
export async function loadDropPage(ctx: OrgContext, dropId: string) {
  const drop = await getDropDetail(ctx.organization.id, dropId);
  if (!drop) return null;
  const revisions = (await listDropRevisions(dropId)).map((r) => ({
    ...r,
    baselineSource: r.options.baselineSource ?? (r.baseline ? 'given' : 'automatic'),
    scaleUsedPxPerMm: r.options.scalePxPerMm ?? null,
    settings: r.options.settings ?? null,
    warnings: r.warnings ?? [],
  }));
  return { drop, revisions };
}
export type DropPage = NonNullable<Awaited<ReturnType<typeof loadDropPage>>>;
