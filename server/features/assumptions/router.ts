// /api/designs/:id/assumptions — list (every member); state, edit, withdraw (designers and admins).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, DESIGNERS, READERS } from '@/server/features/designs/access';
import { createAssumption, listAssumptions, patchAssumption, withdrawAssumption } from '@/server/features/assumptions/service';
import { AssumptionBodySchema, AssumptionParamsSchema, AssumptionPatchBodySchema } from '@/shared/api/assumptions';
import { DesignParamsSchema } from '@/shared/api/designs';

export function assumptionsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/designs/:id/assumptions', signedIn, async (req, res) => {
    const { params } = validate(req, { params: DesignParamsSchema });
    const { design } = await designFor(db, req, params.id, READERS);
    res.json({ assumptions: await listAssumptions(db, design.id) });
  });

  router.post('/designs/:id/assumptions', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: DesignParamsSchema, body: AssumptionBodySchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    res.status(201).json(await createAssumption(db, design, callerOf(req).user, body));
  });

  router.patch('/designs/:id/assumptions/:aid', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: AssumptionParamsSchema, body: AssumptionPatchBodySchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    res.json(await patchAssumption(db, design, params.aid, body));
  });

  router.delete('/designs/:id/assumptions/:aid', signedIn, async (req, res) => {
    const { params } = validate(req, { params: AssumptionParamsSchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    await withdrawAssumption(db, design, params.aid);
    res.status(204).end();
  });

  return router;
}
