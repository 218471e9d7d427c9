import { and, eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { auditEvents, coatings, sessions } from '@/db/schema';
import { newId } from '@/db/queries/ids';
import { closeMailQueue } from '@/server/mail/queue';
import { SESSION_ABSOLUTE_LIFETIME } from '@/lib/auth/lucia';
import { GET as me } from '@/app/api/me/route';
import { DELETE as unwatch, PUT as watch } from '@/app/api/coatings/[id]/watch/route';
import { apiRequest, APP_ORIGIN } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

const DAY = 86_400_000;

async function signedInAfter(ageMs: number): Promise<{ status: number; sessionLeft: number }> {
  const lab = await createOrganization();
  const member = await createMember(lab.id, 'viewer');
  // Used all along: the sliding expiry is still ahead.
  await getDb()
    .update(sessions)
    .set({ createdAt: new Date(Date.now() - ageMs), expiresAt: new Date(Date.now() + DAY) })
    .where(eq(sessions.id, member.sessionId));
  const response = await me(apiRequest('/api/me', { sessionId: member.sessionId }), undefined);
  const left = await getDb().select().from(sessions).where(eq(sessions.id, member.sessionId));
  return { status: response.status, sessionLeft: left.length };
}

describe('sessions', () => {
  it('end at the absolute limit after sign-in, however recently they were used', async () => {
    expect(SESSION_ABSOLUTE_LIFETIME.milliseconds()).toBe(30 * DAY);
    expect(await signedInAfter(29 * DAY)).toEqual({ status: 200, sessionLeft: 1 });
    expect(await signedInAfter(30 * DAY + 60_000)).toEqual({ status: 401, sessionLeft: 0 });
  });
});

/** A lab, its admin and one coating, with the route params for that coating. */
async function labWithCoating() {
  const lab = await createOrganization();
  const admin = await createMember(lab.id, 'admin');
  const coatingId = newId();
  await getDb().insert(coatings).values({ id: coatingId, organizationId: lab.id, code: 'WA-1', name: 'Watched coat' });
  return { lab, admin, coatingId, params: { params: Promise.resolve({ id: coatingId }) } };
}

describe('watching a coating', () => {
  it('is audited when it changes, and only then', async () => {
    const { lab, admin, coatingId, params } = await labWithCoating();
    const call = (handler: typeof watch, method: string) =>
      handler(apiRequest(`/api/coatings/${coatingId}/watch`, { method, sessionId: admin.sessionId }), params);
    expect((await call(watch, 'PUT')).status).toBe(200);
    expect((await call(watch, 'PUT')).status).toBe(200);
    expect((await call(unwatch, 'DELETE')).status).toBe(200);
    const rows = await getDb()
      .select({ action: auditEvents.action, actor: auditEvents.actorUserId, entityId: auditEvents.entityId })
      .from(auditEvents)
      .where(and(eq(auditEvents.organizationId, lab.id), eq(auditEvents.entityType, 'coating')))
      .orderBy(auditEvents.id);
    expect(rows).toEqual([
      { action: 'coating.watch', actor: admin.userId, entityId: coatingId },
      { action: 'coating.unwatch', actor: admin.userId, entityId: coatingId },
    ]);
  });
});

describe('the Origin check of mutations', () => {
  it('compares scheme, host and port with APP_URL', async () => {
    const { admin, coatingId, params } = await labWithCoating();
    const app = new URL(APP_ORIGIN);
    const put = (origin: string) =>
      watch(apiRequest(`/api/coatings/${coatingId}/watch`, { method: 'PUT', sessionId: admin.sessionId, origin }), params);
    for (const origin of [
      `${app.protocol === 'http:' ? 'https:' : 'http:'}//${app.host}`,
      `${app.protocol}//${app.hostname}:1`,
      'http://evil.example',
      'null',
    ]) {
      const response = await put(origin);
      expect(response.status, origin).toBe(403);
      expect(((await response.json()) as { error: { code: string } }).error.code).toBe('bad_origin');
    }
    expect((await put(APP_ORIGIN)).status).toBe(200);
  });
});
