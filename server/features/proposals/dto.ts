// The API shapes of a stored proposal: the summary every list uses and the evidence block.
import type { Proposal } from '@/server/db/models';
import type { Evidence, ProposalSummary } from '@/shared/api/proposals';

export function proposalSummary(p: Proposal): ProposalSummary {
  return {
    id: p.id,
    engineId: p.engineId,
    scanId: p.scanId,
    designId: p.designId,
    revision: p.revisionNumber,
    ruleId: p.ruleId,
    title: p.title,
    message: p.message,
    location: p.location,
    savings: p.savings,
    verdict: p.verdict,
    marginStatus: p.marginStatus,
    status: p.status,
    readiness: p.readiness,
    overlapsWith: p.overlapsWith ?? [],
    boardIds: p.boardIds ?? [],
    createdAt: p.createdAt.toISOString(),
  };
}

/** Evidence from the stored verification; `expressions` maps assumption ids to their text. */
export function evidenceOf(p: Proposal, expressions: Map<string, string>): Evidence {
  const v = p.verification;
  const switchLevel = v.method === 'switch-level';
  const note = v.note ?? '';
  const ev: Evidence = {
    verdict: p.verdict,
    method: v.method,
    assumptionsUsed: p.assumptionIds.map((id) => ({ id, expression: expressions.get(id) ?? '(removed)' })),
    switchSim: {
      vectors: v.simulatedVectors ?? 0,
      contention: switchLevel && note.includes('driven both ways') ? [note] : [],
      floating: switchLevel && note.includes('floats') ? [note] : [],
      sneakPaths: switchLevel && !note.includes('driven both ways') && !note.includes('floats') && note ? [note] : [],
    },
    compared: v.compared ?? [],
    ...(note ? { note } : {}),
  };
  if (v.counterexample) ev.counterexample = { inputs: v.counterexample, outputs: v.differing ?? [] };
  return ev;
}
