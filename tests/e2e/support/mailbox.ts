import type { Page } from 'playwright-core';
import { BASE_URL } from './browser';

/** The local mail stand-in's HTTP API (scripts/services/mail-fake.ts), started by `npm test`. */
export const MAILBOX = process.env.MAIL_FAKE_URL;

export type Mail = { id: string; to: string[]; subject: string; text: string; html: string };

/** Waits for the mail worker to deliver a mail to `to` whose subject matches. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 30_000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const response = await fetch(`${MAILBOX}/api/messages?to=${encodeURIComponent(to)}`);
    const mails = (await response.json()) as Mail[];
    const mail = mails.find((m) => subject.test(m.subject));
    if (mail) return mail;
    if (Date.now() > deadline)
      throw new Error(`no mail "${subject}" to ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

export function linkIn(mail: Mail): string {
  const match = /(https?:\/\/\S+token=[A-Za-z0-9_-]+)/.exec(mail.text);
  if (!match) throw new Error(`no link in: ${mail.text}`);
  // The mail links to APP_URL; the test server may be reached under another host name.
  const link = new URL(match[1]!);
  return `${BASE_URL}${link.pathname}${link.search}`;
}

/**
 * After "Create account": the page says to check the mail; the mailed link finishes the sign-up
 * and lands on the new lab's dashboard.
 */
export async function finishSignUpFromMail(page: Page, email: string): Promise<void> {
  await page.getByText(/Check your mail/).waitFor();
  const mail = await waitForMail(email, /^Finish creating your Beadline account$/);
  await page.goto(linkIn(mail));
  await page.getByRole('button', { name: 'Finish creating my account' }).click();
  await page.waitForURL(`${BASE_URL}/dashboard`);
}
