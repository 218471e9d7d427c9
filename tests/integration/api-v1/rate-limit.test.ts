import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import * as coatings from '@/app/api/v1/coatings/route';
import { createMember, createOrganization } from '../support/fixtures';
import { makeToken, noParams, v1Request } from './support';

// Read when the first request comes in; this file runs in its own module graph.
process.env.API_RATE_LIMIT_PER_MINUTE = '5';

let tokenA: string;
let tokenB: string;

beforeAll(async () => {
  const lab = await createOrganization();
  const admin = await createMember(lab.id, 'admin');
  tokenA = (await makeToken(lab.id, admin.userId, 'read')).token;
  tokenB = (await makeToken(lab.id, admin.userId, 'read')).token;
});

afterAll(async () => {
  await closeDb();
});

describe('per-token rate limit', () => {
  it('answers 429 with Retry-After past the limit, for that token only', async () => {
    for (let i = 0; i < 5; i++) {
      expect((await coatings.GET(v1Request('/coatings', { token: tokenA }), noParams)).status).toBe(
        200,
      );
    }
    const limited = await coatings.GET(v1Request('/coatings', { token: tokenA }), noParams);
    expect(limited.status).toBe(429);
    const retryAfter = Number(limited.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(60);
    const body = await limited.json();
    expect(body.error.code).toBe('rate_limited');
    expect(body.retryAfterSeconds).toBe(retryAfter);
    expect((await coatings.GET(v1Request('/coatings', { token: tokenB }), noParams)).status).toBe(
      200,
    );
  });
});
