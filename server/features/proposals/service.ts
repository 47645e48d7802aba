// Proposals: a design's list with filters and sorts (done in SQL on indexed columns) and one
// proposal's detail with evidence, margins, decisions and comments.
import { Op, type Order, type WhereOptions } from 'sequelize';
import type { Db } from '@/server/db';
import type { Proposal } from '@/server/db/models';
import { labelOf, userLabels } from '@/server/features/designs/users';
import { evidenceOf, proposalSummary } from '@/server/features/proposals/dto';
import type { ProposalDetail, ProposalListQuery, ProposalSummary } from '@/shared/api/proposals';

/** DESIGN.md §8: shown with every proposal and in every report. */
export const CAUTIONS = [
  'The margins are first-order estimates. Before a rewrite goes on a board, simulate the exported deck and check it on the bench; use the parts’ data sheets for limits.',
  'Work on anything connected to mains, or anything safety-related, follows local codes and licensed practice.',
];

const STATUS_ORDER = `CASE status WHEN 'open' THEN 0 WHEN 'accepted' THEN 1 WHEN 'out-of-date' THEN 2 WHEN 'rejected' THEN 3 ELSE 4 END`;

export async function listProposals(db: Db, designId: string, q: ProposalListQuery): Promise<ProposalSummary[]> {
  const where: WhereOptions<Proposal> = {
    designId,
    ...(q.rule ? { ruleId: q.rule } : {}),
    ...(q.status ? { status: q.status } : {}),
    ...(q.verdict ? { verdict: q.verdict } : {}),
    ...(q.board ? { boardIds: { [Op.contains]: [q.board] } } : {}),
  };
  const dir = (q.order ?? (q.sort === 'savings' || q.sort === 'created' ? 'desc' : 'asc')).toUpperCase() as 'ASC' | 'DESC';
  const by: Record<typeof q.sort, Order> = {
    savings: [['savingsParts', dir], ['createdAt', 'DESC'], ['id', 'ASC']],
    rule: [['ruleId', dir], ['savingsParts', 'DESC'], ['id', 'ASC']],
    status: [[db.sequelize.literal(STATUS_ORDER), dir], ['savingsParts', 'DESC'], ['id', 'ASC']],
    created: [['createdAt', dir], ['id', 'ASC']],
  };
  const rows = await db.models.Proposal.findAll({
    where,
    order: by[q.sort],
    attributes: { exclude: ['edit', 'verification', 'margins'] },
    limit: 1000,
  });
  return rows.map(proposalSummary);
}

export async function proposalDetail(db: Db, p: Proposal): Promise<ProposalDetail> {
  const [design, scan, decisions, comments, assumptions] = await Promise.all([
    db.models.Design.findByPk(p.designId, { attributes: ['name'] }),
    db.models.Scan.findByPk(p.scanId, { attributes: ['startedBy'] }),
    db.models.Decision.findAll({ where: { proposalId: p.id }, order: [['createdAt', 'ASC']] }),
    db.models.Comment.findAll({ where: { proposalId: p.id }, order: [['createdAt', 'ASC']] }),
    db.models.Assumption.findAll({ where: { id: { [Op.in]: p.assumptionIds } }, attributes: ['id', 'expression'] }),
  ]);
  const labels = await userLabels(db, [scan?.startedBy, ...decisions.map((d) => d.reviewerId), ...comments.map((c) => c.authorId)]);
  return {
    ...proposalSummary(p),
    edit: p.edit as unknown as ProposalDetail['edit'],
    evidence: evidenceOf(p, new Map(assumptions.map((a) => [a.id, a.expression]))),
    margins: p.margins,
    decisions: decisions.map((d) => ({ decision: d.decision, reason: d.reason, reviewer: d.reviewerId ? labelOf(labels, d.reviewerId) : d.reviewerEmail, at: d.createdAt.toISOString() })),
    comments: comments.map((c) => ({ id: c.id, author: c.authorId ? labelOf(labels, c.authorId) : c.authorEmail, body: c.body, createdAt: c.createdAt.toISOString() })),
    designName: design?.name ?? '',
    startedBy: labelOf(labels, scan?.startedBy),
    cautions: CAUTIONS,
  };
}
