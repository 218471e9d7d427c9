import 'server-only';
import type { ResultVisibility } from '@/db/queries/visibility';
import { can, type Role } from '@/lib/auth/permissions';

export type { ResultVisibility };

/**
 * Which results a role sees (the rule itself is in db/queries/visibility.ts): every latest
 * revision for roles that may read all results, approved ones only for the others (viewers).
 */
export function resultVisibility(role: Role): ResultVisibility {
  return can(role, 'results:read-all') ? 'all' : 'approved';
}
