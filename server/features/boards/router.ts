// /api/designs/:id/boards — list (every member), create and change (designers and admins).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { designFor, DESIGNERS, READERS } from '@/server/features/designs/access';
import { createBoard, listBoards, patchBoard } from '@/server/features/boards/service';
import { BoardBodySchema, BoardParamsSchema, BoardPatchBodySchema } from '@/shared/api/boards';
import { DesignParamsSchema } from '@/shared/api/designs';

export function boardsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/designs/:id/boards', signedIn, async (req, res) => {
    const { params } = validate(req, { params: DesignParamsSchema });
    const { design } = await designFor(db, req, params.id, READERS);
    res.json({ boards: await listBoards(db, design) });
  });

  router.post('/designs/:id/boards', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: DesignParamsSchema, body: BoardBodySchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    res.status(201).json(await createBoard(db, design, body));
  });

  router.patch('/designs/:id/boards/:bid', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: BoardParamsSchema, body: BoardPatchBodySchema });
    const { design } = await designFor(db, req, params.id, DESIGNERS);
    res.json(await patchBoard(db, design, params.bid, body));
  });

  return router;
}
