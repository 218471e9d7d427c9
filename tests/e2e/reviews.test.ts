import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';
import { waitForMail } from './support/mailbox';

let browser: Browser;
/** The certificate link of the review page, for the test of its job. */
let certificateHref: string | null = null;

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
  await page
    .getByRole('table', { name: 'Waiting for review' })
    .getByRole('link', { name: new RegExp(lot) })
    .first()
    .click();
  await page.getByRole('heading', { name: new RegExp(`Review of .*${lot}`) }).waitFor();
}

describe('review and sign-off', () => {
  it('a reviewer rejects with a comment, then approves the resubmission with their password', async () => {
    const analyst = await as('analyst@kestrel.example');
    await submit(analyst, 'PP-Print · F-2612', 'Plasma dose checked on the line');

    // The reviewer is told by mail, and the mail opens the review.
    const mail = await waitForMail(
      'reviewer@kestrel.example',
      /^Results to review: PP-Print F-2612/,
    );
    expect(mail.text).toContain('Plasma dose checked on the line');
    const reviewPath = /\/reviews\/[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
    expect(reviewPath).toBeTruthy();
    const reviewer = await as('reviewer@kestrel.example');
    await reviewer.goto(`${BASE_URL}${reviewPath}`);
    await reviewer.getByRole('heading', { name: /Review of .*F-2612/ }).waitFor();
    // Each drop with its photo and overlay, opening its drop page; the batch's verdict; the certificate.
    const drops = reviewer.getByTestId('review-drop');
    expect(await drops.count()).toBeGreaterThan(0);
    const photo = drops.first().getByRole('img');
    await photo.waitFor();
    expect(
      await photo.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0),
    ).toBe(true);
    expect(await drops.first().locator('svg line').count()).toBeGreaterThanOrEqual(3);
    expect(await drops.first().getByRole('link').getAttribute('href')).toMatch(/^\/drops\/[^/]+$/);
    const verdicts = reviewer.getByTestId('review-verdicts');
    expect(await verdicts.getByRole('row').count()).toBeGreaterThan(1);
    expect(await verdicts.textContent()).toMatch(/Pass|Fail|Not enough data|No spec/);
    expect(await reviewer.getByTestId('certificate-preview').getAttribute('href')).toMatch(
      /^\/api\/batches\/[^/]+\/report$/,
    );
    certificateHref = await reviewer.getByTestId('certificate-preview').getAttribute('href');
    // Rejecting needs a reason.
    await reviewer.getByRole('button', { name: 'Reject' }).click();
    await reviewer.getByText('Say why the results are rejected').waitFor();
    await reviewer.getByLabel(/Comment/).fill('Repeat P2: drops look contaminated.');
    await reviewer.getByRole('button', { name: 'Reject' }).click();
    await reviewer
      .getByTestId('review-outcome')
      .getByRole('heading', { name: 'Rejected' })
      .waitFor({ timeout: 30_000 });
    expect(await reviewer.getByTestId('review-outcome').textContent()).toContain('Repeat P2');

    // Resubmitted; a wrong password does not sign, the right one does.
    await submit(analyst, 'PP-Print · F-2612', 'Checked again');
    await openReview(reviewer, 'F-2612');
    await reviewer.getByLabel(/Your password/).fill('not my password');
    await reviewer.getByRole('button', { name: 'Approve and sign' }).click();
    await reviewer.getByText('That password is not right').waitFor({ timeout: 30_000 });
    await reviewer.getByLabel(/Your password/).fill(DEMO_PASSWORD);
    await reviewer.getByRole('button', { name: 'Approve and sign' }).click();
    await reviewer
      .getByRole('heading', { name: 'Approved and signed' })
      .waitFor({ timeout: 30_000 });
    expect(await reviewer.getByTestId('review-outcome').textContent()).toMatch(/Ines Okafor/);
    await analyst.context().close();
    await reviewer.context().close();
  }, 180_000);

  it('the certificate preview of a review is prepared by a job, then served as a PDF', async () => {
    expect(certificateHref).toBeTruthy();
    const reviewer = await as('reviewer@kestrel.example');
    // The certificate is prepared by a job: 202 with a page that reloads, then the PDF.
    const certificate = `${BASE_URL}${certificateHref}`;
    let answer = await reviewer.request.get(certificate);
    if (answer.status() === 202) expect(await answer.text()).toContain('being prepared');
    for (let i = 0; i < 150 && answer.status() === 202; i++) {
      await reviewer.waitForTimeout(1000);
      answer = await reviewer.request.get(certificate);
    }
    expect(answer.status()).toBe(200);
    expect(answer.headers()['content-type']).toBe('application/pdf');
    expect((await answer.body()).subarray(0, 5).toString()).toBe('%PDF-');
    await reviewer.context().close();
  }, 180_000);

  it('viewers cannot open a review or decide one', async () => {
    const viewer = await as('viewer@kestrel.example');
    await viewer.goto(`${BASE_URL}/reviews`);
    expect(await viewer.getByRole('button', { name: 'Submit for review' }).count()).toBe(0);
    const status = await viewer.evaluate(async () => {
      const res = await fetch('/api/reviews', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: '{}',
      });
      return res.status;
    });
    expect(status).toBe(403);
    await viewer.context().close();
  });
});
