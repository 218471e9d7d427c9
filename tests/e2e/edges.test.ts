/**
 * The product's edges as a client on the network sees them, over plain HTTP against the server
 * that `npm test` started (scripts/serve.ts in front of Next.js).
 */
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';
import { postSignInForm } from '@/scripts/sign-in-form';
import { BASE_URL } from './support/browser';

const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => undefined });

afterAll(async () => {
  await sql.end();
});

describe('sign-in throttling over HTTP', () => {
  it('a guesser rotating X-Forwarded-For is counted by the address it connects from', async () => {
    const email = `guessed-${randomBytes(4).toString('hex')}@lab.example`;
    const answers: string[] = [];
    for (let i = 0; i < 8; i++) {
      const answer = await postSignInForm(
        BASE_URL,
        { email, password: `guess ${i}` },
        { 'x-forwarded-for': `198.51.100.${i + 1}`, 'x-real-ip': `198.51.100.${i + 1}` },
      );
      expect(answer.cookie).toBeNull();
      answers.push(/Too many failed sign-in attempts/.test(answer.html) ? 'slowed' : 'checked');
    }
    // Three free guesses, then waits that double: quick guesses after them are not checked.
    expect(answers.slice(0, 3)).toEqual(['checked', 'checked', 'checked']);
    expect(answers).toContain('slowed');
    const rows = await sql<{ address: string }[]>`
      select ip_address as address from sign_in_attempts where email = ${email}`;
    expect(rows.length).toBeGreaterThanOrEqual(3);
    expect(new Set(rows.map((r) => r.address))).toEqual(new Set(['127.0.0.1']));
  });
});
