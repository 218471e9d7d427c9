import { randomBytes } from 'node:crypto';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_USERS } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';
import { finishSignUpFromMail } from './support/mailbox';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('sign-up, sign-out, sign-in', () => {
  it('a new lab signs up, lands in its own shell, signs out and back in', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const email = `e2e-${randomBytes(4).toString('hex')}@lab.example`;
    const password = 'a sturdy password 42';

    await page.goto(`${BASE_URL}/sign-up`);
    await page.getByLabel('Your name').fill('Rosa Test');
    await page.getByLabel('Work e-mail').fill(email);
    await page.getByLabel('Password').fill(password);
    await page.getByLabel('Lab or organization').fill('Harbour Coatings Lab');
    await page.getByRole('button', { name: 'Create account' }).click();
    await finishSignUpFromMail(page, email);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Harbour Coatings Lab');
    const nav = page.getByRole('navigation', { name: 'Sections' });
    for (const section of ['Dashboard', 'Coatings', 'Batches', 'Measure', 'Compare', 'Surface energy', 'Reviews', 'Team']) {
      expect(await nav.getByRole('link', { name: section, exact: true }).count()).toBe(1);
    }
    // An empty lab shows honest empty states, not numbers.
    expect(await page.getByText('No drop photos have been measured').count()).toBe(1);

    await page.getByRole('button', { name: 'Sign out' }).first().click();
    await page.waitForURL(`${BASE_URL}/sign-in`);
    await page.goto(`${BASE_URL}/dashboard`);
    await page.waitForURL(/\/sign-in/);

    // Wrong password: a message, the e-mail kept in the form.
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('not my password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    // (Next's route announcer also has role=alert, so find the message by its words.)
    await page.getByText(/do not match an account/).waitFor();
    expect(await page.getByLabel('E-mail').inputValue()).toBe(email);

    await signIn(page, email, password);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Harbour Coatings Lab');
    await context.close();
  });

  it('sign-up with an invalid form names each field and keeps what was typed', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${BASE_URL}/sign-up`);
    await page.getByLabel('Your name').fill('Short Password');
    await page.getByLabel('Work e-mail').fill('not-an-email');
    await page.getByLabel('Password').fill('short');
    await page.getByLabel('Lab or organization').fill('Lab');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Enter a valid e-mail address').waitFor();
    expect(await page.getByText('Use at least 10 characters').count()).toBe(1);
    expect(await page.getByLabel('Your name').inputValue()).toBe('Short Password');
    await context.close();
  });
});

describe('each demo role signs in', () => {
  for (const user of DEMO_USERS) {
    it(`${user.role} (${user.email})`, async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signIn(page, user.email, DEMO_PASSWORD);
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe(DEMO_ORGANIZATION.name);
      const nav = page.getByRole('navigation', { name: 'Sections' });
      const teamLinks = await nav.getByRole('link', { name: 'Team', exact: true }).count();
      expect(teamLinks).toBe(user.role === 'admin' ? 1 : 0);
      const measureLinks = await nav.getByRole('link', { name: 'Measure', exact: true }).count();
      expect(measureLinks).toBe(user.role === 'admin' || user.role === 'analyst' ? 1 : 0);
      if (user.role !== 'admin') {
        const response = await page.goto(`${BASE_URL}/team`);
        expect(response?.status()).toBe(403);
        expect(await page.getByRole('heading', { level: 1 }).textContent()).toMatch(/cannot open this page/);
      }
      await context.close();
    });
  }
});
