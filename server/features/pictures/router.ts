// /api/proposals/:id/region, /api/proposals/:id/simulate and /api/designs/:id/drawing: pictures
// every team member may look at (simulating changes nothing, so viewers may run it too).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, READERS } from '@/server/features/designs/access';
import { proposalFor } from '@/server/features/proposals/router';
import { designDrawing, proposalRegion, simulateProposal } from '@/server/features/pictures/service';
import { DesignParamsSchema } from '@/shared/api/designs';
import { DrawingQuerySchema, SimulateBodySchema } from '@/shared/api/pictures';
import { ProposalParamsSchema } from '@/shared/api/proposals';

export function picturesRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/proposals/:id/region', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ProposalParamsSchema });
    const { proposal } = await proposalFor(db, req, params.id, READERS);
    res.json(await proposalRegion(db, proposal));
  });

  router.post('/proposals/:id/simulate', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: ProposalParamsSchema, body: SimulateBodySchema });
    const { proposal } = await proposalFor(db, req, params.id, READERS);
    res.json(await simulateProposal(db, proposal, body.stimulus));
  });

  router.get('/designs/:id/drawing', signedIn, async (req, res) => {
    const { params, query } = validate(req, { params: DesignParamsSchema, query: DrawingQuerySchema });
    const { design } = await designFor(db, req, params.id, READERS);
    res.json(await designDrawing(db, design, query));
  });

  return router;
}
