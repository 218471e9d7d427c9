import 'server-only';
import {
  AUDIT_PAGE_SIZE,
  auditFilterOptions,
  listAuditEvents,
  type AuditFilters,
} from '@/db/queries/audit';

export { AUDIT_PAGE_SIZE, type AuditFilters };

/** The audit log page: one page of events matching the filters, and the filters' choices. */
export async function loadAuditLog(organizationId: string, filters: AuditFilters, page: number) {
  const [{ rows, total }, options] = await Promise.all([
    listAuditEvents(organizationId, filters, page),
    auditFilterOptions(organizationId),
  ]);
  return { rows, total, pages: Math.max(1, Math.ceil(total / AUDIT_PAGE_SIZE)), options };
}
