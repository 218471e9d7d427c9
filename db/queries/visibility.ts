import 'server-only';
import { eq, sql, type AnyColumn, type SQL } from 'drizzle-orm';

/**
 * The one rule for results under review, applied here in the data layer so that every page,
 * route, CSV, PDF and e-mail obeys it: with `approved` visibility (viewers) a drop's result
 * counts only when its latest analysis revision is approved — a newer draft replaces an approved
 * result until it is approved in turn — and a saved computation (surface energy) only when every
 * analysis it was computed from is approved now. `all` (roles that may read every result) sees
 * every latest revision. Services get the visibility of a role from server/visibility.ts; every
 * query that returns results takes it.
 */
export type ResultVisibility = 'all' | 'approved';

/** The condition on an analysis' review status (drizzle column), or none. */
export function visibleStatus(
  visibility: ResultVisibility,
  reviewStatus: AnyColumn,
): SQL | undefined {
  return visibility === 'all' ? undefined : eq(reviewStatus, 'approved');
}

/** The same condition for a raw SQL query, as `and …` on a qualified column such as `a.review_status`. */
export function andVisibleStatus(visibility: ResultVisibility, reviewStatus: SQL): SQL {
  return visibility === 'all' ? sql`` : sql`and ${reviewStatus} = 'approved'`;
}

/**
 * A saved computation whose inputs (`inputs.liquids[].analysisIds`) name the analyses it used:
 * visible with `approved` only when each of them is approved now.
 */
export function visibleSavedInputs(
  visibility: ResultVisibility,
  inputs: AnyColumn,
): SQL | undefined {
  if (visibility === 'all') return undefined;
  return sql`not exists (
    select 1
    from jsonb_array_elements(${inputs}->'liquids') as l(row)
    cross join lateral jsonb_array_elements_text(l.row->'analysisIds') as used(id)
    left join analyses ua on ua.id = used.id
    where ua.review_status is distinct from 'approved'
  )`;
}
