// /api/designs — list (every member), upload (designers and admins), detail (every member).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { assertRole, callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, DESIGNERS, READERS } from '@/server/features/designs/access';
import { createDesign, designDetail, listDesigns } from '@/server/features/designs/service';
import { receiveUpload, uploadedFile } from '@/server/features/designs/upload';
import { DesignParamsSchema, DesignUploadFieldsSchema, type DesignListResponse } from '@/shared/api/designs';

export function designsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/designs', signedIn, async (req, res) => {
    validate(req, {});
    const body: DesignListResponse = { designs: await listDesigns(db, callerOf(req).membership.teamId) };
    res.json(body);
  });

  // The role is checked before the upload is read, so a viewer's file is never buffered.
  router.post('/designs', signedIn, (req, _res, next) => {
    assertRole(callerOf(req).membership, DESIGNERS);
    next();
  }, receiveUpload, async (req, res) => {
    const { body } = validate(req, { body: DesignUploadFieldsSchema });
    const file = uploadedFile(req.file);
    const { user, membership } = callerOf(req);
    const design = await createDesign(db, user, membership.teamId, file, body);
    res.status(201).json(await designDetail(db, design));
  });

  router.get('/designs/:id', signedIn, async (req, res) => {
    const { params } = validate(req, { params: DesignParamsSchema });
    const { design } = await designFor(db, req, params.id, READERS);
    res.json(await designDetail(db, design));
  });

  return router;
}
