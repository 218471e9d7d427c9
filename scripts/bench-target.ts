/**
 * What the load benchmarks share: the running Beadline they measure (loopback only, so they can
 * never load someone else's server), signing in as a demo user, and percentiles.
 */
import { DEMO_PASSWORD, DEMO_USERS } from '../db/demo';
import { postSignInForm } from './sign-in-form';

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '[::1]', '::1']);

/** BENCH_URL, else APP_URL, else 127.0.0.1:$PORT (3000); exits unless it is a loopback address. */
export function benchOrigin(): string {
  const url = new URL(
    process.env.BENCH_URL ??
      process.env.APP_URL ??
      `http://127.0.0.1:${process.env.PORT ?? '3000'}`,
  );
  if (!LOOPBACK.has(url.hostname)) {
    console.error(`The benchmark runs against a loopback address only, not ${url.host}.`);
    process.exit(2);
  }
  return url.origin;
}

/** The session cookie of a demo user (db/demo.ts; the seeded demo must be there). */
export async function signInDemo(
  origin: string,
  role: (typeof DEMO_USERS)[number]['role'],
): Promise<string> {
  const email = DEMO_USERS.find((user) => user.role === role)!.email;
  const answer = await postSignInForm(origin, { email, password: DEMO_PASSWORD });
  if (!answer.cookie) {
    throw new Error(
      `Signing in as ${email} failed (status ${answer.status}). Is the demo seeded (npm start does it)?`,
    );
  }
  return answer.cookie;
}

/** The p-th percentile of ascending values (nearest rank). */
export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const index = Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1);
  return sorted[Math.max(0, index)]!;
}

export const ms = (v: number) => (Number.isFinite(v) ? `${Math.round(v)} ms` : '—');
