import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { checkCredentials, INVALID_CREDENTIALS_MESSAGE, SIGN_IN_LIMITS } from '@/lib/auth/sign-in';
import { createMember, createOrganization, TEST_PASSWORD, uniqueEmail } from '../support/fixtures';

const address = () => `10.9.${randomBytes(1)[0]}.${randomBytes(1)[0]}`;
let email: string;

beforeAll(async () => {
  const lab = await createOrganization();
  email = (await createMember(lab.id, 'analyst')).email;
});

afterAll(async () => {
  await closeDb();
});

describe('checkCredentials', () => {
  it('accepts the right password', async () => {
    const outcome = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress: address() });
    expect(outcome.ok).toBe(true);
  });

  it('says exactly the same for an unknown e-mail and a wrong password', async () => {
    const wrongPassword = await checkCredentials({ email, password: 'not the password', ipAddress: address() });
    const unknownEmail = await checkCredentials({
      email: uniqueEmail('nobody'),
      password: TEST_PASSWORD,
      ipAddress: address(),
    });
    expect(wrongPassword).toEqual(unknownEmail);
    expect(wrongPassword).toEqual({
      ok: false,
      code: 'invalid_credentials',
      message: INVALID_CREDENTIALS_MESSAGE,
    });
  });

  it('pauses an account after too many failures, even with the right password', async () => {
    const lab = await createOrganization();
    const target = (await createMember(lab.id, 'viewer')).email;
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      const outcome = await checkCredentials({ email: target, password: `guess ${i}`, ipAddress: address() });
      expect(outcome).toMatchObject({ ok: false, code: 'invalid_credentials' });
    }
    const blocked = await checkCredentials({ email: target, password: TEST_PASSWORD, ipAddress: address() });
    expect(blocked).toMatchObject({ ok: false, code: 'too_many_attempts' });
  });

  it('pauses a network address that tries many accounts', async () => {
    const ipAddress = address();
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress; i++) {
      await checkCredentials({ email: uniqueEmail('spray'), password: 'x', ipAddress });
    }
    const blocked = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress });
    expect(blocked).toMatchObject({ ok: false, code: 'too_many_attempts' });
    const otherAddress = await checkCredentials({ email, password: TEST_PASSWORD, ipAddress: address() });
    expect(otherAddress.ok).toBe(true);
  });
});
