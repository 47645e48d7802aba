// The text of every e-mail the product sends (plain text and a simple HTML twin).
import { ROLE_LABELS, type Role } from '@/shared/domain/roles';

export type MessageBody = { subject: string; text: string; html: string };

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function htmlOf(paragraphs: string[], link: { href: string; label: string }): string {
  const ps = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html><html><body>\n${ps}\n<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>\n</body></html>`;
}

export function inviteMessage(p: { teamName: string; inviterName: string; role: Role; link: string; expiresAt: Date }): MessageBody {
  const lines = [
    `${p.inviterName} invited you to join ${p.teamName} on Trimwire as ${ROLE_LABELS[p.role].toLowerCase()}.`,
    `Choose a password to accept. The link works once and expires on ${p.expiresAt.toUTCString()}.`,
    'If you did not expect this, ignore this message.',
  ];
  return {
    subject: `You're invited to ${p.teamName} on Trimwire`,
    text: `${lines.join('\n\n')}\n\n${p.link}\n`,
    html: htmlOf(lines, { href: p.link, label: 'Choose a password' }),
  };
}

export function resetMessage(p: { name: string; link: string; expiresAt: Date }): MessageBody {
  const lines = [
    `Hello ${p.name},`,
    `Someone asked to reset your Trimwire password. Choose a new one with the link below; it works once and expires on ${p.expiresAt.toUTCString()}.`,
    'If you did not ask for this, ignore this message; your password stays as it is.',
  ];
  return {
    subject: 'Reset your Trimwire password',
    text: `${lines.join('\n\n')}\n\n${p.link}\n`,
    html: htmlOf(lines, { href: p.link, label: 'Choose a new password' }),
  };
}
