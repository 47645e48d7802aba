// Review: a decision on an open proposal (never on one from a scan the reviewer started), recorded
// with who and when; accepting marks the proposals that overlap it out of date until the next scan.
// Comments on proposals; the review queue across the team's designs.
import { Op, QueryTypes } from 'sequelize';
import type { Db } from '@/server/db';
import type { Proposal, User } from '@/server/db/models';
import { Conflict, Forbidden } from '@/server/http/errors';
import { recordAudit } from '@/server/features/audit/service';
import { proposalSummary } from '@/server/features/proposals/dto';
import type { DecisionBody } from '@/shared/api/review';
import type { Comment } from '@/shared/api/proposals';
import { labelOf, userLabels } from '@/server/features/designs/users';

export async function decide(db: Db, proposalId: string, teamId: string, reviewer: User, body: DecisionBody): Promise<{ proposal: Proposal; startedBy: string | null }> {
  return db.sequelize.transaction(async (transaction) => {
    const p = await db.models.Proposal.findByPk(proposalId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!p) throw new Conflict('The proposal is gone.');
    const scan = await db.models.Scan.findByPk(p.scanId, { attributes: ['startedBy'], transaction });
    if (scan?.startedBy === reviewer.id) {
      throw new Forbidden('You started the scan that made this proposal; another reviewer must decide it.', 'own-scan');
    }
    if (p.status !== 'open') throw new Conflict(`The proposal is ${p.status}, not open; only open proposals can be decided.`, 'not-open', { status: p.status });
    const status = body.decision === 'accept' ? 'accepted' : 'rejected';
    await p.update({ status }, { transaction });
    await db.models.Decision.create({ proposalId: p.id, reviewerId: reviewer.id, reviewerEmail: reviewer.email, decision: body.decision, reason: body.reason ?? null }, { transaction });
    if (body.decision === 'accept' && p.overlapsWith?.length) {
      await db.models.Proposal.update({ status: 'out-of-date' }, { where: { id: { [Op.in]: p.overlapsWith }, status: 'open' }, transaction });
    }
    await recordAudit(db, { teamId, actor: reviewer, action: 'decision', target: p.title, details: { proposalId: p.id, decision: body.decision, reason: body.reason ?? null } }, transaction);
    return { proposal: p, startedBy: scan?.startedBy ?? null };
  });
}

export async function listComments(db: Db, proposalId: string): Promise<Comment[]> {
  const rows = await db.models.Comment.findAll({ where: { proposalId }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  const labels = await userLabels(db, rows.map((r) => r.authorId));
  return rows.map((c) => ({ id: c.id, author: c.authorId ? labelOf(labels, c.authorId) : c.authorEmail, body: c.body, createdAt: c.createdAt.toISOString() }));
}

export async function addComment(db: Db, proposalId: string, author: User, body: string): Promise<Comment> {
  const c = await db.models.Comment.create({ proposalId, authorId: author.id, authorEmail: author.email, body });
  return { id: c.id, author: `${author.name} <${author.email}>`, body: c.body, createdAt: c.createdAt.toISOString() };
}

/** Open proposals on the team's designs, leaving out those from scans the caller started. */
export async function reviewQueue(db: Db, teamId: string, userId: string) {
  const rows = await db.sequelize.query<{ id: string; design_name: string }>(
    `SELECT p.id, d.name AS design_name FROM proposals p
       JOIN designs d ON d.id = p.design_id
       JOIN scans s ON s.id = p.scan_id
     WHERE d.team_id = :teamId AND p.status = 'open' AND s.started_by IS DISTINCT FROM :userId
     ORDER BY p.created_at ASC, p.savings_parts DESC, p.id LIMIT 500`,
    { replacements: { teamId, userId }, type: QueryTypes.SELECT },
  );
  if (!rows.length) return [];
  const byId = new Map((await db.models.Proposal.findAll({ where: { id: { [Op.in]: rows.map((r) => r.id) } }, attributes: { exclude: ['edit', 'verification', 'margins'] } })).map((p) => [p.id, p]));
  return rows.filter((r) => byId.has(r.id)).map((r) => ({ ...proposalSummary(byId.get(r.id)!), designName: r.design_name }));
}
