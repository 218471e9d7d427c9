import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function as(email: string): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, email, DEMO_PASSWORD);
  return page;
}

async function submit(page: Page, batchLabel: string, note: string) {
  await page.goto(`${BASE_URL}/reviews`);
  await page.getByLabel('Batch').selectOption({ label: batchLabel });
  await page.getByLabel(/Note for the reviewer/).fill(note);
  await page.getByRole('button', { name: 'Submit for review' }).click();
  await page.getByText(/Submitted \d+ results? for review/).waitFor({ timeout: 30_000 });
}

async function openReview(page: Page, lot: string) {
  await page.goto(`${BASE_URL}/reviews`);
  await page.getByRole('table', { name: 'Waiting for review' }).getByRole('link', { name: new RegExp(lot) }).first().click();
  await page.getByRole('heading', { name: new RegExp(`Review of .*${lot}`) }).waitFor();
}

describe('review and sign-off', () => {
  it('a reviewer rejects with a comment, then approves the resubmission with their password', async () => {
    const analyst = await as('analyst@kestrel.example');
    await submit(analyst, 'PP-Print · F-2612', 'Plasma dose checked on the line');

    const reviewer = await as('reviewer@kestrel.example');
    await openReview(reviewer, 'F-2612');
    expect(await reviewer.getByTestId('review-rows').getByRole('row').count()).toBeGreaterThan(1);
    // Rejecting needs a reason.
    await reviewer.getByRole('button', { name: 'Reject' }).click();
    await reviewer.getByText('Say why the results are rejected').waitFor();
    await reviewer.getByLabel(/Comment/).fill('Repeat P2: drops look contaminated.');
    await reviewer.getByRole('button', { name: 'Reject' }).click();
    await reviewer.getByTestId('review-outcome').getByRole('heading', { name: 'Rejected' }).waitFor({ timeout: 30_000 });
    expect(await reviewer.getByTestId('review-outcome').textContent()).toContain('Repeat P2');

    // Resubmitted; a wrong password does not sign, the right one does.
    await submit(analyst, 'PP-Print · F-2612', 'Checked again');
    await openReview(reviewer, 'F-2612');
    await reviewer.getByLabel(/Your password/).fill('not my password');
    await reviewer.getByRole('button', { name: 'Approve and sign' }).click();
    await reviewer.getByText('That password is not right').waitFor({ timeout: 30_000 });
    await reviewer.getByLabel(/Your password/).fill(DEMO_PASSWORD);
    await reviewer.getByRole('button', { name: 'Approve and sign' }).click();
    await reviewer.getByRole('heading', { name: 'Approved and signed' }).waitFor({ timeout: 30_000 });
    expect(await reviewer.getByTestId('review-outcome').textContent()).toMatch(/Ines Okafor/);
    await analyst.context().close();
    await reviewer.context().close();
  });

  it('viewers cannot open a review or decide one', async () => {
    const viewer = await as('viewer@kestrel.example');
    await viewer.goto(`${BASE_URL}/reviews`);
    expect(await viewer.getByRole('button', { name: 'Submit for review' }).count()).toBe(0);
    const status = await viewer.evaluate(async () => {
      const res = await fetch('/api/reviews', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' });
      return res.status;
    });
    expect(status).toBe(403);
    await viewer.context().close();
  });
});
