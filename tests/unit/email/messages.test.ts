import { describe, expect, it } from 'vitest';
import { emailVerificationMail, invitationMail, passwordResetMail } from '@/lib/email/messages';

const link = 'http://127.0.0.1:3000/invitations/accept?token=abc_DEF-123';

describe('mail messages', () => {
  it('an invitation names the lab, the inviter, the role and the expiry, with the link in both parts', () => {
    const mail = invitationMail({
      to: 'new.person@lab.example',
      organizationName: 'Kestrel <Surface> Works',
      inviterName: 'Ada Admin',
      role: 'reviewer',
      link,
      expiresAt: new Date('2026-12-09T01:00:00Z'),
    });
    expect(mail.subject).toBe('Join Kestrel <Surface> Works on Beadline');
    expect(mail.text).toContain(
      'Ada Admin invited you to join Kestrel <Surface> Works on Beadline as Reviewer',
    );
    expect(mail.text).toContain(link);
    expect(mail.text).toContain('2026-12-09 01:00 UTC');
    expect(mail.text.trimEnd().endsWith('Beadline')).toBe(true);
    expect(mail.html).toContain(`href="${link}"`);
    // Names from users are escaped in the HTML part.
    expect(mail.html).toContain('Kestrel &lt;Surface&gt; Works');
    expect(mail.html).not.toContain('<Surface>');
  });

  it('a password reset says how long the link lasts and what happens', () => {
    const mail = passwordResetMail({
      to: 'a@lab.example',
      name: 'Ana',
      link: 'http://x/reset-password?token=t',
    });
    expect(mail.subject).toBe('Set a new Beadline password');
    expect(mail.text).toMatch(/one hour/);
    expect(mail.text).toMatch(/signs you out everywhere/);
    expect(mail.html).toContain('http://x/reset-password?token=t');
  });

  it('an address confirmation carries its link', () => {
    const mail = emailVerificationMail({
      to: 'a@lab.example',
      name: 'Ana',
      link: 'http://x/verify-email?token=t',
    });
    expect(mail.text).toContain('http://x/verify-email?token=t');
    expect(mail.html).toContain('Confirm my e-mail address');
  });
});
