// E-mail texts carry the working link and escape what people typed.
import { describe, expect, it } from 'vitest';
import { inviteMessage, resetMessage } from '@/server/mail/templates';

describe('mail templates', () => {
  const link = 'http://127.0.0.1:8080/set-password?token=abc_DEF-123';
  const expiresAt = new Date('2026-01-08T12:00:00Z');

  it('invite: team, role, expiry and the link in text and HTML', () => {
    const m = inviteMessage({ teamName: 'Larkspur Relay Works', inviterName: 'Maren Oduya', role: 'reviewer', link, expiresAt });
    expect(m.subject).toContain('Larkspur Relay Works');
    expect(m.text).toContain(link);
    expect(m.text).toContain('reviewer');
    expect(m.text).toContain('Thu, 08 Jan 2026 12:00:00 GMT');
    expect(m.html).toContain(`href="${link}"`);
  });

  it('escapes names in HTML', () => {
    const m = inviteMessage({ teamName: '<b>Evil</b> & Co', inviterName: 'x"y', role: 'viewer', link, expiresAt });
    expect(m.html).not.toContain('<b>Evil</b>');
    expect(m.html).toContain('&lt;b&gt;Evil&lt;/b&gt; &amp; Co');
  });

  it('reset: greets by name and carries the link', () => {
    const m = resetMessage({ name: 'Priya Hallett', link, expiresAt });
    expect(m.text).toContain('Hello Priya Hallett');
    expect(m.text).toContain(link);
  });
});
