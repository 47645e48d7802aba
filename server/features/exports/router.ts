// GET /api/designs/:id/revisions/:rev/export?format=… — a file download for every member.
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { NotFound } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { recordAudit } from '@/server/features/audit/service';
import { designFor, READERS } from '@/server/features/designs/access';
import { exportRevision } from '@/server/features/exports/service';
import { ExportParamsSchema, ExportQuerySchema } from '@/shared/api/revisions';

export function exportsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/designs/:id/revisions/:rev/export', requireSignedIn(db), async (req, res) => {
    const { params, query } = validate(req, { params: ExportParamsSchema, query: ExportQuerySchema });
    const { design } = await designFor(db, req, params.id, READERS);
    const rev = await db.models.Revision.findOne({ where: { designId: design.id, number: params.rev } });
    if (!rev) throw new NotFound(`The design has no revision ${params.rev}.`);
    const file = await exportRevision(db, design, rev, query.format);
    await recordAudit(db, { teamId: design.teamId, actor: callerOf(req).user, action: 'export', target: design.name, details: { designId: design.id, revision: rev.number, format: query.format } });
    res.set('Content-Type', file.contentType);
    res.set('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.set('X-Content-Type-Options', 'nosniff');
    res.send(file.body);
  });

  return router;
}
