// Lessons: who may see and change them, create/edit/duplicate/publish/delete, and their explorer
// and what-if. Drafts are seen by their author and admins; published lessons by the whole team.
import crypto from 'node:crypto';
import { Op } from 'sequelize';
import type { Request } from 'express';
import type { Db } from '@/server/db';
import type { Lesson, Membership, User } from '@/server/db/models';
import type { LessonSection } from '@/server/db/models/lesson';
import { authorizeForTeam, callerOf } from '@/server/auth/caller';
import { BadRequest, Forbidden, NotFound } from '@/server/http/errors';
import { buildExplorer } from '@/server/features/lessons/explorer';
import { InputError } from '@/optimizer/errors';
import { runWhatIf, type ExplorerData, type WhatIfResult } from '@/optimizer/whatif';
import type { Lesson as LessonDto, LessonBody, LessonPatchBody, LessonSummary, WhatIfBody } from '@/shared/api/lessons';
import { ROLES, type Role } from '@/shared/domain/roles';

export const LESSON_READERS: readonly Role[] = ROLES;
export const LESSON_WRITERS: readonly Role[] = ['educator', 'admin'];

async function namesOf(db: Db, ids: (string | null)[]): Promise<Map<string, User>> {
  const list = [...new Set(ids.filter((x): x is string => !!x))];
  const users = list.length ? await db.models.User.findAll({ where: { id: list } }) : [];
  return new Map(users.map((u) => [u.id, u]));
}

async function summaries(db: Db, lessons: Lesson[]): Promise<LessonSummary[]> {
  const designs = await db.models.Design.findAll({ where: { id: [...new Set(lessons.map((l) => l.designId))] } });
  const revisions = await db.models.Revision.findAll({ where: { id: [...new Set(lessons.map((l) => l.revisionId))] }, attributes: ['id', 'number'] });
  const users = await namesOf(db, lessons.map((l) => l.authorId));
  const designName = new Map(designs.map((d) => [d.id, d.name]));
  const revNumber = new Map(revisions.map((r) => [r.id, r.number]));
  return lessons.map((l) => ({
    id: l.id,
    title: l.title,
    status: l.status,
    designName: designName.get(l.designId) ?? '',
    revision: revNumber.get(l.revisionId) ?? 0,
    proposalCount: l.proposalIds.length,
    author: l.authorId ? (users.get(l.authorId)?.name ?? '') : '',
    updatedAt: l.updatedAt.toISOString(),
    publishedAt: l.publishedAt ? l.publishedAt.toISOString() : null,
  }));
}

export async function lessonDto(db: Db, l: Lesson): Promise<LessonDto> {
  const [s] = await summaries(db, [l]);
  return { ...s!, designId: l.designId, authorId: l.authorId, proposalIds: [...l.proposalIds], sections: l.sections, createdAt: l.createdAt.toISOString() };
}

/** A draft is visible to its author and admins only; to anyone else it does not exist. */
function canSee(l: Lesson, userId: string, m: Membership): boolean {
  return l.status === 'published' || l.authorId === userId || m.role === 'admin';
}

/** Loads a lesson for the caller with one of `roles`; writers must be its author or an admin. */
export async function lessonFor(db: Db, req: Request, id: string, roles: readonly Role[], write = false): Promise<{ lesson: Lesson; membership: Membership }> {
  const lesson = await db.models.Lesson.findByPk(id);
  if (!lesson) throw new NotFound('No such lesson.');
  const { user } = callerOf(req);
  const membership = await authorizeForTeam(db, req, lesson.teamId, LESSON_READERS);
  if (!canSee(lesson, user.id, membership)) throw new NotFound('No such lesson.');
  if (!roles.includes(membership.role)) throw new Forbidden(`This needs one of these roles: ${roles.join(', ')}.`);
  if (write && lesson.authorId !== user.id && membership.role !== 'admin') throw new Forbidden('Only the lesson’s author or an admin can change it.');
  return { lesson, membership };
}

export async function listLessons(db: Db, req: Request): Promise<LessonSummary[]> {
  const { user, membership } = callerOf(req);
  const where =
    membership.role === 'admin'
      ? { teamId: membership.teamId }
      : { teamId: membership.teamId, [Op.or]: [{ status: 'published' }, { authorId: user.id }] };
  const lessons = await db.models.Lesson.findAll({ where, order: [['updatedAt', 'DESC'], ['id', 'ASC']] });
  return summaries(db, lessons);
}

function sectionsOf(list: { id?: string | undefined; heading: string; body: string }[]): LessonSection[] {
  const seen = new Set<string>();
  return list.map((s) => {
    const id = s.id && !seen.has(s.id) ? s.id : crypto.randomUUID();
    seen.add(id);
    return { id, heading: s.heading, body: s.body };
  });
}

/** Every chosen proposal must come from the lesson's design revision (no reaching elsewhere). */
async function checkProposals(db: Db, designId: string, revisionId: string, ids: string[]): Promise<string[]> {
  const unique = [...new Set(ids)];
  if (!unique.length) return unique;
  const found = await db.models.Proposal.findAll({ where: { id: unique, designId, revisionId }, attributes: ['id'] });
  const ok = new Set(found.map((p) => p.id));
  const missing = unique.filter((id) => !ok.has(id));
  if (missing.length) throw new BadRequest('Choose proposals of the lesson’s design revision.', { issues: missing.map((id) => ({ path: 'body.proposalIds', message: `no proposal ${id} on this revision` })) });
  return unique;
}

export async function createLesson(db: Db, req: Request, body: LessonBody): Promise<LessonDto> {
  const { user } = callerOf(req);
  const design = await db.models.Design.findByPk(body.designId);
  if (!design) throw new NotFound('No such design.');
  await authorizeForTeam(db, req, design.teamId, LESSON_WRITERS);
  const revision = await db.models.Revision.findOne({
    where: { designId: design.id, ...(body.revision !== undefined ? { number: body.revision } : {}) },
    order: [['number', 'DESC']],
  });
  if (!revision) throw new NotFound('No such revision.');
  const proposalIds = await checkProposals(db, design.id, revision.id, body.proposalIds);
  const lesson = await db.models.Lesson.create({
    teamId: design.teamId,
    designId: design.id,
    revisionId: revision.id,
    authorId: user.id,
    title: body.title,
    proposalIds,
    sections: sectionsOf(body.sections),
  });
  return lessonDto(db, lesson);
}

export async function patchLesson(db: Db, lesson: Lesson, body: LessonPatchBody): Promise<LessonDto> {
  const changes: Partial<Pick<Lesson, 'title' | 'proposalIds' | 'sections' | 'status' | 'publishedAt'>> = {};
  if (body.title !== undefined) changes.title = body.title;
  if (body.proposalIds !== undefined) changes.proposalIds = await checkProposals(db, lesson.designId, lesson.revisionId, body.proposalIds);
  if (body.sections !== undefined) changes.sections = sectionsOf(body.sections);
  if (body.status === 'draft') Object.assign(changes, { status: 'draft', publishedAt: null });
  await lesson.update(changes);
  return lessonDto(db, lesson);
}

export async function publishLesson(db: Db, lesson: Lesson): Promise<LessonDto> {
  if (lesson.status !== 'published') await lesson.update({ status: 'published', publishedAt: new Date() });
  return lessonDto(db, lesson);
}

/** A copy as a new draft of the caller's (share links are not copied). */
export async function duplicateLesson(db: Db, req: Request, lesson: Lesson): Promise<LessonDto> {
  const { user } = callerOf(req);
  const copy = await db.models.Lesson.create({
    teamId: lesson.teamId,
    designId: lesson.designId,
    revisionId: lesson.revisionId,
    authorId: user.id,
    title: `${lesson.title} (copy)`.slice(0, 200),
    proposalIds: [...lesson.proposalIds],
    sections: lesson.sections.map((s) => ({ ...s, id: crypto.randomUUID() })),
  });
  return lessonDto(db, copy);
}

/** The explorer of a lesson: its revision and its chosen proposals, in the lesson's order. */
export async function lessonExplorer(db: Db, lesson: Lesson): Promise<ExplorerData> {
  const design = await db.models.Design.findByPk(lesson.designId);
  const revision = await db.models.Revision.findByPk(lesson.revisionId);
  if (!design || !revision) throw new NotFound('No such lesson.');
  const rows = lesson.proposalIds.length
    ? await db.models.Proposal.findAll({ where: { id: lesson.proposalIds, designId: design.id, revisionId: revision.id } })
    : [];
  const byId = new Map(rows.map((p) => [p.id, p]));
  return buildExplorer(db, design, revision, lesson.proposalIds.flatMap((id) => (byId.has(id) ? [byId.get(id)!] : [])));
}

/** Runs the same engine the browser runs; a bad setting or unknown proposal is a 400. */
export function whatIfOn(data: ExplorerData, body: WhatIfBody): WhatIfResult {
  try {
    return runWhatIf(data.inputs, body.settings, body.enabled);
  } catch (err) {
    if (err instanceof InputError) throw new BadRequest(err.message, { diagnostics: err.diagnostics });
    throw err;
  }
}

/** The explorer of a design for its team: the latest revision and every proposal scanned on it. */
export async function designExplorer(db: Db, req: Request, designId: string): Promise<ExplorerData> {
  const design = await db.models.Design.findByPk(designId);
  if (!design) throw new NotFound('No such design.');
  await authorizeForTeam(db, req, design.teamId, LESSON_READERS);
  const revision = await db.models.Revision.findOne({ where: { designId: design.id }, order: [['number', 'DESC']] });
  if (!revision) throw new NotFound('No such revision.');
  const proposals = await db.models.Proposal.findAll({
    where: { designId: design.id, revisionId: revision.id, status: { [Op.ne]: 'out-of-date' } },
    order: [['savingsParts', 'DESC'], ['id', 'ASC']],
  });
  return buildExplorer(db, design, revision, proposals);
}
