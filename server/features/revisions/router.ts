// POST /api/designs/:id/revisions — a new source (multipart) or applying accepted proposals (JSON);
// designers and admins only.
import { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, DESIGNERS } from '@/server/features/designs/access';
import { receiveUpload, uploadedFile } from '@/server/features/designs/upload';
import { userLabels } from '@/server/features/designs/users';
import { revisionDtos } from '@/server/features/revisions/dto';
import { applyAccepted, uploadRevision } from '@/server/features/revisions/service';
import { DesignParamsSchema } from '@/shared/api/designs';
import { ApplyBodySchema, RevisionUploadFieldsSchema } from '@/shared/api/revisions';
import type { Db } from '@/server/db';
import type { Revision } from '@/server/db/models';

async function revisionResponse(db: Db, rev: Revision) {
  const all = await db.models.Revision.findAll({ where: { designId: rev.designId }, attributes: { exclude: ['source'] } });
  return revisionDtos(all, await userLabels(db, all.map((r) => r.createdBy))).find((r) => r.id === rev.id)!;
}

export function revisionsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.post('/designs/:id/revisions', signedIn, async (req, res, next) => {
    const { params } = validate(req, { params: DesignParamsSchema, body: z.unknown() });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    if (req.is('multipart/form-data')) return next();
    const { body } = validate(req, { params: DesignParamsSchema, body: ApplyBodySchema });
    const rev = await applyAccepted(db, design, callerOf(req).user, body);
    res.status(201).json(await revisionResponse(db, rev));
  }, receiveUpload, async (req, res) => {
    const { params, body } = validate(req, { params: DesignParamsSchema, body: RevisionUploadFieldsSchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    const rev = await uploadRevision(db, design, callerOf(req).user, uploadedFile(req.file), body);
    res.status(201).json(await revisionResponse(db, rev));
  });

  return router;
}
