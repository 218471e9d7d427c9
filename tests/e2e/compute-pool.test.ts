/**
 * CPU-heavy work off the request thread (issue 12, failure 8), over plain HTTP against the
 * production server that `npm test` started: pendant-drop fits run in the compute pool
 * (server/compute/pool.ts, its worker file found from the production build), the server keeps
 * answering while they run, one user's fifth simultaneous calculation is 429 `busy`, and a
 * too-large input is refused without harm. Timing is measured by `npm run bench:compute`, not here.
 */
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS } from '@/db/demo';
import { MAX_PENDANT_EDGE_POINTS } from '@/lib/contracts/limits';
import { postSignInForm } from '@/scripts/sign-in-form';
import { pendantEdgeBody } from '../support/pendant-photo';
import { BASE_URL } from './support/browser';

async function signInAs(role: (typeof DEMO_USERS)[number]['role']): Promise<string> {
  const email = DEMO_USERS.find((user) => user.role === role)!.email;
  const answer = await postSignInForm(BASE_URL, { email, password: DEMO_PASSWORD });
  if (!answer.cookie) throw new Error(`signing in as ${email} answered ${answer.status}`);
  return answer.cookie;
}

function postPendant(cookie: string, body: string) {
  return fetch(`${BASE_URL}/api/tensiometry/pendant-drop`, {
    method: 'POST',
    headers: { cookie, origin: BASE_URL, 'content-type': 'application/json' },
    body,
  });
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('pendant-drop fits in the compute pool', () => {
  it('four 20 000-point fits leave the server answering; a fifth of the same user is 429 busy', async () => {
    // A viewer may compute (not save): issue 12 ran the fits as one.
    const cookie = await signInAs('viewer');
    const body = JSON.stringify(pendantEdgeBody(MAX_PENDANT_EDGE_POINTS));
    let finished = 0;
    const fits = Array.from({ length: 4 }, () =>
      postPendant(cookie, body).then(async (response) => {
        finished += 1;
        return { status: response.status, body: await response.json() };
      }),
    );
    // /api/health answers while the fits run, and says when all four are in the pool.
    for (let inFlight = 0; inFlight < 4;) {
      const health = await fetch(`${BASE_URL}/api/health`);
      expect(health.status).toBe(200);
      inFlight = (await health.json()).compute.inFlight;
      expect(finished).toBe(0);
      if (inFlight < 4) await sleep(100);
    }
    const busy = await postPendant(cookie, JSON.stringify(pendantEdgeBody(100)));
    // What this test is about: the answers came while the four fits were still running.
    expect(finished).toBe(0);
    expect(busy.status).toBe(429);
    expect(Number(busy.headers.get('retry-after'))).toBeGreaterThan(0);
    const refusal = await busy.json();
    expect(refusal.error.code).toBe('busy');
    expect(refusal.error.message).toMatch(/Wait for one to finish/);

    for (const fit of await Promise.all(fits)) {
      expect(fit.status, JSON.stringify(fit.body)).toBe(200);
      expect(fit.body.result.pointCount).toBe(MAX_PENDANT_EDGE_POINTS);
      expect(fit.body.result.surfaceTensionMilliNewtonPerM).toBeGreaterThan(0);
    }
    // The user's slots are free again, and a fit answers what the outline was rendered with:
    // the Young–Laplace equation (Bashforth & Adams 1883) at γ = 72.0 mN/m
    // (tests/support/pendant-photo.ts), within 0.5 %.
    const after = await postPendant(cookie, JSON.stringify(pendantEdgeBody(2_000)));
    expect(after.status).toBe(200);
    const gamma = (await after.json()).result.surfaceTensionMilliNewtonPerM;
    expect(Math.abs(gamma - 72) / 72).toBeLessThan(0.005);
    // Four 20 000-point fits take about 5 s of CPU each; the shared test machine may be slow.
  }, 600_000);

  it('refuses too-large inputs with the error body and keeps answering', async () => {
    const cookie = await signInAs('viewer');
    const tooMany = await postPendant(
      cookie,
      JSON.stringify(pendantEdgeBody(MAX_PENDANT_EDGE_POINTS + 2)),
    );
    expect(tooMany.status).toBe(400);
    const tooManyBody = await tooMany.json();
    expect(tooManyBody.error.code).toBe('invalid_input');
    expect(tooManyBody.error.fields.edge).toMatch(/At most 20,000 edge points; thin the outline/);

    const padded = JSON.stringify({ ...pendantEdgeBody(100), padding: 'x'.repeat(3 << 20) });
    const tooLarge = await postPendant(cookie, padded);
    expect(tooLarge.status).toBe(413);
    expect((await tooLarge.json()).error.code).toBe('payload_too_large');

    expect((await fetch(`${BASE_URL}/api/health`)).status).toBe(200);
  });
});
