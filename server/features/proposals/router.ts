// /api/designs/:id/proposals (filtered list) and /api/proposals/:id (detail); every member reads.
import { Router, type Request } from 'express';
import type { AppDeps } from '@/server/deps';
import { authorizeForTeam, requireSignedIn } from '@/server/auth/caller';
import type { Db } from '@/server/db';
import type { Proposal } from '@/server/db/models';
import { NotFound } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { designFor, READERS } from '@/server/features/designs/access';
import { listProposals, proposalDetail } from '@/server/features/proposals/service';
import { DesignParamsSchema } from '@/shared/api/designs';
import { ProposalListQuerySchema, ProposalParamsSchema } from '@/shared/api/proposals';
import type { Role } from '@/shared/domain/roles';

/** A proposal for the caller: 404 outside its design's team, 403 without one of `roles`. */
export async function proposalFor(db: Db, req: Request, id: string, roles: readonly Role[]): Promise<{ proposal: Proposal; teamId: string; designName: string }> {
  const proposal = await db.models.Proposal.findByPk(id);
  if (!proposal) throw new NotFound('No such proposal.');
  const design = await db.models.Design.findByPk(proposal.designId, { attributes: ['teamId', 'name'] });
  if (!design) throw new NotFound('No such proposal.');
  await authorizeForTeam(db, req, design.teamId, roles);
  return { proposal, teamId: design.teamId, designName: design.name };
}

export function proposalsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/designs/:id/proposals', signedIn, async (req, res) => {
    const { params, query } = validate(req, { params: DesignParamsSchema, query: ProposalListQuerySchema });
    const { design } = await designFor(db, req, params.id, READERS);
    res.json({ proposals: await listProposals(db, design.id, query) });
  });

  router.get('/proposals/:id', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ProposalParamsSchema });
    const { proposal } = await proposalFor(db, req, params.id, READERS);
    res.json(await proposalDetail(db, proposal));
  });

  return router;
}
