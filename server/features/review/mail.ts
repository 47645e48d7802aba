// E-mails of the review workflow: reviewers hear when a scan leaves proposals to review, the
// person who started a scan hears when its proposals are decided. Each honours the recipient's
// notification choices; a mail that cannot be sent is logged and never fails the action.
import { Op } from 'sequelize';
import type { Db } from '@/server/db';
import type { Mailer } from '@/server/mail/mailer';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function body(lines: string[], link: string, label: string) {
  return {
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: `<!doctype html><html><body>\n${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('\n')}\n<p><a href="${escapeHtml(link)}">${escapeHtml(label)}</a></p>\n</body></html>`,
  };
}

type Log = (msg: string, err: unknown) => void;

export async function notifyReviewers(
  db: Db,
  mailer: Mailer,
  p: { teamId: string; designId: string; designName: string; revision: number; count: number; startedBy: string | null; publicUrl: string },
  log: Log,
): Promise<number> {
  const members = await db.models.Membership.findAll({ where: { teamId: p.teamId, role: { [Op.in]: ['reviewer', 'admin'] } }, include: [{ model: db.models.User, as: 'user' }] });
  const ids = members.map((m) => m.userId).filter((id) => id !== p.startedBy);
  const prefs = new Map((await db.models.NotificationPrefs.findAll({ where: { userId: { [Op.in]: ids } } })).map((x) => [x.userId, x]));
  let sent = 0;
  for (const m of members) {
    if (m.userId === p.startedBy || !m.user) continue;
    if (prefs.get(m.userId)?.reviewRequests === false) continue;
    const link = `${p.publicUrl}/review`;
    const lines = [
      `A scan of ${p.designName} (revision ${p.revision}) left ${p.count} proposal${p.count === 1 ? '' : 's'} to review.`,
      'Each shows its proof or counterexample, its margins at the worst corners and the parts it saves. Accept it, or reject it with a reason.',
      'You can turn these messages off under Account → Notifications.',
    ];
    try {
      await mailer.send({ to: m.user.email, subject: `${p.count} proposal${p.count === 1 ? '' : 's'} to review on ${p.designName}`, ...body(lines, link, 'Open the review queue'), teamIds: [p.teamId] });
      sent++;
    } catch (err) {
      log('review request mail failed', err);
    }
  }
  return sent;
}

export async function notifyDecision(
  db: Db,
  mailer: Mailer,
  p: { teamId: string; designName: string; proposalId: string; title: string; decision: 'accept' | 'reject'; reason: string | null; reviewer: string; recipientId: string | null; publicUrl: string },
  log: Log,
): Promise<boolean> {
  if (!p.recipientId) return false;
  const user = await db.models.User.findByPk(p.recipientId);
  if (!user) return false;
  const prefs = await db.models.NotificationPrefs.findByPk(user.id);
  if (prefs?.decisions === false) return false;
  const verb = p.decision === 'accept' ? 'accepted' : 'rejected';
  const lines = [
    `${p.reviewer} ${verb} “${p.title}” on ${p.designName}.`,
    ...(p.reason ? [`Reason: ${p.reason}`] : []),
    p.decision === 'accept' ? 'Accepted proposals can be applied to make a new revision.' : 'The proposal stays on record with the reason.',
    'You can turn these messages off under Account → Notifications.',
  ];
  try {
    await mailer.send({ to: user.email, subject: `Proposal ${verb}: ${p.title}`, ...body(lines, `${p.publicUrl}/proposals/${p.proposalId}`, 'Open the proposal'), teamIds: [p.teamId] });
    return true;
  } catch (err) {
    log('decision mail failed', err);
    return false;
  }
}
