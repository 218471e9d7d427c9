import { randomBytes } from 'node:crypto';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, launchBrowser, signIn } from './support/browser';
import { MAILBOX, finishSignUpFromMail, linkIn, waitForMail } from './support/mailbox';

async function signUp(
  page: Page,
  input: { name: string; email: string; password: string; lab: string },
) {
  await page.goto(`${BASE_URL}/sign-up`);
  await page.getByLabel('Your name').fill(input.name);
  await page.getByLabel('Work e-mail').fill(input.email);
  await page.getByLabel('Password').fill(input.password);
  await page.getByLabel('Lab or organization').fill(input.lab);
  await page.getByRole('button', { name: 'Create account' }).click();
  await finishSignUpFromMail(page, input.email);
}

async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await page.waitForURL(/\/sign-in/);
}

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe.skipIf(!MAILBOX)('team by e-mail', () => {
  it('an admin invites; the invitee follows the mailed link, sets a password and works with the invited role', async () => {
    const suffix = randomBytes(4).toString('hex');
    const adminEmail = `e2e-admin-${suffix}@lab.example`;
    const inviteeEmail = `e2e-invitee-${suffix}@lab.example`;
    const adminContext = await browser.newContext();
    const admin = await adminContext.newPage();
    await signUp(admin, {
      name: 'Ines Admin',
      email: adminEmail,
      password: 'admin password 2026',
      lab: 'Gannet Coatings Lab',
    });
    // The sign-up link proved the address: no reminder to confirm it.
    expect(await admin.getByText('Confirm your e-mail address').count()).toBe(0);

    await admin.goto(`${BASE_URL}/team`);
    await admin.getByLabel('E-mail', { exact: true }).fill(inviteeEmail);
    await admin.getByLabel('Role', { exact: true }).selectOption('reviewer');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByText(`Invitation sent to ${inviteeEmail}`).waitFor();
    await admin.reload();
    await admin.getByRole('cell', { name: inviteeEmail, exact: true }).waitFor();

    const mail = await waitForMail(inviteeEmail, /^Join Gannet Coatings Lab on Beadline$/);
    expect(mail.text).toContain('Ines Admin invited you');
    expect(mail.html).toContain('Accept the invitation');

    const inviteeContext = await browser.newContext();
    const invitee = await inviteeContext.newPage();
    await invitee.goto(linkIn(mail));
    await invitee.getByText('as Reviewer').waitFor();
    await invitee.getByLabel('Your name').fill('Tomas Invitee');
    await invitee.getByLabel('Password').fill('short');
    await invitee.getByRole('button', { name: 'Create account and join' }).click();
    await invitee.getByText('Use at least 10 characters').waitFor();
    expect(await invitee.getByLabel('Your name').inputValue()).toBe('Tomas Invitee');
    await invitee.getByLabel('Password').fill('invitee password 2026');
    await invitee.getByRole('button', { name: 'Create account and join' }).click();
    await invitee.waitForURL(`${BASE_URL}/dashboard`);
    expect(await invitee.getByRole('heading', { level: 1 }).textContent()).toBe(
      'Gannet Coatings Lab',
    );

    await signOut(invitee);
    await signIn(invitee, inviteeEmail, 'invitee password 2026');
    expect(await invitee.getByText('Reviewer · Tomas Invitee').count()).toBe(1);
    const nav = invitee.getByRole('navigation', { name: 'Sections' });
    expect(await nav.getByRole('link', { name: 'Team', exact: true }).count()).toBe(0);
    expect(await nav.getByRole('link', { name: 'Audit log', exact: true }).count()).toBe(0);

    // The link works once.
    await invitee.goto(linkIn(mail));
    await invitee.getByText(/already used/).waitFor();

    // The admin sees the new member and the trail of it all.
    await admin.goto(`${BASE_URL}/team`);
    await admin.getByRole('cell', { name: 'Tomas Invitee', exact: true }).waitFor();
    await admin
      .getByRole('navigation', { name: 'Sections' })
      .getByRole('link', { name: 'Audit log' })
      .click();
    await admin.waitForURL(`${BASE_URL}/audit`);
    await admin.getByRole('cell', { name: 'invitation.accept', exact: true }).waitFor();
    expect(await admin.getByRole('cell', { name: 'invitation.create', exact: true }).count()).toBe(
      1,
    );
    await admin.getByLabel('Action').selectOption('invitation.create');
    await admin.getByRole('button', { name: 'Filter' }).click();
    await admin.waitForURL(/action=invitation\.create/);
    expect(await admin.getByRole('cell', { name: 'invitation.accept', exact: true }).count()).toBe(
      0,
    );

    await adminContext.close();
    await inviteeContext.close();
  });

  it('password reset by e-mail, end to end', async () => {
    const email = `e2e-reset-${randomBytes(4).toString('hex')}@lab.example`;
    const context = await browser.newContext();
    const page = await context.newPage();
    await signUp(page, {
      name: 'Pia Forgetful',
      email,
      password: 'first password 2026',
      lab: 'Petrel Surface Lab',
    });
    await signOut(page);

    await page.getByRole('link', { name: 'Forgot password?' }).click();
    await page.waitForURL(`${BASE_URL}/forgot-password`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await page.getByText(`If ${email} has a Beadline account`).waitFor();

    const mail = await waitForMail(email, /^Set a new Beadline password$/);
    await page.goto(linkIn(mail));
    await page.getByLabel('New password').fill('second password 2026');
    await page.getByRole('button', { name: 'Set new password' }).click();
    await page.waitForURL(/\/sign-in\?reason=password-reset/);
    await page.getByText('Your password was changed').waitFor();

    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('first password 2026');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText(/do not match an account/).waitFor();
    await signIn(page, email, 'second password 2026');
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Petrel Surface Lab');

    await page.goto(linkIn(mail));
    await page.getByText(/already used/).waitFor();
    await context.close();
  });
});
