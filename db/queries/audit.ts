import 'server-only';
import { and, count, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import { auditEvents, users } from '../schema';
import { getDb, type Database } from '../client';

export type AuditInput = {
  actorUserId: string | null;
  organizationId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
};

type Executor = Pick<Database, 'insert'>;

/**
 * recordAudit bound to one transaction and one actor: `audit(action, entityType, entityId,
 * { before?, after? })`.
 */
export function auditAs(
  tx: Executor,
  actor: { userId: string | null; organizationId: string | null },
) {
  return (
    action: string,
    entityType: string,
    entityId: string,
    change: Pick<AuditInput, 'before' | 'after'>,
  ) =>
    recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action,
      entityType,
      entityId,
      ...change,
    });
}

/** Writes one audit row; call it with the transaction that makes the change. */
export async function recordAudit(tx: Executor, input: AuditInput): Promise<void> {
  await tx.insert(auditEvents).values({
    actorUserId: input.actorUserId,
    organizationId: input.organizationId,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId ?? null,
    before: input.before ?? null,
    after: input.after ?? null,
  });
}

export type AuditFilters = {
  action?: string;
  entityType?: string;
  actorUserId?: string;
  /** Inclusive start, UTC. */
  from?: Date;
  /** Exclusive end, UTC. */
  to?: Date;
};

export const AUDIT_PAGE_SIZE = 50;

/** One page of an organization's audit trail, newest first, and how many rows match in all. */
export async function listAuditEvents(organizationId: string, filters: AuditFilters, page: number) {
  const conditions: SQL[] = [eq(auditEvents.organizationId, organizationId)];
  if (filters.action) conditions.push(eq(auditEvents.action, filters.action));
  if (filters.entityType) conditions.push(eq(auditEvents.entityType, filters.entityType));
  if (filters.actorUserId) conditions.push(eq(auditEvents.actorUserId, filters.actorUserId));
  if (filters.from) conditions.push(gte(auditEvents.createdAt, filters.from));
  if (filters.to) conditions.push(lt(auditEvents.createdAt, filters.to));
  const where = and(...conditions);
  const db = getDb();
  const [total] = await db.select({ n: count() }).from(auditEvents).where(where);
  const rows = await db
    .select({
      id: auditEvents.id,
      action: auditEvents.action,
      entityType: auditEvents.entityType,
      entityId: auditEvents.entityId,
      before: auditEvents.before,
      after: auditEvents.after,
      createdAt: auditEvents.createdAt,
      actorUserId: auditEvents.actorUserId,
      actorName: users.name,
      actorEmail: users.email,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorUserId))
    .where(where)
    .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id))
    .limit(AUDIT_PAGE_SIZE)
    .offset(Math.max(0, page - 1) * AUDIT_PAGE_SIZE);
  return { rows, total: total?.n ?? 0 };
}

/** The choices for the audit page's filters: what occurs in this organization's trail. */
export async function auditFilterOptions(organizationId: string) {
  const db = getDb();
  const inOrg = eq(auditEvents.organizationId, organizationId);
  const [actions, entityTypes, actors] = await Promise.all([
    db
      .selectDistinct({ value: auditEvents.action })
      .from(auditEvents)
      .where(inOrg)
      .orderBy(auditEvents.action),
    db
      .selectDistinct({ value: auditEvents.entityType })
      .from(auditEvents)
      .where(inOrg)
      .orderBy(auditEvents.entityType),
    db
      .selectDistinct({ id: users.id, name: users.name, email: users.email })
      .from(auditEvents)
      .innerJoin(users, eq(users.id, auditEvents.actorUserId))
      .where(inOrg)
      .orderBy(users.name),
  ]);
  return {
    actions: actions.map((a) => a.value),
    entityTypes: entityTypes.map((e) => e.value),
    actors,
  };
}
