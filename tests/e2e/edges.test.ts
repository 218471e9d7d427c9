/**
 * The product's edges as a client on the network sees them, over plain HTTP against the server
 * that `npm test` started (scripts/serve.ts in front of Next.js).
 */
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import postgres from 'postgres';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { postSignInForm } from '@/scripts/sign-in-form';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

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

describe('security headers', () => {
  it('every page has a Content-Security-Policy with a fresh nonce that its own scripts carry', async () => {
    const policies: string[] = [];
    for (let i = 0; i < 2; i++) {
      const response = await fetch(`${BASE_URL}/sign-in`);
      const html = await response.text();
      const policy = response.headers.get('content-security-policy') ?? '';
      const nonce = /'nonce-([^']+)'/.exec(policy)?.[1];
      expect(nonce, policy).toBeTruthy();
      expect(policy).toContain("'wasm-unsafe-eval'");
      expect(policy).toContain("frame-ancestors 'none'");
      expect(policy).toContain("object-src 'none'");
      const scriptSrc = policy.split(';').find((d) => d.trim().startsWith('script-src')) ?? '';
      expect(scriptSrc).not.toContain("'unsafe-inline'");
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
      policies.push(policy);
    }
    expect(policies[0]).not.toBe(policies[1]);
  });

  it.each(['/sign-in', '/sign-up', '/api/health'])('%s sends nosniff, no framing and a referrer policy', async (route) => {
    const response = await fetch(`${BASE_URL}${route}`);
    await response.arrayBuffer();
    expect(response.headers.get('x-content-type-options')).toBe('nosniff');
    expect(response.headers.get('x-frame-options')).toBe('DENY');
    expect(response.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(response.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
  });

  /** A signed-in page that records every policy violation and page error it meets. */
  async function watchedPage(email: string) {
    const browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    const page = await context.newPage();
    const violations: string[] = [];
    await page.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (event) => {
        console.error(
          `CSP violation: ${event.violatedDirective} ${event.blockedURI} at ${event.sourceFile}:${event.lineNumber} on ${location.pathname}`,
        );
      });
    });
    page.on('console', (message) => {
      if (/CSP violation|Content Security Policy/i.test(message.text())) violations.push(message.text());
    });
    page.on('pageerror', (error) => violations.push(`page error: ${error.message}`));
    await signIn(page, email, DEMO_PASSWORD);
    return { browser, page, violations };
  }

  it('the measurement workspace still analyses a photo in Chromium under the policy', async () => {
    // As the admin: the photo stays in its uploader's strip, waiting for a sample, and the
    // analyst's strip belongs to tests/e2e/measure.test.ts.
    const { browser, page, violations } = await watchedPage('admin@kestrel.example');
    try {
      await page.goto(`${BASE_URL}/measure`);
      await page
        .getByTestId('photo-input')
        .setInputFiles([path.resolve(__dirname, '../../fixtures/drops/cap-60-noisy.png')]);
      const table = page.getByRole('table', { name: 'Photos' });
      await table.getByRole('button', { name: 'cap-60-noisy.png', exact: true }).click({ timeout: 60_000 });
      await page.getByTestId('angle-left').waitFor({ timeout: 60_000 });
      // The fixture was rendered at 60° (fixtures/drops/manifest.json); analysed in the worker.
      const left = Number.parseFloat((await page.getByTestId('angle-left').textContent()) ?? 'NaN');
      expect(left).toBeGreaterThan(58);
      expect(left).toBeLessThan(62);
      expect(violations).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('the signed-in pages and their forms run under the policy without a violation', async () => {
    const { browser, page, violations } = await watchedPage('admin@kestrel.example');
    try {
      for (const route of [
        '/dashboard',
        '/coatings',
        '/batches',
        '/sessions',
        '/probe-liquids',
        '/compare',
        '/surface-energy',
        '/tensiometry',
        '/reviews',
        '/team',
        '/audit',
      ]) {
        await page.goto(`${BASE_URL}${route}`);
        await page.waitForLoadState('networkidle');
      }
      expect(violations).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
