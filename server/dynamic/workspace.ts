import 'server-only';
import { listProbeLiquidChoices, listSampleChoices } from '@/db/queries/drops';
import type { OrgContext } from '@/lib/auth/context';

/** The dynamic-wetting page: the samples and probe liquids a series can be saved to. */
export async function loadDynamicWorkspace(ctx: OrgContext) {
  const organizationId = ctx.organization.id;
  const [samples, liquids] = await Promise.all([
    listSampleChoices(organizationId),
    listProbeLiquidChoices(organizationId),
  ]);
  return { samples, liquids };
}
