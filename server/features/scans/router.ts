// /api/designs/:id/scans (start: designers and admins), /api/scans/:id (read: every member),
// /api/scans/:id/cancel (designers and admins).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { authorizeForTeam, callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, DESIGNERS, READERS } from '@/server/features/designs/access';
import { cancelScan, scanResponse, scanRow, startScan, sweepIfStale } from '@/server/features/scans/service';
import type { ScanQueue } from '@/server/jobs/queue';
import { DesignParamsSchema } from '@/shared/api/designs';
import { ScanParamsSchema, ScanStartBodySchema } from '@/shared/api/scans';
import { NotFound } from '@/server/http/errors';
import type { Request } from 'express';
import type { Role } from '@/shared/domain/roles';

export function scansRouter(deps: AppDeps & { queue: ScanQueue }): Router {
  const { db, queue } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  async function scanFor(req: Request, id: string, roles: readonly Role[]) {
    const s = await scanRow(db, id);
    const design = await db.models.Design.findByPk(s.designId, { attributes: ['teamId'] });
    if (!design) throw new NotFound('No such scan.');
    await authorizeForTeam(db, req, design.teamId, roles);
    return s;
  }

  router.post('/designs/:id/scans', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: DesignParamsSchema, body: ScanStartBodySchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    res.status(202).json(await startScan(db, queue, design, callerOf(req).user, body));
  });

  router.get('/scans/:id', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ScanParamsSchema });
    const s = await sweepIfStale(db, queue, await scanFor(req, params.id, READERS));
    res.json(await scanResponse(db, s));
  });

  router.post('/scans/:id/cancel', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ScanParamsSchema });
    const s = await scanFor(req, params.id, DESIGNERS);
    res.json(await cancelScan(db, s, callerOf(req).user));
  });

  return router;
}
