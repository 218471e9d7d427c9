/**
 * The mails Beadline sends: plain words, a text part and a simple HTML part, both carrying the
 * same link. Pure functions, so they are tested without a mail server.
 */
import { ROLE_LABELS, type Role } from '@/lib/auth/permissions';

export type MailMessage = {
  to: string;
  subject: string;
  text: string;
  html: string;
};

function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

function formatDate(date: Date): string {
  return date.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

/** Wraps paragraphs and one button-like link in Beadline's plain mail layout. */
function layout(input: {
  paragraphs: string[];
  link: { href: string; label: string };
  footer: string;
}) {
  const body = input.paragraphs
    .map((p) => `<p style="margin:0 0 16px;line-height:1.5">${escapeHtml(p)}</p>`)
    .join('\n');
  const href = escapeHtml(input.link.href);
  return `<!doctype html>
<html lang="en"><body style="margin:0;background:#f4f7f7;font-family:Helvetica,Arial,sans-serif;color:#1b2a2b">
<div style="max-width:560px;margin:0 auto;padding:24px">
<p style="margin:0 0 24px;font-size:18px;font-weight:600;color:#134f52">Beadline</p>
<div style="background:#ffffff;border:1px solid #d9e2e2;border-radius:8px;padding:24px">
${body}
<p style="margin:24px 0"><a href="${href}" style="background:#134f52;color:#ffffff;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(input.link.label)}</a></p>
<p style="margin:0;font-size:13px;color:#5b6b6c">If the button does not work, open this address: <a href="${href}" style="color:#134f52">${href}</a></p>
</div>
<p style="margin:16px 0 0;font-size:12px;color:#5b6b6c">${escapeHtml(input.footer)}</p>
</div></body></html>`;
}

function text(lines: string[]): string {
  return `${lines.join('\n\n')}\n\n-- \nBeadline\n`;
}

export function invitationMail(input: {
  to: string;
  organizationName: string;
  inviterName: string;
  role: Role;
  link: string;
  expiresAt: Date;
}): MailMessage {
  const role = ROLE_LABELS[input.role];
  const intro = `${input.inviterName} invited you to join ${input.organizationName} on Beadline as ${role.name} (${role.summary}).`;
  const expiry = `The link works once and until ${formatDate(input.expiresAt)}.`;
  const footer =
    'If you did not expect this invitation, ignore this mail; nothing happens without the link.';
  return {
    to: input.to,
    subject: `Join ${input.organizationName} on Beadline`,
    text: text([intro, `Accept the invitation: ${input.link}`, expiry, footer]),
    html: layout({
      paragraphs: [intro, expiry],
      link: { href: input.link, label: 'Accept the invitation' },
      footer,
    }),
  };
}

export function passwordResetMail(input: { to: string; name: string; link: string }): MailMessage {
  const intro = `Hello ${input.name}, someone (we hope you) asked to set a new Beadline password for ${input.to}.`;
  const expiry =
    'The link works once and for one hour. Setting a new password signs you out everywhere.';
  const footer = 'If you did not ask for this, ignore this mail; your password stays as it is.';
  return {
    to: input.to,
    subject: 'Set a new Beadline password',
    text: text([intro, `Set a new password: ${input.link}`, expiry, footer]),
    html: layout({
      paragraphs: [intro, expiry],
      link: { href: input.link, label: 'Set a new password' },
      footer,
    }),
  };
}

export function emailVerificationMail(input: {
  to: string;
  name: string;
  link: string;
}): MailMessage {
  const intro = `Hello ${input.name}, confirm that ${input.to} is your address so your lab can reach you through Beadline.`;
  const expiry = 'The link works once and for 7 days.';
  const footer = 'If you did not create a Beadline account, ignore this mail.';
  return {
    to: input.to,
    subject: 'Confirm your e-mail address for Beadline',
    text: text([intro, `Confirm your e-mail address: ${input.link}`, expiry, footer]),
    html: layout({
      paragraphs: [intro, expiry],
      link: { href: input.link, label: 'Confirm my e-mail address' },
      footer,
    }),
  };
}

/** A notice about lab results (review outcome, out-of-spec batch): paragraphs and one link. */
export function noticeMail(input: {
  to: string;
  subject: string;
  paragraphs: string[];
  link: { href: string; label: string };
  footer: string;
}): MailMessage {
  return {
    to: input.to,
    subject: input.subject,
    text: text([...input.paragraphs, `${input.link.label}: ${input.link.href}`, input.footer]),
    html: layout({ paragraphs: input.paragraphs, link: input.link, footer: input.footer }),
  };
}

export function signUpLinkMail(input: {
  to: string;
  name: string;
  organizationName: string;
  link: string;
}): MailMessage {
  const intro = `Hello ${input.name}, follow the link to finish creating your Beadline account and the lab ${input.organizationName}, with you as its admin.`;
  const expiry = 'The link works once and for 24 hours.';
  const footer = 'If you did not sign up for Beadline, ignore this mail; nothing is created without the link.';
  return {
    to: input.to,
    subject: 'Finish creating your Beadline account',
    text: text([intro, `Finish creating your account: ${input.link}`, expiry, footer]),
    html: layout({
      paragraphs: [intro, expiry],
      link: { href: input.link, label: 'Finish creating my account' },
      footer,
    }),
  };
}

export function signUpExistingAccountMail(input: {
  to: string;
  name: string;
  signInLink: string;
  resetLink: string;
}): MailMessage {
  const intro = `Hello ${input.name}, someone asked to create a Beadline account for ${input.to}. This address already has one, so nothing was created.`;
  const reset = `If that was you, sign in with your password. Forgot it? Set a new one: ${input.resetLink}`;
  const footer = 'If it was not you, ignore this mail; your account stays as it is.';
  return {
    to: input.to,
    subject: 'You already have a Beadline account',
    text: text([intro, `Sign in: ${input.signInLink}`, reset, footer]),
    html: layout({
      paragraphs: [intro, reset],
      link: { href: input.signInLink, label: 'Sign in' },
      footer,
    }),
  };
}
