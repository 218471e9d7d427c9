/**
 * Forms that must not tell whether an address has an account do the account-dependent work
 * after their answer is sent (Next's after()), so the answer takes as long either way. Here
 * after() only collects the work, to show that the answer came first and held no lookup.
 */
import { afterAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { closeDb } from '@/db/client';
import { closeMailQueue } from '@/server/mail/queue';
import { requestPasswordResetAction } from '@/app/(auth)/account-actions';
import { signUp } from '@/app/(auth)/actions';
import { simulateRequest } from '../support/request';
import { createMember, createOrganization, uniqueEmail } from '../support/fixtures';
import { form, mailJobsTo } from '../team/support';

const deferred = vi.hoisted(() => ({ tasks: [] as Array<() => Promise<unknown>> }));

vi.mock('next/server', async (importOriginal) => ({
  ...(await importOriginal<typeof import('next/server')>()),
  after: (task: () => Promise<unknown>) => {
    deferred.tasks.push(task);
  },
}));

async function runDeferred(): Promise<void> {
  const tasks = deferred.tasks.splice(0);
  for (const task of tasks) await task();
}

beforeEach(() => {
  deferred.tasks.length = 0;
});

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

describe('the answer comes before any work that depends on the address', () => {
  it('password reset: known and unknown addresses are answered alike, the mail is queued afterwards', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'analyst');
    const unknown = uniqueEmail('nobody');
    simulateRequest({ sessionId: null });
    const known = await requestPasswordResetAction({}, form({ email: member.email }));
    simulateRequest({ sessionId: null });
    const other = await requestPasswordResetAction({}, form({ email: unknown }));
    expect(known.notice?.replace(member.email, '<email>')).toBe(other.notice?.replace(unknown, '<email>'));
    expect(deferred.tasks).toHaveLength(2);
    expect(await mailJobsTo(member.email)).toHaveLength(0);
    await runDeferred();
    expect(await mailJobsTo(member.email)).toHaveLength(1);
    expect(await mailJobsTo(unknown)).toHaveLength(0);
  });

  it('sign-up: an existing and a new address are answered alike, the mails are queued afterwards', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'viewer');
    const fresh = uniqueEmail('fresh');
    const fields = { name: 'Ida Alike', password: 'a long enough password', organizationName: 'Alike Lab' };
    simulateRequest({ sessionId: null, clientAddress: '10.44.0.1' });
    const existing = await signUp({}, form({ ...fields, email: member.email }));
    simulateRequest({ sessionId: null, clientAddress: '10.44.0.1' });
    const created = await signUp({}, form({ ...fields, email: fresh }));
    expect(existing.notice?.replace(member.email, '<email>')).toBe(created.notice?.replace(fresh, '<email>'));
    expect(deferred.tasks).toHaveLength(2);
    expect(await mailJobsTo(member.email)).toHaveLength(0);
    expect(await mailJobsTo(fresh)).toHaveLength(0);
    await runDeferred();
    expect((await mailJobsTo(member.email))[0]?.data.kind).toBe('sign-up-existing-account');
    expect((await mailJobsTo(fresh))[0]?.data.kind).toBe('sign-up');
  });
});
