// /api/share/:token — a shared lesson, read-only: its title, notes and explorer, nothing else of
// the team; public links open signed out, team-only links need a signed-in member. What-if runs
// here too for viewers who want the server's figures.
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { lessonExplorer, whatIfOn } from '@/server/features/lessons/service';
import { lessonForToken } from '@/server/features/share/service';
import { ShareTokenParamsSchema, WhatIfBodySchema } from '@/shared/api/lessons';
import { NotFound } from '@/server/http/errors';

export function shareRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/:token', async (req, res) => {
    const params = ShareTokenParamsSchema.safeParse(req.params);
    // A malformed token is as unknown as a wrong one: no hint what a token looks like.
    if (!params.success) throw new NotFound('This link does not work (it may have been revoked or have expired).');
    validate(req, { params: ShareTokenParamsSchema });
    const lesson = await lessonForToken(db, req, params.data.token);
    const author = lesson.authorId ? await db.models.User.findByPk(lesson.authorId, { attributes: ['name'] }) : null;
    res.json({
      lesson: {
        id: lesson.id,
        title: lesson.title,
        sections: lesson.sections,
        author: author?.name ?? '',
        publishedAt: lesson.publishedAt ? lesson.publishedAt.toISOString() : null,
      },
      explorer: await lessonExplorer(db, lesson),
    });
  });

  router.post('/:token/whatif', async (req, res) => {
    const params = ShareTokenParamsSchema.safeParse(req.params);
    if (!params.success) throw new NotFound('This link does not work (it may have been revoked or have expired).');
    const { body } = validate(req, { params: ShareTokenParamsSchema, body: WhatIfBodySchema });
    const lesson = await lessonForToken(db, req, params.data.token);
    res.json(whatIfOn(await lessonExplorer(db, lesson), body));
  });

  return router;
}
