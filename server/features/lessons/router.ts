// /api/lessons — list, read (drafts: author and admins), create/edit/duplicate/publish/delete
// (educators and admins; changes by the author or an admin), share links, explorer and what-if;
// /api/designs/:id/explorer — the explorer of a design's latest revision for its team.
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import {
  createLesson, designExplorer, duplicateLesson, LESSON_READERS, LESSON_WRITERS, lessonDto, lessonExplorer, lessonFor,
  listLessons, patchLesson, publishLesson, whatIfOn,
} from '@/server/features/lessons/service';
import { createShareLink, listShareLinks, revokeShareLink } from '@/server/features/share/service';
import { DesignParamsSchema } from '@/shared/api/designs';
import { LessonBodySchema, LessonParamsSchema, LessonPatchBodySchema, ShareLinkBodySchema, ShareLinkParamsSchema, WhatIfBodySchema } from '@/shared/api/lessons';

export function lessonsRouter(deps: AppDeps): Router {
  const { db, env } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/lessons', signedIn, async (req, res) => {
    validate(req, {});
    res.json({ lessons: await listLessons(db, req) });
  });

  router.post('/lessons', signedIn, async (req, res) => {
    const { body } = validate(req, { body: LessonBodySchema });
    res.status(201).json(await createLesson(db, req, body));
  });

  router.get('/lessons/:id', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_READERS);
    res.json(await lessonDto(db, lesson));
  });

  router.patch('/lessons/:id', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: LessonParamsSchema, body: LessonPatchBodySchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    res.json(await patchLesson(db, lesson, body));
  });

  router.delete('/lessons/:id', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    await lesson.destroy();
    res.status(204).end();
  });

  router.post('/lessons/:id/duplicate', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS);
    res.status(201).json(await duplicateLesson(db, req, lesson));
  });

  router.post('/lessons/:id/publish', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    res.json(await publishLesson(db, lesson));
  });

  router.get('/lessons/:id/explorer', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_READERS);
    res.json(await lessonExplorer(db, lesson));
  });

  router.post('/lessons/:id/whatif', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: LessonParamsSchema, body: WhatIfBodySchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_READERS);
    res.json(whatIfOn(await lessonExplorer(db, lesson), body));
  });

  router.get('/lessons/:id/share-links', signedIn, async (req, res) => {
    const { params } = validate(req, { params: LessonParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    res.json({ links: await listShareLinks(db, lesson) });
  });

  router.post('/lessons/:id/share-links', signedIn, async (req, res) => {
    const { params, body } = validate(req, { params: LessonParamsSchema, body: ShareLinkBodySchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    res.status(201).json(await createShareLink(db, lesson, callerOf(req).user.id, body, env.PUBLIC_URL));
  });

  router.delete('/lessons/:id/share-links/:linkId', signedIn, async (req, res) => {
    const { params } = validate(req, { params: ShareLinkParamsSchema });
    const { lesson } = await lessonFor(db, req, params.id, LESSON_WRITERS, true);
    await revokeShareLink(db, lesson, params.linkId);
    res.status(204).end();
  });

  router.get('/designs/:id/explorer', signedIn, async (req, res) => {
    const { params } = validate(req, { params: DesignParamsSchema });
    res.json(await designExplorer(db, req, params.id));
  });

  return router;
}
