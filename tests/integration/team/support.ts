import { and, eq, sql } from 'drizzle-orm';
import { getDb, getSql } from '@/db/client';
import { auditEvents } from '@/db/schema';

export type QueuedMail = {
  id: string;
  state: string;
  retryCount: number;
  data: { to: string; subject: string; text: string; html: string; kind: string };
};

/** Mail jobs queued for `to` (any state), oldest first. */
export async function mailJobsTo(to: string, queue = 'mail'): Promise<QueuedMail[]> {
  const rows = await getSql()<
    { id: string; state: string; retry_count: number; data: QueuedMail['data'] }[]
  >`
    select id, state, retry_count, data from pgboss.job
    where name = ${queue} and data->>'to' = ${to} order by created_on`;
  return rows.map((r) => ({ id: r.id, state: r.state, retryCount: r.retry_count, data: r.data }));
}

/** The token of the link in a mail's text part. */
export function tokenIn(text: string): string {
  const match = /token=([A-Za-z0-9_-]+)/.exec(text);
  if (!match) throw new Error(`no link with a token in: ${text}`);
  return match[1]!;
}

export async function auditRows(filter: {
  organizationId?: string | null;
  action?: string;
  entityId?: string;
}) {
  const conditions = [];
  if (filter.organizationId) conditions.push(eq(auditEvents.organizationId, filter.organizationId));
  if (filter.action) conditions.push(eq(auditEvents.action, filter.action));
  if (filter.entityId) conditions.push(eq(auditEvents.entityId, filter.entityId));
  return getDb()
    .select()
    .from(auditEvents)
    .where(conditions.length ? and(...conditions) : sql`true`)
    .orderBy(auditEvents.id);
}

/** Runs a server action that should end in redirect(); returns where to. */
export async function redirectOf(run: Promise<unknown>): Promise<string> {
  try {
    await run;
  } catch (error) {
    const digest = (error as { digest?: unknown }).digest;
    if (typeof digest === 'string' && digest.startsWith('NEXT_REDIRECT'))
      return digest.split(';')[2] ?? '';
    throw error;
  }
  throw new Error('expected the action to redirect');
}

export function form(values: Record<string, string>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.set(key, value);
  return data;
}
