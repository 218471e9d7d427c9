import 'server-only';
import { sql } from 'drizzle-orm';
import type { RecentDrop } from '@/lib/contracts/dashboard';
import { getDb } from '../client';
import { andVisibleStatus, type ResultVisibility } from './visibility';

type RecentRow = {
  drop_id: string;
  sample_label: string;
  lot_code: string;
  coating_code: string;
  liquid_name: string;
  mean_deg: number;
  measured_at: Date | string;
  measured_by: string | null;
  review_status: RecentDrop['reviewStatus'];
};

/**
 * The newest drops of the organization with their latest analysis, as `visibility`
 * allows. Walks drops_org_time_idx backwards.
 */
export async function recentDrops(
  organizationId: string,
  options: { visibility: ResultVisibility; limit?: number },
): Promise<RecentDrop[]> {
  const rows = await getDb().execute<RecentRow>(sql`
    select d.id as drop_id, s.label as sample_label, b.lot_code, c.code as coating_code,
           l.name as liquid_name, a.mean_deg, d.measured_at, u.name as measured_by, a.review_status
    from drops d
    join samples s on s.id = d.sample_id
    join batches b on b.id = s.batch_id
    join coatings c on c.id = b.coating_id
    join probe_liquids l on l.id = d.probe_liquid_id
    join lateral (
      select x.mean_deg, x.review_status from analyses x
      where x.drop_id = d.id order by x.revision desc limit 1
    ) a on true
    left join users u on u.id = d.created_by_user_id
    where d.organization_id = ${organizationId}
      and d.archived_at is null
      ${andVisibleStatus(options.visibility, sql`a.review_status`)}
    order by d.measured_at desc, d.id desc
    limit ${options.limit ?? 10}
  `);
  return rows.map((r) => ({
    dropId: r.drop_id,
    sampleLabel: r.sample_label,
    lotCode: r.lot_code,
    coatingCode: r.coating_code,
    liquidName: r.liquid_name,
    meanDeg: Number(r.mean_deg),
    measuredAt: (r.measured_at instanceof Date
      ? r.measured_at
      : new Date(r.measured_at)
    ).toISOString(),
    measuredBy: r.measured_by,
    reviewStatus: r.review_status,
  }));
}

/** Review requests (submitted results of a batch or sample) waiting for a decision. */
export async function pendingReviewCount(organizationId: string): Promise<number> {
  const [row] = await getDb().execute<{ n: number | string }>(sql`
    select count(*) as n
    from reviews r
    where r.organization_id = ${organizationId}
      and r.status = 'submitted'
  `);
  return Number(row?.n ?? 0);
}
