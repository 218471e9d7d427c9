import { randomBytes } from 'node:crypto';
import type { APIRequestContext, Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS } from '@/db/demo';
import { SIGNATURE_HEADER, TIMESTAMP_HEADER, verifyWebhook } from '@/lib/webhooks/signature';
import { until } from '../support/until';
import { startReceiver, type Receiver } from '../support/webhook-receiver';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

/*
 * Issue 15, item 4, in Chromium: an admin registers a webhook on the Webhooks page (the test
 * server runs with WEBHOOK_ALLOW_PRIVATE=1, so a receiver on 127.0.0.1 is allowed), copies the
 * secret shown once, an import of angles changes a batch's verdict, the receiver gets the
 * signed event, and the delivery log shows it and sends it again.
 */

let browser: Browser;
let receiver: Receiver;

beforeAll(async () => {
  browser = await launchBrowser();
  receiver = await startReceiver();
});

afterAll(async () => {
  await browser?.close();
  await receiver?.close();
});

const emailOf = (role: string) => DEMO_USERS.find((u) => u.role === role)!.email;

/** POST JSON as the signed-in page's user, from the app's origin (as the page would). */
async function post(request: APIRequestContext, path: string, data: unknown) {
  const response = await request.post(`${BASE_URL}${path}`, {
    data,
    headers: { origin: BASE_URL },
  });
  const body = (await response.json()) as Record<string, { id: string }>;
  expect(response.status(), JSON.stringify(body)).toBeLessThan(300);
  return Object.values(body)[0]!;
}

describe('webhooks page', () => {
  it('an admin registers a webhook, sees the secret once, and follows its delivery in the log', async () => {
    const context = await browser.newContext();
    const page: Page = await context.newPage();
    page.setDefaultTimeout(60_000);
    await signIn(page, emailOf('admin'), DEMO_PASSWORD);

    await page.goto(`${BASE_URL}/team`);
    await page.getByRole('link', { name: 'Webhooks' }).click();
    await page.waitForURL(`${BASE_URL}/team/webhooks`);
    const path = `/hooks/${randomBytes(4).toString('hex')}`;
    const url = receiver.url(path);

    // Not an http(s) address: the form says what to do and keeps what was typed.
    await page.getByLabel('Receiving address').fill('ftp://files.example.com/in');
    await page.getByRole('button', { name: 'Register webhook' }).click();
    await page.getByText('Enter a full http:// or https:// address').first().waitFor();
    expect(await page.getByLabel('Receiving address').inputValue()).toBe(
      'ftp://files.example.com/in',
    );

    await page.getByLabel('Receiving address').fill(url);
    await page.getByLabel('What it is for').fill('LIMS release queue');
    await page.getByLabel(/Analysis saved/).uncheck();
    await page.getByLabel(/Review decided/).uncheck();
    await page.getByLabel(/Batch verdict changed/).check();
    await page.getByRole('button', { name: 'Register webhook' }).click();
    await page.getByText('Copy its signing secret now').waitFor();
    const secret = await page.getByLabel('Signing secret').inputValue();
    expect(secret).toMatch(/^whsec_/);
    await page.reload();
    await page.getByRole('link', { name: url }).waitFor();
    // Shown once: not on the page any more.
    expect(await page.content()).not.toContain(secret);

    // A batch of the admin's own whose imported angles give it its first verdict.
    const code = `WH-${randomBytes(3).toString('hex').toUpperCase()}`;
    const coating = await post(context.request, '/api/coatings', {
      code,
      name: 'Webhook test topcoat',
    });
    const batch = await post(context.request, '/api/batches', {
      coatingId: coating.id,
      lotCode: `L-${code}`,
      producedOn: '2026-11-30',
    });
    await post(context.request, '/api/samples', { batchId: batch.id, label: 'P-01' });
    const csv = [
      'Sample label,Probe liquid,Left angle (°),Right angle (°),Measured at,Operator,Note',
      'P-01,Water,104.2,103.8,2026-11-30 10:30,K. Operator,',
    ].join('\n');
    const imported = await context.request.post(`${BASE_URL}/api/batches/${batch.id}/import`, {
      data: { csv },
      headers: { origin: BASE_URL },
    });
    expect(imported.status()).toBeLessThan(300);

    // Within one retry (the first waits 30–60 s) should the first attempt meet a busy server.
    const received = await until(() => receiver.received, (r) => r.length > 0, 90_000);
    expect(received).toHaveLength(1);
    const first = received[0]!;
    expect(
      verifyWebhook(
        secret,
        {
          signature: first.headers[SIGNATURE_HEADER] as string,
          timestamp: first.headers[TIMESTAMP_HEADER] as string,
        },
        first.body,
      ),
    ).toEqual({ ok: true });
    const event = JSON.parse(first.body);
    expect(event).toMatchObject({
      type: 'batch.verdict_changed',
      data: { batchId: batch.id, lotCode: `L-${code}`, previous: null },
    });

    // The log: delivered, one attempt, answer 200; "Send again" sends the same event.
    await page.getByRole('link', { name: url }).click();
    await page.getByRole('heading', { name: 'Webhook deliveries' }).waitFor();
    const row = page.getByRole('row', { name: /batch\.verdict_changed/ });
    await row.getByText('Delivered').waitFor();
    await row.getByRole('cell', { name: '200', exact: true }).waitFor();
    await row.getByRole('button', { name: /Send the batch\.verdict_changed event/ }).click();
    await page.getByText('Queued to be sent again now.').waitFor();
    await until(() => receiver.received, (r) => r.length >= 2, 30_000);
    expect(receiver.received[1]!.body).toBe(first.body);
    await page.reload();
    await page.getByRole('row', { name: /batch\.verdict_changed/ }).getByText('Delivered').waitFor();

    // Deleted with its log: the demo organization's later events go nowhere.
    await page.getByRole('link', { name: 'All webhooks' }).click();
    await page.getByRole('button', { name: `Delete the webhook for ${url}` }).click();
    // The row goes (and its button with it) once the page is refreshed from the server.
    await page.getByRole('link', { name: url }).waitFor({ state: 'detached' });
    await page.reload();
    expect(await page.getByRole('link', { name: url }).count()).toBe(0);
    await context.close();
  }, 240_000);

  it('an analyst is refused the page', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, emailOf('analyst'), DEMO_PASSWORD);
    const response = await page.goto(`${BASE_URL}/team/webhooks`);
    expect(response?.status()).toBe(403);
    expect(await page.getByLabel('Receiving address').count()).toBe(0);
    await context.close();
  });
});
