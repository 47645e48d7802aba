// Share links of a lesson: a 32-byte random token (base64url, 43 characters) shown once, stored
// only as its sha256; revocable; optional expiry. Resolving a token yields its lesson and nothing
// else; an unknown, revoked or expired token, or a lesson back in draft, are the same 404.
import crypto from 'node:crypto';
import type { Request } from 'express';
import type { Db } from '@/server/db';
import type { Lesson, LessonShareLink } from '@/server/db/models';
import { resolveMembership } from '@/server/auth/caller';
import { Conflict, NotFound, Unauthorized } from '@/server/http/errors';
import type { ShareLink, ShareLinkBody } from '@/shared/api/lessons';

export const SHARE_TOKEN_BYTES = 32;

export function newShareToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(SHARE_TOKEN_BYTES).toString('base64url');
  return { token, hash: hashShareToken(token) };
}

export function hashShareToken(token: string): string {
  return crypto.createHash('sha256').update(token, 'utf8').digest('hex');
}

export function shareUrl(publicUrl: string, token: string): string {
  return `${publicUrl.replace(/\/+$/, '')}/share/${token}`;
}

async function linkDtos(db: Db, links: LessonShareLink[]): Promise<ShareLink[]> {
  const ids = [...new Set(links.map((l) => l.createdBy).filter((x): x is string => !!x))];
  const users = ids.length ? await db.models.User.findAll({ where: { id: ids } }) : [];
  const name = new Map(users.map((u) => [u.id, u.name]));
  return links.map((l) => ({
    id: l.id,
    public: l.public,
    expiresAt: l.expiresAt ? l.expiresAt.toISOString() : null,
    revokedAt: l.revokedAt ? l.revokedAt.toISOString() : null,
    createdAt: l.createdAt.toISOString(),
    createdBy: l.createdBy ? (name.get(l.createdBy) ?? '') : '',
  }));
}

export async function createShareLink(db: Db, lesson: Lesson, userId: string, body: ShareLinkBody, publicUrl: string) {
  if (lesson.status !== 'published') throw new Conflict('Publish the lesson before sharing it.');
  const expiresAt = body.expiresAt ? new Date(body.expiresAt) : null;
  if (expiresAt && expiresAt.getTime() <= Date.now()) throw new Conflict('The expiry must be in the future.');
  const { token, hash } = newShareToken();
  const link = await db.models.LessonShareLink.create({ lessonId: lesson.id, tokenHash: hash, public: body.public, expiresAt, createdBy: userId });
  const [dto] = await linkDtos(db, [link]);
  return { ...dto!, token, url: shareUrl(publicUrl, token) };
}

export async function listShareLinks(db: Db, lesson: Lesson): Promise<ShareLink[]> {
  const links = await db.models.LessonShareLink.findAll({ where: { lessonId: lesson.id }, order: [['createdAt', 'DESC'], ['id', 'ASC']] });
  return linkDtos(db, links);
}

export async function revokeShareLink(db: Db, lesson: Lesson, linkId: string): Promise<void> {
  const link = await db.models.LessonShareLink.findOne({ where: { id: linkId, lessonId: lesson.id } });
  if (!link) throw new NotFound('No such share link.');
  if (!link.revokedAt) await link.update({ revokedAt: new Date() });
}

const GONE = 'This link does not work (it may have been revoked or have expired).';

/**
 * The lesson a token opens. A team-only link needs a signed-in member of the lesson's team (any
 * role): signed out → 401, anyone else → the same 404 as a bad token.
 */
export async function lessonForToken(db: Db, req: Request, token: string): Promise<Lesson> {
  const link = await db.models.LessonShareLink.findOne({ where: { tokenHash: hashShareToken(token) } });
  if (!link || link.revokedAt || (link.expiresAt && link.expiresAt.getTime() <= Date.now())) throw new NotFound(GONE);
  const lesson = await db.models.Lesson.findByPk(link.lessonId);
  if (!lesson || lesson.status !== 'published') throw new NotFound(GONE);
  if (!link.public) {
    if (!req.user) throw new Unauthorized('Sign in with your team account to open this lesson.');
    if (!(await resolveMembership(db, req.user.id, lesson.teamId))) throw new NotFound(GONE);
  }
  return lesson;
}
