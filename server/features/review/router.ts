// /api/proposals/:id/decision (reviewers and admins), /api/proposals/:id/comments (every member
// reads; every role but viewer writes), /api/review-queue (every member reads).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { READERS, REVIEWERS } from '@/server/features/designs/access';
import { proposalFor } from '@/server/features/proposals/router';
import { proposalDetail } from '@/server/features/proposals/service';
import { notifyDecision } from '@/server/features/review/mail';
import { addComment, decide, listComments, reviewQueue } from '@/server/features/review/service';
import { ProposalParamsSchema } from '@/shared/api/proposals';
import { CommentBodySchema, DecisionBodySchema } from '@/shared/api/review';
import type { Role } from '@/shared/domain/roles';

const COMMENTERS: readonly Role[] = ['admin', 'designer', 'reviewer', 'educator'];

export function reviewRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);
  const log = (m: string, e: unknown) => console.error(`[trimwire] ${m}:`, e);

  router.post('/proposals/:id/decision', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: ProposalParamsSchema, body: DecisionBodySchema });
    const { teamId, designName } = await proposalFor(db, req, params.id, REVIEWERS);
    const { user } = callerOf(req);
    const { proposal, startedBy } = await decide(db, params.id, teamId, user, body);
    await notifyDecision(db, deps.mailer, { teamId, designName, proposalId: proposal.id, title: proposal.title, decision: body.decision, reason: body.reason ?? null, reviewer: user.name, recipientId: startedBy, publicUrl: deps.env.PUBLIC_URL }, log);
    res.json(await proposalDetail(db, proposal));
  });

  router.get('/proposals/:id/comments', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ProposalParamsSchema });
    await proposalFor(db, req, params.id, READERS);
    res.json({ comments: await listComments(db, params.id) });
  });

  router.post('/proposals/:id/comments', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: ProposalParamsSchema, body: CommentBodySchema });
    await proposalFor(db, req, params.id, COMMENTERS);
    res.status(201).json(await addComment(db, params.id, callerOf(req).user, body.body));
  });

  router.get('/review-queue', signedIn, async (req, res) => {
    validate(req, {});
    const { user, membership } = callerOf(req);
    res.json({ proposals: await reviewQueue(db, membership.teamId, user.id) });
  });

  return router;
}
