import { afterAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { closeMailQueue } from '@/server/mail/queue';
import { signIn } from '@/app/(auth)/actions';
import SignInPage from '@/app/(auth)/sign-in/page';
import { simulateRequest } from '../support/request';
import { createMember, createOrganization, TEST_PASSWORD } from '../support/fixtures';
import { form, redirectOf } from '../team/support';

afterAll(async () => {
  await closeMailQueue();
  await closeDb();
});

/**
 * Targets that a browser would follow to another site: a backslash or a tab turns "/x" into
 * "//x" in its URL parser, and a path that normalises to "//host" is protocol-relative.
 * The form field holds them decoded, as the sign-in page passes `next` on.
 */
const FOREIGN_TARGETS = [
  '//evil.example/x',
  '/\\evil.example/x',
  '\\\\evil.example',
  '/\t/evil.example',
  '/\n/evil.example',
  '/%09/evil.example',
  '/%5Cevil.example',
  '/%2F%2Fevil.example',
  '/./\\evil.example',
  '/.//evil.example',
  'https://evil.example/x',
  'http:evil.example',
  'javascript:alert(1)',
  '  //evil.example',
  'evil.example',
];

describe('sign-in redirects only to a path of this site', () => {
  it.each(FOREIGN_TARGETS)('refuses next=%j and goes to the dashboard', async (next) => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'analyst');
    simulateRequest({ sessionId: null });
    const target = await redirectOf(
      signIn({}, form({ email: member.email, password: TEST_PASSWORD, next })),
    );
    expect(target).toBe('/dashboard');
  });

  it('keeps a path of this site with its query', async () => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'analyst');
    simulateRequest({ sessionId: null });
    const target = await redirectOf(
      signIn(
        {},
        form({ email: member.email, password: TEST_PASSWORD, next: '/invitations/accept?token=abc' }),
      ),
    );
    expect(target).toBe('/invitations/accept?token=abc');
  });

  it.each(FOREIGN_TARGETS)('the sign-in page of a signed-in user refuses next=%j', async (next) => {
    const lab = await createOrganization();
    const member = await createMember(lab.id, 'viewer');
    simulateRequest({ sessionId: member.sessionId });
    const target = await redirectOf(SignInPage({ searchParams: Promise.resolve({ next }) }));
    expect(target).toBe('/dashboard');
  });
});
